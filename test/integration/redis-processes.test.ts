/**
 * Worker processes that die, stop or are told to stop: each test runs real `node` worker
 * processes against a real Redis and watches them through the lines they print. The test
 * gate in front of every chunk (test/helpers/chunk-gate.ts, inherited by the worker
 * processes) holds a chunk in progress — its job active and locked, its sandbox thread busy —
 * for as long as a test needs, whatever the machine's speed.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { installChunkGate, type ChunkGate } from '../helpers/chunk-gate.js'
import { Queue } from 'bullmq'
import type { SweepQueue } from '../../src/backends/port.js'
import { createRedisQueue } from '../../src/backends/redis/index.js'
import type { SweepRecord } from '../../src/backends/port.js'
import { CHUNK_QUEUE_NAME, chunkJobId, keyLayout } from '../../src/backends/redis/keys.js'
import { normaliseSpec, type NormalisedSpec } from '../../src/spec/index.js'
import { startWorker } from '../../src/backends/redis/worker/worker.js'
import {
  computeInProcess, quietLogger, REDIS_URL, redisAvailable, removePrefix, fullResult, resultBytes, testPrefix, waitForRecord,
  waitForTerminal
} from './helpers.js'
import { spawnWorker, stopWorker, type WorkerLine, type WorkerProcess } from './worker-processes.js'

const available = await redisAvailable()

/** Noisy recall in a model place-cell network at finite temperature: one short chunk per load. */
function noisyRecallSpec (overrides: Record<string, unknown> = {}): NormalisedSpec {
  return normaliseSpec({
    label: 'noisy room recall',
    neurons: 200,
    load: { values: [0.05, 0.1, 0.15] },
    dynamics: { temperature: 0.3, maxSweeps: 60, burnIn: 20 },
    trials: 30,
    seed: 17,
    ...overrides
  })
}

/** Stalled-job recovery in seconds rather than BullMQ's production default of about 30 s. */
const FAST_RECOVERY = { lockDurationMs: 2000, stalledIntervalMs: 1000, progressIntervalMs: 200 }

const isStartOf = (sweepId: string) => (line: WorkerLine): boolean => line.type === 'started' && 'sweepId' in line && line.sweepId === sweepId

