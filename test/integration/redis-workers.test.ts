/**
 * Workers of the Redis backend: the result does not depend on how many workers computed
 * it, and a failing chunk fails its sweep with the right kind (the user's spec, or the
 * system), retrying only what a retry could fix.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { setTimeout } from 'node:timers/promises'
import { randomUUID } from 'node:crypto'
import { Queue, UnrecoverableError, Worker, type Job } from 'bullmq'
import { Redis } from 'ioredis'
import type { SweepQueue } from '../../src/backends/port.js'
import { createRedisQueue } from '../../src/backends/redis/index.js'
import { CHUNK_QUEUE_NAME, chunkJobId, keyLayout } from '../../src/backends/redis/keys.js'
import { startWorker, type WorkerProcessOptions } from '../../src/backends/redis/worker/worker.js'
import { normaliseSpec } from '../../src/spec/index.js'
import { dispatchOrder, planSweep } from '../../src/sweep/index.js'
import { installChunkGate } from '../helpers/chunk-gate.js'
import {
  computeInProcess, corridorSpec, quietLogger, REDIS_URL, redisAvailable, removePrefix, fullResult, resultBytes, roomCodesSpec,
  testPrefix, waitForTerminal
} from './helpers.js'

const available = await redisAvailable()
/** Quick retries: the backoff policy is BullMQ's; what matters here is that it is applied. */
const FAST_RETRY = { attempts: 3, backoffMs: 50 }

