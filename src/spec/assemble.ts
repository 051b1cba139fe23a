/**
 * Fan-in: chunk results → the sweep result. Trials are placed by their (point, trial)
 * index, never by arrival, and every point is aggregated from its trials in trial order, so
 * the result is the same whatever the chunking, worker count or completion order.
 */
import { aggregatePoint, ENGINE_TIE_RULE, ENGINE_VERSION, RNG_ALGORITHM, theoryForPoint, type PointSummary, type TrialRecord, type UnavailableReason } from '../engine/index.js'
import { assembleSearches } from './analysis/assemble.js'
import type { ScalingRow, SearchRow } from './analysis/types.js'
import { canonicalJson, sortKeysDeep, specHash } from './canonical.js'
import type { ChunkResult } from './chunks.js'
import { IncompleteResultError } from './errors.js'
import { countPoints, pointAt } from './grid.js'
import type { NormalisedSpec } from './types.js'

/** Where and how a result was computed. Timing is the caller's; everything else describes the code. */
export interface Provenance {
  specHash: string
  engineVersion: string
  /** Node.js version (process.version) of the assembling process. */
  node: string
  /** V8 version; Math.exp and friends may change with it. */
  v8: string
  /** Random number algorithm and stream derivation. */
  rng: string
  /** T = 0 tie rule of the dynamics: `keep` = a zero local field leaves the neuron's state unchanged. */
  tieRule: typeof ENGINE_TIE_RULE
  /** Wall-clock seconds from the first chunk started to the last one finished. */
  wallSeconds: number
  /** CPU seconds summed over all chunks. */
  cpuSeconds: number
  /** Worker threads or processes that ran chunks, when known. */
  workers?: number
  /** Name of an accelerated code path used by the workers, when one was. */
  fastPath?: string
}

export interface ResultRow {
  point: number
  /** The varied parameters at this point, by path. */
  values: Record<string, number>
  /** N, P and the realised load α = P/N. */
  params: { alpha: number, neurons: number, patterns: number }
  summary: PointSummary
  /** Theory values that apply at this point, by name. */
  theory: Record<string, number>
  /** The model's other theory values, by name: why each is missing here (reason codes: docs/theory.md). */
  theoryUnavailable: Record<string, UnavailableReason>
}

export interface SweepResult {
  specHash: string
  spec: NormalisedSpec
  /** One row per grid point (empty for an analysis: see `searches`). */
  rows: ResultRow[]
  /** trials[point][trial] (empty for an analysis, which keeps per-step summaries instead). */
  trials: TrialRecord[][]
  /** Analysis specs only: one threshold search per point of the outer grid. */
  searches?: SearchRow[]
  /** Analysis specs with a scaling fit only: one fit per combination of the other varied parameters. */
  scaling?: ScalingRow[]
  provenance: Provenance
}

// MAIN //

/** Provenance for results assembled in this process, given the caller's timing. */
export function makeProvenance (spec: NormalisedSpec, timing: { wallSeconds: number, cpuSeconds: number, workers?: number, fastPath?: string }): Provenance {
  return {
    specHash: specHash(spec),
    engineVersion: ENGINE_VERSION,
    node: process.version,
    v8: process.versions.v8,
    rng: RNG_ALGORITHM,
    tieRule: ENGINE_TIE_RULE,
    ...timing
  }
}

/**
 * Assembles the sweep result from chunk results in any order.
 *
 * @throws {IncompleteResultError} when some trial is missing, duplicated with different
 *   content, or outside the grid.
 * The fast paths the chunks report are recorded in the provenance unless the caller set one.
 *
 * @throws {RangeError} when the provenance names another spec.
 */
export function assembleResult (spec: NormalisedSpec, chunkResults: readonly ChunkResult[], provenance: Provenance): SweepResult {
  const hash = specHash(spec)
  if (provenance.specHash !== hash) {
    throw new RangeError(`invalid argument. The provenance is for spec ${provenance.specHash}, not ${hash}.`)
  }
  const fastPaths = [...new Set(chunkResults.flatMap((r) => r.fastPath === undefined ? [] : [r.fastPath]))].sort()
  if (provenance.fastPath === undefined && fastPaths.length > 0) provenance = { ...provenance, fastPath: fastPaths.join(', ') }
  if (spec.analysis !== undefined) {
    const analysed = assembleSearches(spec, spec.analysis, chunkResults)
    return sortKeysDeep({ specHash: hash, spec, rows: [], trials: [], ...analysed, provenance })
  }
  const trials = placeTrials(spec, chunkResults)
  const rows: ResultRow[] = trials.map((pointTrials, point) => {
    const { values, params } = pointAt(spec, point)
    const theory = theoryForPoint(params)
    return {
      point,
      values,
      params: { alpha: params.patterns / params.neurons, neurons: params.neurons, patterns: params.patterns },
      summary: aggregatePoint(params, pointTrials),
      theory: sortKeysDeep(theory.values),
      theoryUnavailable: sortKeysDeep(theory.unavailable)
    }
  })
  return { specHash: hash, spec, rows, trials, provenance: sortKeysDeep(provenance) }
}

function placeTrials (spec: NormalisedSpec, chunkResults: readonly ChunkResult[]): TrialRecord[][] {
  const points = countPoints(spec)
  const slots: Array<Array<TrialRecord | undefined>> = Array.from({ length: points }, () => new Array<TrialRecord | undefined>(spec.trials))
  const problems: string[] = []
  const ordered = [...chunkResults].sort((a, b) => a.chunk - b.chunk)
  for (const result of ordered) {
    if (!(Number.isSafeInteger(result.point) && result.point >= 0 && result.point < points)) {
      problems.push(`chunk ${result.chunk} names point ${result.point}, outside the grid of ${points}`)
      continue
    }
    const slot = slots[result.point]!
    let outside = 0
    let conflicting = 0
    for (const record of result.trials) {
      const t = record.trial
      if (!(Number.isSafeInteger(t) && t >= 0 && t < spec.trials)) {
        outside++
        continue
      }
      const earlier = slot[t]
      // A retried chunk may be delivered twice; identical records are harmless, different ones are a bug.
      if (earlier === undefined) slot[t] = record
      else if (earlier !== record && canonicalJson(earlier) !== canonicalJson(record)) conflicting++
    }
    if (outside > 0) problems.push(`chunk ${result.chunk} holds ${outside} trial(s) of point ${result.point} outside 0…${spec.trials - 1}`)
    if (conflicting > 0) problems.push(`chunk ${result.chunk} delivered ${conflicting} trial(s) of point ${result.point} twice with different content`)
  }
  for (let point = 0; point < points; point++) {
    const slot = slots[point]!
    let missing = 0
    for (let t = 0; t < spec.trials; t++) if (slot[t] === undefined) missing++
    if (missing > 0) problems.push(`point ${point} is missing ${missing} of ${spec.trials} trials`)
  }
  if (problems.length > 0) throw new IncompleteResultError(problems)
  return slots as TrialRecord[][]
}
