/**
 * The embedded backend, the default when no Redis is configured: sweeps and results in a
 * SQLite file under the data directory, trials on a fixed set of worker threads in this
 * process. Interrupted sweeps resume on the next start, keeping the chunks already stored.
 */
import { randomUUID } from 'node:crypto'
import { availableParallelism } from 'node:os'
import type { Logger } from 'pino'
import type { ResourceLimits } from 'node:worker_threads'
import { countPoints, planChunks, specHash } from '../../spec/index.js'
import type { NormalisedSpec, SweepResult } from '../../spec/index.js'
import { IdempotencyConflictError } from '../port.js'
import type { ListQuery, QueueStats, SubmitInput, SweepEvent, SweepQueue, SweepRecord } from '../port.js'
import { decodeValue } from '../shared/trial-codec.js'
import { defaultChunkWorkerEntry, type WorkerEntry } from '../shared/worker-entry.js'
import { ActiveSweep } from './active-sweep.js'
import { SweepEventHub } from './event-hub.js'
import { ChunkScheduler } from './scheduler.js'
import { SweepStore } from './store.js'
import { ChunkThreadPool } from './thread-pool.js'

export interface EmbeddedQueueTuning {
  /**
   * Tries per chunk before a system failure (thread crash, storage error) fails the sweep.
   * @defaultValue 3
   */
  maxAttempts: number
  /**
   * Minimum milliseconds between two progress events of one sweep.
   * @defaultValue 250
   */
  progressIntervalMs: number
  /**
   * How long an Idempotency-Key stays bound to its sweep.
   * @defaultValue 86_400_000 (24 h)
   */
  idempotencyTtlMs: number
  /**
   * How long `close()` waits for running chunks to stop before terminating the threads.
   * @defaultValue 2000
   */
  closeGraceMs: number
}

export interface EmbeddedQueueOptions {
  /** Directory of the SQLite file; created if missing. */
  dataDir: string
  /**
   * Compute threads.
   * @defaultValue os.availableParallelism()
   */
  threads?: number
  logger?: Logger
  tuning?: Partial<EmbeddedQueueTuning>
  /** Per-thread V8 limits: a thread over its heap limit dies alone and its chunk counts as a system failure. */
  resourceLimits?: ResourceLimits
  /**
   * The module compute threads load.
   * @defaultValue the shipped chunk worker (tests substitute fault-injecting wrappers)
   */
  workerEntry?: WorkerEntry
}

const DEFAULT_TUNING: EmbeddedQueueTuning = {
  maxAttempts: 3,
  progressIntervalMs: 250,
  idempotencyTtlMs: 24 * 60 * 60 * 1000,
  closeGraceMs: 2000
}

export async function createEmbeddedQueue (options: EmbeddedQueueOptions): Promise<SweepQueue> {
  const tuning = { ...DEFAULT_TUNING, ...options.tuning }
  const threads = options.threads ?? availableParallelism()
  if (!Number.isInteger(threads) || threads < 1) throw new RangeError(`invalid argument. threads: must be a positive integer. Value: ${threads}.`)
  const logger = options.logger?.child({ component: 'embedded-queue' })
  const store = new SweepStore(options.dataDir)
  const pool = new ChunkThreadPool({
    threads,
    entry: options.workerEntry ?? defaultChunkWorkerEntry(),
    onIdleThreadError: error => logger?.error({ err: error }, 'an idle compute thread failed'),
    ...(options.resourceLimits ? { resourceLimits: options.resourceLimits } : {})
  })
  try {
    await pool.warmUp()
  } catch (error) {
    await pool.destroy()
    store.close()
    throw new Error('The compute threads of the embedded backend could not start.', { cause: error })
  }
  const queue = new EmbeddedQueue(store, pool, tuning, logger)
  queue.resumeInterrupted()
  logger?.info({ dataDir: options.dataDir, threads, database: store.path }, 'embedded queue ready')
  return queue
}

class EmbeddedQueue implements SweepQueue {
  readonly kind = 'embedded' as const
  readonly #store: SweepStore
  readonly #pool: ChunkThreadPool
  readonly #events: SweepEventHub
  readonly #scheduler: ChunkScheduler
  readonly #tuning: EmbeddedQueueTuning
  readonly #logger: Logger | undefined
  #closed: Promise<void> | null = null

