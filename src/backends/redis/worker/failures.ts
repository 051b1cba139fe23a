/**
 * The one way a Redis-backend sweep is failed: used by the sandboxed processor (a user error,
 * a chunk's last failed attempt, an assembly that cannot succeed) and by the worker process
 * (a chunk whose attempts ended without the processor saying why: a crash, a stall). The
 * failure text comes from the lifecycle's builder (src/sweep/failure.ts), never from an
 * internal error message.
 */
import type { Redis } from 'ioredis'
import type { SweepFailure } from '../../../sweep/index.js'
import type { ChunkQueue } from '../chunk-queue.js'
import { publishStop, publishSweepEvent } from '../events.js'
import type { KeyLayout } from '../keys.js'
import type { RedisSweepStore } from '../store.js'

export interface FailureDeps {
  redis: Redis
  keys: KeyLayout
  store: RedisSweepStore
  chunks: ChunkQueue
}

/**
 * Fails the sweep (once), stops its other running chunks on every worker and drops its
 * waiting ones. Returns whether this call made the change.
 */
export async function failSweep (deps: FailureDeps, sweepId: string, chunksTotal: number, failure: SweepFailure): Promise<boolean> {
  const transition = await deps.store.stop(sweepId, 'failed', failure, Date.now())
  if (!transition.changed) return false
  await publishStop(deps.redis, deps.keys, sweepId)
  await publishSweepEvent(deps.redis, deps.keys, sweepId, 'state')
  await deps.chunks.removePending(sweepId, chunksTotal, await deps.store.dispatchRun(sweepId))
  return true
}
