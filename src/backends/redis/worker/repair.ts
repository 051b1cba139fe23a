/**
 * Repairs that any live worker makes periodically, for work a process left half done when it
 * died:
 * - sweeps whose submitting API instance died between storing the record and adding the chunk
 *   jobs: their remaining work is added from what is stored with them (the plan is never made
 *   again, so a release with other planning constants adds exactly the stored chunks; chunks
 *   already stored are not added). Job ids are deterministic, so work already queued is not
 *   duplicated;
 * - sweeps whose worker died between a job's final failure and failing the sweep: the jobs
 *   that failed for good lately are looked at again (jobsFailedSince).
 */
import type { Redis } from 'ioredis'
import type { Logger } from 'pino'
import type { NormalisedSpec } from '../../../spec/index.js'
import { isTerminal, planSweep } from '../../../sweep/index.js'
import type { ChunkQueue } from '../chunk-queue.js'
import type { RedisSweepStore } from '../store.js'
import { enqueueRemaining } from '../dispatch.js'

/** Sweeps created longer ago than this whose jobs were never confirmed are enqueued again; also the period of the repairs. */
export const UNENQUEUED_REPAIR_AGE_MS = 30_000

/** Final failures this recent are looked at again: two repair periods, so one live worker's repair sees each at least once. */
export const FAILED_REPAIR_WINDOW_MS = 2 * UNENQUEUED_REPAIR_AGE_MS

/** Ids of the jobs that failed for good since `sinceMs` (BullMQ scores its failed set by the time of failure), oldest first. */
export async function jobsFailedSince (redis: Redis, chunkQueue: ChunkQueue, sinceMs: number, limit = 1000): Promise<string[]> {
  return await redis.zrangebyscore(chunkQueue.queue.keys.failed!, sinceMs, '+inf', 'LIMIT', 0, limit)
}

export async function enqueueForgotten (store: RedisSweepStore, chunkQueue: ChunkQueue, logger: Logger, nowMs = Date.now()): Promise<number> {
  let repaired = 0
  for (const sweepId of await store.unenqueuedBefore(nowMs - UNENQUEUED_REPAIR_AGE_MS)) {
    const view = await store.workView(sweepId)
    if (view === null || isTerminal(view.status)) {
      await store.markEnqueued(sweepId)
      continue
    }
    const spec = JSON.parse(view.specJson) as NormalisedSpec
    if (await store.plan(sweepId) === null) {
      // A sweep stored before plans were stored has none: planning now is all that can be done.
      await chunkQueue.enqueueChunks(sweepId, view.specHash, spec, planSweep(spec).chunks)
      await store.markEnqueued(sweepId)
    } else {
      await enqueueRemaining(store, chunkQueue, sweepId, view.specHash, spec)
    }
    repaired++
    logger.warn({ sweepId }, 'enqueued the chunks of a sweep its API instance never finished submitting')
  }
  return repaired
}
