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
import { decodeChunkValue } from './codec.js'
import { POINT_KEYING, type ChunkResult } from './compute-chunk.js'
import { EngineMixError, IncompleteResultError } from './errors.js'
import { precisionOutcome } from './precision.js'
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
 * without the trial records, which stay in the chunks. Points are assembled one at a time:
 * only one point's records are decoded at once, so the memory an assembly needs is that of
 * the largest point (what the work estimate counts), never that of the whole sweep.
 *
 * @throws {IncompleteResultError} when a chunk of the plan is missing or does not hold its trials.
 */
export function assembleStored (spec: NormalisedSpec, plan: readonly Chunk[], stored: readonly StoredChunk[], provenance: Provenance): SweepResult {
  const bodies = new Map(stored.map((chunk) => [chunk.index, chunk.body]))
  const missing = plan.filter((chunk) => !bodies.has(chunk.index))
  if (missing.length > 0) throw new IncompleteResultError([`${missing.length} of ${plan.length} chunks are not stored (first: ${missing[0]!.index})`])
  const decode = (chunk: Chunk): ChunkResult => decodeChunk(bodies.get(chunk.index)!, chunk)
  // A search's chunk is its whole result; the canonical stream's one chunk holds every point.
  if (spec.analysis !== undefined || spec.streams === 'canonical') return { ...assembleResult(spec, plan.map(decode), provenance), trials: [] }

  const hash = specHash(spec)
  if (provenance.specHash !== hash) throw new RangeError(`invalid argument. The provenance is for spec ${provenance.specHash}, not ${hash}.`)
  const chunksOfPoint = new Map<number, Chunk[]>()
  for (const chunk of plan) {
    const list = chunksOfPoint.get(chunk.point)
    if (list === undefined) chunksOfPoint.set(chunk.point, [chunk])
    else list.push(chunk)
  }
  const fastPaths = new Set<string>()
  const rows: ResultRow[] = []
  for (let point = 0; point < countPoints(spec); point++) {
    const planned = chunksOfPoint.get(point) ?? []
    const results = planned.map(decode)
    for (const result of results) if (result.fastPath !== undefined) fastPaths.add(result.fastPath)
    rows.push(resultRow(spec, point, placePointTrials(spec, point, results, trialsOf(planned))))
  }
  if (provenance.fastPath === undefined && fastPaths.size > 0) provenance = { ...provenance, fastPath: [...fastPaths].sort().join(', ') }
  return { specHash: hash, spec, rows, trials: [], provenance: sortKeysDeep(provenance) }
}

/**
 * The rows of the points finished so far, from whatever is stored (a sweep running, canceled
 * or failed): a point counts when its planned chunks are all stored and, with precision
 * targets, it is closed. Rows are those the finished result will hold for these points.
 */
