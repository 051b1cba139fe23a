/**
 * The Redis backend against a real Redis: a sweep's life through the queue port, listing,
 * idempotency and reuse, and API instances that come and go while workers compute.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { Redis } from 'ioredis'
import { ANY_OWNER, IdempotencyConflictError, type SweepQueue, type SweepRecord } from '../../src/backends/port.js'
import { createRedisQueue } from '../../src/backends/redis/index.js'
import { keyLayout } from '../../src/backends/redis/keys.js'
import { RedisSweepStore } from '../../src/backends/redis/store.js'
import { replicateKey, specHash, type NormalisedSpec } from '../../src/spec/index.js'
import { decidePoint, planSweep, pointRecords, runChunk, type StoredChunk, type SweepDraft } from '../../src/sweep/index.js'
import { ChunkQueue } from '../../src/backends/redis/chunk-queue.js'
import { startWorker, type RunningWorker } from '../../src/backends/redis/worker/worker.js'
import {
  computeInProcess, corridorSpec, quietLogger, REDIS_URL, redisAvailable, removePrefix, fullResult, resultBytes, roomCodesSpec,
  testPrefix, waitForRecord, waitForTerminal
} from './helpers.js'

const available = await redisAvailable()

describe.runIf(available)('Redis backend: sweeps through the queue port', () => {
  const logger = quietLogger()
  let prefix: string
  let queue: SweepQueue
  const closers: Array<() => Promise<void>> = []

  const worker = async (concurrency = 2): Promise<RunningWorker> => {
    const started = await startWorker({ url: REDIS_URL, prefix, logger, concurrency })
    closers.push(() => started.close())
    return started
  }

  beforeEach(async () => {
    prefix = testPrefix()
    queue = await createRedisQueue({ url: REDIS_URL, prefix, logger })
    closers.push(() => queue.close())
  })

  afterEach(async () => {
    for (const close of closers.splice(0).reverse()) await close()
    await removePrefix(prefix)
  })

  it('runs a submitted sweep to results bit-identical to an in-process run', async () => {
    const spec = corridorSpec()
    const submitted = await queue.submit({ spec, owner: null })
    expect(submitted).toMatchObject({ status: 'queued', owner: null, label: 'corridor recall', reusedFrom: null, error: null })
    expect(submitted.progress).toMatchObject({ chunksDone: 0, trialsDone: 0, pointsTotal: 6, trialsTotal: 1200 })
    expect(await queue.results(submitted.id)).toBeNull()

    await worker()
    const states: string[] = []
    const unsubscribe = queue.subscribe(submitted.id, (event) => { if (event.type === 'state') states.push(event.sweep.status) })
    const done = await waitForTerminal(queue, submitted.id)
    unsubscribe()

    expect(done.status).toBe('succeeded')
    expect(done.error).toBeNull()
    expect(states.at(-1)).toBe('succeeded')
    // Every chunk counted once: the counters land exactly on the totals.
    expect(done.progress).toEqual({ pointsDone: 6, pointsTotal: 6, trialsDone: 1200, trialsTotal: 1200, chunksDone: done.progress.chunksTotal, chunksTotal: done.progress.chunksTotal })
    expect(Date.parse(done.startedAt ?? '')).toBeGreaterThanOrEqual(Date.parse(done.createdAt))
    expect(Date.parse(done.finishedAt ?? '')).toBeGreaterThanOrEqual(Date.parse(done.startedAt ?? ''))
    const result = await fullResult(queue, submitted.id)
    expect(result.provenance.cpuSeconds).toBeGreaterThan(0)
    expect(resultBytes(result)).toBe(resultBytes(computeInProcess(spec)))

    expect(await queue.stats()).toMatchObject({ queued: 0, running: 0, succeeded: 1, failed: 0, canceled: 0, chunksWaiting: 0 })
    // The assembly job stores the result a moment before BullMQ marks the job itself completed.
    await expect.poll(async () => (await queue.stats()).chunksActive, { timeout: 5000, interval: 20 }).toBe(0)
    expect(await queue.ready()).toEqual({ ok: true })
  })

  it('keeps the sweep going when the API instance that submitted it is closed and another one opens', async () => {
    const spec = corridorSpec({ seed: 11 })
    const submitted = await queue.submit({ spec, owner: 'lab-a' })
    await worker()
    await waitForRecord(queue, submitted.id, record => record.progress.chunksDone >= 1)
    await queue.close()

    const second = await createRedisQueue({ url: REDIS_URL, prefix, logger })
    closers.push(() => second.close())
    const done = await waitForTerminal(second, submitted.id)
    expect(done.status).toBe('succeeded')
    expect(done.progress.chunksDone).toBe(done.progress.chunksTotal)
    expect(resultBytes(await fullResult(second, submitted.id))).toBe(resultBytes(computeInProcess(spec)))
  })

  it('lists sweeps newest first with an opaque cursor, filtered by owner and status', async () => {
    const created: SweepRecord[] = []
    for (let seed = 1; seed <= 5; seed++) {
      created.push(await queue.submit({ spec: roomCodesSpec({ seed }), owner: seed % 2 === 0 ? 'lab-b' : 'lab-a' }))
    }
    await queue.cancel(created[0]!.id)

    const firstPage = await queue.list({ owner: ANY_OWNER, limit: 2 })
    expect(firstPage.items.map(item => item.id)).toEqual([created[4]!.id, created[3]!.id])
    expect(firstPage.nextCursor).toEqual(expect.any(String))
    const secondPage = await queue.list({ owner: ANY_OWNER, limit: 2, cursor: firstPage.nextCursor! })
    expect(secondPage.items.map(item => item.id)).toEqual([created[2]!.id, created[1]!.id])
    const lastPage = await queue.list({ owner: ANY_OWNER, limit: 2, cursor: secondPage.nextCursor! })
    expect(lastPage.items.map(item => item.id)).toEqual([created[0]!.id])
    expect(lastPage.nextCursor).toBeNull()

    const labA = await queue.list({ owner: 'lab-a', limit: 10 })
    expect(labA.items.map(item => item.id)).toEqual([created[4]!.id, created[2]!.id, created[0]!.id])
    const queuedOfA = await queue.list({ owner: 'lab-a', status: 'queued', limit: 10 })
    expect(queuedOfA.items.map(item => item.id)).toEqual([created[4]!.id, created[2]!.id])
    // null is the owner of sweeps submitted without tokens: none here.
    expect((await queue.list({ owner: null, limit: 10 })).items).toEqual([])
    const canceled = await queue.list({ owner: ANY_OWNER, status: 'canceled', limit: 10 })
    expect(canceled.items.map(item => item.id)).toEqual([created[0]!.id])

    await expect(queue.list({ owner: ANY_OWNER, limit: 2, cursor: 'not-a-cursor' })).rejects.toMatchObject({ name: 'InvalidCursorError' })
  })

  it('drops index entries of sweeps whose retention expired', async () => {
    const kept = await queue.submit({ spec: roomCodesSpec({ seed: 1 }), owner: null })
    const expired = await queue.submit({ spec: roomCodesSpec({ seed: 2 }), owner: null })
    const redis = new Redis(REDIS_URL)
    try {
      await redis.del(keyLayout(prefix).sweep(expired.id).record)
      const page = await queue.list({ owner: ANY_OWNER, limit: 10 })
      expect(page.items.map(item => item.id)).toEqual([kept.id])
      expect(await redis.zcard(keyLayout(prefix).index)).toBe(1)
    } finally {
      redis.disconnect()
    }
    expect(await queue.get(expired.id)).toBeNull()
    expect(await queue.get('../../etc')).toBeNull()
  })

  it('answers a repeated Idempotency-Key with the same sweep and refuses it for another spec', async () => {
    const spec = roomCodesSpec({ seed: 21 })
    const first = await queue.submit({ spec, owner: 'lab-a', idempotencyKey: 'batch-7' })
    const again = await queue.submit({ spec: JSON.parse(JSON.stringify(spec)), owner: 'lab-a', idempotencyKey: 'batch-7' })
    expect(again.id).toBe(first.id)
    await expect(queue.submit({ spec: roomCodesSpec({ seed: 22 }), owner: 'lab-a', idempotencyKey: 'batch-7' }))
      .rejects.toBeInstanceOf(IdempotencyConflictError)
    // Keys belong to their owner: another lab's identical key starts its own sweep.
    const otherOwner = await queue.submit({ spec, owner: 'lab-b', idempotencyKey: 'batch-7' })
    expect(otherOwner.id).not.toBe(first.id)

    const listed = await queue.list({ owner: ANY_OWNER, limit: 10 })
    expect(listed.items).toHaveLength(2)
    // The repeat enqueued nothing new: one job per chunk of each sweep.
    expect((await queue.stats()).chunksWaiting).toBe(2 * first.progress.chunksTotal)
  })

  it('finishes a sweep whose API instance died between storing it and enqueueing its chunks', async () => {
    // What the dying instance left behind: the record and its index entries, but no jobs.
    const redis = new Redis(REDIS_URL)
    const store = new RedisSweepStore(redis, keyLayout(prefix), 3600)
    const storeOnly = async (spec: NormalisedSpec, createdMs: number, idempotencyKey?: string): Promise<string> => {
      const sweep: SweepDraft = {
        id: crypto.randomUUID(),
        owner: null,
        label: spec.label,
        specHash: specHash(spec),
        spec,
        createdMs,
        plan: planSweep(spec),
        replicateKey: replicateKey(spec),
        reuseKeys: []
      }
      await store.create(sweep, idempotencyKey === undefined ? {} : { idempotency: { key: idempotencyKey, ttlSeconds: 60 } })
      return sweep.id
    }
    try {
      // Long forgotten: any worker enqueues it when it starts (and every 30 s after).
      const forgotten = await storeOnly(roomCodesSpec({ seed: 41 }), Date.now() - 60_000)
      // Just interrupted: the client's retry with the same Idempotency-Key completes the submission.
      const retriedSpec = roomCodesSpec({ seed: 42 })
      const retried = await storeOnly(retriedSpec, Date.now(), 'upload-3')
      expect((await queue.stats()).chunksWaiting).toBe(0)
      expect((await queue.submit({ spec: retriedSpec, owner: null, idempotencyKey: 'upload-3' })).id).toBe(retried)

      await worker()
      expect((await waitForTerminal(queue, forgotten)).status).toBe('succeeded')
      expect((await waitForTerminal(queue, retried)).status).toBe('succeeded')
      expect(resultBytes(await fullResult(queue, retried))).toBe(resultBytes(computeInProcess(retriedSpec)))
    } finally {
      redis.disconnect()
    }
  })

  it('finishes a precision sweep whose worker died after applying a decision and before queueing its block', async () => {
    const redis = new Redis(REDIS_URL)
    const store = new RedisSweepStore(redis, keyLayout(prefix), 3600)
    const chunkQueue = new ChunkQueue(redis, keyLayout(prefix))
    try {
      // Room codes to a target no point meets before the ceiling: three blocks each.
      const spec = roomCodesSpec({ seed: 44, trials: 60, precision: { measure: 'success', halfWidth: 0.001, block: 20 } })
      const { id } = await queue.submit({ spec, owner: null, reusePoints: false })
      // What the dying worker left: the first blocks stored, each point's decision applied to the
      // stored plan, its block's jobs never added; BullMQ then runs the stalled decision again.
      const plan = (await store.plan(id))!
      const stored: StoredChunk[] = []
      for (const chunk of plan.chunks) {
        const outcome = runChunk(spec, chunk, { shouldStop: () => false })
        if (outcome.kind !== 'done') throw new Error(`chunk ${chunk.index}: ${outcome.kind}`)
        await store.recordChunk(id, chunk, outcome.body, 1, Date.now())
        stored.push({ index: chunk.index, body: outcome.body })
      }
      for (const point of [0, 1, 2]) {
        const planned = plan.chunks.filter((chunk) => chunk.point === point)
        const decision = decidePoint(spec, point, pointRecords(spec, planned, stored, point))
        expect(decision.kind).toBe('extend')
        if (decision.kind !== 'extend') continue
        expect(await store.extendPoint(id, point, decision.fromTrial, decision.pieces)).not.toBeNull()
        await chunkQueue.enqueueDecision(id, specHash(spec), point, decision.fromTrial, plan.chunks.length)
      }

      await worker()
      const done = await waitForTerminal(queue, id)
      expect(done.status).toBe('succeeded')
      expect(done.progress.trialsTotal).toBe(3 * 60)
      // The same rows as a sweep no worker died in.
      const reference = await queue.submit({ spec, owner: null, reusePoints: false })
      expect((await waitForTerminal(queue, reference.id)).status).toBe('succeeded')
      expect(resultBytes(await fullResult(queue, id))).toBe(resultBytes(await fullResult(queue, reference.id)))
    } finally {
      await chunkQueue.queue.close()
      redis.disconnect()
    }
  })

  it('reuses the finished results of an identical spec of the same owner when asked', async () => {
    const spec = roomCodesSpec({ seed: 31 })
    const original = await queue.submit({ spec, owner: 'lab-a' })
    await worker()
    await waitForTerminal(queue, original.id)

    const reused = await queue.submit({ spec, owner: 'lab-a', reuse: true })
    expect(reused).toMatchObject({ status: 'succeeded', reusedFrom: original.id })
    expect(reused.progress.trialsDone).toBe(reused.progress.trialsTotal)
    expect(resultBytes(await fullResult(queue, reused.id))).toBe(resultBytes(await fullResult(queue, original.id)))

    // Not asked to reuse, or another lab's results: a fresh run (the idle worker may start it at once).
    const fresh = await queue.submit({ spec, owner: 'lab-a' })
    expect(fresh.reusedFrom).toBeNull()
    expect(['queued', 'running']).toContain(fresh.status)
    const otherLab = await queue.submit({ spec, owner: 'lab-b', reuse: true })
    expect(otherLab.reusedFrom).toBeNull()
    expect(['queued', 'running']).toContain(otherLab.status)
  })
})
