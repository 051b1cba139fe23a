/**
 * Workers inside batch allocations and containers: real `node` worker processes against a
 * real Redis, held mid-sweep at the test chunk gate (test/helpers/chunk-gate.ts). A worker
 * at its run-time limit, one whose next chunk cannot end in time, and one drained by SIGTERM
 * all exit 0 and lose nothing: their chunks return to the queue without spending an attempt,
 * and another worker finishes the sweep with the bytes of a one-process run.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { Queue } from 'bullmq'
import type { SweepQueue } from '../../src/backends/port.js'
import { createRedisQueue } from '../../src/backends/redis/index.js'
import { CHUNK_QUEUE_NAME, keyLayout } from '../../src/backends/redis/keys.js'
import { normaliseSpec, type NormalisedSpec } from '../../src/spec/index.js'
import { chunkCpuSeconds, planSweep } from '../../src/sweep/index.js'
import { installChunkGate, type ChunkGate } from '../helpers/chunk-gate.js'
import { computeInProcess, fullResult, quietLogger, REDIS_URL, redisAvailable, removePrefix, resultBytes, testPrefix, waitForTerminal } from './helpers.js'
import { spawnWorker, stopWorker, type WorkerLine, type WorkerProcess } from './worker-processes.js'

const available = await redisAvailable()

/** Recall of room codes in a model place-cell network at finite temperature: three short chunks. */
function roomRecallSpec (seed: number): NormalisedSpec {
  return normaliseSpec({
    label: 'room recall in a batch allocation',
    neurons: 200,
    load: { values: [0.05, 0.1, 0.15] },
    dynamics: { temperature: 0.3, maxSweeps: 60, burnIn: 20 },
    trials: 30,
    seed
  })
}

const lineOf = (type: WorkerLine['type'], sweepId: string) => (line: WorkerLine): boolean => line.type === type && 'sweepId' in line && line.sweepId === sweepId

