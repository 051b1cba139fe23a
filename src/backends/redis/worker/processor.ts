/**
 * The sandboxed processor: BullMQ runs this module (through sandbox.ts) in a worker thread of
 * the worker process, so a CPU-bound chunk never blocks the process's lock renewals. It
 * handles two jobs: `chunk` (run a chunk's trials and store its result) and `assemble` (turn
 * a finished sweep's chunk results into the sweep result).
 *
 * Exactly-once in effect: a chunk's result is stored under its index (a retry overwrites
 * it with the same bytes and counts nothing), the chunk that completes the count enqueues
 * the assembly under a fixed job id, and the result is stored by a script that only moves
 * a running sweep to succeeded. Every step can be repeated after a crash.
 */
import { workerData } from 'node:worker_threads'
import { UnrecoverableError, WaitingError, type SandboxedJob } from 'bullmq'
import type { Redis } from 'ioredis'
import { specHash, type NormalisedSpec } from '../../../spec/index.js'
import {
  applyBlock, assembleResult, assembleStored, chunkCpuSeconds, classifyChunkError, decidePoint, decodeChunkValue, encodeValue, isTerminal, makeProvenance, pointRecords, runChunk, systemCauseOf,
  systemFailure, trialsEnd, userFailure, type ChunkResult, type ChunkRunOutcome
} from '../../../sweep/index.js'
import type { SweepResult } from '../../../results/index.js'
import { ChunkQueue, SWEEP_GONE, type AssembleJobData, type ChunkJobData, type ChunkRetryPolicy, type DecideJobData, type SweepJobData } from '../chunk-queue.js'
import { openConnection } from '../connections.js'
import { enqueueRemaining } from '../dispatch.js'
import { publishSweepEvent } from '../events.js'
import { keyLayout, type KeyLayout } from '../keys.js'
import { RedisSweepStore } from '../store.js'
import { failSweep } from './failures.js'
import type { HandBackNotice } from './progress-relay.js'
import { StopBoardReader } from './stop-board.js'
import { TimeBudgetReader } from './time-budget.js'
import { runtimeFacts } from '../../../runtime/facts.js'
import { explicitCollector } from '../../../runtime/reclaim.js'

/** What the worker process hands every sandbox thread (BullMQ's `workerThreadsOptions.workerData`). */
export interface SandboxSettings {
  url: string
  prefix: string
  retentionSeconds: number
  retry: ChunkRetryPolicy
  progressIntervalMs: number
  /** Shared with the worker process: see stop-board.ts. */
  stopBoard: SharedArrayBuffer
  /** Shared with the worker process: see time-budget.ts. */
  timeBudget: SharedArrayBuffer
  /** Name of the worker process, for connection names. */
  workerName: string
}

export type ProcessorOutcome =
  | { outcome: 'decided', point: number, close: boolean }
  | { outcome: 'stored', chunk: number, trials: number, computeMs: number, completedSweep: boolean }
  | { outcome: 'assembled', changed: boolean }
  | { outcome: 'skipped', reason: string }
  | { outcome: 'stopped', chunk: number }

interface SandboxContext {
  redis: Redis
  keys: KeyLayout
  store: RedisSweepStore
  chunks: ChunkQueue
  board: StopBoardReader
  budget: TimeBudgetReader
  settings: SandboxSettings
}

let contextPromise: Promise<SandboxContext> | null = null

function sandboxContext (): Promise<SandboxContext> {
  contextPromise ??= (async () => {
    const settings = workerData as SandboxSettings
    // Waits out a Redis restart instead of failing the chunk it is storing.
    const redis = await openConnection(settings.url, 'worker', `${settings.workerName}:sandbox`)
    const keys = keyLayout(settings.prefix)
    return {
      redis,
      keys,
      store: new RedisSweepStore(redis, keys, settings.retentionSeconds),
      chunks: new ChunkQueue(redis, keys, settings.retry),
      board: new StopBoardReader(settings.stopBoard),
      budget: new TimeBudgetReader(settings.timeBudget),
      settings
    }
  })()
  contextPromise.catch(() => { contextPromise = null })
  return contextPromise
}

/** The last spec parsed in this thread: consecutive chunks usually belong to one sweep. */
let cachedSpec: { sweepId: string, hash: string, spec: NormalisedSpec } | null = null

/** Parses the stored spec and proves it is the one the job was created for. */
function loadSpec (sweepId: string, jobSpecHash: string, storedHash: string, specJson: string): NormalisedSpec {
  if (cachedSpec !== null && cachedSpec.sweepId === sweepId && cachedSpec.hash === storedHash && storedHash === jobSpecHash) return cachedSpec.spec
  const spec = JSON.parse(specJson) as NormalisedSpec
  const actual = specHash(spec)
  if (actual !== jobSpecHash || storedHash !== jobSpecHash) {
    throw new Error(`the stored spec of sweep ${sweepId} does not match the spec it was submitted with (hash ${actual}, expected ${jobSpecHash})`)
  }
  cachedSpec = { sweepId, hash: storedHash, spec }
  return spec
}

