/**
 * Units of work shared by every backend. A chunk is a run of consecutive trials of one
 * grid point. Trials draw from streams keyed by (seed, point, trial), so how a sweep is
 * cut into chunks, and who runs them in which order, never changes a result.
 */
import { createPointRunner, estimatePointCost, type TrialRecord } from '../engine/index.js'
import { planSearchChunks, runSearchChunk } from './analysis/run.js'
import type { SearchPayload } from './analysis/types.js'
import { ChunkCanceledError } from './errors.js'
import { countPoints, pointAt } from './grid.js'
import type { NormalisedSpec } from './types.js'
import { ENGINE_OPS_PER_CPU_SECOND, pointOps, TARGET_CHUNK_SECONDS } from './work.js'

export interface Chunk {
  /** Position in the sweep's chunk list (ordered by point, then first trial). */
  index: number
  point: number
  firstTrial: number
  count: number
}

export interface ChunkResult {
  chunk: number
  point: number
  /** Records of trials firstTrial … firstTrial + count − 1, in order (empty for a search chunk). */
  trials: TrialRecord[]
  /** A search chunk's outcome: its steps' summaries, the estimate and its interval. Absent for grid chunks. */
  search?: SearchPayload
  /** The engine's accelerated path for this chunk's networks (e.g. `wasm-simd128-overlap-i16`, `js`). */
  fastPath?: string
}

export interface RunChunkOptions {
  /** Polled before every trial; returning true abandons the chunk with ChunkCanceledError. */
  shouldStop?: () => boolean
  /** Called after every trial with the number of the chunk's trials done so far. */
  onTrial?: (trialsDoneInChunk: number) => void
  /** Explicit garbage collection, offered to the engine before it builds a large network (PointRunnerOptions.reclaim). */
  reclaim?: () => void
}

// MAIN //

/**
 * A threshold-search spec gets one chunk per outer grid point (see analysis/run.ts).
 * Otherwise: splits each point's trials into balanced chunks of about TARGET_CHUNK_SECONDS of
 * estimated CPU time. Chunk boundaries fall on network boundaries (multiples of
 * trialsPerNetwork) where a chunk holds at least one network, so no network is built twice.
 * A deterministic function of the spec (and the throughput constant).
 */
export function planChunks (spec: NormalisedSpec): Chunk[] {
  if (spec.analysis !== undefined) return planSearchChunks(spec, spec.analysis)
  const chunks: Chunk[] = []
  const points = countPoints(spec)
  const trials = spec.trials
  for (let point = 0; point < points; point++) {
    const { params } = pointAt(spec, point)
    const seconds = pointOps(estimatePointCost(params), trials, params.trialsPerNetwork) / ENGINE_OPS_PER_CPU_SECOND
    const pieces = Math.min(trials, Math.max(1, Math.ceil(seconds / TARGET_CHUNK_SECONDS)))
    let size = Math.ceil(trials / pieces)
    const perNetwork = params.trialsPerNetwork
    if (size >= perNetwork) size = Math.ceil(size / perNetwork) * perNetwork
    for (let first = 0; first < trials; first += size) {
      chunks.push({ index: chunks.length, point, firstTrial: first, count: Math.min(size, trials - first) })
    }
  }
  return chunks
}

/**
 * The order in which a sweep's chunks should start: costliest first (estimated work, ties by
 * index). Chunks of the high-load end of a curve take several times longer than those of
 * the low end; started last, one of them would run alone on one core at the end of the sweep
 * while the others idle. Costliest first leaves only short chunks for the end (the
 * longest-processing-time rule). Results do not depend on the order: every trial draws from
 * its own stream and the assembly is by chunk index.
 */
export function dispatchOrder (spec: NormalisedSpec, chunks: readonly Chunk[]): number[] {
  const workOfPoint = new Map<number, (trials: number) => number>()
  const work = chunks.map((chunk) => {
    let of = workOfPoint.get(chunk.point)
    if (of === undefined) {
      const { params } = pointAt(spec, chunk.point)
      const cost = estimatePointCost(params)
      of = (trials) => pointOps(cost, trials, params.trialsPerNetwork)
      workOfPoint.set(chunk.point, of)
    }
    // A search chunk's count is its whole trial budget: comparable across searches.
    return of(chunk.count)
  })
  return chunks.map((chunk) => chunk.index).sort((a, b) => (work[b]! - work[a]!) || a - b)
}

/**
 * Runs one chunk's trials on a single point runner (a search chunk: its whole search).
 *
 * @throws {ChunkCanceledError} when `shouldStop` returns true before a trial.
 * @throws {RangeError} when the chunk does not fit the spec's grid.
 */
export function runChunk (spec: NormalisedSpec, chunk: Chunk, opts: RunChunkOptions = {}): ChunkResult {
  if (spec.analysis !== undefined) return runSearchChunk(spec, spec.analysis, chunk, opts)
  const points = countPoints(spec)
  if (!(Number.isSafeInteger(chunk.point) && chunk.point >= 0 && chunk.point < points) ||
      !(Number.isSafeInteger(chunk.firstTrial) && chunk.firstTrial >= 0) ||
      !(Number.isSafeInteger(chunk.count) && chunk.count >= 1) ||
      chunk.firstTrial + chunk.count > spec.trials) {
    throw new RangeError(`invalid argument. Chunk ${JSON.stringify(chunk)} does not fit a grid of ${points} points × ${spec.trials} trials.`)
  }
  const { params } = pointAt(spec, chunk.point)
  const runner = createPointRunner(params, spec.seed, chunk.point, { reclaim: opts.reclaim })
  const trials: TrialRecord[] = []
  for (let k = 0; k < chunk.count; k++) {
    if (opts.shouldStop?.() === true) throw new ChunkCanceledError(chunk.index, k)
    trials.push(runner.runTrial(chunk.firstTrial + k))
    opts.onTrial?.(k + 1)
  }
  return runner.fastPath === null
    ? { chunk: chunk.index, point: chunk.point, trials }
    : { chunk: chunk.index, point: chunk.point, trials, fastPath: runner.fastPath }
}
