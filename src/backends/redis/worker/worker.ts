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
import { Job, QueueEvents, Worker } from 'bullmq'
import type { Redis } from 'ioredis'
import type { Logger } from 'pino'
import { systemFailure } from '../../../sweep/index.js'
import { threadExecArgv } from '../../../runtime/node-flags.js'
import { ChunkQueue, DEFAULT_RETRY_POLICY, SWEEP_GONE, type ChunkRetryPolicy, type SweepJobData, type SweepJobName } from '../chunk-queue.js'
import { closeConnection, openConnection, redactUrl, workerConnectionOptions } from '../connections.js'
import { EpochWatch } from '../data-loss.js'
import { CHUNK_QUEUE_NAME, keyLayout } from '../keys.js'
import { checkRedisSettings } from '../settings.js'
import { RedisSweepStore } from '../store.js'
import { failSweep, type FailureDeps } from './failures.js'
import type { ProcessorOutcome, SandboxSettings } from './processor.js'
import { isProgressReport, storeProgress } from './progress-relay.js'
import { enqueueForgotten, UNENQUEUED_REPAIR_AGE_MS } from './repair.js'
import { createStopBoardBuffer, StopBoardWriter } from './stop-board.js'
import { RunningChunks, StopRelay } from './stop-relay.js'

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
}

export interface WorkerActivity {
  /**
   * `progress`: a running chunk reported its trials done; `stopped`: the chunk was abandoned
   * because its sweep was canceled or failed; `skipped`: the sweep had ended before the job ran.
   */
  type: 'started' | 'progress' | 'stored' | 'assembled' | 'stopped' | 'skipped' | 'failed'
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
}

const DEFAULT_RETENTION_SECONDS = 7 * 24 * 3600

type SweepJob = Job<SweepJobData, unknown, SweepJobName>

/** The processor module: compiled JavaScript beside this file, or a loader that runs the TypeScript source through tsx. */
function processorFile (): URL {
  const fromSource = import.meta.url.endsWith('.ts')
  return new URL(fromSource ? './processor-from-source.mjs' : './processor.js', import.meta.url)
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
  const sandbox: SandboxSettings = {
    url: options.url,
    prefix: options.prefix,
    retentionSeconds,
    retry,
    progressIntervalMs: options.progressIntervalMs ?? 1000,
    stopBoard: stopBuffer,
    workerName: name
  }

  const worker = new Worker<SweepJobData, unknown, SweepJobName>(CHUNK_QUEUE_NAME, processorFile(), {
    connection: workerConnectionOptions(options.url, `${name}:bullmq`),
    prefix: keys.bullPrefix,
    name,
    concurrency,
    useWorkerThreads: true,
    workerThreadsOptions: { workerData: sandbox, execArgv: threadExecArgv() },
    lockDuration: options.lockDurationMs ?? 30_000,
    stalledInterval: options.stalledIntervalMs ?? 30_000,
    maxStalledCount: 1,
    autorun: false
  })
  const failures = new QueueEvents(CHUNK_QUEUE_NAME, {
    connection: workerConnectionOptions(options.url, `${name}:events`),
    prefix: keys.bullPrefix
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

  /** A job failed for good without the processor failing its sweep (a crash, a stall, a lost thread). */
  const failFromJob = async (jobId: string): Promise<void> => {
    const job = await Job.fromId<SweepJobData>(chunkQueue.queue, jobId)
    if (job === undefined || await job.getState() !== 'failed') return
    const { sweepId, chunksTotal } = job.data
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

  worker.on('active', (job) => {
    running.add(job.id ?? '', job.data.sweepId)
    observe('started', job)
  })
  worker.on('completed', (job, result) => {
    running.remove(job.id ?? '')
    const reply = result as ProcessorOutcome | null
    const outcome = reply?.outcome
    observe(outcome === 'stored' || outcome === 'assembled' || outcome === 'stopped' ? outcome : 'skipped', job)
    // A job that was in flight when its sweep was purged leaves nothing behind either.
    if (reply?.outcome === 'skipped' && reply.reason === SWEEP_GONE) job.remove().catch(() => {})
  })
  worker.on('failed', (job, error) => {
    if (job === undefined) return
    running.remove(job.id ?? '')
    observe('failed', job)
    if (error.name === 'WaitingError') return
    logger.warn({ jobId: job.id, sweepId: job.data.sweepId, attemptsMade: job.attemptsMade, err: error.message }, 'chunk attempt failed')
    if (job.finishedOn !== undefined && job.id !== undefined) failFromJob(job.id).catch((err: unknown) => logger.error({ err }, 'cannot record a failed sweep'))
  })
  worker.on('progress', (job, progress) => {
    if (!isProgressReport(progress)) return
    observe('progress', job, progress.trialsDone)
    storeProgress({ redis, keys, store, logger, stop: (sweepId, why) => stops.stop(sweepId, why) }, job.data.sweepId, progress).catch(() => {})
  })
  worker.on('stalled', (jobId) => logger.warn({ jobId }, 'a chunk lost its worker (crash or lost lock) and returns to the queue'))
  worker.on('error', (err) => logger.error({ err }, 'worker error'))
  failures.on('failed', ({ jobId }) => {
    failFromJob(jobId).catch((err: unknown) => logger.error({ err, jobId }, 'cannot record a failed sweep'))
  })
  failures.on('error', (err) => logger.error({ err }, 'queue events error'))

  await stops.start()
  await epoch.start()
  const repairForgotten = (): void => {
    enqueueForgotten(store, chunkQueue, logger).catch((err: unknown) => logger.warn({ err }, 'cannot repair unenqueued sweeps'))
  }
  const repair = setInterval(repairForgotten, UNENQUEUED_REPAIR_AGE_MS)
  repairForgotten()

  await Promise.all([worker.waitUntilReady(), failures.waitUntilReady()])
  worker.run().catch((err: unknown) => logger.error({ err }, 'worker loop stopped'))
  logger.info({ redis: redactUrl(options.url), prefix: options.prefix, concurrency }, 'worker started')

  let closing: Promise<void> | null = null
  const close = (): Promise<void> => {
    closing ??= (async () => {
      stops.close()
      clearInterval(repair)
      const grace = setTimeout(() => {
        logger.warn({ running: running.size }, 'shutdown grace period over: handing running chunks back to the queue')
        board.requestHandBack()
      }, options.shutdownGraceMs ?? 60_000)
      try {
        await worker.close()
      } finally {
        clearTimeout(grace)
      }
      await failures.close()
      await chunkQueue.close()
      if (subscriber !== null) await closeConnection(subscriber)
      await closeConnection(redis)
      logger.info('worker stopped')
    })()
    return closing
  }
  return { name, close }
}
