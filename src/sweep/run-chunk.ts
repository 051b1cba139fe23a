/**
 * The one chunk runner: what the embedded backend's compute threads, the Redis backend's
 * sandboxed processors and `memsweep run` all call to run a chunk. It adds to the pure
 * computation (compute-chunk.ts) everything a runner needs: the stop check, throttled
 * progress, timing, failure classification and the encoding the stores keep. It never
 * throws for a failure it can explain: the failure is classified here, where the error's
 * class is still known, and returned as a value.
 */
import { performance } from 'node:perf_hooks'
import { passChunkGate } from '../runtime/chunk-gate.js'
import type { NormalisedSpec } from '../spec/index.js'
import { ENGINE_VERSION } from '../engine/index.js'
import { encodeChunkValue } from './codec.js'
import { computeChunk } from './compute-chunk.js'
import { classifyChunkError, type ClassifiedError } from './failure.js'
import type { Chunk } from './plan.js'

export interface ChunkRunHooks {
  /** Polled before every trial (and while held at a test gate); true abandons the chunk. */
  shouldStop: () => boolean
  /** Told the chunk's trials done so far, at most once per `progressIntervalMs`. */
  onProgress?: (trialsDone: number) => void
  /** @defaultValue 250 */
  progressIntervalMs?: number
  /** Explicit garbage collection before large network builds (src/runtime/reclaim.ts). */
  reclaim?: (() => void) | undefined
}

export type ChunkRunOutcome =
  /** `body`: the encoded ChunkResult; `trials`: the chunk's planned count (a search chunk's whole budget). */
  | { kind: 'done', body: Uint8Array, trials: number, computeMs: number }
  | { kind: 'stopped' }
  | { kind: 'failed', error: ClassifiedError }

// MAIN //

export function runChunk (spec: NormalisedSpec, chunk: Chunk, hooks: ChunkRunHooks): ChunkRunOutcome {
  if (hooks.shouldStop() || !passChunkGate(`s${spec.seed}-c${chunk.index}-n${chunk.count}`, hooks.shouldStop)) return { kind: 'stopped' }
  const interval = hooks.progressIntervalMs ?? 250
  const started = performance.now()
  let lastReport = started
  try {
    const result = computeChunk(spec, chunk, {
      shouldStop: hooks.shouldStop,
      ...(hooks.reclaim === undefined ? {} : { reclaim: hooks.reclaim }),
      onTrial: (trialsDone) => {
        if (hooks.onProgress === undefined) return
        const now = performance.now()
        if (now - lastReport < interval) return
        lastReport = now
        hooks.onProgress(trialsDone)
      }
    })
    // Credit the planned count: a grid chunk ran exactly that many trials, a search chunk's count is its budget (progress reaches 100 % when it ends).
    // The engine release travels with the records: assembly refuses to mix two (assemble.ts).
    return { kind: 'done', body: encodeChunkValue({ ...result, engine: ENGINE_VERSION }), trials: chunk.count, computeMs: performance.now() - started }
  } catch (error) {
    const classified = classifyChunkError(error)
    return classified.kind === 'canceled' ? { kind: 'stopped' } : { kind: 'failed', error: classified }
  }
}
