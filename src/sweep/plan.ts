/**
 * A sweep's plan: the chunks it is cut into. The plan is made once, when the sweep is
 * submitted, and stored with it; resuming, repairing or extending a sweep reads the stored
 * plan back and never plans again, so a change of the cost model or of the chunk-size
 * constants between two releases can neither lose nor duplicate work. Trials draw from
 * streams keyed by what is computed (compute-chunk.ts), so how a sweep is cut into chunks,
 * and who runs them in which order, never changes a result.
 */
import { estimatePointCost } from '../engine/index.js'
import { countPoints, maxChunkTrials, pointAt, pointOps, searchTrialBudget, ENGINE_OPS_PER_CPU_SECOND, TARGET_CHUNK_SECONDS } from '../spec/index.js'
import type { NormalisedSpec } from '../spec/index.js'

// VARIABLES //

/**
 * Version of the plan format. Version 1: chunks are runs of consecutive trials of one grid
 * point; a threshold search is one chunk per point of the outer grid holding the search's
 * whole trial budget; a sweep on the canonical stream is one chunk (point 0, every trial of
 * every point in grid order).
 */
export const PLAN_VERSION = 1

export interface Chunk {
  /** Position in the plan (0 … chunks − 1). */
  index: number
  point: number
  firstTrial: number
  count: number
}

export interface SweepPlan {
  version: number
  chunks: Chunk[]
}

// MAIN //

/**
 * A threshold-search spec gets one chunk per outer grid point (a search is sequential).
 * Otherwise each point's trials are split into balanced chunks of about
 * TARGET_CHUNK_SECONDS of estimated CPU time, and of at most maxChunkTrials trials, so a
 * chunk's records stay small in memory and in storage however cheap its trials are. Chunk
 * boundaries fall on network boundaries (multiples of trialsPerNetwork) where a chunk holds
 * at least one network, so no network is built twice.
 */
export function planSweep (spec: NormalisedSpec): SweepPlan {
  if (spec.streams === 'canonical') return { version: PLAN_VERSION, chunks: [canonicalChunk(spec)] }
  return { version: PLAN_VERSION, chunks: spec.analysis === undefined ? gridChunks(spec) : searchChunks(spec) }
}

/** Trials a grid point is planned for at submission: all of them, or with precision targets its first block. */
export function initialTrials (spec: NormalisedSpec): number {
  return spec.precision === undefined ? spec.trials : Math.min(spec.precision.block, spec.trials)
}

/**
 * The canonical stream is one sequence of draws through every point and trial in order, so
 * its sweep cannot be cut: one chunk, counted at point 0, holding points × trials trials.
 */
export function canonicalChunk (spec: NormalisedSpec): Chunk {
  return { index: 0, point: 0, firstTrial: 0, count: countPoints(spec) * spec.trials }
}

function gridChunks (spec: NormalisedSpec): Chunk[] {
  const chunks: Chunk[] = []
  const points = countPoints(spec)
  const trials = initialTrials(spec)
  for (let point = 0; point < points; point++) {
    for (const piece of pointPieces(spec, point, 0, trials)) chunks.push({ index: chunks.length, point, ...piece })
  }
  return chunks
}

/**
 * Trials [from, to) of a grid point cut into runs of about TARGET_CHUNK_SECONDS of estimated
 * CPU time and at most maxChunkTrials trials, sizes rounded to whole networks where a run
 * holds at least one.
 */
export function pointPieces (spec: NormalisedSpec, point: number, from: number, to: number): Array<{ firstTrial: number, count: number }> {
  const trials = to - from
  if (trials <= 0) return []
  const { params } = pointAt(spec, point)
  const seconds = pointOps(estimatePointCost(params), trials, params.trialsPerNetwork) / ENGINE_OPS_PER_CPU_SECOND
  const cap = maxChunkTrials(params)
  const count = Math.min(trials, Math.max(1, Math.ceil(seconds / TARGET_CHUNK_SECONDS), Math.ceil(trials / cap)))
  let size = Math.ceil(trials / count)
  const perNetwork = params.trialsPerNetwork
  if (size >= perNetwork) size = Math.min(Math.ceil(size / perNetwork) * perNetwork, Math.max(perNetwork, Math.floor(cap / perNetwork) * perNetwork))
  const pieces: Array<{ firstTrial: number, count: number }> = []
  for (let first = from; first < to; first += size) pieces.push({ firstTrial: first, count: Math.min(size, to - first) })
  return pieces
}

