/**
 * The Redis backend of the queue port: sweeps are records in Redis, their chunks are BullMQ
 * jobs that any number of worker processes (src/worker) take from a shared queue. An API
 * instance keeps no sweep state of its own, so any instance can answer for any sweep, and
 * an instance can die and come back without losing anything. Key layout: docs/redis.md.
 */
import type { Redis } from 'ioredis'
import type { Logger } from 'pino'
import type { TrialRecord } from '../../engine/index.js'
import { specHash } from '../../spec/index.js'
import type { SweepResult } from '../../results/index.js'
import {
  dataLossFailure, isSweepId, isTerminal, newSweepId, planSweep, readEncodedResult, readResult, readStoredProgress, readTrials, submitToStore,
  type Annotation, type ListQuery, type SweepPage, type SweepRecord
} from '../../sweep/index.js'
import { CallbackDispatcher, type CallbackDispatcherOptions, type CallbackSender } from '../../sweep/index.js'
import { ActiveSweepCapError, IdempotencyConflictError } from '../errors.js'
import type { EncodedResult, QueueStats, StoredProgress, SubmitInput, SweepEvent, SweepQueue } from '../port.js'
import { enqueueRemaining } from './dispatch.js'
import { ChunkQueue, DEFAULT_RETRY_POLICY, type ChunkRetryPolicy } from './chunk-queue.js'
import { closeConnection, openConnection, redactUrl } from './connections.js'
import { publishStop, publishSweepEvent, RedisSweepEvents } from './events.js'
import { keyLayout, type KeyLayout } from './keys.js'
import { EpochWatch } from './data-loss.js'
import { checkRedisSettings } from './settings.js'
import { RedisSweepStore } from './store.js'

export { RedisSettingsError } from './settings.js'
export type { ChunkRetryPolicy } from './chunk-queue.js'

export interface RedisQueueOptions {
  /** redis:// or rediss:// URL. */
  url: string
  /**
   * Prefix of every key and channel; API instances and workers of one deployment share it.
   * @defaultValue 'memsweep'
   */
  prefix?: string
  logger: Logger
  /**
   * How long a finished (succeeded, failed or canceled) sweep and its result are kept.
   * @defaultValue 604800 (7 days)
   */
  retentionSeconds?: number
  /**
   * How long an Idempotency-Key stays bound to its sweep.
   * @defaultValue 86400
   */
  idempotencyTtlSeconds?: number
  /** Retries of failing chunks (system failures only); keep it equal to the workers'. */
  retry?: Partial<ChunkRetryPolicy>
  /**
   * While someone listens to a sweep, its record is re-read this often in case an event hint was lost.
   * @defaultValue 2000
   */
  eventPollMs?: number
  /**
   * Refuse to start when Redis may evict keys.
   * @defaultValue true
   */
  requireNoEviction?: boolean
}

export const DEFAULT_PREFIX = 'memsweep'
export const DEFAULT_RETENTION_SECONDS = 7 * 24 * 3600
const DEFAULT_IDEMPOTENCY_TTL_SECONDS = 24 * 3600
const READY_TIMEOUT_MS = 2000

export async function createRedisQueue (options: RedisQueueOptions): Promise<SweepQueue> {
  const prefix = options.prefix ?? DEFAULT_PREFIX
  const logger = options.logger.child({ component: 'redis-queue' })
  const producer = await openConnection(options.url, 'producer', 'memsweep:api')
  let subscriber: Redis | null = null
  try {
    await checkRedisSettings(producer, logger, { allowEviction: options.requireNoEviction === false })
    subscriber = await openConnection(options.url, 'subscriber', 'memsweep:api-events')
  } catch (error) {
    await closeConnection(producer)
    throw error
  }
  producer.on('error', (err) => logger.warn({ err: err.message }, 'Redis connection error'))
  subscriber.on('error', (err) => logger.warn({ err: err.message }, 'Redis subscriber error'))
  const keys = keyLayout(prefix)
  const store = new RedisSweepStore(producer, keys, options.retentionSeconds ?? DEFAULT_RETENTION_SECONDS)
  const chunks = new ChunkQueue(producer, keys, { ...DEFAULT_RETRY_POLICY, ...options.retry }, (err) => logger.warn({ err: err.message }, 'chunk queue error'))
  const hub = new RedisSweepEvents(subscriber, keys, id => store.get(id), logger, options.eventPollMs ?? 2000)
  const epoch = new EpochWatch(producer, keys.epoch, logger)
  await epoch.start()
  logger.info({ redis: redactUrl(options.url), prefix }, 'Redis queue ready')
  return new RedisQueue(producer, subscriber, keys, store, chunks, hub, epoch, options.idempotencyTtlSeconds ?? DEFAULT_IDEMPOTENCY_TTL_SECONDS, logger)
}

