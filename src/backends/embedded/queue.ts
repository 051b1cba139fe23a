/**
 * The embedded backend, the default when no Redis is configured: sweeps and results in a
 * SQLite file under the data directory, trials on a fixed set of worker threads in this
 * process. Interrupted sweeps resume on the next start, keeping the chunks already stored.
 */
import { randomUUID } from 'node:crypto'
import { availableParallelism } from 'node:os'
import type { Logger } from 'pino'
import type { ResourceLimits } from 'node:worker_threads'
import type { TrialRecord } from '../../engine/index.js'
import { specHash } from '../../spec/index.js'
import type { SweepResult } from '../../results/index.js'
import { CallbackDispatcher, type CallbackDispatcherOptions, type CallbackSender } from '../../sweep/index.js'
import { checkPlan, planSweep, readEncodedResult, readResult, readStoredProgress, readTrials, submitToStore, unresumableFailure, type Annotation, type ListQuery, type SweepPage, type SweepRecord } from '../../sweep/index.js'
import { ActiveSweepCapError, IdempotencyConflictError, StorageUnavailableError } from '../errors.js'
import type { EncodedResult, QueueStats, StoredProgress, SubmitInput, SweepEvent, SweepQueue } from '../port.js'
import { ActiveSweep } from './active-sweep.js'
import { LocalSweepEvents } from './event-hub.js'
import { ChunkScheduler } from './scheduler.js'
import { SqliteSweepStore } from './store.js'
import { ChunkThreadPool } from './thread-pool.js'
import { siblingWorkerEntry, type WorkerEntry } from '../../runtime/worker-entry.js'

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
   * How long an Idempotency-Key stays bound to its sweep, seconds (as on the Redis backend).
   * @defaultValue 86400 (24 h)
   */
  idempotencyTtlSeconds: number
  /**
   * How long `close()` waits for running chunks to stop before terminating the threads.
   * @defaultValue 2000
   */
  closeGraceMs: number
  /**
   * How often the data directory is checked (it may be deleted or replaced under a running service).
   * @defaultValue 5000
   */
  storageCheckMs: number
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
  idempotencyTtlSeconds: 24 * 60 * 60,
  closeGraceMs: 2000,
  storageCheckMs: 5000
}

