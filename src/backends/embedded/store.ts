/**
 * The embedded backend's implementation of the lifecycle's store contract
 * (src/sweep/store.ts): one SQLite file in the data directory, in WAL mode. Every state
 * change is one transaction, so a crash leaves either the old state or the new one; a
 * finished chunk is stored together with the progress it adds.
 *
 * Progress of running attempts is reported often and lives in this object's memory; the
 * record keeps its high-water mark (trials_done only ever grows), so a restart never shows
 * less progress than was shown before it.
 */
import { accessSync, constants, existsSync, mkdirSync, statSync } from 'node:fs'
import { join } from 'node:path'
import Database from 'better-sqlite3'
import type { NormalisedSpec } from '../../spec/index.js'
import {
  ANY_OWNER, chunksPerPoint, CODEC_NAME, decodePlan, encodePlan, isTerminal, SWEEP_STATUSES, trialsEnd,
  type Annotation, type Chunk, type ChunkOutcome, type CreateOptions, type CreateOutcome, type ListQuery, type StoredChunk, type StoredRange,
  type SweepDraft, type SweepFailure, type SweepPage, type SweepPlan, type SweepRecord, type SweepStatus, type SweepStore, type Transition,
  type CallbackDelivery, type CallbackSettlement, type CallbackState
} from '../../sweep/index.js'
import { decodeCursor, encodeCursor } from './cursor.js'
import { migrate } from './schema.js'

export const DATABASE_FILE = 'memsweep.sqlite'

/** Reuse keys looked up per query: SQLite limits the number of bound parameters. */
const KEYS_PER_QUERY = 400

interface SweepRow {
  seq: number
  id: string
  owner: string | null
  label: string | null
  spec_hash: string
  spec_json: string
  plan_json: string | null
  status: SweepStatus
  created_ms: number
  started_ms: number | null
  finished_ms: number | null
  points_total: number
  trials_total: number
  chunks_total: number
  points_done: number
  trials_done: number
  chunks_done: number
  error_kind: SweepFailure['kind'] | null
  error_message: string | null
  reused_from: string | null
  extends: string | null
  tags_json: string
  notes: string | null
  replicate_key: string
  reused_points: number
  reused_trials: number
  open_points_json: string
  callback_url: string | null
  callback_state: CallbackState | null
  callback_attempts: number | null
  callback_error: string | null
}

/** An active sweep as stored: what the scheduler needs to pick it up after a restart. */
export interface ActiveSweepRow {
  id: string
  owner: string | null
  seq: number
  status: 'queued' | 'running'
  spec: NormalisedSpec
  specHash: string
  /** Null for a sweep stored by a release before plans were stored. */
  plan: SweepPlan | null
  startedMs: number | null
}

/** A plan and its per-point chunk counts, kept while a sweep is active. */
interface PlanView {
  plan: SweepPlan
  perPoint: Map<number, number>
}

export class SqliteSweepStore implements SweepStore {
  readonly path: string
  readonly dataDir: string
  readonly #db: Database.Database
  /** The database file as opened: if the path later names another file (or none), writes go nowhere lasting. */
  readonly #identity: { dev: number, ino: number }
  readonly #statements: ReturnType<typeof prepareStatements>
  /** sweep id → chunk index → most trials any running attempt reported (until the chunk is stored). */
  readonly #partials = new Map<string, Map<number, number>>()
  readonly #plans = new Map<string, PlanView>()

  /**
   * @throws {Error} naming the data directory when it cannot be created, opened or written,
   *   or when another memsweep process holds it.
   */
  constructor (dataDir: string) {
    try {
      mkdirSync(dataDir, { recursive: true })
    } catch (error) {
      throw new Error(`The data directory ${dataDir} cannot be created (${(error as NodeJS.ErrnoException).code ?? 'error'}); set DATA_DIR to a writable directory.`, { cause: error })
    }
    this.dataDir = dataDir
    this.path = join(dataDir, DATABASE_FILE)
    let db: Database.Database
    try {
      db = new Database(this.path, { timeout: 2000 })
    } catch (error) {
      throw new Error(`The sweep database ${this.path} cannot be opened (${(error as { code?: string }).code ?? 'error'}); check that DATA_DIR is a writable directory.`, { cause: error })
    }
    this.#db = db
    try {
      db.pragma('journal_mode = WAL')
      // A committed chunk must survive power loss too; commits are seconds apart, so cheap.
      db.pragma('synchronous = FULL')
      db.pragma('foreign_keys = ON')
      // Two processes resuming the same sweeps would run them twice: one owner per directory.
      db.pragma('locking_mode = EXCLUSIVE')
      migrate(db)
    } catch (error) {
      db.close()
      if (error instanceof Database.SqliteError && error.code === 'SQLITE_BUSY') {
        throw new Error(`The data directory ${dataDir} is in use by another memsweep process.`, { cause: error })
      }
      if (error instanceof Database.SqliteError && /READONLY|CANTOPEN|IOERR/.test(error.code)) {
        throw new Error(`The sweep database ${this.path} cannot be written (${error.code}); check that DATA_DIR is a writable directory.`, { cause: error })
      }
      throw error
    }
    this.#statements = prepareStatements(db)
    const opened = statSync(this.path)
    this.#identity = { dev: opened.dev, ino: opened.ino }
  }