export default async function processSweepJob (job: SandboxedJob<SweepJobData>, token?: string, signal?: AbortSignal): Promise<ProcessorOutcome> {
  const context = await sandboxContext()
  if (job.name === 'assemble') return await assemble(context, job as SandboxedJob<AssembleJobData>)
  if (job.name === 'decide') return await decide(context, job as SandboxedJob<DecideJobData>)
  return await runChunkJob(context, job as SandboxedJob<ChunkJobData>, token, signal)
}

/**
 * Precision targets: reads an open point's stored chunks and closes it or gives it another
 * block. Safe to repeat: the store appends only at the extent decided on, and closes once.
 */
async function decide (context: SandboxContext, job: SandboxedJob<DecideJobData>): Promise<ProcessorOutcome> {
  const { store, chunks } = context
  const { sweepId, point, extent } = job.data
  const view = await store.workView(sweepId)
  if (view === null) return { outcome: 'skipped', reason: SWEEP_GONE }
  if (isTerminal(view.status)) return { outcome: 'skipped', reason: `sweep is ${view.status}` }
  const spec = loadSpec(sweepId, job.data.specHash, view.specHash, view.specJson)
  const plan = await store.plan(sweepId)
  if (plan === null) throw new Error(`sweep ${sweepId} has no stored plan`)
  const planned = plan.chunks.filter((chunk) => chunk.point === point)
  if (trialsEnd(planned) !== extent) {
    // A repeat of a decision applied before: the worker that applied it may have died before
    // queueing its block, which nothing else would queue. Queue whatever the sweep still lacks
    // (job ids are deterministic: work already queued is not added twice).
    await enqueueRemaining(store, chunks, sweepId, job.data.specHash, spec)
    return { outcome: 'skipped', reason: 'the point was decided on already' }
  }
  const stored = await store.chunksOf(sweepId, planned.map((chunk) => chunk.index))
  const decision = decidePoint(spec, point, pointRecords(spec, planned, stored, point))
  if (decision.kind === 'close') {
    const closed = await store.closePoint(sweepId, point)
    if (closed.complete) await chunks.enqueueAssembly(sweepId, job.data.specHash, plan.chunks.length, job.data.run)
  } else {
    // The block's trials that earlier sweeps hold are taken (stored already), the rest computed.
    const block = await applyBlock(store, sweepId, spec, point, decision, Date.now())
    if (block.appended !== null) {
      const chunksTotal = plan.chunks.length + block.appended.length
      if (block.toCompute.length > 0) await chunks.enqueueChunks(sweepId, job.data.specHash, spec, block.toCompute, chunksTotal, job.data.run)
      // The whole block was taken: nothing will run to ask for the next decision, so ask now.
      if (block.pointDue) await chunks.enqueueDecision(sweepId, job.data.specHash, point, trialsEnd(block.appended), chunksTotal, job.data.run)
    }
  }
  await publishSweepEvent(context.redis, context.keys, sweepId, 'progress')
  return { outcome: 'decided', point, close: decision.kind === 'close' }
}

