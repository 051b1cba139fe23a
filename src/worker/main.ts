/**
 * A worker process of the Redis backend: takes chunk jobs from the shared queue and runs
 * them in sandboxed threads (processor.ts), any number of processes on any number of
 * machines. The process itself only does bookkeeping, so its event loop stays free for
 * BullMQ's lock renewals: it stores chunk progress, relays stop requests to its threads,
 * and fails sweeps whose chunks failed for good.
 */
import { availableParallelism, hostname } from 'node:os'
import { randomUUID } from 'node:crypto'
import { Job, QueueEvents, Worker } from 'bullmq'
import type { Redis } from 'ioredis'
import type { Logger } from 'pino'
import { planChunks, type NormalisedSpec } from '../spec/index.js'
import { TERMINAL_STATUSES, type SweepStatus } from '../backends/port.js'
import { ChunkQueue, DEFAULT_RETRY_POLICY, type AssembleJobData, type ChunkJobData, type ChunkRetryPolicy, type SweepJobName } from '../backends/redis/chunk-queue.js'
import { closeConnection, openConnection, redactUrl, workerConnectionOptions } from '../backends/redis/connections.js'
import { EpochWatch } from '../backends/redis/data-loss.js'
import { publishStop, publishSweepEvent } from '../backends/redis/events.js'
import { CHUNK_QUEUE_NAME, keyLayout } from '../backends/redis/keys.js'
import { checkRedisSettings } from '../backends/redis/settings.js'
import { RedisSweepStore } from '../backends/redis/store.js'
import type { ProcessorOutcome, SandboxSettings } from './processor.js'
import { createStopBoardBuffer, StopBoardWriter } from './stop-board.js'
import { threadExecArgv } from '../runtime/node-flags.js'

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
/** Sweeps created longer ago than this whose jobs were never confirmed are enqueued again. */
const UNENQUEUED_REPAIR_AGE_MS = 30_000

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

  const worker = new Worker<ChunkJobData | AssembleJobData, unknown, SweepJobName>(CHUNK_QUEUE_NAME, processorFile(), {
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

  const stopSweep = (sweepId: string, why: string): void => {
    if (!running.hasSweep(sweepId)) return
    board.postStop(sweepId)
    for (const jobId of running.jobsOf(sweepId)) worker.cancelJob(jobId, why)
    logger.info({ sweepId }, `stopping running chunks: ${why}`)
  }

  /** Fails a sweep whose chunk failed for good without the processor saying so (a crash, a stall, a lost thread). */
  const failFromJob = async (jobId: string, reason: string): Promise<void> => {
    const job = await Job.fromId<ChunkJobData | AssembleJobData>(chunkQueue.queue, jobId)
    if (job === undefined || await job.getState() !== 'failed') return
    const { sweepId, chunksTotal } = job.data
    const index = 'chunk' in job.data ? job.data.chunk.index : null
    const where = index === null ? 'The assembly of the results' : `Chunk ${index + 1} of ${chunksTotal}`
    const transition = await store.stop(sweepId, 'failed', Date.now(), {
      kind: 'system',
      message: `${where} failed ${job.attemptsMade} time(s) for reasons outside the spec (${firstWords(reason)}). Submitting the sweep again may succeed; the service log has the details.`
    })
    if (!transition.changed) return
    logger.error({ sweepId, jobId, reason }, 'sweep failed: a chunk exhausted its attempts')
    await publishStop(redis, keys, sweepId)
    await publishSweepEvent(redis, keys, sweepId, 'state')
    await chunkQueue.removePending(sweepId, chunksTotal)
  }

  const observe = (type: WorkerActivity['type'], job: Job<ChunkJobData | AssembleJobData, unknown, SweepJobName>, trialsDone?: number): void => {
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
    const outcome = (result as ProcessorOutcome | null)?.outcome
    observe(outcome === 'stored' || outcome === 'assembled' || outcome === 'stopped' ? outcome : 'skipped', job)
  })
  worker.on('failed', (job, error) => {
    if (job === undefined) return
    running.remove(job.id ?? '')
    observe('failed', job)
    if (error.name === 'WaitingError') return
    logger.warn({ jobId: job.id, sweepId: job.data.sweepId, attemptsMade: job.attemptsMade, err: error.message }, 'chunk attempt failed')
    if (job.finishedOn !== undefined && job.id !== undefined) failFromJob(job.id, error.message).catch((err: unknown) => logger.error({ err }, 'cannot record a failed sweep'))
  })
  worker.on('progress', (job, progress) => {
    const report = progress as { chunk?: number, trialsDone?: number }
    if (typeof report.chunk !== 'number' || typeof report.trialsDone !== 'number') return
    observe('progress', job, report.trialsDone)
    const sweepId = job.data.sweepId
    store.reportProgress(sweepId, report.chunk, report.trialsDone, Date.now()).then(async (status) => {
      if (status === 'running') await publishSweepEvent(redis, keys, sweepId, 'progress')
      else if (status === null || TERMINAL_STATUSES.has(status)) stopSweep(sweepId, `sweep is ${status ?? 'gone'}`)
    }).catch((err: unknown) => logger.warn({ err, sweepId }, 'cannot store chunk progress'))
  })
  worker.on('stalled', (jobId) => logger.warn({ jobId }, 'a chunk lost its worker (crash or lost lock) and returns to the queue'))
  worker.on('error', (err) => logger.error({ err }, 'worker error'))
  failures.on('failed', ({ jobId, failedReason }) => {
    failFromJob(jobId, failedReason).catch((err: unknown) => logger.error({ err, jobId }, 'cannot record a failed sweep'))
  })
  failures.on('error', (err) => logger.error({ err }, 'queue events error'))
  subscriber.on('message', (channel: string, sweepId: string) => {
    if (channel === keys.stopChannel) stopSweep(sweepId, 'sweep was canceled or failed')
  })
  await subscriber.subscribe(keys.stopChannel)

  const epoch = new EpochWatch(redis, keys.epoch, logger)
  await epoch.start()
  // Safety net for stop messages lost while the subscriber reconnected.
  const statusPoll = setInterval(() => {
    pollStatuses(store, running.sweeps()).then((stopped) => {
      for (const [sweepId, status] of stopped) stopSweep(sweepId, `sweep is ${status}`)
      return epoch.check()
    }).catch((err: unknown) => logger.warn({ err }, 'cannot poll sweep statuses'))
  }, options.statusPollMs ?? 2000)
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
      clearInterval(statusPoll)
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

/** Chunk jobs this process runs now, by sweep. */
class RunningChunks {
  readonly #sweepOf = new Map<string, string>()

  get size (): number { return this.#sweepOf.size }

  add (jobId: string, sweepId: string): void { this.#sweepOf.set(jobId, sweepId) }
  remove (jobId: string): void { this.#sweepOf.delete(jobId) }
  hasSweep (sweepId: string): boolean { return [...this.#sweepOf.values()].includes(sweepId) }
  jobsOf (sweepId: string): string[] { return [...this.#sweepOf].filter(([, id]) => id === sweepId).map(([jobId]) => jobId) }
  sweeps (): string[] { return [...new Set(this.#sweepOf.values())] }
}

async function pollStatuses (store: RedisSweepStore, sweepIds: string[]): Promise<Array<[string, SweepStatus | 'gone']>> {
  const stopped: Array<[string, SweepStatus | 'gone']> = []
  for (const sweepId of sweepIds) {
    const status = await store.status(sweepId)
    if (status === null) stopped.push([sweepId, 'gone'])
    else if (status === 'canceled' || status === 'failed') stopped.push([sweepId, status])
  }
  return stopped
}

/**
 * Enqueues the chunks of sweeps whose submitting API instance died between storing the
 * record and adding the jobs. Job ids are deterministic, so chunks already queued are not
 * duplicated; chunks already stored are skipped by the processor's counters.
 */
async function enqueueForgotten (store: RedisSweepStore, chunkQueue: ChunkQueue, logger: Logger): Promise<void> {
  for (const sweepId of await store.unenqueuedBefore(Date.now() - UNENQUEUED_REPAIR_AGE_MS)) {
    const view = await store.workView(sweepId)
    if (view === null || TERMINAL_STATUSES.has(view.status)) {
      await store.markEnqueued(sweepId)
      continue
    }
    const spec = JSON.parse(view.specJson) as NormalisedSpec
    await chunkQueue.enqueueChunks(sweepId, view.specHash, spec, planChunks(spec))
    await store.markEnqueued(sweepId)
    logger.warn({ sweepId }, 'enqueued the chunks of a sweep its API instance never finished submitting')
  }
}

function firstWords (text: string): string {
  const line = text.split('\n', 1)[0] ?? ''
  return line.length > 200 ? `${line.slice(0, 199)}…` : line
}

/**
 * Closes the worker on the first SIGTERM or SIGINT (running chunks finish within the grace
 * period or go back to the queue); a second signal exits at once. Resolves once closed.
 */
export function closeOnSignals (worker: RunningWorker, logger: Logger): Promise<void> {
  return new Promise((resolve, reject) => {
    let received = 0
    const onSignal = (signal: NodeJS.Signals): void => {
      received++
      if (received > 1) {
        logger.warn({ signal }, 'second signal: exiting without waiting for running chunks (they return to the queue when their locks expire)')
        process.exit(1)
      }
      logger.info({ signal }, 'shutting down: no new chunks; running chunks finish or are handed back')
      worker.close().then(resolve, reject).finally(() => {
        process.off('SIGTERM', onSignal)
        process.off('SIGINT', onSignal)
      })
    }
    process.on('SIGTERM', onSignal)
    process.on('SIGINT', onSignal)
  })
}