export function assemblePartial (spec: NormalisedSpec, plan: readonly Chunk[], stored: readonly StoredChunk[], openPoints: readonly number[], provenance: Provenance): SweepResult {
  const hash = specHash(spec)
  const bodies = new Map(stored.map((chunk) => [chunk.index, chunk.body]))
  const open = new Set(openPoints)
  const chunksOfPoint = new Map<number, Chunk[]>()
  for (const chunk of plan) {
    const list = chunksOfPoint.get(chunk.point)
    if (list === undefined) chunksOfPoint.set(chunk.point, [chunk])
    else list.push(chunk)
  }
  const points = countPoints(spec)
  const rows: ResultRow[] = []
  if (spec.streams === 'canonical') {
    const whole = plan.every((chunk) => bodies.has(chunk.index)) ? assembleStored(spec, plan, stored, provenance).rows : []
    return { specHash: hash, spec, rows: whole, trials: [], provenance: sortKeysDeep(provenance), partial: { pointsDone: whole.length, pointsTotal: points } }
  }
  if (spec.analysis === undefined) {
    for (let point = 0; point < points; point++) {
      const planned = chunksOfPoint.get(point) ?? []
      if (open.has(point) || planned.length === 0 || !planned.every((chunk) => bodies.has(chunk.index))) continue
      const results = planned.map((chunk) => decodeChunk(bodies.get(chunk.index)!, chunk))
      rows.push(resultRow(spec, point, placePointTrials(spec, point, results, trialsOf(planned))))
    }
    return { specHash: hash, spec, rows, trials: [], provenance: sortKeysDeep(provenance), partial: { pointsDone: rows.length, pointsTotal: points } }
  }
  // A search is finished when its one chunk is stored.
  const done = plan.filter((chunk) => bodies.has(chunk.index)).map((chunk) => decodeChunk(bodies.get(chunk.index)!, chunk))
  const searches = done.map((result) => {
    const { values, params } = pointAt(spec, result.point)
    const payload = result.search!
    return { search: result.point, values, neurons: params.neurons, stepsUsed: payload.steps.length, trialsUsed: payload.steps.reduce((n, step) => n + step.summary.trials, 0), ...payload }
  }).sort((a, b) => a.search - b.search)
  return sortKeysDeep({ specHash: hash, spec, rows: [], trials: [], searches, provenance, partial: { pointsDone: searches.length, pointsTotal: points } })
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
  const rows = trials.map((pointTrials, point) => resultRow(spec, point, pointTrials))
  return { specHash: hash, spec, rows, trials, provenance: sortKeysDeep(provenance) }
}

/** One grid point's row: its parameters, the summary of its trials in trial order, its theory values. */
function resultRow (spec: NormalisedSpec, point: number, pointTrials: readonly TrialRecord[]): ResultRow {
  const { values, params } = pointAt(spec, point)
  const theory = theoryForPoint(params)
  const summary = aggregatePoint(params, pointTrials)
  const precision = precisionOutcome(spec, summary)
  return {
    point,
    values,
    params: rowParams(params),
    summary,
    theory: sortKeysDeep(theory.values),
    theoryUnavailable: sortKeysDeep(theory.unavailable),
    ...(precision === undefined ? {} : { precision })
  }
}

/** Trials a point's planned chunks hold. */
function trialsOf (chunks: readonly Chunk[]): number {
  return chunks.reduce((sum, chunk) => sum + chunk.count, 0)
}

/**
 * The records of one point's stored chunks, in trial order: what a precision decision or a
 * partial result reads.
 *
 * @throws {IncompleteResultError} when a chunk of the point is not stored.
 */
export function pointRecords (spec: NormalisedSpec, plan: readonly Chunk[], stored: readonly StoredChunk[], point: number): TrialRecord[] {
  const bodies = new Map(stored.map((chunk) => [chunk.index, chunk.body]))
  const planned = plan.filter((chunk) => chunk.point === point)
  const results = planned.map((chunk) => {
    const body = bodies.get(chunk.index)
    if (body === undefined) throw new IncompleteResultError([`chunk ${chunk.index} of point ${point} is not stored`])
    return decodeChunk(body, chunk)
  })
  return placePointTrials(spec, point, results, trialsOf(planned))
}

/** The trial records of stored chunks, trials[point][trial], for readers that ask for them. */
export function storedTrials (spec: NormalisedSpec, plan: readonly Chunk[], stored: readonly StoredChunk[]): TrialRecord[][] {
  const bodies = new Map(stored.map((chunk) => [chunk.index, chunk.body]))
  return placeTrials(spec, plan.map((chunk) => {
    const body = bodies.get(chunk.index)
    if (body === undefined) throw new IncompleteResultError([`chunk ${chunk.index} is not stored`])
    return decodeChunk(body, chunk)
  }))
}

/**
 * A stored chunk's result, placed at its planned chunk. Chunks record the engine release that
 * computed them (run-chunk.ts); one result never mixes two releases, whose records may differ.
 *
 * @throws {EngineMixError} for a chunk computed by another engine release than this one.
 */