class RedisQueue implements SweepQueue {
  readonly kind = 'redis' as const
  #closed: Promise<void> | null = null
  #callbacks: CallbackDispatcher | null = null

  constructor (
    readonly producer: Redis,
    readonly subscriber: Redis,
    readonly keys: KeyLayout,
    readonly store: RedisSweepStore,
    readonly chunks: ChunkQueue,
    readonly hub: RedisSweepEvents,
    readonly epoch: EpochWatch,
    readonly idempotencyTtlSeconds: number,
    readonly logger: Logger
  ) {}

  /**
   * Sweeps this instance saw queued or running, so that a Redis that lost its data (restart
   * without persistence, flush) turns them into failed sweeps with a system error instead
   * of letting them vanish.
   */
  readonly #unfinished = new Map<string, SweepRecord>()

  #remember (record: SweepRecord | null): SweepRecord | null {
    if (record === null) return null
    if (isTerminal(record.status)) this.#unfinished.delete(record.id)
    else this.#unfinished.set(record.id, record)
    return record
  }

  /** Checks the epoch; after a data loss, records every remembered unfinished sweep as failed (system). */
  async #noticeDataLoss (): Promise<void> {
    if (!await this.epoch.check()) return
    const lost = [...this.#unfinished.values()]
    this.#unfinished.clear()
    const now = Date.now()
    for (const record of lost) {
      await this.store.create({
        id: record.id,
        owner: record.owner,
        label: record.label,
        specHash: record.specHash,
        spec: record.spec,
        createdMs: Date.parse(record.createdAt),
        plan: planSweep(record.spec),
        replicateKey: record.replicateKey,
        reuseKeys: []
      })
      await this.store.stop(record.id, 'failed', dataLossFailure(), now)
      await publishSweepEvent(this.producer, this.keys, record.id, 'state')
      this.logger.error({ sweepId: record.id }, 'sweep lost with the Redis data recorded as failed (system)')
    }
  }

  async submit (input: SubmitInput): Promise<SweepRecord> {
    this.#assertOpen()
    return this.#remember(await this.#submit(input))!
  }

  async #submit (input: SubmitInput): Promise<SweepRecord> {
    const spec = input.spec
    const hash = specHash(spec)
    const id = newSweepId()
    const outcome = await submitToStore(this.store, {
      id,
      spec,
      owner: input.owner,
      createdMs: Date.now(),
      reuseFrom: input.reuse === true ? await this.store.findReusable(input.owner, hash) : null,
      ...(input.reusePoints === undefined ? {} : { reusePoints: input.reusePoints }),
      ...(input.idempotencyKey === undefined ? {} : { idempotency: { key: input.idempotencyKey, ttlSeconds: this.idempotencyTtlSeconds } }),
      ...(input.maxActive === undefined ? {} : { maxActive: input.maxActive }),
      ...(input.extends === undefined ? {} : { extends: input.extends }),
      ...(input.tags === undefined ? {} : { tags: input.tags }),
      ...(input.notes === undefined ? {} : { notes: input.notes }),
      ...(input.callbackUrl === undefined ? {} : { callbackUrl: input.callbackUrl })
    })
    if (outcome.kind === 'over-cap') throw new ActiveSweepCapError(input.owner, outcome.active, input.maxActive ?? outcome.active)
    if (outcome.kind === 'existing') {
      if (outcome.binding.specHash !== hash) throw new IdempotencyConflictError(input.idempotencyKey ?? '')
      const existing = await this.store.get(outcome.binding.sweepId)
      if (existing === null) {
        // The key outlived its sweep (retention shorter than the key's life): start afresh.
        await this.store.releaseIdempotencyKey(input.owner, input.idempotencyKey ?? '')
        return await this.#submit(input)
      }
      // A retry after a submit that stored the record but died before enqueueing: finish the job.
      if (!isTerminal(existing.status) && !await this.store.isEnqueued(existing.id)) {
        await enqueueRemaining(this.store, this.chunks, existing.id, existing.specHash, existing.spec)
      }
      return existing
    }
    if (outcome.status === 'queued') await enqueueRemaining(this.store, this.chunks, id, hash, spec)
    const record = await this.store.get(id)
    if (record === null) throw new Error(`Sweep ${id} vanished right after it was stored.`)
    return record
  }

  async resume (id: string, options: { maxActive?: number } = {}): Promise<SweepRecord | null> {
    this.#assertOpen()
    if (!isSweepId(id)) return null
    const transition = await this.store.reopen(id, Date.now(), options.maxActive)
    const record = await this.store.get(id)
    if (transition.overCap !== undefined) throw new ActiveSweepCapError(record?.owner ?? null, transition.overCap, options.maxActive ?? transition.overCap)
    if (transition.changed && record !== null) {
      await enqueueRemaining(this.store, this.chunks, id, record.specHash, record.spec)
      await publishSweepEvent(this.producer, this.keys, id, 'state')
      this.logger.info({ sweepId: id }, 'sweep resumed')
    }
    return this.#remember(record)
  }

  async annotate (id: string, patch: Annotation): Promise<SweepRecord | null> {
    this.#assertOpen()
    if (!isSweepId(id)) return null
    return await this.store.annotate(id, patch)
  }

  async purge (id: string): Promise<boolean> {
    this.#assertOpen()
    if (!isSweepId(id)) return false
    const [plan, run] = await Promise.all([this.store.plan(id), this.store.dispatchRun(id)])
    if (!await this.store.purge(id)) return false
    if (plan !== null) await this.chunks.removeFinished(id, plan.chunks, run)
    return true
  }

  async storedProgress (id: string): Promise<StoredProgress | null> {
    this.#assertOpen()
    if (!isSweepId(id)) return null
    return await readStoredProgress(this.store, id)
  }

  async get (id: string): Promise<SweepRecord | null> {
    this.#assertOpen()
    if (!isSweepId(id)) return null
    const record = await this.store.get(id)
    if (record === null && this.#unfinished.has(id)) {
      await this.#noticeDataLoss()
      return this.#remember(await this.store.get(id))
    }
    return this.#remember(record)
  }

  async list (query: ListQuery): Promise<SweepPage> {
    this.#assertOpen()
    return await this.store.list(query)
  }

  async cancel (id: string): Promise<SweepRecord | null> {
    this.#assertOpen()
    if (!isSweepId(id)) return null
    const record = await this.store.get(id)
    if (record === null || isTerminal(record.status)) return record
    const transition = await this.store.stop(id, 'canceled', null, Date.now())
    if (transition.changed) {
      // Running chunks stop on every worker; waiting ones are removed so no worker picks them up.
      await publishStop(this.producer, this.keys, id)
      await publishSweepEvent(this.producer, this.keys, id, 'state')
      const removed = await this.chunks.removePending(id, record.progress.chunksTotal, await this.store.dispatchRun(id))
      this.logger.info({ sweepId: id, removedChunks: removed }, 'sweep canceled')
    }
    return await this.store.get(id)
  }

  async results (id: string): Promise<SweepResult | null> {
    this.#assertOpen()
    if (!isSweepId(id)) return null
    return await readResult(this.store, id)
  }

  async trials (id: string): Promise<TrialRecord[][] | null> {
    this.#assertOpen()
    if (!isSweepId(id)) return null
    return await readTrials(this.store, id)
  }

  async encodedResult (id: string, options: { trials: boolean }): Promise<EncodedResult | null> {
    this.#assertOpen()
    if (!isSweepId(id)) return null
    return await readEncodedResult(this.store, id, options)
  }

  subscribe (id: string, listener: (event: SweepEvent) => void): () => void {
    if (this.#closed !== null || !isSweepId(id)) return () => {}
    return this.hub.subscribe(id, listener)
  }

  async stats (): Promise<QueueStats> {
    this.#assertOpen()
    const [counts, jobs] = await Promise.all([this.store.counts(), this.chunks.counts()])
    return { ...counts, chunksWaiting: jobs.waiting, chunksActive: jobs.active }
  }

  async ready (): Promise<{ ok: boolean, detail?: string }> {
    if (this.#closed !== null) return { ok: false, detail: 'the Redis queue is closed' }
    let timer: NodeJS.Timeout | undefined
    try {
      await Promise.race([
        this.producer.ping(),
        new Promise((_resolve, reject) => { timer = setTimeout(() => reject(new Error('timeout')), READY_TIMEOUT_MS) })
      ])
      // Readiness probes run often: a cheap place to notice (and log loudly) that Redis lost its data.
      await this.#noticeDataLoss()
      if (this.subscriber.status !== 'ready') return { ok: false, detail: 'the Redis event subscriber is reconnecting' }
      return { ok: true }
    } catch (error) {
      return { ok: false, detail: `Redis does not answer (${error instanceof Error ? error.message : String(error)})` }
    } finally {
      clearTimeout(timer)
    }
  }

  startCallbacks (send: CallbackSender, options: CallbackDispatcherOptions = {}): void {
    this.#assertOpen()
    if (this.#callbacks !== null) return
    this.#callbacks = new CallbackDispatcher(this.store, send, options)
    this.#callbacks.start()
  }

  close (): Promise<void> {
    this.#closed ??= (async () => {
      await this.#callbacks?.stop()
      this.hub.close()
      await this.chunks.close()
      await closeConnection(this.subscriber)
      await closeConnection(this.producer)
      this.logger.info('Redis queue closed')
    })()
    return this.#closed
  }

  #assertOpen (): void {
    if (this.#closed !== null) throw new Error('The Redis queue is closed.')
  }
}