export async function createEmbeddedQueue (options: EmbeddedQueueOptions): Promise<SweepQueue> {
  const tuning = { ...DEFAULT_TUNING, ...options.tuning }
  const threads = options.threads ?? availableParallelism()
  if (!Number.isInteger(threads) || threads < 1) throw new RangeError(`invalid argument. threads: must be a positive integer. Value: ${threads}.`)
  const logger = options.logger?.child({ component: 'embedded-queue' })
  const store = new SqliteSweepStore(options.dataDir)
  const pool = new ChunkThreadPool({
    threads,
    entry: options.workerEntry ?? siblingWorkerEntry(import.meta.url, 'chunk-worker'),
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
  readonly #store: SqliteSweepStore
  readonly #pool: ChunkThreadPool
  readonly #events: LocalSweepEvents
  readonly #scheduler: ChunkScheduler
  readonly #tuning: EmbeddedQueueTuning
  readonly #logger: Logger | undefined
  readonly #storageCheck: NodeJS.Timeout
  /** What is wrong with the data directory, once noticed; the service needs a restart then. */
  #storageProblem: string | null = null
  #closed: Promise<void> | null = null
  #callbacks: CallbackDispatcher | null = null

  constructor (store: SqliteSweepStore, pool: ChunkThreadPool, tuning: EmbeddedQueueTuning, logger: Logger | undefined) {
    this.#store = store
    this.#pool = pool
    this.#tuning = tuning
    this.#logger = logger
    this.#events = new LocalSweepEvents(tuning.progressIntervalMs, (id) => this.#store.getNow(id), logger)
    this.#scheduler = new ChunkScheduler({
      store,
      pool,
      events: this.#events,
      options: { maxAttempts: tuning.maxAttempts, progressIntervalMs: tuning.progressIntervalMs },
      ...(logger ? { logger } : {})
    })
    this.#storageCheck = setInterval(() => { this.#checkStorage() }, tuning.storageCheckMs)
    this.#storageCheck.unref()
  }

  /**
   * Notices a data directory deleted, replaced or made read-only under the running service:
   * SQLite would go on writing to a file nobody can open again. From then on readiness fails,
   * submissions are refused with 503, no new chunk starts, and a copy of everything stored so
   * far is written back to the data directory, so a restart resumes from it.
   */
  #checkStorage (): string | null {
    if (this.#storageProblem !== null || this.#closed !== null) return this.#storageProblem
    const problem = this.#store.health()
    if (problem === null) return null
    this.#storageProblem = problem
    this.#scheduler.pause()
    this.#logger?.error({ dataDir: this.#store.dataDir, problem }, `STORAGE LOST: ${problem}. New sweeps are refused and no chunk starts; restart the service (with DATA_DIR on a kept, writable directory) to resume`)
    this.#store.rescue().then(
      () => this.#logger?.error({ path: this.#store.path }, 'a copy of the sweep database as it was when the loss was noticed was written back; a restart resumes from it'),
      (error: unknown) => this.#logger?.error({ err: error, path: this.#store.path }, 'the sweep database could not be written back: sweeps stored since the service started may be lost')
    )
    return problem
  }

  /**
   * Picks up every sweep that was queued or running when the process last stopped, with the
   * plan stored at submission: whatever the planning constants of this release, the chunks
   * stored before are the plan's own.
   */
  resumeInterrupted (): void {
    for (const row of this.#store.activeSweeps()) {
      try {
        let plan = row.plan
        if (plan === null) {
          // Stored by a release that did not store plans: plan now, compute every chunk again.
          plan = planSweep(row.spec)
          this.#store.adoptPlan(row.id, plan)
          this.#logger?.warn({ sweepId: row.id }, 'sweep from an earlier release: planned again, its stored chunks are recomputed')
        }
        checkPlan(row.spec, plan)
        this.#activate(row.id)
        this.#logger?.info({ sweepId: row.id, status: row.status }, 'resuming sweep')
      } catch (error) {
        this.#logger?.error({ err: error, sweepId: row.id }, 'cannot resume sweep')
        this.#store.stopNow(row.id, 'failed', unresumableFailure(), Date.now())
      }
    }
  }

  async submit (input: SubmitInput): Promise<SweepRecord> {
    this.#assertOpen()
    const problem = this.#checkStorage()
    if (problem !== null) throw new StorageUnavailableError(problem)
    // The stored text, parsed: the exact spec a resumed run would see.
    const spec = JSON.parse(JSON.stringify(input.spec)) as SubmitInput['spec']
    const hash = specHash(spec)
    const id = randomUUID()
    const outcome = await submitToStore(this.#store, {
      id,
      spec,
      owner: input.owner,
      createdMs: Date.now(),
      reuseFrom: input.reuse === true ? this.#store.findReusable(input.owner, hash) : null,
      ...(input.reusePoints === undefined ? {} : { reusePoints: input.reusePoints }),
      ...(input.idempotencyKey === undefined ? {} : { idempotency: { key: input.idempotencyKey, ttlSeconds: this.#tuning.idempotencyTtlSeconds } }),
      ...(input.maxActive === undefined ? {} : { maxActive: input.maxActive }),
      ...(input.extends === undefined ? {} : { extends: input.extends }),
      ...(input.tags === undefined ? {} : { tags: input.tags }),
      ...(input.notes === undefined ? {} : { notes: input.notes }),
      ...(input.callbackUrl === undefined ? {} : { callbackUrl: input.callbackUrl })
    })
    if (outcome.kind === 'existing') {
      if (outcome.binding.specHash !== hash) throw new IdempotencyConflictError(input.idempotencyKey ?? '')
      return this.#required(outcome.binding.sweepId)
    }
    if (outcome.kind === 'over-cap') throw new ActiveSweepCapError(input.owner, outcome.active, input.maxActive ?? outcome.active)
    if (outcome.status === 'queued') this.#activate(id)
    return this.#required(id)
  }

  async resume (id: string, options: { maxActive?: number } = {}): Promise<SweepRecord | null> {
    this.#assertOpen()
    const problem = this.#checkStorage()
    if (problem !== null) throw new StorageUnavailableError(problem)
    const reopened = await this.#store.reopen(id, Date.now(), options.maxActive)
    if (reopened.overCap !== undefined) throw new ActiveSweepCapError((this.#store.getNow(id))?.owner ?? null, reopened.overCap, options.maxActive ?? reopened.overCap)
    if (reopened.changed) {
      this.#activate(id)
      this.#logger?.info({ sweepId: id }, 'sweep resumed')
    }
    return this.#store.getNow(id)
  }

  async annotate (id: string, patch: Annotation): Promise<SweepRecord | null> {
    this.#assertOpen()
    return await this.#store.annotate(id, patch)
  }

  async purge (id: string): Promise<boolean> {
    this.#assertOpen()
    return await this.#store.purge(id)
  }

  async storedProgress (id: string): Promise<StoredProgress | null> {
    this.#assertOpen()
    return await readStoredProgress(this.#store, id)
  }

  /** Hands a stored queued sweep to the scheduler, with its stored plan, chunks and open points. */
  #activate (id: string): void {
    const record = this.#store.getNow(id)
    const plan = this.#store.planNow(id)
    if (record === null || plan === null) throw new Error(`Sweep ${id} has no stored plan to run.`)
    this.#scheduler.add(new ActiveSweep({
      id,
      ownerKey: record.owner ?? '',
      seq: this.#store.seqOf(id) ?? 0,
      spec: record.spec,
      plan,
      doneIndices: this.#store.doneChunksNow(id),
      openPoints: this.#store.openPointsNow(id),
      startedMs: record.startedAt === null ? null : Date.parse(record.startedAt)
    }))
  }

  async get (id: string): Promise<SweepRecord | null> {
    this.#assertOpen()
    return this.#store.getNow(id)
  }

  async list (query: ListQuery): Promise<SweepPage> {
    this.#assertOpen()
    return await this.#store.list(query)
  }

  async cancel (id: string): Promise<SweepRecord | null> {
    this.#assertOpen()
    const record = this.#store.getNow(id)
    if (record === null) return null
    if (record.status === 'queued' || record.status === 'running') this.#scheduler.cancel(id)
    return this.#store.getNow(id)
  }

  async results (id: string): Promise<SweepResult | null> {
    this.#assertOpen()
    return await readResult(this.#store, id)
  }

  async trials (id: string): Promise<TrialRecord[][] | null> {
    this.#assertOpen()
    return await readTrials(this.#store, id)
  }

  async encodedResult (id: string, options: { trials: boolean }): Promise<EncodedResult | null> {
    this.#assertOpen()
    return await readEncodedResult(this.#store, id, options)
  }

  subscribe (id: string, listener: (event: SweepEvent) => void): () => void {
    return this.#events.subscribe(id, listener)
  }

  async stats (): Promise<QueueStats> {
    this.#assertOpen()
    return { ...this.#store.countsNow(), ...this.#scheduler.counts() }
  }

  async ready (): Promise<{ ok: boolean, detail?: string }> {
    if (this.#closed !== null) return { ok: false, detail: 'the embedded queue is closed' }
    if (this.#checkStorage() !== null) return { ok: false, detail: 'the sweep storage is unavailable (the service log names the cause)' }
    try {
      this.#store.ping()
      return { ok: true }
    } catch (error) {
      this.#logger?.error({ err: error }, 'readiness check failed')
      return { ok: false, detail: 'the sweep database does not answer' }
    }
  }

  startCallbacks (send: CallbackSender, options: CallbackDispatcherOptions = {}): void {
    this.#assertOpen()
    if (this.#callbacks !== null) return
    this.#callbacks = new CallbackDispatcher(this.#store, send, options)
    this.#callbacks.start()
  }

  close (): Promise<void> {
    this.#closed ??= this.#shutDown()
    return this.#closed
  }

  async #shutDown (): Promise<void> {
    await this.#callbacks?.stop()
    clearInterval(this.#storageCheck)
    await this.#scheduler.close(this.#tuning.closeGraceMs)
    this.#events.close()
    await this.#pool.destroy()
    this.#store.close()
    this.#logger?.info('embedded queue closed')
  }

  #required (id: string): SweepRecord {
    const record = this.#store.getNow(id)
    if (record === null) throw new Error(`Sweep ${id} vanished right after it was stored.`)
    return record
  }

  #assertOpen (): void {
    if (this.#closed !== null) throw new Error('The embedded queue is closed.')
  }
}