/** A stored chunk of an earlier sweep that holds trials [firstTrial, firstTrial + count) of a point with the same parameters and seed. */
export interface ReusableRange {
  sweepId: string
  chunkIndex: number
  firstTrial: number
  count: number
}

/** Where an inherited chunk's trials are stored: a whole stored chunk, or (with `skip`) a run of trials inside one. */
export interface InheritSource {
  sweepId: string
  chunkIndex: number
  /** Trials of the stored chunk before the inherited ones; absent when the whole stored chunk is taken. */
  skip?: number
}

export interface PlanWithReuse {
  plan: SweepPlan
  /** Chunks of the plan whose trials an earlier sweep holds already: copy, do not compute. */
  inherit: Array<{ chunk: Chunk, from: InheritSource }>
}

/**
 * The plan of a grid sweep that takes every trial it can from earlier sweeps: each point's
 * trials are covered by coverWithReuse. Every trial is covered exactly once, and a trial's
 * record depends on its index only, so the result is that of a fresh run.
 */
export function planWithReuse (spec: NormalisedSpec, available: (point: number) => readonly ReusableRange[]): PlanWithReuse {
  if (spec.analysis !== undefined || spec.streams === 'canonical') return { plan: planSweep(spec), inherit: [] }
  const chunks: Chunk[] = []
  const inherit: PlanWithReuse['inherit'] = []
  const trials = initialTrials(spec)
  for (let point = 0; point < countPoints(spec); point++) {
    for (const { from, ...piece } of coverWithReuse(spec, point, 0, trials, available(point))) {
      const chunk = { index: chunks.length, point, ...piece }
      chunks.push(chunk)
      if (from !== undefined) inherit.push({ chunk, from })
    }
  }
  return { plan: { version: PLAN_VERSION, chunks }, inherit }
}

/**
 * Runs of trials covering [from, to) of a point, in order, taking stored trials where there are
 * some: walking from `from`, the stored range that holds the trial reached and runs furthest is
 * taken, whole or (when it starts earlier or ends beyond `to`) the part of it from there on;
 * trials no stored range holds are cut as usual (pointPieces) up to the next stored range.
 */
export function coverWithReuse (spec: NormalisedSpec, point: number, from: number, to: number, available: readonly ReusableRange[]): Array<{ firstTrial: number, count: number, from?: InheritSource }> {
  const ranges = available.filter((range) => Number.isSafeInteger(range.count) && range.count >= 1 && Number.isSafeInteger(range.firstTrial) && range.firstTrial >= 0)
  const end = (range: ReusableRange): number => Math.min(to, range.firstTrial + range.count)
  const pieces: Array<{ firstTrial: number, count: number, from?: InheritSource }> = []
  let at = from
  while (at < to) {
    // The furthest reaching first, then a whole stored chunk before a part of one (a copy is cheaper than a slice).
    const whole = (range: ReusableRange): boolean => range.firstTrial === at && range.firstTrial + range.count <= to
    const here = ranges.filter((range) => range.firstTrial <= at && at < range.firstTrial + range.count)
      .sort((a, b) => end(b) - end(a) || Number(whole(b)) - Number(whole(a)) || a.sweepId.localeCompare(b.sweepId) || a.chunkIndex - b.chunkIndex)[0]
    if (here !== undefined) {
      pieces.push({
        firstTrial: at,
        count: end(here) - at,
        from: whole(here) ? { sweepId: here.sweepId, chunkIndex: here.chunkIndex } : { sweepId: here.sweepId, chunkIndex: here.chunkIndex, skip: at - here.firstTrial }
      })
      at = end(here)
      continue
    }
    const next = Math.min(to, ...ranges.filter((range) => range.firstTrial > at).map((range) => range.firstTrial))
    pieces.push(...pointPieces(spec, point, at, next))
    at = next
  }
  return pieces
}

function searchChunks (spec: NormalisedSpec): Chunk[] {
  const count = searchTrialBudget(spec, spec.analysis!)
  return Array.from({ length: countPoints(spec) }, (_, point) => ({ index: point, point, firstTrial: 0, count }))
}

/**
 * Checks that a stored plan is one this code can run for this spec: indexed 0 … n − 1,
 * every chunk inside the grid, and every trial of every point covered exactly once (with
 * precision targets: at least the first block, in whole runs from trial 0).
 *
 * @throws {RangeError} naming the first problem.
 */