describe.runIf(available)('Redis backend: workers', () => {
  const logger = quietLogger()
  let prefix: string
  const closers: Array<() => Promise<void>> = []

  const openQueue = async (): Promise<SweepQueue> => {
    const queue = await createRedisQueue({ url: REDIS_URL, prefix, logger, retry: FAST_RETRY })
    closers.push(() => queue.close())
    return queue
  }
  const startWorkers = async (count: number, options: Partial<WorkerProcessOptions> = {}): Promise<void> => {
    for (let n = 0; n < count; n++) {
      const worker = await startWorker({ url: REDIS_URL, prefix, logger, concurrency: 1, retry: FAST_RETRY, ...options })
      closers.push(() => worker.close())
    }
  }
  /**
   * The chunk's BullMQ job once it has failed for good (the sweep is marked failed a moment
   * before). Polled rather than awaited through QueueEvents: a listener that is ready has not
   * necessarily started reading the event stream, and a failure landing in that gap is never
   * heard of (the wait then hangs).
   */
  const failedChunkJob = async (sweepId: string, index: number, timeoutMs = 20_000): Promise<Job> => {
    const bull = new Queue(CHUNK_QUEUE_NAME, { connection: { url: REDIS_URL }, prefix: keyLayout(prefix).bullPrefix })
    try {
      const deadline = Date.now() + timeoutMs
      for (;;) {
        const state = await bull.getJobState(chunkJobId(sweepId, index))
        if (state === 'unknown') throw new Error(`no job for chunk ${index}`)
        // Read after its state: a job read before its failure would show the attempts made until then.
        if (state === 'failed') return (await bull.getJob(chunkJobId(sweepId, index)))!
        if (state === 'completed') throw new Error(`chunk ${index} completed; a failure was expected`)
        if (Date.now() > deadline) throw new Error(`chunk ${index}'s job still ${state} after ${timeoutMs} ms`)
        await setTimeout(25)
      }
    } finally {
      await bull.close()
    }
  }

  /**
   * What a worker that died half-way through a failure leaves behind: the sweep's first chunk
   * (the costliest, taken first) failed for good in BullMQ, the sweep itself not failed.
   */
  const failFirstChunkAndDie = async (sweepId: string, index: number): Promise<void> => {
    const manual = new Worker(CHUNK_QUEUE_NAME, null, { connection: { url: REDIS_URL }, prefix: keyLayout(prefix).bullPrefix })
    try {
      const token = randomUUID()
      const job = await manual.getNextJob(token)
      if (job?.id !== chunkJobId(sweepId, index)) throw new Error(`took job ${job?.id ?? 'none'}, not chunk ${index}`)
      await job.moveToFailed(new UnrecoverableError('the worker died here'), token)
    } finally {
      await manual.close()
    }
  }

  beforeEach(() => { prefix = testPrefix() })

  afterEach(async () => {
    for (const close of closers.splice(0).reverse()) await close()
    await removePrefix(prefix)
  })

  it('gives byte-identical results with one worker and with two', async () => {
    const spec = corridorSpec({ seed: 5 })
    const queue = await openQueue()

    await startWorkers(1)
    const single = await queue.submit({ spec, owner: null })
    expect((await waitForTerminal(queue, single.id)).status).toBe('succeeded')

    await startWorkers(1)
    const pair = await queue.submit({ spec, owner: null })
    expect((await waitForTerminal(queue, pair.id)).status).toBe('succeeded')

    const one = resultBytes(await fullResult(queue, single.id))
    expect(resultBytes(await fullResult(queue, pair.id))).toBe(one)
    expect(one).toBe(resultBytes(computeInProcess(spec)))
  })

  it('fails a sweep whose spec the engine refuses as a user error, without retrying', async () => {
    const queue = await openQueue()
    // Passes the schema-free queue port but not the engine: an overlap threshold outside [−1, 1].
    const spec = { ...roomCodesSpec({ seed: 3 }), successThreshold: 5 }
    const submitted = await queue.submit({ spec, owner: null })
    await startWorkers(1)
    // Inside the test's own time limit, so that a timeout reports what the wait saw.
    const done = await waitForTerminal(queue, submitted.id, 45_000)
    expect(done.status).toBe('failed')
    expect(done.error?.kind).toBe('user')
    expect(done.error?.message).toMatch(/successThreshold/)
    // The first chunk a worker takes is the costliest (dispatchOrder); it is the one that failed.
    const job = await failedChunkJob(submitted.id, dispatchOrder(spec, planSweep(spec).chunks)[0]!)
    expect(job.attemptsMade).toBe(1)
    // The sweep's other chunks never ran: they were removed or skipped once it failed.
    expect(done.progress.chunksDone).toBe(0)
    expect(await queue.stats()).toMatchObject({ failed: 1, running: 0, queued: 0 })
  })

  it('retries a system failure with backoff, then fails the sweep as the system\'s fault', async () => {
    const queue = await openQueue()
    const spec = normaliseSpec({ label: 'single room', neurons: 60, patterns: 3, trials: 4, seed: 1 })
    const submitted = await queue.submit({ spec, owner: null })
    // Storage corruption: the stored spec no longer matches the hash the sweep was submitted with.
    const redis = new Redis(REDIS_URL)
    try {
      await redis.hset(keyLayout(prefix).sweep(submitted.id).record, 'spec', JSON.stringify({ ...spec, seed: 2 }))
    } finally {
      redis.disconnect()
    }
    await startWorkers(1)
    // Inside the test's own time limit, so that a timeout reports what the wait saw.
    const done = await waitForTerminal(queue, submitted.id, 45_000)
    expect(done.status).toBe('failed')
    expect(done.error?.kind).toBe('system')
    expect(done.error?.message).toMatch(/failed 3 times/)
    const job = await failedChunkJob(submitted.id, 0)
    expect(job.attemptsMade).toBe(3)
  })

  it('runs more than ten compute threads in one worker without a listener-leak warning', async () => {
    // BullMQ pipes every sandbox thread's output into this process's: twelve threads, twelve pipes.
    const threads = 12
    const warnings: string[] = []
    const onWarning = (warning: Error): void => { warnings.push(`${warning.name}: ${warning.message}`) }
    process.on('warning', onWarning)
    const gate = installChunkGate()
    try {
      const queue = await openQueue()
      const spec = roomCodesSpec({ seed: 5, load: { from: 0.01, to: 0.12, step: 0.01 } })
      expect(planSweep(spec).chunks.length).toBeGreaterThanOrEqual(threads)
      gate.hold()
      const submitted = await queue.submit({ spec, owner: null })
      await startWorkers(1, { concurrency: threads })
      // Every thread holds a chunk at the gate: all twelve sandboxes are alive at once.
      await gate.untilWaiting(threads)
      gate.open()
      expect((await waitForTerminal(queue, submitted.id, 45_000)).status).toBe('succeeded')
      await new Promise((resolve) => setImmediate(resolve))
      expect(warnings).toEqual([])
    } finally {
      process.off('warning', onWarning)
      gate.remove()
    }
  })

  it('fails a sweep whose worker died between its chunk\'s final failure and failing the sweep', async () => {
    const queue = await openQueue()
    const spec = roomCodesSpec({ seed: 11 })
    const submitted = await queue.submit({ spec, owner: null })
    await failFirstChunkAndDie(submitted.id, dispatchOrder(spec, planSweep(spec).chunks)[0]!)
    expect((await queue.get(submitted.id))?.status).toBe('queued')

    // Any live worker repairs it: here the one that starts next, at once.
    await startWorkers(1)
    const done = await waitForTerminal(queue, submitted.id, 45_000)
    expect(done.status).toBe('failed')
    expect(done.error?.kind).toBe('system')
    expect(done.error?.message).toMatch(/stopped answering/)
  })

  it('lets a resumed sweep run on: a chunk that failed for good in an earlier run does not fail it again', async () => {
    const queue = await openQueue()
    const spec = normaliseSpec({ label: 'single room', neurons: 60, patterns: 3, trials: 4, seed: 4 })
    const submitted = await queue.submit({ spec, owner: null })
    const record = keyLayout(prefix).sweep(submitted.id).record
    const redis = new Redis(REDIS_URL)
    closers.push(async () => { redis.disconnect() })
    // Storage corruption fails the chunk's last attempt, and the sweep, as the system's fault.
    await redis.hset(record, 'spec', JSON.stringify({ ...spec, seed: 5 }))
    const first = await startWorker({ url: REDIS_URL, prefix, logger, concurrency: 1, retry: FAST_RETRY })
    expect((await waitForTerminal(queue, submitted.id, 45_000)).status).toBe('failed')
    await first.close()

    // Repaired, the sweep is resumed; the failed job of its first run is still among the recent failures.
    await redis.hset(record, 'spec', JSON.stringify(spec))
    expect((await queue.resume(submitted.id))?.status).toBe('queued')
    // A worker's repair runs before it takes work.
    await startWorkers(1)
    const done = await waitForTerminal(queue, submitted.id, 45_000)
    expect(done.status).toBe('succeeded')
    expect(resultBytes(await fullResult(queue, submitted.id))).toBe(resultBytes(computeInProcess(spec)))
  })
})
