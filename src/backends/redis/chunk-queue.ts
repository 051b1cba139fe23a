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
  /** The sweep's resume count when the job was added (absent: 0); follow-up jobs carry it on. */
  run?: number
}

export interface AssembleJobData {
  sweepId: string
  specHash: string
  chunksTotal: number
  run?: number
}

/** Precision targets: decide whether an open point whose planned trials end at `extent` takes another block. */
export interface DecideJobData {
  sweepId: string
  specHash: string
  point: number
  extent: number
  chunksTotal: number
  run?: number
}

export type SweepJobData = ChunkJobData | AssembleJobData | DecideJobData

/** The reason a job gives when its sweep was purged (or expired): the worker removes such a job once it ends. */
export const SWEEP_GONE = 'sweep no longer stored'

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
  async enqueueChunks (sweepId: string, specHash: string, spec: NormalisedSpec, chunks: readonly Chunk[], chunksTotal = chunks.length, run = 0): Promise<void> {
    const byIndex = new Map(chunks.map((chunk) => [chunk.index, chunk]))
    const ordered = dispatchOrder(spec, chunks).map((index) => byIndex.get(index)!)
    for (let first = 0; first < ordered.length; first += ADD_BATCH) {
      const batch = ordered.slice(first, first + ADD_BATCH).map(chunk => ({
        name: 'chunk' as const,
        data: { sweepId, specHash, chunk, chunksTotal, ...(run === 0 ? {} : { run }) } satisfies ChunkJobData,
        opts: this.#jobOptions(chunkJobId(sweepId, chunk.index, run))
      }))
      await this.queue.addBulk(batch)
    }
  }

  /** The decision on an open point at a given extent: its fixed id makes a repeat a no-op. */
  async enqueueDecision (sweepId: string, specHash: string, point: number, extent: number, chunksTotal: number, run = 0): Promise<void> {
    const data: DecideJobData = { sweepId, specHash, point, extent, chunksTotal, ...(run === 0 ? {} : { run }) }
    await this.queue.add('decide', data, this.#jobOptions(decideJobId(sweepId, point, extent, run)))
  }

  async enqueueAssembly (sweepId: string, specHash: string, chunksTotal: number, run = 0): Promise<void> {
    const data: AssembleJobData = { sweepId, specHash, chunksTotal, ...(run === 0 ? {} : { run }) }
    await this.queue.add('assemble', data, this.#jobOptions(assembleJobId(sweepId, run)))
  }

  /** Removes a sweep's chunks that are not running (waiting or delayed for a retry); running ones are locked and stay. */
  async removePending (sweepId: string, chunksTotal: number, run = 0): Promise<number> {
    let removed = 0
    for (let first = 0; first < chunksTotal; first += REMOVE_BATCH) {
      const last = Math.min(chunksTotal, first + REMOVE_BATCH)
      const replies = await Promise.all(Array.from({ length: last - first }, (_unused, offset) =>
        this.queue.remove(chunkJobId(sweepId, first + offset, run)).catch(() => 0)))
      removed += replies.reduce<number>((sum, reply) => sum + reply, 0)
    }
    return removed
  }

  /**
   * Removes every job a finished sweep left in the queue (kept for inspection: completed or
   * failed chunks, decisions, its assembly), so a purge leaves nothing of it behind.
   */
  async removeFinished (sweepId: string, plan: readonly Chunk[], lastRun = 0): Promise<void> {
    for (let run = 0; run <= lastRun; run++) await this.#removeRun(sweepId, plan, run)
  }

  async #removeRun (sweepId: string, plan: readonly Chunk[], run: number): Promise<void> {
    const ids = plan.map((chunk) => chunkJobId(sweepId, chunk.index, run))
    // A decision ran at each block end of a point (precision targets); a repeat of an id is harmless.
    const ends = new Map<number, Set<number>>()
    for (const chunk of plan) {
      const set = ends.get(chunk.point) ?? new Set<number>()
      set.add(chunk.firstTrial + chunk.count)
      ends.set(chunk.point, set)
    }
    for (const [point, extents] of ends) for (const extent of extents) ids.push(decideJobId(sweepId, point, extent, run))
    ids.push(assembleJobId(sweepId, run))
    for (let first = 0; first < ids.length; first += REMOVE_BATCH) {
      await Promise.all(ids.slice(first, first + REMOVE_BATCH).map(async (id) => await this.queue.remove(id).catch(() => 0)))
    }
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