describe.runIf(available)('Redis backend: worker processes', () => {
  const logger = quietLogger()
  let prefix: string
  const workers: WorkerProcess[] = []
  const closers: Array<() => Promise<void>> = []

  const openQueue = async (): Promise<SweepQueue> => {
    const queue = await createRedisQueue({ url: REDIS_URL, prefix, logger })
    closers.push(() => queue.close())
    return queue
  }
  const spawn = async (options: Record<string, unknown> = {}): Promise<WorkerProcess> => {
    const worker = spawnWorker({ url: REDIS_URL, prefix, concurrency: 1, ...FAST_RECOVERY, ...options })
    workers.push(worker)
    await worker.waitFor(line => line.type === 'ready')
    return worker
  }
  const jobState = async (jobId: string): Promise<string> => {
    const bull = new Queue(CHUNK_QUEUE_NAME, { connection: { url: REDIS_URL }, prefix: keyLayout(prefix).bullPrefix })
    try {
      return await bull.getJobState(jobId)
    } finally {
      await bull.close()
    }
  }

  let gate: ChunkGate
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

  it('completes a sweep with byte-identical results when one of two worker processes is SIGKILLed mid-chunk', async () => {
    const queue = await openQueue()
    const [victim, survivor] = await Promise.all([spawn(), spawn()])
    const spec = noisyRecallSpec()
    gate.hold()
    const submitted = await queue.submit({ spec, owner: null })
    const seen: Array<SweepRecord['progress']> = []
    const unsubscribe = queue.subscribe(submitted.id, (event) => { seen.push(event.sweep.progress) })
    closers.push(async () => { unsubscribe() })

    // Mid-chunk: each worker holds one chunk of the sweep at the gate.
    const started = await victim.waitFor(isStartOf(submitted.id))
    await gate.untilWaiting(2)
    const killedJob = (started as { jobId: string }).jobId
    victim.child.kill('SIGKILL')
    await victim.exited
    // Killed mid-chunk: the job is still marked active, held by a lock nobody renews.
    expect(await jobState(killedJob)).toBe('active')

    gate.open()
    await survivor.waitFor(line => line.type === 'started' && 'jobId' in line && line.jobId === killedJob)
    const done = await waitForTerminal(queue, submitted.id)

    expect(done.status).toBe('succeeded')
    // No chunk lost, none counted twice.
    expect(done.progress.chunksDone).toBe(done.progress.chunksTotal)
    expect(done.progress.trialsDone).toBe(done.progress.trialsTotal)
    expect(done.progress.pointsDone).toBe(done.progress.pointsTotal)
    expect(resultBytes(await fullResult(queue, submitted.id))).toBe(resultBytes(computeInProcess(spec)))
    // Each chunk ran once: the killed one had not passed the gate, the others were not redone.
    const ran = gate.ranForSeed(spec.seed)
    expect(new Set(ran.labels).size).toBe(ran.chunks)
    expect(ran.chunks).toBe(done.progress.chunksTotal)
    // No counter went down across the crash and the retry.
    for (const counter of ['pointsDone', 'trialsDone', 'chunksDone'] as const) {
      const values = seen.map((progress) => progress[counter])
      expect(values, counter).toEqual([...values].sort((a, b) => a - b))
    }
  })

  it('stops a chunk running in another worker process after a cancel sent to another API instance', async () => {
    const submitter = await openQueue()
    const canceler = await openQueue()
    const worker = await spawn()
    const spec = noisyRecallSpec({ seed: 23 })
    gate.hold()
    const submitted = await submitter.submit({ spec, owner: null })
    expect(submitted.progress.chunksTotal).toBeGreaterThan(1)

    // The running chunk is visible as running from the other API instance.
    const running = await worker.waitFor(isStartOf(submitted.id))
    await gate.untilWaiting()
    const runningJob = (running as { jobId: string }).jobId
    expect((await waitForRecord(canceler, submitted.id, record => record.status === 'running')).progress.chunksDone).toBe(0)

    const seenBySubmitter = waitForRecord(submitter, submitted.id, record => record.status === 'canceled')
    const afterCancel = await canceler.cancel(submitted.id)
    expect(afterCancel?.status).toBe('canceled')
    // The held chunk learns of the stop through the stop channel and the shared stop board, in its own process.
    await worker.waitFor(line => line.type === 'stopped' && 'jobId' in line && line.jobId === runningJob)
    expect((await seenBySubmitter).finishedAt).not.toBeNull()

    // Nothing of the sweep waits or runs any more: waiting chunks were removed (a worker that took
    // one in the instant before the removal finds the sweep canceled and drops it unrun).
    for (let index = 0; index < submitted.progress.chunksTotal; index++) {
      expect(['unknown', 'completed']).toContain(await jobState(chunkJobId(submitted.id, index)))
    }
    const after = await canceler.get(submitted.id)
    expect(after?.progress.chunksDone).toBe(afterCancel?.progress.chunksDone)
    expect(await canceler.stats()).toMatchObject({ canceled: 1, running: 0, chunksWaiting: 0, chunksActive: 0 })
    expect(await canceler.results(submitted.id)).toBeNull()
  })

  it('hands a running chunk back to the queue when its worker gets SIGTERM and the grace period runs out', async () => {
    const queue = await openQueue()
    const leaving = await spawn({ shutdownGraceMs: 100 })
    const spec = noisyRecallSpec({ seed: 29 })
    gate.hold()
    const submitted = await queue.submit({ spec, owner: null })
    const running = await leaving.waitFor(isStartOf(submitted.id))
    await gate.untilWaiting()
    const handedBack = (running as { jobId: string }).jobId

    leaving.child.kill('SIGTERM')
    expect(await leaving.exited).toEqual({ code: 0, signal: null })
    // Back in the queue at once, not after a lock timeout, and not counted as a failed attempt.
    expect(await jobState(handedBack)).toBe('waiting')
    const record = await queue.get(submitted.id)
    expect(record?.status).toBe('running')
    gate.open()

    const successor = await startWorker({ url: REDIS_URL, prefix, logger, concurrency: 1 })
    closers.push(() => successor.close())
    const done = await waitForTerminal(queue, submitted.id)
    expect(done.status).toBe('succeeded')
    expect(done.progress.trialsDone).toBe(done.progress.trialsTotal)
    expect(resultBytes(await fullResult(queue, submitted.id))).toBe(resultBytes(computeInProcess(spec)))
  })

  it('fails the sweep as the system\'s fault when its chunk keeps losing its worker', async () => {
    const queue = await openQueue()
    const spec = noisyRecallSpec({ seed: 31, load: { values: [0.1] } })
    gate.hold()
    const submitted = await queue.submit({ spec, owner: null })
    const jobId = chunkJobId(submitted.id, 0)
    // A chunk whose worker dies gets one more try (maxStalledCount 1); the second loss fails it for good.
    for (let loss = 1; loss <= 2; loss++) {
      const doomed = await spawn()
      await doomed.waitFor(line => line.type === 'started' && 'jobId' in line && line.jobId === jobId)
      doomed.child.kill('SIGKILL')
      await doomed.exited
    }
    // The next worker finds the chunk stalled a second time: BullMQ fails the job in that worker's hands.
    await spawn()
    const done = await waitForTerminal(queue, submitted.id, 45_000)
    expect(done.status).toBe('failed')
    expect(done.error?.kind).toBe('system')
    expect(done.error?.message).toMatch(/stopped answering/)
    // It never passed the gate: no attempt computed anything.
    expect(gate.ranForSeed(spec.seed).chunks).toBe(0)
  })
})