function decodeChunk (body: Uint8Array, chunk: Chunk): ChunkResult {
  const { engine, ...result } = decodeChunkValue<ChunkResult & { engine?: string }>(body)
  if (engine !== undefined && engine !== ENGINE_VERSION) throw new EngineMixError(chunk.index, engine, ENGINE_VERSION)
  return { ...result, chunk: chunk.index, point: chunk.point }
}

/** The trials of one point from its chunks' results, in trial order (see placeTrials). */
function placePointTrials (spec: NormalisedSpec, point: number, chunkResults: readonly ChunkResult[], trials: number): TrialRecord[] {
  const slot = new Array<TrialRecord | undefined>(trials)
  const problems = fillSlot(point, slot, chunkResults)
  if (problems.length > 0) throw new IncompleteResultError(problems)
  return slot as TrialRecord[]
}

function placeTrials (spec: NormalisedSpec, chunkResults: readonly ChunkResult[]): TrialRecord[][] {
  if (spec.streams === 'canonical') chunkResults = splitCanonical(spec, chunkResults)
  const points = countPoints(spec)
  const problems: string[] = []
  const byPoint: ChunkResult[][] = Array.from({ length: points }, () => [])
  for (const result of chunkResults) {
    if (Number.isSafeInteger(result.point) && result.point >= 0 && result.point < points) byPoint[result.point]!.push(result)
    else problems.push(`chunk ${result.chunk} names point ${result.point}, outside the grid of ${points}`)
  }
  // With precision targets a point holds the trials its blocks ran; otherwise `trials` each.
  const countOf = (point: number): number => spec.precision === undefined ? spec.trials : byPoint[point]!.reduce((sum, result) => sum + result.trials.length, 0)
  const slots: Array<Array<TrialRecord | undefined>> = Array.from({ length: points }, (_, point) => new Array<TrialRecord | undefined>(countOf(point)))
  for (let point = 0; point < points; point++) problems.push(...fillSlot(point, slots[point]!, byPoint[point]!))
  if (problems.length > 0) throw new IncompleteResultError(problems)
  return slots as TrialRecord[][]
}

/**
 * Places one point's trial records by their trial index, never by arrival, and lists what
 * is wrong: trials outside the point, trials delivered twice with different content (a
 * retried chunk may be delivered twice; identical records are harmless), missing trials.
 */
function fillSlot (point: number, slot: Array<TrialRecord | undefined>, chunkResults: readonly ChunkResult[]): string[] {
  const trials = slot.length
  const problems: string[] = []
  for (const result of [...chunkResults].sort((a, b) => a.chunk - b.chunk)) {
    let outside = 0
    let conflicting = 0
    for (const record of result.trials) {
      const t = record.trial
      if (!(Number.isSafeInteger(t) && t >= 0 && t < trials)) {
        outside++
        continue
      }
      const earlier = slot[t]
      if (earlier === undefined) slot[t] = record
      else if (earlier !== record && canonicalJson(earlier) !== canonicalJson(record)) conflicting++
    }
    if (outside > 0) problems.push(`chunk ${result.chunk} holds ${outside} trial(s) of point ${point} outside 0…${trials - 1}`)
    if (conflicting > 0) problems.push(`chunk ${result.chunk} delivered ${conflicting} trial(s) of point ${point} twice with different content`)
  }
  let missing = 0
  for (let t = 0; t < trials; t++) if (slot[t] === undefined) missing++
  if (missing > 0) problems.push(`point ${point} is missing ${missing} of ${trials} trials`)
  return problems
}

/** The canonical chunk holds every point's trials in grid order: as one result per point. */
function splitCanonical (spec: NormalisedSpec, chunkResults: readonly ChunkResult[]): ChunkResult[] {
  return chunkResults.flatMap((result) => Array.from({ length: countPoints(spec) }, (_, point) => ({
    chunk: result.chunk,
    point,
    trials: result.trials.slice(point * spec.trials, (point + 1) * spec.trials)
  })))
}
