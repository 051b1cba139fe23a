/**
 * The BullMQ side of the Redis backend: a sweep becomes one job per chunk, plus one
 * assembly job once every chunk is stored. Job ids are derived from the sweep id, so adding
 * a job twice is a no-op while the first copy exists, and job payloads are references
 * (sweep id, chunk coordinates): the spec is stored once, in the sweep record.
 */
import { Queue, type JobsOptions } from 'bullmq'
import type { Redis } from 'ioredis'
import { type NormalisedSpec } from '../../spec/index.js'
import { dispatchOrder, type Chunk } from '../../sweep/index.js'
import { assembleJobId, CHUNK_QUEUE_NAME, chunkJobId, decideJobId, type KeyLayout } from './keys.js'

export interface ChunkJobData {
  sweepId: string
  specHash: string
  chunk: Chunk
  chunksTotal: number
}

export interface AssembleJobData {
  sweepId: string
  specHash: string
  chunksTotal: number
}

/** Precision targets: decide whether an open point whose planned trials end at `extent` takes another block. */
export interface DecideJobData {
  sweepId: string
  specHash: string
  point: number
  extent: number
  chunksTotal: number
}

export type SweepJobData = ChunkJobData | AssembleJobData | DecideJobData

export type SweepJobName = 'chunk' | 'assemble' | 'decide'

export interface ChunkRetryPolicy {
  /**
   * Tries per chunk; only system failures are retried (user errors fail at once).
   * @defaultValue 3
   */
  attempts: number
  /**
   * First retry delay in ms; doubles with every further try (±20 % jitter).
   * @defaultValue 5000
   */
  backoffMs: number
}

export const DEFAULT_RETRY_POLICY: ChunkRetryPolicy = { attempts: 3, backoffMs: 5000 }

/** Jobs per addBulk round trip: large sweeps have thousands of chunks. */
const ADD_BATCH = 500
/** Concurrent removals when a sweep stops. */
const REMOVE_BATCH = 100

export class ChunkQueue {
  readonly queue: Queue

  /**
   * @param onError - told of connection errors; without a listener BullMQ's 'error' event
   *   would throw and take the process (or sandbox thread) down during a Redis restart.
   */
  constructor (connection: Redis, readonly keys: KeyLayout, readonly retry: ChunkRetryPolicy = DEFAULT_RETRY_POLICY, onError: (error: Error) => void = () => {}) {
    this.queue = new Queue(CHUNK_QUEUE_NAME, { connection, prefix: keys.bullPrefix, skipWaitingForReady: true })
    this.queue.on('error', onError)
  }

  #jobOptions (jobId: string): JobsOptions {
    return {
      jobId,
      attempts: this.retry.attempts,
      backoff: { type: 'exponential', delay: this.retry.backoffMs, jitter: 0.2 },
      // Our sweep record is the source of truth; finished jobs are kept only for inspection.
      removeOnComplete: { age: 3600, count: 1000 },
      removeOnFail: { age: 7 * 24 * 3600, count: 10_000 }
    }
  }

  /**
   * Adds the chunks' jobs costliest first (dispatchOrder): workers take jobs first in, first out.
   * `chunks` may be part of a plan (what is left to compute) of `chunksTotal` chunks in all.
   */
  async enqueueChunks (sweepId: string, specHash: string, spec: NormalisedSpec, chunks: readonly Chunk[], chunksTotal = chunks.length): Promise<void> {
    const byIndex = new Map(chunks.map((chunk) => [chunk.index, chunk]))
    const ordered = dispatchOrder(spec, chunks).map((index) => byIndex.get(index)!)
    for (let first = 0; first < ordered.length; first += ADD_BATCH) {
      const batch = ordered.slice(first, first + ADD_BATCH).map(chunk => ({
        name: 'chunk' as const,
        data: { sweepId, specHash, chunk, chunksTotal } satisfies ChunkJobData,
        opts: this.#jobOptions(chunkJobId(sweepId, chunk.index))
      }))
      await this.queue.addBulk(batch)
    }
  }

  /** The decision on an open point at a given extent: its fixed id makes a repeat a no-op. */
  async enqueueDecision (sweepId: string, specHash: string, point: number, extent: number, chunksTotal: number): Promise<void> {
    await this.queue.add('decide', { sweepId, specHash, point, extent, chunksTotal } satisfies DecideJobData, this.#jobOptions(decideJobId(sweepId, point, extent)))
  }

  async enqueueAssembly (sweepId: string, specHash: string, chunksTotal: number): Promise<void> {
    await this.queue.add('assemble', { sweepId, specHash, chunksTotal } satisfies AssembleJobData, this.#jobOptions(assembleJobId(sweepId)))
  }

  /** Removes a sweep's chunks that are not running (waiting or delayed for a retry); running ones are locked and stay. */
  async removePending (sweepId: string, chunksTotal: number): Promise<number> {
    let removed = 0
    for (let first = 0; first < chunksTotal; first += REMOVE_BATCH) {
      const last = Math.min(chunksTotal, first + REMOVE_BATCH)
      const replies = await Promise.all(Array.from({ length: last - first }, (_unused, offset) =>
        this.queue.remove(chunkJobId(sweepId, first + offset)).catch(() => 0)))
      removed += replies.reduce<number>((sum, reply) => sum + reply, 0)
    }
    return removed
  }

  async counts (): Promise<{ waiting: number, active: number, completed: number, failed: number }> {
    const counts = await this.queue.getJobCounts('wait', 'prioritized', 'delayed', 'active', 'completed', 'failed')
    return {
      waiting: (counts.wait ?? 0) + (counts.prioritized ?? 0) + (counts.delayed ?? 0),
      active: counts.active ?? 0,
      completed: counts.completed ?? 0,
      failed: counts.failed ?? 0
    }
  }

  async close (): Promise<void> {
    await this.queue.close()
  }
}
