/**
 * Fan-in: stored chunk results → the sweep result. Trials are placed by the plan's (point,
 * trial range) of each chunk, never by arrival, and every point is aggregated from its
 * trials in trial order, so the result is the same whatever the chunking, worker count or
 * completion order. Facts about the run (timing, the assembling process) come in as
 * arguments.
 */
import { aggregatePoint, ENGINE_TIE_RULE, ENGINE_VERSION, RNG_ALGORITHM, theoryForPoint, type TrialRecord } from '../engine/index.js'
import { canonicalJson, countPoints, pointAt, sortKeysDeep, specHash, type NormalisedSpec } from '../spec/index.js'
import type { Provenance, ResultRow, SweepResult } from '../results/types.js'
import { rowParams } from '../results/row-params.js'
import type { RuntimeFacts } from '../runtime/facts.js'
import { assembleSearches } from './analysis/assemble-searches.js'
import { decodeValue } from './codec.js'
import { POINT_KEYING, type ChunkResult } from './compute-chunk.js'
import { IncompleteResultError } from './errors.js'
import type { Chunk } from './plan.js'

export interface RunTiming {
  wallSeconds: number
  cpuSeconds: number
  workers?: number
  fastPath?: string
}

/** A stored chunk: its index in the plan and its encoded ChunkResult. */
export interface StoredChunk {
  index: number
  body: Uint8Array
}

// MAIN //

/** Provenance of a result, from the assembling process's facts and the run's timing. */
export function makeProvenance (spec: NormalisedSpec, facts: RuntimeFacts, timing: RunTiming): Provenance {
  return {
    specHash: specHash(spec),
    engineVersion: ENGINE_VERSION,
    node: facts.node,
    v8: facts.v8,
    rng: RNG_ALGORITHM,
    pointKeying: POINT_KEYING,
    tieRule: ENGINE_TIE_RULE,
    ...timing
  }
}

/**
 * The result from stored chunks, as a store keeps it: rows (or searches) and provenance,
 * without the trial records, which stay in the chunks.
 *
 * @throws {IncompleteResultError} when a chunk of the plan is missing or does not hold its trials.
 */
export function assembleStored (spec: NormalisedSpec, plan: readonly Chunk[], stored: readonly StoredChunk[], provenance: Provenance): SweepResult {
  const bodies = new Map(stored.map((chunk) => [chunk.index, chunk.body]))
  const results: ChunkResult[] = []
  const missing: number[] = []
  for (const chunk of plan) {
    const body = bodies.get(chunk.index)
    if (body === undefined) missing.push(chunk.index)
    else results.push({ ...decodeValue<ChunkResult>(body), chunk: chunk.index, point: chunk.point })
  }
  if (missing.length > 0) throw new IncompleteResultError([`${missing.length} of ${plan.length} chunks are not stored (first: ${missing[0]!})`])
  return { ...assembleResult(spec, results, provenance), trials: [] }
}

/**
 * Assembles the sweep result, trial records included, from chunk results in any order.
 * The fast paths the chunks report are recorded in the provenance unless it names one.
 *
 * @throws {IncompleteResultError} when some trial is missing, duplicated with different
 *   content, or outside the grid.
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
      params: rowParams(params),
      summary: aggregatePoint(params, pointTrials),
      theory: sortKeysDeep(theory.values),
      theoryUnavailable: sortKeysDeep(theory.unavailable)
    }
  })
  return { specHash: hash, spec, rows, trials, provenance: sortKeysDeep(provenance) }
}

/** The trial records of stored chunks, trials[point][trial], for readers that ask for them. */
export function storedTrials (spec: NormalisedSpec, plan: readonly Chunk[], stored: readonly StoredChunk[]): TrialRecord[][] {
  const bodies = new Map(stored.map((chunk) => [chunk.index, chunk.body]))
  return placeTrials(spec, plan.map((chunk) => {
    const body = bodies.get(chunk.index)
    if (body === undefined) throw new IncompleteResultError([`chunk ${chunk.index} is not stored`])
    return { ...decodeValue<ChunkResult>(body), chunk: chunk.index, point: chunk.point }
  }))
}

function placeTrials (spec: NormalisedSpec, chunkResults: readonly ChunkResult[]): TrialRecord[][] {
  if (spec.streams === 'canonical') chunkResults = splitCanonical(spec, chunkResults)
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

/** The canonical chunk holds every point's trials in grid order: as one result per point. */
function splitCanonical (spec: NormalisedSpec, chunkResults: readonly ChunkResult[]): ChunkResult[] {
  return chunkResults.flatMap((result) => Array.from({ length: countPoints(spec) }, (_, point) => ({
    chunk: result.chunk,
    point,
    trials: result.trials.slice(point * spec.trials, (point + 1) * spec.trials)
  })))
}
