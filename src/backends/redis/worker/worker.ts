/**
 * A worker process of the Redis backend: takes chunk jobs from the shared queue and runs
 * them in sandboxed threads (processor.ts), any number of processes on any number of
 * machines. The process itself only does bookkeeping, so its event loop stays free for
 * BullMQ's lock renewals: it relays progress (progress-relay.ts) and stop requests
 * (stop-relay.ts), records sweeps whose chunks failed for good (failures.ts), and repairs
 * sweeps whose API instance never finished submitting them (repair.ts).
 */
import { availableParallelism, hostname } from 'node:os'
import { randomUUID } from 'node:crypto'
import { Job, Worker } from 'bullmq'
import type { Redis } from 'ioredis'
import type { Logger } from 'pino'
import { systemFailure } from '../../../sweep/index.js'
import { threadExecArgv } from '../../../runtime/node-flags.js'
import { siblingWorkerEntry } from '../../../runtime/worker-entry.js'
import { ChunkQueue, DEFAULT_RETRY_POLICY, SWEEP_GONE, type ChunkRetryPolicy, type SweepJobData, type SweepJobName } from '../chunk-queue.js'
import { closeConnection, openConnection, redactUrl, workerConnectionOptions } from '../connections.js'
import { EpochWatch } from '../data-loss.js'
import { CHUNK_QUEUE_NAME, keyLayout } from '../keys.js'
import { checkRedisSettings } from '../settings.js'
import { RedisSweepStore } from '../store.js'
import { failSweep, type FailureDeps } from './failures.js'
import type { ProcessorOutcome, SandboxSettings } from './processor.js'
import { isHandBackNotice, isProgressReport, storeProgress } from './progress-relay.js'
import { enqueueForgotten, FAILED_REPAIR_WINDOW_MS, jobsFailedSince, UNENQUEUED_REPAIR_AGE_MS } from './repair.js'
import { createStopBoardBuffer, StopBoardWriter } from './stop-board.js'
import { RunningChunks, StopRelay } from './stop-relay.js'
import { createTimeBudgetBuffer, TimeBudgetWriter } from './time-budget.js'
import { startHealthServer, type HealthServer } from './health.js'

export { closeOnSignals } from './signals.js'

export interface WorkerProcessOptions {
  url: string
  /** Key prefix shared with the API instances. */
  prefix: string
  logger: Logger
  /**
   * Chunks run at once, one sandbox thread each.
   * @defaultValue os.availableParallelism()
   */
  concurrency?: number
  /**
   * How long a chunk's lock lasts without renewal; a dead worker's chunks go back to the queue after about this long.
   * @defaultValue 30000
   */
  lockDurationMs?: number
  /**
   * Period of the check for chunks whose worker died.
   * @defaultValue 30000
   */
  stalledIntervalMs?: number
  /**
   * After SIGTERM (or close()), how long running chunks may take to finish before they are stopped and handed back to the queue.
   * @defaultValue 60000
   */
  shutdownGraceMs?: number
  /**
   * Minimum ms between two progress reports of one chunk.
   * @defaultValue 1000
   */
  progressIntervalMs?: number
  /**
   * How often the statuses of sweeps with running chunks are re-read, in case a stop message was missed.
   * @defaultValue 2000
   */
  statusPollMs?: number
  /**
   * Retention of finished sweeps, as set by the API instances (used when a worker fails a sweep).
   * @defaultValue 604800 (7 days)
   */
  retentionSeconds?: number
  /** Retry policy applied to the assembly jobs this worker enqueues; keep it equal to the API's. */
  retry?: Partial<ChunkRetryPolicy>
  /** A name for logs and Redis client lists; defaults to host:pid:random. */
  name?: string
  /**
   * Refuse to start when Redis may evict keys.
   * @defaultValue true
   */
  requireNoEviction?: boolean
  /** Told when this process starts and ends a job (for supervisors and tests). */
  observer?: (activity: WorkerActivity) => void
  /**
   * A batch allocation's limit: the worker takes no chunk it cannot finish (by the chunk's
   * cost estimate at this machine's measured speed) before `maxRuntimeMs` after `startedAtMs`
   * less `drainReserveMs`, hands back what still runs then, and closes. Unset: no limit.
   */
  maxRuntimeMs?: number
  /**
   * Time kept at the end of `maxRuntimeMs` for handing running chunks back and closing.
   * @defaultValue 10 % of maxRuntimeMs, between 1 s and 60 s
   */
  drainReserveMs?: number
  /**
   * When the run time counts from (a batch job's limit counts from its process's start).
   * @defaultValue the process's start
   */
  startedAtMs?: number
  /** Close once no job has run for this long (a batch allocation with nothing left to do). Unset: never. */
  exitWhenIdleMs?: number
  /** Serve `/livez` and `/readyz` on this port (0: any free port; unset: none), for an orchestrator's probes. */
  healthPort?: number
  /** @defaultValue '0.0.0.0' (probes come from outside the container) */
  healthHost?: string
}

