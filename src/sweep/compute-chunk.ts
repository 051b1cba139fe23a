/**
 * The computation of one chunk: its trials (or, for an analysis, its whole threshold
 * search), as plain data. No timing, no encoding, no failure handling: run-chunk.ts wraps
 * this for every backend.
 *
 * Every trial of a grid point draws from streams keyed by (seed, point key, trial), where
 * the point key is a hash of the point's full model parameters rather than its position in
 * the grid. Two sweeps with the same seed therefore draw the very same trials at a point
 * with the same parameters, whatever else their grids hold: a sweep extended by more axis
 * values, or a new sweep that shares points with an old one, can reuse finished trials and
 * still give exactly the numbers of a fresh run.
 */
import { createHash } from 'node:crypto'
import { createPointRunner, keyedParams, Xoshiro256StarStar, type PointParams, type TrialRecord } from '../engine/index.js'
import { countPoints } from '../spec/index.js'
import { canonicalJson, pointAt, type NormalisedSpec, type SearchPayload } from '../spec/index.js'
import { runSearchChunk } from './analysis/run-search.js'
import { ChunkCanceledError } from './errors.js'
import type { Chunk } from './plan.js'

// VARIABLES //

/**
 * Point keys live in [2^52, 2^53): above the stream indices of threshold searches
 * (SEARCH_STREAM_OFFSET = 2^40 plus at most ~2^37), below the largest safe integer.
 */
const POINT_KEY_BASE = 2 ** 52

/** Names the point keying in provenance; change it if the derivation ever changes. */
export const POINT_KEYING = 'point key = 2^52 + first 52 bits of sha256(canonical JSON of the point\'s model parameters)'

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

export interface ComputeChunkOptions {
  /** Polled before every trial; returning true abandons the chunk with ChunkCanceledError. */
  shouldStop?: () => boolean
  /** Called after every trial with the number of the chunk's trials done so far. */
  onTrial?: (trialsDoneInChunk: number) => void
  /** Explicit garbage collection, offered to the engine before it builds a large network (PointRunnerOptions.reclaim). */
  reclaim?: () => void
}

// MAIN //

/** The stream key of a grid point: a function of its model parameters only (output-only members left out: keyedParams). */
export function pointStreamKey (params: PointParams): number {
  const digest = createHash('sha256').update(canonicalJson(keyedParams(params))).digest()
  // 52 bits: the top 4 bits of byte 0, then bytes 1-6.
  const high = digest[0]! & 0x0f
  let low = 0
  for (let i = 1; i <= 6; i++) low = low * 256 + digest[i]!
  return POINT_KEY_BASE + high * 2 ** 48 + low
}

/**
 * Runs one chunk's trials on a single point runner (a search chunk: its whole search).
 *
 * @throws {ChunkCanceledError} when `shouldStop` returns true before a trial.
 * @throws {RangeError} when the chunk does not fit the spec's grid.
 */
export function computeChunk (spec: NormalisedSpec, chunk: Chunk, opts: ComputeChunkOptions = {}): ChunkResult {
  if (spec.analysis !== undefined) return runSearchChunk(spec, spec.analysis, chunk, opts)
  if (spec.streams === 'canonical') return computeCanonicalChunk(spec, chunk, opts)
  if (!(Number.isSafeInteger(chunk.firstTrial) && chunk.firstTrial >= 0) ||
      !(Number.isSafeInteger(chunk.count) && chunk.count >= 1) ||
      chunk.firstTrial + chunk.count > spec.trials) {
    throw new RangeError(`invalid argument. Chunk ${JSON.stringify(chunk)} does not fit ${spec.trials} trials per point.`)
  }
  const { params } = pointAt(spec, chunk.point)
  const runner = createPointRunner(params, spec.seed, pointStreamKey(params), { reclaim: opts.reclaim })
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

/**
 * A sweep on the canonical stream (docs/canonical-stream.md): one xoshiro256** stream seeded
 * with the spec's seed (SplitMix64 fills its state), drawn through the points in grid order
 * and each point's trials in order, a network drawn just before its first trial. The chunk
 * holds every trial of every point, in that order.
 *
 * @throws {ChunkCanceledError} when `shouldStop` returns true before a trial.
 * @throws {RangeError} when the chunk is not the sweep's one canonical chunk.
 */
function computeCanonicalChunk (spec: NormalisedSpec, chunk: Chunk, opts: ComputeChunkOptions): ChunkResult {
  const points = countPoints(spec)
  if (chunk.point !== 0 || chunk.firstTrial !== 0 || chunk.count !== points * spec.trials) {
    throw new RangeError(`invalid argument. Chunk ${JSON.stringify(chunk)} is not the canonical chunk of ${points} points × ${spec.trials} trials.`)
  }
  const stream = Xoshiro256StarStar.fromSeed(BigInt(spec.seed))
  const trials: TrialRecord[] = []
  const fastPaths = new Set<string>()
  for (let point = 0; point < points; point++) {
    const runner = createPointRunner(pointAt(spec, point).params, spec.seed, 0, { reclaim: opts.reclaim, stream })
    for (let t = 0; t < spec.trials; t++) {
      if (opts.shouldStop?.() === true) throw new ChunkCanceledError(chunk.index, trials.length)
      trials.push(runner.runTrial(t))
      opts.onTrial?.(trials.length)
    }
    if (runner.fastPath !== null) fastPaths.add(runner.fastPath)
  }
  return fastPaths.size === 0
    ? { chunk: chunk.index, point: 0, trials }
    : { chunk: chunk.index, point: 0, trials, fastPath: [...fastPaths].sort().join(', ') }
}