  /**
   * Null while the data directory and the database file are the ones opened and the
   * directory is writable; otherwise what is wrong, naming the path. (SQLite keeps writing
   * to a deleted file without an error: only this check notices that nothing would last.)
   */
  health (): string | null {
    if (!existsSync(this.dataDir)) return `the data directory ${this.dataDir} no longer exists`
    let current
    try {
      current = statSync(this.path)
    } catch {
      return `the sweep database ${this.path} was deleted while the service ran`
    }
    if (current.dev !== this.#identity.dev || current.ino !== this.#identity.ino) return `the sweep database ${this.path} was replaced by another file while the service ran`
    try {
      accessSync(this.dataDir, constants.W_OK)
    } catch {
      return `the data directory ${this.dataDir} is no longer writable`
    }
    return null
  }

  /**
   * Writes a copy of the open database to its own path (re-creating the directory if
   * needed), so that a restart resumes from everything stored until now.
   */
  async rescue (): Promise<void> {
    mkdirSync(this.dataDir, { recursive: true })
    await this.#db.backup(this.path)
  }

  ping (): void {
    this.#db.prepare('SELECT 1').get()
  }

  close (): void {
    if (this.#db.open) this.#db.close()
  }

  async create (draft: SweepDraft, options: CreateOptions = {}): Promise<CreateOutcome> {
    return this.createNow(draft, options)
  }

  /** `create`, synchronously (the embedded queue submits inside its own event-loop turn). */
  createNow (draft: SweepDraft, options: CreateOptions = {}): CreateOutcome {
    const ownerKey = draft.owner ?? ''
    return this.#db.transaction((): CreateOutcome => {
      if (options.idempotency !== undefined) {
        this.#statements.purgeIdempotency.run(draft.createdMs - options.idempotency.ttlSeconds * 1000)
        const bound = this.#statements.getIdempotency.get(ownerKey, options.idempotency.key) as { spec_hash: string, sweep_id: string } | undefined
        if (bound !== undefined) return { kind: 'existing', binding: { specHash: bound.spec_hash, sweepId: bound.sweep_id } }
      }
      const reusedFrom = options.reuseFrom ?? null
      if (reusedFrom === null && options.maxActive !== undefined) {
        const active = this.#countActive(draft.owner)
        if (active >= options.maxActive) return { kind: 'over-cap', active }
      }
      const done = reusedFrom !== null
      // A reuse takes the original's plan with its data, so the two always match.
      const plan = done ? (this.#planView(reusedFrom)?.plan ?? draft.plan) : draft.plan
      const trialsTotal = plan.chunks.reduce((sum, chunk) => sum + chunk.count, 0)
      const points = chunksPerPoint(plan.chunks).size
      this.#statements.insertSweep.run({
        id: draft.id,
        owner: draft.owner,
        label: draft.label,
        spec_hash: draft.specHash,
        spec_json: JSON.stringify(draft.spec),
        plan_json: encodePlan(plan),
        status: done ? 'succeeded' : 'queued',
        created_ms: draft.createdMs,
        started_ms: done ? draft.createdMs : null,
        finished_ms: done ? draft.createdMs : null,
        points_total: points,
        trials_total: trialsTotal,
        chunks_total: plan.chunks.length,
        points_done: done ? points : 0,
        trials_done: done ? trialsTotal : 0,
        chunks_done: done ? plan.chunks.length : 0,
        reused_from: reusedFrom,
        extends: draft.extends ?? null,
        tags_json: JSON.stringify(draft.tags ?? []),
        notes: draft.notes ?? null,
        replicate_key: draft.replicateKey,
        reused_points: done ? points : 0,
        reused_trials: done ? trialsTotal : 0,
        open_points_json: JSON.stringify(done ? [] : draft.openPoints ?? []),
        reuse_points: draft.reusePoints === false ? 0 : 1
      })
      if (done) {
        // Its own copy of the data: either sweep can be removed without the other losing anything.
        this.#statements.copyResult.run(draft.id, draft.createdMs, reusedFrom)
        this.#statements.copyChunks.run(draft.id, draft.createdMs, reusedFrom)
      }
      if (draft.callbackUrl !== undefined && draft.callbackUrl !== null) {
        this.#statements.insertCallback.run(draft.id, draft.callbackUrl)
        if (done) this.#statements.armCallback.run({ id: draft.id, status: 'succeeded', now: draft.createdMs })
      }
      draft.reuseKeys.forEach((key, point) => this.#statements.insertPointKey.run(draft.id, point, draft.owner, key))
      if (options.idempotency !== undefined) {
        this.#statements.insertIdempotency.run(ownerKey, options.idempotency.key, draft.specHash, draft.id, draft.createdMs)
      }
      return { kind: 'created', status: done ? 'succeeded' : 'queued' }
    })()
  }

  async get (id: string): Promise<SweepRecord | null> {
    return this.getNow(id)
  }

  getNow (id: string): SweepRecord | null {
    const row = this.#statements.getSweep.get(id) as SweepRow | undefined
    return row === undefined ? null : this.#toRecord(row)
  }

  /** The insertion sequence of a sweep (its place in first-in, first-out order). */
  seqOf (id: string): number | null {
    const row = this.#statements.getSweep.get(id) as SweepRow | undefined
    return row?.seq ?? null
  }