export interface WorkerActivity {
  /**
   * `progress`: a running chunk reported its trials done; `stopped`: the chunk was abandoned
   * because its sweep was canceled or failed; `skipped`: the sweep had ended before the job ran.
   */
  type: 'started' | 'progress' | 'stored' | 'assembled' | 'stopped' | 'skipped' | 'failed' | 'handed-back'
  jobId: string
  sweepId: string
  job: SweepJobName
  /** Trials of the chunk done so far (progress only). */
  trialsDone?: number
}

export interface RunningWorker {
  readonly name: string
  /** Stops taking chunks, lets running ones finish within the grace period, hands back the rest, then closes. */
  close: () => Promise<void>
  /** Resolves once the worker has closed, whether told to (close, a signal) or on its own (idle, out of time). */
  readonly closed: Promise<void>
  /** The port of the health server, when one was asked for. */
  readonly healthPort: number | null
}

/** Why a worker closes; logged, and what decides how long running chunks may go on. */
export type CloseReason = 'asked' | 'idle' | 'out-of-time'

/** The default `drainReserveMs` for a run-time limit. */
export function defaultDrainReserveMs (maxRuntimeMs: number): number {
  return Math.min(60_000, Math.max(1000, Math.round(maxRuntimeMs / 10)))
}

const DEFAULT_RETENTION_SECONDS = 7 * 24 * 3600

type SweepJob = Job<SweepJobData, unknown, SweepJobName>

/**
 * BullMQ pipes each sandbox thread's stdout and stderr into this process's, one set of
 * listeners per thread on each: a worker of more than ten threads (or several workers in one
 * process) would set off Node's leak warning for listeners it means to have. Raises the limit
 * by the threads' share and returns what gives it back.
 */
function allowThreadPipes (threads: number): () => void {
  const streams = [process.stdout, process.stderr]
  for (const stream of streams) stream.setMaxListeners(stream.getMaxListeners() + threads)
  return () => {
    for (const stream of streams) stream.setMaxListeners(Math.max(0, stream.getMaxListeners() - threads))
  }
}