async function runChunkJob (context: SandboxContext, job: SandboxedJob<ChunkJobData>, token: string | undefined, signal: AbortSignal | undefined): Promise<ProcessorOutcome> {
  const { store, board, budget, settings } = context
  const { sweepId, chunk, chunksTotal } = job.data
  // Noted before the status is read: only a stop posted after a live status stops this chunk.
  const stopsBefore = board.stopsPosted(sweepId)
  const view = await store.workView(sweepId)
  if (view === null) return { outcome: 'skipped', reason: SWEEP_GONE }
  if (isTerminal(view.status)) return { outcome: 'skipped', reason: `sweep is ${view.status}` }
  // A job of a run before the sweep's last resume: the resume enqueued this chunk afresh if it was missing.
  if ((job.data.run ?? 0) < view.run) return { outcome: 'skipped', reason: 'superseded by a resume' }
  await store.markRunning(sweepId, Date.now())

  let spec: NormalisedSpec | null = null
  let outcome: ChunkRunOutcome
  try {
    spec = loadSpec(sweepId, job.data.specHash, view.specHash, view.specJson)
  } catch (error) {
    outcome = { kind: 'failed', error: classifyChunkError(error) }
  }
  const estimatedSeconds = spec === null ? 0 : chunkCpuSeconds(spec, chunk)
  if (spec !== null && !budget.fits(estimatedSeconds, Date.now())) {
    // The worker's time runs out before this chunk would end: back to the queue unrun, no attempt spent.
    return await handBack(job, token, { chunk: chunk.index, handedBack: 'out-of-time' })
  }
  outcome ??= runChunk(spec!, chunk, {
    // Called between trials while this thread's event loop is blocked: only shared memory can answer.
    shouldStop: () => board.stopsPosted(sweepId) > stopsBefore || board.handBackRequested() || signal?.aborted === true,
    progressIntervalMs: settings.progressIntervalMs,
    // Posted to the worker process at once (the message does not wait for this loop); it stores the progress.
    onProgress: (trialsDone) => { job.updateProgress({ chunk: chunk.index, trialsDone }).catch(() => {}) },
    reclaim: explicitCollector()
  })
  switch (outcome.kind) {
    case 'stopped': {
      const status = await store.status(sweepId)
      // Shutting down, or a stop that was meant for an earlier run of a sweep resumed since (a
      // late message): give the chunk back without spending one of its attempts.
      if (status !== null && !isTerminal(status)) return await handBack(job, token, { chunk: chunk.index, handedBack: 'stopped' })
      return { outcome: 'stopped', chunk: chunk.index }
    }
    case 'failed': {
      if (outcome.error.kind === 'user') {
        await failSweep(context, sweepId, chunksTotal, userFailure(outcome.error.message))
        throw new UnrecoverableError(outcome.error.message)
      }
      const attempts = job.opts.attempts ?? 1
      if (job.attemptsMade + 1 >= attempts) {
        await failSweep(context, sweepId, chunksTotal, systemFailure({ chunkIndex: chunk.index, chunksTotal }, attempts, systemCauseOf(outcome.error.name)))
      }
      throw new Error(`${outcome.error.name}: ${outcome.error.message}`)
    }
    case 'done': {
      budget.recordRun(estimatedSeconds, outcome.computeMs)
      const stored = await store.recordChunk(sweepId, chunk, outcome.body, outcome.computeMs, Date.now())
      if (stored.status !== 'running') return { outcome: 'skipped', reason: `sweep is ${stored.status === '' ? 'gone' : stored.status}` }
      await publishSweepEvent(context.redis, context.keys, sweepId, 'progress')
      // Whichever attempt sees the plan complete enqueues the assembly (or a due decision); fixed ids make repeats no-ops.
      if (stored.complete) await context.chunks.enqueueAssembly(sweepId, job.data.specHash, chunksTotal, job.data.run)
      if (stored.pointDue) await context.chunks.enqueueDecision(sweepId, job.data.specHash, chunk.point, chunk.firstTrial + chunk.count, chunksTotal, job.data.run)
      return { outcome: 'stored', chunk: chunk.index, trials: outcome.trials, computeMs: outcome.computeMs, completedSweep: stored.complete }
    }
  }
}

/** Returns the job to the queue without spending one of its attempts, telling the worker process first. */
async function handBack (job: SandboxedJob<ChunkJobData>, token: string | undefined, notice: HandBackNotice): Promise<never> {
  await job.updateProgress(notice).catch(() => {})
  await job.moveToWait(token)
  throw new WaitingError()
}

async function assemble (context: SandboxContext, job: SandboxedJob<AssembleJobData>): Promise<ProcessorOutcome> {
  const { store } = context
  const { sweepId, chunksTotal } = job.data
  const view = await store.workView(sweepId)
  if (view === null) return { outcome: 'skipped', reason: SWEEP_GONE }
  if (isTerminal(view.status)) return { outcome: 'skipped', reason: `sweep is ${view.status}` }
  let body: Uint8Array
  try {
    const spec = loadSpec(sweepId, job.data.specHash, view.specHash, view.specJson)
    const [plan, stored] = await Promise.all([store.plan(sweepId), store.storedChunks(sweepId)])
    const finishedMs = Date.now()
    const provenance = makeProvenance(spec, runtimeFacts(), {
      wallSeconds: Math.max(0, finishedMs - (view.startedMs ?? finishedMs)) / 1000,
      cpuSeconds: stored.computeMs / 1000
    })
    body = encodeValue(plan === null
      // A sweep stored before plans were: its result keeps its trials, as results then did.
      ? legacyResult(spec, stored.chunks.map((chunk) => decodeChunkValue<ChunkResult>(chunk.body)), provenance)
      : assembleStored(spec, plan.chunks, stored.chunks, provenance))
  } catch (error) {
    const classified = classifyChunkError(error)
    const attempts = job.opts.attempts ?? 1
    // Stored chunks that cannot be assembled are the system's fault, never the spec's.
    if (job.attemptsMade + 1 >= attempts) {
      await failSweep(context, sweepId, chunksTotal, systemFailure({ chunkIndex: null, chunksTotal }, attempts, systemCauseOf(classified.name)))
    }
    throw new Error(`${classified.name}: ${classified.message}`)
  }
  const finished = await store.succeed(sweepId, body, Date.now())
  if (finished.changed) await publishSweepEvent(context.redis, context.keys, sweepId, 'state')
  return { outcome: 'assembled', changed: finished.changed }
}

function legacyResult (spec: NormalisedSpec, chunks: ChunkResult[], provenance: ReturnType<typeof makeProvenance>): SweepResult {
  return assembleResult(spec, chunks, provenance)
}