  async list (query: ListQuery): Promise<SweepPage> {
    const after = query.cursor === undefined ? null : decodeCursor(query.cursor)
    const anyOwner = query.owner === ANY_OWNER
    const rows = this.#statements.list.all({
      owner: anyOwner ? null : query.owner,
      any_owner: anyOwner ? 1 : 0,
      status: query.status ?? null,
      tag: query.tag ?? null,
      text: query.text === undefined ? null : `%${query.text.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`,
      replicate_key: query.replicateKey ?? null,
      after_created: after?.createdMs ?? null,
      after_seq: after?.seq ?? null,
      limit: query.limit + 1
    }) as SweepRow[]
    const page = rows.slice(0, query.limit)
    const last = page.at(-1)
    const nextCursor = rows.length > query.limit && last !== undefined
      ? encodeCursor({ createdMs: last.created_ms, seq: last.seq })
      : null
    return { items: page.map((row) => this.#toRecord(row)), nextCursor }
  }

  async countActive (owner: string | null): Promise<number> {
    return this.#countActive(owner)
  }

  /** The original (never itself a reuse) of the newest succeeded sweep of this owner with this hash. */
  findReusable (owner: string | null, specHash: string): string | null {
    const row = this.#statements.findReusable.get(owner, specHash) as { id: string } | undefined
    return row?.id ?? null
  }

  async plan (id: string): Promise<SweepPlan | null> {
    return this.planNow(id)
  }

  planNow (id: string): SweepPlan | null {
    return this.#planView(id)?.plan ?? null
  }

  openPointsNow (id: string): number[] {
    return this.#openPoints(id)
  }

  activeSweeps (): ActiveSweepRow[] {
    const rows = this.#statements.active.all() as SweepRow[]
    return rows.map((row) => ({
      id: row.id,
      owner: row.owner,
      seq: row.seq,
      status: row.status as ActiveSweepRow['status'],
      spec: JSON.parse(row.spec_json) as NormalisedSpec,
      specHash: row.spec_hash,
      plan: row.plan_json === null ? null : decodePlan(row.plan_json),
      startedMs: row.started_ms
    }))
  }

  /**
   * Gives a sweep stored before plans were stored a plan made now. Its stored chunks were
   * cut by an unknown plan, so they are dropped and computed again (results are the same:
   * every trial draws from its own stream).
   */
  adoptPlan (id: string, plan: SweepPlan): void {
    this.#db.transaction(() => {
      this.#statements.deleteChunks.run(id)
      this.#statements.adoptPlan.run({
        id,
        plan_json: encodePlan(plan),
        points_total: chunksPerPoint(plan.chunks).size,
        trials_total: plan.chunks.reduce((sum, chunk) => sum + chunk.count, 0),
        chunks_total: plan.chunks.length
      })
    })()
    this.#plans.delete(id)
  }

  async doneChunks (id: string): Promise<number[]> {
    return this.doneChunksNow(id)
  }

  doneChunksNow (id: string): number[] {
    return (this.#statements.doneChunks.all(id) as Array<{ chunk_index: number }>).map((row) => row.chunk_index)
  }

  async markRunning (id: string, nowMs: number): Promise<SweepStatus | null> {
    this.#statements.markRunning.run(nowMs, id)
    return this.#status(id)
  }

  async reportProgress (id: string, chunkIndex: number, trialsDone: number, nowMs: number): Promise<SweepStatus | null> {
    const status = this.#status(id)
    if (status !== 'running' && status !== 'queued') return status
    if (status === 'queued') this.#statements.markRunning.run(nowMs, id)
    if (this.#statements.chunkExists.get(id, chunkIndex) !== undefined) return 'running'
    const view = this.#planView(id)
    const chunk = view?.plan.chunks[chunkIndex]
    if (chunk === undefined) return 'running'
    let partial = this.#partials.get(id)
    if (partial === undefined) this.#partials.set(id, partial = new Map())
    const before = partial.get(chunkIndex) ?? 0
    const now = Math.min(chunk.count, Math.max(0, Math.floor(trialsDone)))
    if (now > before) {
      partial.set(chunkIndex, now)
      this.#raiseHighWater(id)
    }
    return 'running'
  }

  async recordChunk (id: string, chunk: Chunk, body: Uint8Array, computeMs: number, nowMs: number): Promise<ChunkOutcome> {
    return this.recordChunkNow(id, chunk, body, computeMs, nowMs)
  }

  /**
   * @throws {RangeError} when the chunk is not the stored plan's chunk at its index.
   */
  recordChunkNow (id: string, chunk: Chunk, body: Uint8Array, computeMs: number, nowMs: number): ChunkOutcome {
    return this.#storeChunk(id, chunk, nowMs, () => {
      this.#statements.upsertChunk.run({
        sweep_id: id,
        chunk_index: chunk.index,
        point: chunk.point,
        first_trial: chunk.firstTrial,
        trials: chunk.count,
        compute_ms: computeMs,
        codec: CODEC_NAME,
        body,
        finished_ms: nowMs
      })
      return true
    })
  }

  async inheritChunk (id: string, chunk: Chunk, from: { sweepId: string, chunkIndex: number }, nowMs: number): Promise<ChunkOutcome> {
    return this.#storeChunk(id, chunk, nowMs, () => {
      if (this.#statements.chunkExists.get(id, chunk.index) !== undefined) return true
      return this.#statements.inheritChunk.run({
        sweep_id: id,
        chunk_index: chunk.index,
        point: chunk.point,
        first_trial: chunk.firstTrial,
        trials: chunk.count,
        finished_ms: nowMs,
        from_sweep: from.sweepId,
        from_chunk: from.chunkIndex
      }).changes === 1
    })
  }

  /**
   * Stores a chunk of the plan (its row written by `write`, which answers whether a row is
   * there now) and adds what it completes, in one transaction.
   */
  #storeChunk (id: string, chunk: Chunk, nowMs: number, write: () => boolean): ChunkOutcome {
    return this.#db.transaction((): ChunkOutcome => {
      const status = this.#status(id)
      if (status === null) return { status: '', stored: false, complete: false, pointDue: false }
      if (isTerminal(status)) return { status, stored: false, complete: false, pointDue: false }
      const view = this.#planView(id)
      const planned = view?.plan.chunks[chunk.index]
      if (view === undefined || planned === undefined || planned.point !== chunk.point || planned.firstTrial !== chunk.firstTrial || planned.count !== chunk.count) {
        throw new RangeError(`invalid argument. Chunk ${JSON.stringify(chunk)} is not in the stored plan of sweep ${id}.`)
      }
      if (status === 'queued') this.#statements.markRunning.run(nowMs, id)
      const isNew = this.#statements.chunkExists.get(id, chunk.index) === undefined
      if (!write()) return { status: 'running', stored: false, complete: false, pointDue: false }
      const storedOfPoint = (this.#statements.chunksOfPoint.get(id, chunk.point) as { n: number }).n
      const pointStored = storedOfPoint === view.perPoint.get(chunk.point)
      const open = this.#openPoints(id).includes(chunk.point)
      if (isNew) {
        this.#statements.addChunk.run({ id, points: pointStored && !open ? 1 : 0 })
        this.#partials.get(id)?.delete(chunk.index)
      }
      this.#raiseHighWater(id)
      // Due whenever the open point's planned chunks are all stored, a repeat included: a decision lost in a crash is asked again.
      return { status: 'running', stored: isNew, complete: this.#complete(id), pointDue: pointStored && open }
    })()
  }

  async storedChunks (id: string): Promise<{ chunks: StoredChunk[], computeMs: number }> {
    return this.storedChunksNow(id)
  }

  async chunksBetween (id: string, from: number, count: number): Promise<StoredChunk[]> {
    const rows = this.#statements.chunkBodiesBetween.all(this.#dataOwner(id), from, from + count) as Array<{ chunk_index: number, codec: string, body: Uint8Array }>
    for (const row of rows) if (row.codec !== CODEC_NAME) throw new Error(`Unknown chunk codec '${row.codec}'.`)
    return rows.map((row) => ({ index: row.chunk_index, body: row.body }))
  }

  async trialsPlan (id: string): Promise<SweepPlan | null> {
    return await this.plan(this.#dataOwner(id))
  }

  storedChunksNow (id: string): { chunks: StoredChunk[], computeMs: number } {
    const rows = this.#statements.chunkBodies.all(this.#dataOwner(id)) as Array<{ chunk_index: number, codec: string, body: Uint8Array, compute_ms: number }>
    let computeMs = 0
    for (const row of rows) {
      if (row.codec !== CODEC_NAME) throw new Error(`Unknown chunk codec '${row.codec}'.`)
      computeMs += row.compute_ms
    }
    return { chunks: rows.map((row) => ({ index: row.chunk_index, body: row.body })), computeMs }
  }

  async succeed (id: string, resultBody: Uint8Array, nowMs: number): Promise<Transition> {
    return this.succeedNow(id, resultBody, nowMs)
  }

  /** @throws {Error} when some chunk of the plan is not stored or some point is open. */
  succeedNow (id: string, resultBody: Uint8Array, nowMs: number): Transition {
    return this.#db.transaction((): Transition => {
      const status = this.#status(id)
      if (status === null) return { changed: false, status: '' }
      if (isTerminal(status)) return { changed: false, status }
      if (!this.#complete(id)) throw new Error(`Sweep ${id} is not complete: cannot store its result.`)
      this.#statements.markSucceeded.run(nowMs, nowMs, id)
      this.#statements.insertResult.run(id, CODEC_NAME, resultBody, nowMs)
      this.#statements.armCallback.run({ id, status: 'succeeded', now: nowMs })
      this.#forget(id)
      return { changed: true, status: 'succeeded' }
    })()
  }

  async stop (id: string, to: 'failed' | 'canceled', failure: SweepFailure | null, nowMs: number): Promise<Transition> {
    return this.stopNow(id, to, failure, nowMs)
  }

  /** Ends an active sweep; its stored chunks stay (partial results, resume). */
  stopNow (id: string, to: 'failed' | 'canceled', failure: SweepFailure | null, nowMs: number): Transition {
    const changes = this.#db.transaction((): number => {
      const changed = this.#statements.markStopped.run({
        id,
        status: to,
        finished_ms: nowMs,
        error_kind: failure?.kind ?? null,
        error_message: failure?.message ?? null
      }).changes
      if (changed === 1) this.#statements.armCallback.run({ id, status: to, now: nowMs })
      return changed
    })()
    if (changes === 1) {
      this.#forget(id)
      return { changed: true, status: to }
    }
    return { changed: false, status: this.#status(id) ?? '' }
  }

  async reopen (id: string, _nowMs: number, maxActive?: number): Promise<Transition & { overCap?: number }> {
    return this.#db.transaction((): Transition & { overCap?: number } => {
      const row = this.#statements.getSweep.get(id) as SweepRow | undefined
      if (row === undefined) return { changed: false, status: '' }
      if (row.status !== 'canceled' && row.status !== 'failed') return { changed: false, status: row.status }
      if (maxActive !== undefined) {
        const active = this.#countActive(row.owner)
        if (active >= maxActive) return { changed: false, status: row.status, overCap: active }
      }
      this.#statements.reopen.run(id)
      this.#statements.rewaitCallback.run(id)
      return { changed: true, status: 'queued' }
    })()
  }

  async resultBody (id: string): Promise<Uint8Array | null> {
    const row = this.#statements.resultFor.get(id, id) as { codec: string, body: Uint8Array } | undefined
    if (row === undefined) return null
    if (row.codec !== CODEC_NAME) throw new Error(`Unknown result codec '${row.codec}'.`)
    return row.body
  }

  async counts (): Promise<Record<SweepStatus, number>> {
    return this.countsNow()
  }

  countsNow (): Record<SweepStatus, number> {
    const counts = Object.fromEntries(SWEEP_STATUSES.map((status) => [status, 0])) as Record<SweepStatus, number>
    for (const row of this.#statements.countByStatus.all() as Array<{ status: SweepStatus, n: number }>) counts[row.status] = row.n
    return counts
  }

  async annotate (id: string, patch: Annotation): Promise<SweepRecord | null> {
    this.#statements.annotate.run({
      id,
      set_label: patch.label === undefined ? 0 : 1,
      label: patch.label ?? null,
      set_tags: patch.tags === undefined ? 0 : 1,
      tags_json: JSON.stringify(patch.tags ?? []),
      set_notes: patch.notes === undefined ? 0 : 1,
      notes: patch.notes ?? null
    })
    return this.getNow(id)
  }

  async recordReuse (id: string, reused: { points: number, trials: number }): Promise<void> {
    this.#statements.recordReuse.run(reused.points, reused.trials, id)
  }

  async reusesPoints (id: string): Promise<boolean> {
    const row = this.#statements.reusesPoints.get(id) as { reuse_points: number } | undefined
    return row !== undefined && row.reuse_points === 1
  }

  async purge (id: string): Promise<boolean> {
    return this.#db.transaction((): boolean => {
      const status = this.#status(id)
      if (status === null || !isTerminal(status)) return false
      // Sweeps stored by an earlier release that read this one's data get their own copy first.
      for (const { id: reuser } of this.#statements.reusersOf.all(id) as Array<{ id: string }>) {
        if (this.#statements.resultOwn.get(reuser) === undefined) {
          this.#statements.copyResult.run(reuser, Date.now(), id)
          this.#statements.copyChunks.run(reuser, Date.now(), id)
        }
      }
      this.#statements.unlinkReusers.run(id)
      for (const statement of [this.#statements.deleteChunks, this.#statements.deleteResult, this.#statements.deletePointKeys, this.#statements.deleteIdempotency, this.#statements.deleteCallback, this.#statements.deleteSweep]) {
        statement.run(id)
      }
      this.#forget(id)
      return true
    })()
  }

  async claimCallbacks (nowMs: number, leaseMs: number, limit: number): Promise<CallbackDelivery[]> {
    return this.#db.transaction((): CallbackDelivery[] => {
      const rows = this.#statements.dueCallbacks.all(nowMs, limit) as Array<{
        sweep_id: string, owner: string | null, url: string, generation: number, event_status: CallbackDelivery['status'], finished_ms: number, attempts: number
      }>
      for (const row of rows) this.#statements.leaseCallback.run(nowMs + leaseMs, row.sweep_id)
      return rows.map((row) => ({
        sweepId: row.sweep_id, owner: row.owner, url: row.url, generation: row.generation, status: row.event_status, finishedMs: row.finished_ms, attempts: row.attempts
      }))
    })()
  }

  async settleCallback (sweepId: string, generation: number, settlement: CallbackSettlement): Promise<void> {
    if (settlement.delivered) {
      this.#statements.settleCallback.run({ id: sweepId, generation, state: 'delivered', error: null, due: null })
      return
    }
    this.#statements.settleCallback.run({
      id: sweepId, generation, state: settlement.retryAtMs === null ? 'failed' : 'pending', error: settlement.error, due: settlement.retryAtMs
    })
  }

  async storedRanges (owner: string | null, reuseKeys: readonly string[]): Promise<Map<string, StoredRange[]>> {
    const ranges = new Map<string, StoredRange[]>()
    const unique = [...new Set(reuseKeys)]
    for (let first = 0; first < unique.length; first += KEYS_PER_QUERY) {
      const keys = unique.slice(first, first + KEYS_PER_QUERY)
      const rows = this.#db.prepare(`
        SELECT k.reuse_key, c.sweep_id, c.chunk_index, c.first_trial, c.trials FROM point_keys k
        JOIN chunk_results c ON c.sweep_id = k.sweep_id AND c.point = k.point
        WHERE k.owner IS ? AND c.first_trial IS NOT NULL AND k.reuse_key IN (${keys.map(() => '?').join(', ')})
        ORDER BY c.sweep_id, c.chunk_index`).all(owner, ...keys) as Array<{ reuse_key: string, sweep_id: string, chunk_index: number, first_trial: number, trials: number }>
      for (const row of rows) {
        let list = ranges.get(row.reuse_key)
        if (list === undefined) ranges.set(row.reuse_key, list = [])
        list.push({ sweepId: row.sweep_id, chunkIndex: row.chunk_index, firstTrial: row.first_trial, count: row.trials })
      }
    }
    return ranges
  }

  async extendPoint (id: string, point: number, fromTrial: number, pieces: ReadonlyArray<{ firstTrial: number, count: number }>): Promise<Chunk[] | null> {
    return this.#db.transaction((): Chunk[] | null => {
      const status = this.#status(id)
      if (status === null || isTerminal(status) || !this.#openPoints(id).includes(point)) return null
      const view = this.#planView(id)
      if (view === undefined) return null
      const extent = trialsEnd(view.plan.chunks.filter((chunk) => chunk.point === point))
      if (extent !== fromTrial || pieces.length === 0) return null
      const appended = pieces.map((piece, k): Chunk => ({ index: view.plan.chunks.length + k, point, firstTrial: piece.firstTrial, count: piece.count }))
      const plan: SweepPlan = { version: view.plan.version, chunks: [...view.plan.chunks, ...appended] }
      this.#statements.replacePlan.run({
        id,
        plan_json: encodePlan(plan),
        trials: appended.reduce((sum, chunk) => sum + chunk.count, 0),
        chunks: appended.length
      })
      this.#plans.delete(id)
      return appended
    })()
  }

  async closePoint (id: string, point: number): Promise<{ closed: boolean, complete: boolean }> {
    return this.closePointNow(id, point)
  }

  closePointNow (id: string, point: number): { closed: boolean, complete: boolean } {
    return this.#db.transaction(() => {
      const open = this.#openPoints(id)
      const status = this.#status(id)
      if (status === null || isTerminal(status) || !open.includes(point)) return { closed: false, complete: false }
      this.#statements.setOpenPoints.run(JSON.stringify(open.filter((p) => p !== point)), id)
      const view = this.#planView(id)
      const storedOfPoint = (this.#statements.chunksOfPoint.get(id, point) as { n: number }).n
      if (view !== undefined && storedOfPoint === view.perPoint.get(point)) this.#statements.addPoint.run(id)
      return { closed: true, complete: this.#complete(id) }
    })()
  }

  async openPoints (id: string): Promise<number[]> {
    return this.#openPoints(id)
  }

  #openPoints (id: string): number[] {
    const row = this.#statements.openPoints.get(id) as { open_points_json: string } | undefined
    return row === undefined ? [] : JSON.parse(row.open_points_json) as number[]
  }

  #complete (id: string): boolean {
    const counters = this.#statements.counters.get(id) as { chunks_done: number, chunks_total: number, open_points_json: string } | undefined
    return counters !== undefined && counters.chunks_done === counters.chunks_total && counters.open_points_json === '[]'
  }

  #countActive (owner: string | null): number {
    return (this.#statements.countActive.get(owner) as { n: number }).n
  }

  #status (id: string): SweepStatus | null {
    const row = this.#statements.status.get(id) as { status: SweepStatus } | undefined
    return row?.status ?? null
  }

  /** The sweep whose rows hold this sweep's data: itself, or for a reuse stored by an earlier release (no copy of its own), its original. */
  #dataOwner (id: string): string {
    const row = this.#statements.reusedFrom.get(id) as { reused_from: string | null } | undefined
    if (row?.reused_from == null || this.#statements.resultOwn.get(id) !== undefined) return id
    return row.reused_from
  }

  #planView (id: string): PlanView | undefined {
    let view = this.#plans.get(id)
    if (view === undefined) {
      const row = this.#statements.planOf.get(id) as { plan_json: string | null, status: SweepStatus } | undefined
      if (row === undefined || row.plan_json === null) return undefined
      const plan = decodePlan(row.plan_json)
      view = { plan, perPoint: chunksPerPoint(plan.chunks) }
      // Only active sweeps are asked for their plan often; finished ones are read once.
      if (!isTerminal(row.status)) this.#plans.set(id, view)
    }
    return view
  }

  /** trials_done = max(trials_done, stored trials + reported partial trials). */
  #raiseHighWater (id: string): void {
    let partial = 0
    for (const trials of this.#partials.get(id)?.values() ?? []) partial += trials
    this.#statements.raiseTrials.run({ id, partial })
  }

  #forget (id: string): void {
    this.#partials.delete(id)
    this.#plans.delete(id)
  }

  #toRecord (row: SweepRow): SweepRecord {
    return {
      id: row.id,
      owner: row.owner,
      label: row.label,
      specHash: row.spec_hash,
      spec: JSON.parse(row.spec_json) as NormalisedSpec,
      status: row.status,
      createdAt: isoTime(row.created_ms),
      startedAt: row.started_ms === null ? null : isoTime(row.started_ms),
      finishedAt: row.finished_ms === null ? null : isoTime(row.finished_ms),
      progress: {
        pointsDone: row.points_done,
        pointsTotal: row.points_total,
        trialsDone: row.trials_done,
        trialsTotal: row.trials_total,
        chunksDone: row.chunks_done,
        chunksTotal: row.chunks_total
      },
      error: row.error_kind === null ? null : { kind: row.error_kind, message: row.error_message ?? '' },
      reusedFrom: row.reused_from,
      extends: row.extends,
      reused: { points: row.reused_points, trials: row.reused_trials },
      tags: JSON.parse(row.tags_json) as string[],
      notes: row.notes,
      replicateKey: row.replicate_key,
      callback: row.callback_url === null || row.callback_url === undefined
        ? null
        : { url: row.callback_url, state: row.callback_state ?? 'waiting', attempts: row.callback_attempts ?? 0, lastError: row.callback_error }
    }
  }
}

/** A sweep row with its callback's columns (NULL when it has none). */
const SWEEP_WITH_CALLBACK = `
  SELECT s.*, c.url AS callback_url, c.state AS callback_state, c.attempts AS callback_attempts, c.last_error AS callback_error
  FROM sweeps s LEFT JOIN sweep_callbacks c ON c.sweep_id = s.id`

function prepareStatements (db: Database.Database) {
  return {
    insertSweep: db.prepare(`
      INSERT INTO sweeps (id, owner, label, spec_hash, spec_json, plan_json, status, created_ms, started_ms, finished_ms,
        points_total, trials_total, chunks_total, points_done, trials_done, chunks_done, reused_from,
        extends, tags_json, notes, replicate_key, reused_points, reused_trials, open_points_json, reuse_points)
      VALUES (@id, @owner, @label, @spec_hash, @spec_json, @plan_json, @status, @created_ms, @started_ms, @finished_ms,
        @points_total, @trials_total, @chunks_total, @points_done, @trials_done, @chunks_done, @reused_from,
        @extends, @tags_json, @notes, @replicate_key, @reused_points, @reused_trials, @open_points_json, @reuse_points)`),
    reusesPoints: db.prepare('SELECT reuse_points FROM sweeps WHERE id = ?'),
    getSweep: db.prepare(`${SWEEP_WITH_CALLBACK} WHERE s.id = ?`),
    insertCallback: db.prepare('INSERT INTO sweep_callbacks (sweep_id, url) VALUES (?, ?)'),
    armCallback: db.prepare(`
      UPDATE sweep_callbacks SET state = 'pending', attempts = 0, last_error = NULL, generation = generation + 1,
        event_status = @status, finished_ms = @now, due_ms = @now
      WHERE sweep_id = @id`),
    dueCallbacks: db.prepare(`
      SELECT c.sweep_id, s.owner, c.url, c.generation, c.event_status, c.finished_ms, c.attempts
      FROM sweep_callbacks c JOIN sweeps s ON s.id = c.sweep_id
      WHERE c.state = 'pending' AND c.due_ms <= ? ORDER BY c.due_ms LIMIT ?`),
    leaseCallback: db.prepare('UPDATE sweep_callbacks SET due_ms = ? WHERE sweep_id = ?'),
    settleCallback: db.prepare(`
      UPDATE sweep_callbacks SET state = @state, attempts = attempts + 1, last_error = @error, due_ms = @due
      WHERE sweep_id = @id AND generation = @generation AND state = 'pending'`),
    deleteCallback: db.prepare('DELETE FROM sweep_callbacks WHERE sweep_id = ?'),
    // A resumed sweep waits for its next end; an event of the last one still due is sent all the same.
    rewaitCallback: db.prepare("UPDATE sweep_callbacks SET state = 'waiting' WHERE sweep_id = ? AND state <> 'pending'"),
    status: db.prepare('SELECT status FROM sweeps WHERE id = ?'),
    planOf: db.prepare('SELECT plan_json, status FROM sweeps WHERE id = ?'),
    openPoints: db.prepare('SELECT open_points_json FROM sweeps WHERE id = ?'),
    setOpenPoints: db.prepare('UPDATE sweeps SET open_points_json = ? WHERE id = ?'),
    reusedFrom: db.prepare('SELECT reused_from FROM sweeps WHERE id = ?'),
    // Newest first; `owner IS @owner` matches NULL (tokens off) as well as a name.
    list: db.prepare(`
      ${SWEEP_WITH_CALLBACK}
      WHERE (@any_owner = 1 OR owner IS @owner)
        AND (@status IS NULL OR status = @status)
        AND (@tag IS NULL OR EXISTS (SELECT 1 FROM json_each(tags_json) WHERE value = @tag))
        AND (@text IS NULL OR lower(COALESCE(label, '')) LIKE @text ESCAPE '\\' OR lower(COALESCE(notes, '')) LIKE @text ESCAPE '\\')
        AND (@replicate_key IS NULL OR replicate_key = @replicate_key)
        AND (@after_created IS NULL OR created_ms < @after_created OR (created_ms = @after_created AND seq < @after_seq))
      ORDER BY created_ms DESC, seq DESC
      LIMIT @limit`),
    countActive: db.prepare("SELECT COUNT(*) AS n FROM sweeps WHERE owner IS ? AND status IN ('queued', 'running')"),
    purgeIdempotency: db.prepare('DELETE FROM idempotency_keys WHERE created_ms < ?'),
    getIdempotency: db.prepare('SELECT spec_hash, sweep_id FROM idempotency_keys WHERE owner_key = ? AND key = ?'),
    insertIdempotency: db.prepare('INSERT INTO idempotency_keys (owner_key, key, spec_hash, sweep_id, created_ms) VALUES (?, ?, ?, ?, ?)'),
    findReusable: db.prepare(`
      SELECT s.id FROM sweeps s
      WHERE s.owner IS ? AND s.spec_hash = ? AND s.status = 'succeeded' AND s.reused_from IS NULL
        AND EXISTS (SELECT 1 FROM sweep_results r WHERE r.sweep_id = s.id)
      ORDER BY s.created_ms DESC, s.seq DESC LIMIT 1`),
    insertPointKey: db.prepare('INSERT INTO point_keys (sweep_id, point, owner, reuse_key) VALUES (?, ?, ?, ?)'),
    active: db.prepare("SELECT * FROM sweeps WHERE status IN ('queued', 'running') ORDER BY created_ms, seq"),
    adoptPlan: db.prepare(`
      UPDATE sweeps SET plan_json = @plan_json, points_total = @points_total, trials_total = @trials_total,
        chunks_total = @chunks_total, points_done = 0, chunks_done = 0
      WHERE id = @id`),
    replacePlan: db.prepare(`
      UPDATE sweeps SET plan_json = @plan_json, trials_total = trials_total + @trials, chunks_total = chunks_total + @chunks
      WHERE id = @id`),
    doneChunks: db.prepare('SELECT chunk_index FROM chunk_results WHERE sweep_id = ? ORDER BY chunk_index'),
    chunkExists: db.prepare('SELECT 1 FROM chunk_results WHERE sweep_id = ? AND chunk_index = ?'),
    chunksOfPoint: db.prepare('SELECT COUNT(*) AS n FROM chunk_results WHERE sweep_id = ? AND point = ?'),
    markRunning: db.prepare("UPDATE sweeps SET status = 'running', started_ms = ? WHERE id = ? AND status = 'queued'"),
    addChunk: db.prepare(`
      UPDATE sweeps SET points_done = points_done + @points, chunks_done = chunks_done + 1
      WHERE id = @id AND status = 'running'`),
    addPoint: db.prepare('UPDATE sweeps SET points_done = points_done + 1 WHERE id = ?'),
    raiseTrials: db.prepare(`
      UPDATE sweeps SET trials_done = MAX(trials_done, MIN(trials_total,
        COALESCE((SELECT SUM(trials) FROM chunk_results WHERE sweep_id = @id), 0) + @partial))
      WHERE id = @id`),
    counters: db.prepare('SELECT chunks_done, chunks_total, open_points_json FROM sweeps WHERE id = ?'),
    upsertChunk: db.prepare(`
      INSERT OR REPLACE INTO chunk_results (sweep_id, chunk_index, point, first_trial, trials, compute_ms, codec, body, finished_ms)
      VALUES (@sweep_id, @chunk_index, @point, @first_trial, @trials, @compute_ms, @codec, @body, @finished_ms)`),
    // A copy of another sweep's stored chunk holding exactly the same trials: no compute time of this sweep's own.
    inheritChunk: db.prepare(`
      INSERT INTO chunk_results (sweep_id, chunk_index, point, first_trial, trials, compute_ms, codec, body, finished_ms)
      SELECT @sweep_id, @chunk_index, @point, first_trial, trials, 0, codec, body, @finished_ms FROM chunk_results
      WHERE sweep_id = @from_sweep AND chunk_index = @from_chunk AND first_trial = @first_trial AND trials = @trials`),
    chunkBodies: db.prepare('SELECT chunk_index, codec, body, compute_ms FROM chunk_results WHERE sweep_id = ? ORDER BY chunk_index'),
    chunkBodiesBetween: db.prepare('SELECT chunk_index, codec, body FROM chunk_results WHERE sweep_id = ? AND chunk_index >= ? AND chunk_index < ? ORDER BY chunk_index'),
    copyChunks: db.prepare(`
      INSERT INTO chunk_results (sweep_id, chunk_index, point, first_trial, trials, compute_ms, codec, body, finished_ms)
      SELECT ?, chunk_index, point, first_trial, trials, 0, codec, body, ? FROM chunk_results WHERE sweep_id = ?`),
    copyResult: db.prepare('INSERT INTO sweep_results (sweep_id, codec, body, created_ms) SELECT ?, codec, body, ? FROM sweep_results WHERE sweep_id = ?'),
    resultOwn: db.prepare('SELECT 1 FROM sweep_results WHERE sweep_id = ?'),
    deleteChunks: db.prepare('DELETE FROM chunk_results WHERE sweep_id = ?'),
    deleteResult: db.prepare('DELETE FROM sweep_results WHERE sweep_id = ?'),
    deletePointKeys: db.prepare('DELETE FROM point_keys WHERE sweep_id = ?'),
    deleteIdempotency: db.prepare('DELETE FROM idempotency_keys WHERE sweep_id = ?'),
    deleteSweep: db.prepare('DELETE FROM sweeps WHERE id = ?'),
    reusersOf: db.prepare('SELECT id FROM sweeps WHERE reused_from = ?'),
    unlinkReusers: db.prepare('UPDATE sweeps SET reused_from = NULL WHERE reused_from = ?'),
    markSucceeded: db.prepare(`
      UPDATE sweeps SET status = 'succeeded', finished_ms = ?, started_ms = COALESCE(started_ms, ?)
      WHERE id = ? AND status IN ('queued', 'running')`),
    insertResult: db.prepare('INSERT OR REPLACE INTO sweep_results (sweep_id, codec, body, created_ms) VALUES (?, ?, ?, ?)'),
    markStopped: db.prepare(`
      UPDATE sweeps SET status = @status, finished_ms = @finished_ms, error_kind = @error_kind, error_message = @error_message
      WHERE id = @id AND status IN ('queued', 'running')`),
    reopen: db.prepare(`
      UPDATE sweeps SET status = 'queued', finished_ms = NULL, error_kind = NULL, error_message = NULL
      WHERE id = ? AND status IN ('canceled', 'failed')`),
    annotate: db.prepare(`
      UPDATE sweeps SET
        label = CASE WHEN @set_label = 1 THEN @label ELSE label END,
        tags_json = CASE WHEN @set_tags = 1 THEN @tags_json ELSE tags_json END,
        notes = CASE WHEN @set_notes = 1 THEN @notes ELSE notes END
      WHERE id = @id`),
    recordReuse: db.prepare('UPDATE sweeps SET reused_points = reused_points + ?, reused_trials = reused_trials + ? WHERE id = ?'),
    // Its own result first; a reuse stored by an earlier release has none and reads its original's.
    resultFor: db.prepare(`
      SELECT r.codec, r.body FROM sweep_results r JOIN sweeps s ON s.id = r.sweep_id
      WHERE r.sweep_id = ? AND s.status = 'succeeded'
      UNION ALL
      SELECT r.codec, r.body FROM sweeps s JOIN sweep_results r ON r.sweep_id = s.reused_from
      WHERE s.id = ? AND s.status = 'succeeded'
      LIMIT 1`),
    countByStatus: db.prepare('SELECT status, COUNT(*) AS n FROM sweeps GROUP BY status')
  }
}

function isoTime (ms: number): string {
  return new Date(ms).toISOString()
}