describe.runIf(available)('Redis workers in batch allocations', () => {
  const logger = quietLogger()
  let prefix: string
  let gate: ChunkGate
  const workers: WorkerProcess[] = []
  const closers: Array<() => Promise<void>> = []

  const openQueue = async (): Promise<SweepQueue> => {
    const queue = await createRedisQueue({ url: REDIS_URL, prefix, logger })
    closers.push(() => queue.close())
    return queue
  }
  const spawn = async (options: Record<string, unknown>): Promise<{ worker: WorkerProcess, healthPort: number | null }> => {
    const worker = spawnWorker({ url: REDIS_URL, prefix, concurrency: 1, progressIntervalMs: 200, ...options })
    workers.push(worker)
    const ready = await worker.waitFor(line => line.type === 'ready')
    return { worker, healthPort: 'healthPort' in ready ? ready.healthPort : null }
  }
  const job = async (jobId: string): Promise<{ state: string, attemptsMade: number }> => {
    const bull = new Queue(CHUNK_QUEUE_NAME, { connection: { url: REDIS_URL }, prefix: keyLayout(prefix).bullPrefix })
    try {
      const found = await bull.getJob(jobId)
      return { state: await bull.getJobState(jobId), attemptsMade: found?.attemptsMade ?? -1 }
    } finally {
      await bull.close()
    }
  }
  const probe = async (port: number | null, path: string): Promise<{ status: number, body: { status: string, reason?: string } }> => {
    const response = await fetch(`http://127.0.0.1:${port}${path}`)
    return { status: response.status, body: await response.json() as { status: string, reason?: string } }
  }

  beforeEach(() => {
    prefix = testPrefix()
    gate = installChunkGate()
  })

  afterEach(async () => {
    gate.remove()
    await Promise.all(workers.splice(0).map(worker => stopWorker(worker)))
    for (const close of closers.splice(0).reverse()) await close()
    await removePrefix(prefix)
  })

  it('a worker at its run-time limit mid-sweep hands its running chunk back and exits 0; another finishes with the same bytes', async () => {
    const queue = await openQueue()
    const spec = roomRecallSpec(41)
    gate.hold()
    const submitted = await queue.submit({ spec, owner: null })
    expect(submitted.progress.chunksTotal).toBe(3)
    // A short limit: the worker stops when it comes, whatever it is doing (its chunk waits at the gate).
    const { worker: limited, healthPort } = await spawn({ maxRuntimeMs: 6000, drainReserveMs: 1000, healthPort: 0, healthHost: '127.0.0.1' })

    // Mid-sweep: one chunk let through to be stored, the next held at the gate when the limit comes.
    await limited.waitFor(lineOf('started', submitted.id))
    expect(await probe(healthPort, '/readyz')).toEqual({ status: 200, body: { status: 'ready', reason: 'taking chunks' } })
    expect((await probe(healthPort, '/livez')).status).toBe(200)
    gate.release(1)

    expect(await limited.exited).toEqual({ code: 0, signal: null })
    // Every chunk it took was stored or handed back (on a machine so slow that the limit came
    // before its first chunk passed the gate, that one was handed back too).
    const took = limited.lines.filter(lineOf('started', submitted.id)).map(line => (line as { jobId: string }).jobId)
    const stored = limited.lines.filter(lineOf('stored', submitted.id)).map(line => (line as { jobId: string }).jobId)
    const handedBack = limited.lines.filter(lineOf('handed-back', submitted.id)).map(line => (line as { jobId: string }).jobId)
    expect(handedBack).toHaveLength(1)
    expect([...stored, ...handedBack].sort()).toEqual([...took].sort())
    // Back in the queue at once, no attempt spent on it.
    expect(await job(handedBack[0]!)).toEqual({ state: 'waiting', attemptsMade: 0 })
    expect((await queue.get(submitted.id))?.progress.chunksDone).toBe(stored.length)

    gate.open()
    const { worker: successor } = await spawn({ exitWhenIdleMs: 300 })
    const done = await waitForTerminal(queue, submitted.id)
    expect(done.status).toBe('succeeded')
    expect(done.progress.trialsDone).toBe(done.progress.trialsTotal)
    expect(resultBytes(await fullResult(queue, submitted.id))).toBe(resultBytes(computeInProcess(spec)))
    // Nothing lost, nothing run twice: the handed-back chunk had not passed the gate on the first worker.
    const ran = gate.ranForSeed(spec.seed)
    expect(ran.chunks).toBe(3)
    expect(new Set(ran.labels).size).toBe(3)
    // With nothing left to run, the successor leaves on its own.
    expect(await successor.exited).toEqual({ code: 0, signal: null })
  })

  it('hands back unrun a chunk whose estimate does not fit in the time left, and exits 0 without waiting for its limit', async () => {
    const queue = await openQueue()
    // The canonical stream is one chunk: the whole sweep, estimated at over a minute of CPU.
    const spec = normaliseSpec({ label: 'one long stream of room codes', neurons: 4000, load: { values: [0.1, 0.12] }, trials: 2000, seed: 43, streams: 'canonical' })
    const [only] = planSweep(spec).chunks
    expect(chunkCpuSeconds(spec, only!)).toBeGreaterThan(60)
    gate.hold()
    const { worker } = await spawn({ maxRuntimeMs: 30 * 60_000, drainReserveMs: 29 * 60_000 })
    const submitted = await queue.submit({ spec, owner: null })

    const started = await worker.waitFor(lineOf('started', submitted.id))
    expect(await worker.exited).toEqual({ code: 0, signal: null })
    const jobId = (started as { jobId: string }).jobId
    expect(worker.lines.some(line => line.type === 'handed-back' && 'jobId' in line && line.jobId === jobId)).toBe(true)
    expect(await job(jobId)).toEqual({ state: 'waiting', attemptsMade: 0 })
    // Never started: it did not reach the gate.
    expect(gate.ranForSeed(spec.seed).chunks).toBe(0)
    expect(gate.waiting()).toBe(0)
    expect((await queue.cancel(submitted.id))?.status).toBe('canceled')
  })

  it('on SIGTERM a worker reports not ready, lets its running chunk finish within the grace period, and exits 0', async () => {
    const queue = await openQueue()
    const spec = roomRecallSpec(47)
    gate.hold()
    const { worker, healthPort } = await spawn({ shutdownGraceMs: 120_000, healthPort: 0, healthHost: '127.0.0.1' })
    const submitted = await queue.submit({ spec, owner: null })
    const started = await worker.waitFor(lineOf('started', submitted.id))
    await gate.untilWaiting()

    worker.child.kill('SIGTERM')
    for (let answer = await probe(healthPort, '/readyz'); answer.status === 200; answer = await probe(healthPort, '/readyz')) {
      await new Promise(resolve => setTimeout(resolve, 20))
    }
    expect(await probe(healthPort, '/readyz')).toEqual({ status: 503, body: { status: 'not ready', reason: 'draining' } })
    gate.release(1)
    expect(await worker.exited).toEqual({ code: 0, signal: null })
    expect(worker.lines.filter(line => line.type === 'stored')).toEqual([expect.objectContaining({ jobId: (started as { jobId: string }).jobId })])
    // It took no second chunk after the signal.
    expect(worker.lines.filter(line => line.type === 'started')).toHaveLength(1)
    expect((await queue.get(submitted.id))?.progress.chunksDone).toBe(1)
    expect((await queue.cancel(submitted.id))?.status).toBe('canceled')
  })
})