  constructor (store: SweepStore, pool: ChunkThreadPool, tuning: EmbeddedQueueTuning, logger: Logger | undefined) {
    this.#store = store
    this.#pool = pool
    this.#tuning = tuning
    this.#logger = logger
    this.#events = new SweepEventHub(tuning.progressIntervalMs, id => this.#snapshot(id), logger)
    this.#scheduler = new ChunkScheduler({
      store,
      pool,
      events: this.#events,
      options: { maxAttempts: tuning.maxAttempts, progressIntervalMs: tuning.progressIntervalMs },
      ...(logger ? { logger } : {})
    })
  }

  /** Picks up every sweep that was queued or running when the process last stopped. */
  resumeInterrupted (): void {
    for (const row of this.#store.activeSweeps()) {
      try {
        const spec = JSON.parse(row.specJson) as NormalisedSpec
        this.#scheduler.add(new ActiveSweep({
          id: row.id,
          ownerKey: row.owner ?? '',
          seq: row.seq,
          spec,
          specHash: row.specHash,
          plan: planChunks(spec),
          doneIndices: this.#store.doneChunkIndices(row.id),
          startedMs: row.startedMs
        }))
        this.#logger?.info({ sweepId: row.id, status: row.status }, 'resuming sweep')
      } catch (error) {
        this.#logger?.error({ err: error, sweepId: row.id }, 'cannot resume sweep')
        this.#store.finishUnsuccessfully(row.id, 'failed', {
          kind: 'system',
          message: 'The sweep could not be resumed after a restart: this version of the service cannot plan its stored spec.'
        }, Date.now())
      }
    }
  }

  async submit (input: SubmitInput): Promise<SweepRecord> {
    this.#assertOpen()
    const spec = input.spec
    const hash = specHash(spec)
    const plan = planChunks(spec)
    const trialsTotal = plan.reduce((sum, chunk) => sum + chunk.count, 0)
    const ownerKey = input.owner ?? ''
    const now = Date.now()
    const outcome = this.#store.transaction(() => {
      if (input.idempotencyKey !== undefined) {
        const bound = this.#store.findIdempotencyKey(ownerKey, input.idempotencyKey, now, this.#tuning.idempotencyTtlMs)
        if (bound !== null) {
          if (bound.specHash !== hash) throw new IdempotencyConflictError(input.idempotencyKey)
          return { id: bound.sweepId, run: false, seq: 0 }
        }
      }
      const id = randomUUID()
      const reusedFrom = input.reuse === true ? this.#store.findReusable(input.owner, hash) : null
      const seq = this.#store.insertSweep({
        id,
        owner: input.owner,
        label: spec.label,
        specHash: hash,
        specJson: JSON.stringify(spec),
        createdMs: now,
        pointsTotal: countPoints(spec),
        trialsTotal,
        chunksTotal: plan.length,
        reusedFrom
      })
      if (input.idempotencyKey !== undefined) this.#store.insertIdempotencyKey(ownerKey, input.idempotencyKey, hash, id, now)
      return { id, run: reusedFrom === null, seq }
    })
    if (outcome.run) {
      this.#scheduler.add(new ActiveSweep({
        id: outcome.id,
        ownerKey,
        seq: outcome.seq,
        // The stored text, parsed: the exact spec a resumed run would see.
        spec: JSON.parse(JSON.stringify(spec)) as NormalisedSpec,
        specHash: hash,
        plan,
        doneIndices: [],
        startedMs: null
      }))
    }
    const record = this.#snapshot(outcome.id)
    if (record === null) throw new Error(`Sweep ${outcome.id} vanished right after it was stored.`)
    return record
  }

  async get (id: string): Promise<SweepRecord | null> {
    this.#assertOpen()
    return this.#snapshot(id)
  }

  async list (query: ListQuery): Promise<{ items: SweepRecord[], nextCursor: string | null }> {
    this.#assertOpen()
    const page = this.#store.list(query)
    return { items: page.items.map(record => this.#withRunningTrials(record)), nextCursor: page.nextCursor }
  }

  async cancel (id: string): Promise<SweepRecord | null> {
    this.#assertOpen()
    const record = this.#store.get(id)
    if (record === null) return null
    if (record.status === 'queued' || record.status === 'running') this.#scheduler.cancel(id)
    return this.#store.get(id)
  }

  async results (id: string): Promise<SweepResult | null> {
    this.#assertOpen()
    const stored = this.#store.resultBody(id)
    return stored === null ? null : decodeValue<SweepResult>(stored.codec, stored.body)
  }

  subscribe (id: string, listener: (event: SweepEvent) => void): () => void {
    return this.#events.subscribe(id, listener)
  }

  async stats (): Promise<QueueStats> {
    this.#assertOpen()
    return { ...this.#store.countByStatus(), ...this.#scheduler.counts() }
  }

  async ready (): Promise<{ ok: boolean, detail?: string }> {
    if (this.#closed !== null) return { ok: false, detail: 'the embedded queue is closed' }
    try {
      this.#store.ping()
      return { ok: true }
    } catch (error) {
      this.#logger?.error({ err: error }, 'readiness check failed')
      return { ok: false, detail: 'the sweep database does not answer' }
    }
  }

  close (): Promise<void> {
    this.#closed ??= this.#shutDown()
    return this.#closed
  }

  async #shutDown (): Promise<void> {
    await this.#scheduler.close(this.#tuning.closeGraceMs)
    this.#events.close()
    await this.#pool.destroy()
    this.#store.close()
    this.#logger?.info('embedded queue closed')
  }

  #snapshot (id: string): SweepRecord | null {
    const record = this.#store.get(id)
    return record === null ? null : this.#withRunningTrials(record)
  }

  /** Adds the trials of chunks still running, so progress moves between chunk commits. */
  #withRunningTrials (record: SweepRecord): SweepRecord {
    if (record.status !== 'running') return record
    const running = this.#scheduler.runningTrials(record.id)
    if (running === 0) return record
    const trialsDone = Math.min(record.progress.trialsTotal, record.progress.trialsDone + running)
    return { ...record, progress: { ...record.progress, trialsDone } }
  }

  #assertOpen (): void {
    if (this.#closed !== null) throw new Error('The embedded queue is closed.')
  }
}