export function checkPlan (spec: NormalisedSpec, plan: SweepPlan): void {
  if (plan.version !== PLAN_VERSION) throw new RangeError(`invalid argument. Plan version ${plan.version} is not supported (this code runs version ${PLAN_VERSION}).`)
  if (spec.streams === 'canonical') {
    const only = canonicalChunk(spec)
    if (plan.chunks.length !== 1 || JSON.stringify(plan.chunks[0]) !== JSON.stringify(only)) {
      throw new RangeError(`invalid argument. A sweep on the canonical stream is the one chunk ${JSON.stringify(only)}.`)
    }
    return
  }
  const points = countPoints(spec)
  const perPoint = spec.analysis === undefined ? initialTrials(spec) : searchTrialBudget(spec, spec.analysis)
  const covered = new Float64Array(points)
  plan.chunks.forEach((chunk, position) => {
    if (chunk.index !== position) throw new RangeError(`invalid argument. Chunk at position ${position} has index ${chunk.index}.`)
    if (!(Number.isSafeInteger(chunk.point) && chunk.point >= 0 && chunk.point < points) ||
        !(Number.isSafeInteger(chunk.firstTrial) && chunk.firstTrial >= 0) ||
        !(Number.isSafeInteger(chunk.count) && chunk.count >= 1) ||
        chunk.firstTrial + chunk.count > (spec.precision === undefined ? perPoint : spec.trials)) {
      throw new RangeError(`invalid argument. Chunk ${JSON.stringify(chunk)} does not fit a grid of ${points} points × ${perPoint} trials.`)
    }
    covered[chunk.point]! += chunk.count
  })
  const ceiling = spec.precision === undefined ? perPoint : spec.trials
  const short = covered.findIndex((trials) => trials < perPoint || trials > ceiling)
  if (short >= 0) throw new RangeError(`invalid argument. The plan covers ${covered[short]} trials of point ${short}, not ${perPoint}.`)
}

/**
 * The order in which a sweep's chunks should start: costliest first (estimated work, ties by
 * index). Chunks of the high-load end of a curve take several times longer than those of
 * the low end; started last, one of them would run alone on one core at the end of the sweep
 * while the others idle. Costliest first leaves only short chunks for the end (the
 * longest-processing-time rule). Results do not depend on the order.
 */
export function dispatchOrder (spec: NormalisedSpec, chunks: readonly Chunk[]): number[] {
  const workOfPoint = new Map<number, (trials: number) => number>()
  const work = new Map<number, number>()
  for (const chunk of chunks) {
    let of = workOfPoint.get(chunk.point)
    if (of === undefined) {
      const { params } = pointAt(spec, chunk.point)
      const cost = estimatePointCost(params)
      of = (trials) => pointOps(cost, trials, params.trialsPerNetwork)
      workOfPoint.set(chunk.point, of)
    }
    // A search chunk's count is its whole trial budget: comparable across searches.
    work.set(chunk.index, of(chunk.count))
  }
  return chunks.map((chunk) => chunk.index).sort((a, b) => (work.get(b)! - work.get(a)!) || a - b)
}

/** Grid point → number of the plan's chunks covering it. */
/** The trial after the last one these runs of trials cover: where a point's planned trials end (0 for none). */
export function trialsEnd (runs: ReadonlyArray<{ firstTrial: number, count: number }>): number {
  return runs.reduce((end, run) => Math.max(end, run.firstTrial + run.count), 0)
}

export function chunksPerPoint (chunks: readonly Chunk[]): Map<number, number> {
  const counts = new Map<number, number>()
  for (const chunk of chunks) counts.set(chunk.point, (counts.get(chunk.point) ?? 0) + 1)
  return counts
}

/** The plan as stored: compact JSON, one [point, firstTrial, count] triple per chunk in index order. */
export function encodePlan (plan: SweepPlan): string {
  return JSON.stringify({ version: plan.version, chunks: plan.chunks.map((c) => [c.point, c.firstTrial, c.count]) })
}

/** @throws {RangeError} when the text is not a stored plan. */
export function decodePlan (text: string): SweepPlan {
  const parsed = JSON.parse(text) as { version?: unknown, chunks?: unknown }
  if (typeof parsed.version !== 'number' || !Array.isArray(parsed.chunks)) throw new RangeError('invalid argument. Not a stored sweep plan.')
  const chunks = (parsed.chunks as unknown[]).map((entry, index): Chunk => {
    if (!Array.isArray(entry) || entry.length !== 3 || !entry.every(Number.isSafeInteger)) throw new RangeError(`invalid argument. Stored plan entry ${index} is malformed.`)
    const [point, firstTrial, count] = entry as [number, number, number]
    return { index, point, firstTrial, count }
  })
  return { version: parsed.version, chunks }
}
