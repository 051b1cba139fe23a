/**
 * Search chunks: one chunk per point of the outer grid, running that point's whole threshold
 * search. The design is sequential (each step's value depends on the steps before), so a
 * search cannot be split across workers; searches at different outer points run in parallel.
 */
import { aggregatePoint, createPointRunner, type TrialRecord } from '../../engine/index.js'
import { runThresholdSearch, type StepObservation } from '../../engine/analysis/index.js'
import type { ChunkResult, ComputeChunkOptions } from '../compute-chunk.js'
import { ChunkCanceledError } from '../errors.js'
import type { Chunk } from '../plan.js'
import { countPoints, pointAt } from '../../spec/grid.js'
import type { NormalisedSpec } from '../../spec/types.js'
import { realisedValue, withParameter } from '../../spec/analysis/parameter.js'
import type { NormalisedAnalysis, SearchStepRecord } from '../../spec/analysis/types.js'
import { searchTrialBudget } from '../../spec/analysis/budget.js'

/**
 * Step k of search s draws its networks and trials from grid-point index
 * SEARCH_STREAM_OFFSET + s·SEARCH_STEP_STRIDE + k. The offset (2^40) keeps searches off the
 * streams of ordinary grid points (indices below 10^5), so a search never reuses the networks
 * of a grid sweep with the same seed; the stride exceeds the most steps a search may take.
 */
export const SEARCH_STREAM_OFFSET = 2 ** 40
export const SEARCH_STEP_STRIDE = 1000

// MAIN //

/** The stream point of step `step` of search `search`. */
export function searchStreamPoint (search: number, step: number): number {
  return SEARCH_STREAM_OFFSET + search * SEARCH_STEP_STRIDE + step
}

/**
 * Runs one search. `shouldStop` is polled before every trial, `onTrial` reports the
 * search's trials so far (at most the chunk's count). The result's `trials` is empty: a
 * search keeps per-step summaries, not per-trial records.
 *
 * @throws {ChunkCanceledError} when `shouldStop` returns true before a trial.
 * @throws {RangeError} when the chunk is not one this spec plans.
 */
export function runSearchChunk (spec: NormalisedSpec, analysis: NormalisedAnalysis, chunk: Chunk, opts: ComputeChunkOptions): ChunkResult {
  const points = countPoints(spec)
  if (!(Number.isSafeInteger(chunk.point) && chunk.point >= 0 && chunk.point < points) ||
      chunk.index !== chunk.point || chunk.firstTrial !== 0 || chunk.count !== searchTrialBudget(spec, analysis)) {
    throw new RangeError(`invalid argument. Chunk ${JSON.stringify(chunk)} is not a search chunk of this spec (${points} searches of up to ${searchTrialBudget(spec, analysis)} trials).`)
  }
  const base = pointAt(spec, chunk.point).params
  const steps: SearchStepRecord[] = []
  let done = 0
  const evaluate = (value: number, step: number): StepObservation => {
    const params = withParameter(base, analysis.parameter, value)
    const runner = createPointRunner(params, spec.seed, searchStreamPoint(chunk.point, step), { reclaim: opts.reclaim })
    const records: TrialRecord[] = []
    for (let t = 0; t < spec.trials; t++) {
      if (opts.shouldStop?.() === true) throw new ChunkCanceledError(chunk.index, done)
      records.push(runner.runTrial(t))
      done++
      opts.onTrial?.(done)
    }
    const summary = aggregatePoint(params, records)
    steps.push({
      step,
      value,
      side: 'above',
      params: { alpha: params.patterns / params.neurons, neurons: params.neurons, patterns: params.patterns },
      summary
    })
    return { trials: summary.trials, successes: summary.success.count, overlapMean: summary.overlap.mean, overlapSe: summary.overlap.se }
  }
  const outcome = runThresholdSearch({
    from: analysis.from,
    to: analysis.to,
    direction: analysis.direction,
    measure: analysis.measure,
    level: analysis.level,
    maxSteps: analysis.maxSteps,
    tolerance: analysis.tolerance,
    confidence: analysis.confidence,
    realise: (x) => realisedValue(analysis.parameter, base, x)
  }, evaluate)
  outcome.steps.forEach((s, i) => { steps[i]!.side = s.side })
  return {
    chunk: chunk.index,
    point: chunk.point,
    trials: [],
    search: {
      stoppedBy: outcome.stoppedBy,
      estimate: outcome.estimate,
      low: outcome.low,
      high: outcome.high,
      bracket: outcome.bracket,
      fit: outcome.fit,
      note: outcome.note,
      steps
    }
  }
}