export async function startWorker (options: WorkerProcessOptions): Promise<RunningWorker> {
  const name = options.name ?? `${hostname()}:${process.pid}:${randomUUID().slice(0, 8)}`
  const logger = options.logger.child({ component: 'worker', worker: name })
  const keys = keyLayout(options.prefix)
  const concurrency = options.concurrency ?? availableParallelism()
  if (!Number.isInteger(concurrency) || concurrency < 1) throw new RangeError(`invalid argument. concurrency: must be a positive integer. Value: ${concurrency}.`)
  const retry = { ...DEFAULT_RETRY_POLICY, ...options.retry }
  const retentionSeconds = options.retentionSeconds ?? DEFAULT_RETENTION_SECONDS

  const redis = await openConnection(options.url, 'worker', `${name}:main`)
  let subscriber: Redis | null = null
  try {
    await checkRedisSettings(redis, logger, { allowEviction: options.requireNoEviction === false })
    subscriber = await openConnection(options.url, 'subscriber', `${name}:stop`)
  } catch (error) {
    await closeConnection(redis)
    throw error
  }
  const store = new RedisSweepStore(redis, keys, retentionSeconds)
  const chunkQueue = new ChunkQueue(redis, keys, retry, (err) => logger.warn({ err: err.message }, 'chunk queue error'))
  const failureDeps: FailureDeps = { redis, keys, store, chunks: chunkQueue }
  const stopBuffer = createStopBoardBuffer()
  const board = new StopBoardWriter(stopBuffer)
  const budgetBuffer = createTimeBudgetBuffer()
  const budget = new TimeBudgetWriter(budgetBuffer)
  const takeUntil = options.maxRuntimeMs === undefined
    ? null
    : (options.startedAtMs ?? Date.now() - process.uptime() * 1000) + options.maxRuntimeMs - (options.drainReserveMs ?? defaultDrainReserveMs(options.maxRuntimeMs))
  if (takeUntil !== null) budget.limitTo(takeUntil)
  const sandbox: SandboxSettings = {
    url: options.url,
    prefix: options.prefix,
    retentionSeconds,
    retry,
    progressIntervalMs: options.progressIntervalMs ?? 1000,
    stopBoard: stopBuffer,
    timeBudget: budgetBuffer,
    workerName: name
  }

  const releaseThreadPipes = allowThreadPipes(concurrency)
  // The sandbox threads' module, started as every thread module is (src/runtime/worker-entry.ts).
  const entry = siblingWorkerEntry(import.meta.url, 'sandbox')
  const worker = new Worker<SweepJobData, unknown, SweepJobName>(CHUNK_QUEUE_NAME, new URL(entry.filename), {
    connection: workerConnectionOptions(options.url, `${name}:bullmq`),
    prefix: keys.bullPrefix,
    name,
    concurrency,
    useWorkerThreads: true,
    workerThreadsOptions: { workerData: sandbox, execArgv: threadExecArgv(), argv: entry.argv },
    lockDuration: options.lockDurationMs ?? 30_000,
    stalledInterval: options.stalledIntervalMs ?? 30_000,
    maxStalledCount: 1,
    autorun: false
  })
  const running = new RunningChunks()
  const epoch = new EpochWatch(redis, keys.epoch, logger)
  const stops = new StopRelay({
    subscriber,
    keys,
    store,
    board,
    running,
    cancelJob: (jobId, why) => worker.cancelJob(jobId, why),
    logger,
    pollMs: options.statusPollMs ?? 2000,
    afterPoll: () => epoch.check()
  })

  /**
   * A job failed for good without the processor failing its sweep (a crash, a stall, a lost
   * thread). Every final failure happens in some worker's hands, a job stalled too often
   * included (BullMQ fails it in the worker that takes it next), so each worker's own 'failed'
   * events cover them all: no worker reads the queue-wide event stream, whose cost would grow
   * with the number of workers times the number of chunks. A worker that dies between the
   * job's failure and the sweep's leaves the rest to the periodic repair (failedLately).
   */
  const failFromJob = async (jobId: string): Promise<void> => {
    const job = await Job.fromId<SweepJobData>(chunkQueue.queue, jobId)
    if (job === undefined || await job.getState() !== 'failed') return
    const { sweepId, chunksTotal } = job.data
    // A job of an earlier run says nothing about a sweep resumed since.
    if ((job.data.run ?? 0) !== await store.dispatchRun(sweepId)) return
    const chunkIndex = 'chunk' in job.data ? job.data.chunk.index : null
    const failure = systemFailure({ chunkIndex, chunksTotal }, job.attemptsMade, 'lost-worker')
    if (await failSweep(failureDeps, sweepId, chunksTotal, failure)) {
      logger.error({ sweepId, jobId, reason: job.failedReason }, 'sweep failed: a chunk exhausted its attempts')
    }
  }

  const observe = (type: WorkerActivity['type'], job: SweepJob, trialsDone?: number): void => {
    if (options.observer === undefined) return
    try {
      options.observer({ type, jobId: job.id ?? '', sweepId: job.data.sweepId, job: job.name, ...(trialsDone === undefined ? {} : { trialsDone }) })
    } catch (err) {
      logger.warn({ err }, 'worker observer threw')
    }
  }

  let closing: Promise<void> | null = null
  let resolveClosed!: () => void
  let rejectClosed!: (error: unknown) => void
  const closed = new Promise<void>((resolve, reject) => {
    resolveClosed = resolve
    rejectClosed = reject
  })
  // Awaited by whoever runs the process (closeOnSignals); a close that fails is reported there, not as an unhandled rejection.
  closed.catch(() => {})
  let lastBusyMs = Date.now()
  const finished = (job: SweepJob): void => {
    running.remove(job.id ?? '')
    lastBusyMs = Date.now()
  }
  worker.on('active', (job) => {
    running.add(job.id ?? '', job.data.sweepId)
    lastBusyMs = Date.now()
    observe('started', job)
  })
  worker.on('completed', (job, result) => {
    finished(job)
    const reply = result as ProcessorOutcome | null
    const outcome = reply?.outcome
    observe(outcome === 'stored' || outcome === 'assembled' || outcome === 'stopped' ? outcome : 'skipped', job)
    // A job that was in flight when its sweep was purged leaves nothing behind either.
    if (reply?.outcome === 'skipped' && reply.reason === SWEEP_GONE) job.remove().catch(() => {})
  })
  worker.on('failed', (job, error) => {
    if (job === undefined) return
    finished(job)
    observe('failed', job)
    logger.warn({ jobId: job.id, sweepId: job.data.sweepId, attemptsMade: job.attemptsMade, err: error.message }, 'chunk attempt failed')
    if (job.finishedOn !== undefined && job.id !== undefined) failFromJob(job.id).catch((err: unknown) => logger.error({ err }, 'cannot record a failed sweep'))
  })
  worker.on('progress', (job, progress) => {
    if (isHandBackNotice(progress)) {
      finished(job)
      observe('handed-back', job)
      // A chunk that would not end in time: later ones would not either, so take no more.
      if (progress.handedBack === 'out-of-time' && closing === null) {
        logger.info({ jobId: job.id }, 'the next chunk would not end before the run-time limit: handed back, taking no more')
        close('out-of-time').catch((err: unknown) => logger.error({ err }, 'cannot close'))
      }
      return
    }
    if (!isProgressReport(progress)) return
    observe('progress', job, progress.trialsDone)
    storeProgress({ redis, keys, store, logger, stop: (sweepId, why) => stops.stop(sweepId, why) }, job.data.sweepId, progress).catch(() => {})
  })
  worker.on('stalled', (jobId) => logger.warn({ jobId }, 'a chunk lost its worker (crash or lost lock) and returns to the queue'))
  worker.on('error', (err) => logger.error({ err }, 'worker error'))

  await stops.start()
  await epoch.start()
  /** Sweeps a dead worker left running after their chunk failed for good. */
  const failedLately = async (): Promise<void> => {
    for (const jobId of await jobsFailedSince(redis, chunkQueue, Date.now() - FAILED_REPAIR_WINDOW_MS)) await failFromJob(jobId)
  }
  const repairHalfDone = async (): Promise<void> => {
    await Promise.all([
      enqueueForgotten(store, chunkQueue, logger).catch((err: unknown) => logger.warn({ err }, 'cannot repair unenqueued sweeps')),
      failedLately().catch((err: unknown) => logger.warn({ err }, 'cannot look at the chunks that failed lately'))
    ])
  }
  // repairHalfDone reports its own errors and never rejects.
  const repair = setInterval(() => { repairHalfDone().catch(() => {}) }, UNENQUEUED_REPAIR_AGE_MS)
  // Before taking work: what a dead process left half done is settled first.
  await repairHalfDone()

  await worker.waitUntilReady()
  worker.run().catch((err: unknown) => logger.error({ err }, 'worker loop stopped'))
  logger.info({ redis: redactUrl(options.url), prefix: options.prefix, concurrency }, 'worker started')

  let limitTimer: NodeJS.Timeout | undefined
  let idleTimer: NodeJS.Timeout | undefined
  let health: HealthServer | null = null
  /**
   * Stops taking chunks and closes once the running ones are stored or handed back. Asked
   * (a signal): they have the grace period. Out of time: until the limit. Idle: none runs.
   */
  const close = (reason: CloseReason = 'asked'): Promise<void> => {
    closing ??= (async () => {
      clearTimeout(limitTimer)
      clearTimeout(idleTimer)
      stops.close()
      clearInterval(repair)
      const graceMs = reason === 'out-of-time' && takeUntil !== null
        ? Math.max(0, takeUntil - Date.now())
        : options.shutdownGraceMs ?? 60_000
      if (takeUntil === null || Date.now() + graceMs < takeUntil) budget.limitTo(Date.now() + graceMs)
      logger.info({ reason, running: running.size, graceMs, slowness: budget.slowness() }, 'closing: taking no more chunks')
      const grace = setTimeout(() => {
        logger.warn({ running: running.size }, 'grace period over: handing running chunks back to the queue')
        board.requestHandBack()
      }, graceMs)
      try {
        await worker.close()
      } finally {
        clearTimeout(grace)
        releaseThreadPipes()
      }
      await chunkQueue.close()
      if (health !== null) await health.close()
      if (subscriber !== null) await closeConnection(subscriber)
      await closeConnection(redis)
      logger.info({ reason }, 'worker stopped')
    })()
    closing.then(resolveClosed, rejectClosed)
    return closing
  }
  if (takeUntil !== null) {
    limitTimer = setTimeout(() => {
      logger.info('run-time limit reached: handing running chunks back')
      close('out-of-time').catch((err: unknown) => logger.error({ err }, 'cannot close'))
    }, Math.max(0, takeUntil - Date.now()))
  }
  if (options.exitWhenIdleMs !== undefined) {
    const idleMs = options.exitWhenIdleMs
    const checkIdle = (): void => {
      const quietFor = Date.now() - lastBusyMs
      if (running.size === 0 && quietFor >= idleMs) {
        logger.info({ idleMs }, 'idle: no chunk to run')
        close('idle').catch((err: unknown) => logger.error({ err }, 'cannot close'))
        return
      }
      idleTimer = setTimeout(checkIdle, Math.max(50, Math.min(1000, running.size > 0 ? idleMs : idleMs - quietFor)))
    }
    idleTimer = setTimeout(checkIdle, Math.max(50, Math.min(1000, idleMs)))
  }
  if (options.healthPort !== undefined) {
    health = await startHealthServer({
      port: options.healthPort,
      host: options.healthHost ?? '0.0.0.0',
      logger,
      readiness: async () => {
        if (closing !== null) return { ready: false, reason: 'draining' }
        try {
          await withTimeout(redis.ping(), 2000)
          return { ready: true, reason: 'taking chunks' }
        } catch {
          return { ready: false, reason: 'Redis does not answer' }
        }
      }
    }).catch(async (error: unknown) => {
      await close('asked')
      throw error
    })
  }
  return { name, close: () => close('asked'), closed, healthPort: health === null ? null : health.port }
}

function withTimeout<T> (promise: Promise<T>, ms: number): Promise<T> {
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`no answer within ${ms} ms`)), ms)
    promise.then((value) => { clearTimeout(timer); resolve(value) }, (error: unknown) => { clearTimeout(timer); reject(error) })
  })
}
