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
  ANY_OWNER, chunksPerPoint, CODEC_NAME, decodePlan, encodePlan, isTerminal, SWEEP_STATUSES,
  type Chunk, type ChunkOutcome, type CreateOptions, type CreateOutcome, type ListQuery, type StoredChunk, type SweepDraft,
  type SweepFailure, type SweepPage, type SweepPlan, type SweepRecord, type SweepStatus, type SweepStore, type Transition
} from '../../sweep/index.js'
import { decodeCursor, encodeCursor } from './cursor.js'
import { migrate } from './schema.js'

export const DATABASE_FILE = 'memsweep.sqlite'

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
      const trialsTotal = draft.plan.chunks.reduce((sum, chunk) => sum + chunk.count, 0)
      this.#statements.insertSweep.run({
        id: draft.id,
        owner: draft.owner,
        label: draft.label,
        spec_hash: draft.specHash,
        spec_json: JSON.stringify(draft.spec),
        plan_json: encodePlan(draft.plan),
        status: done ? 'succeeded' : 'queued',
        created_ms: draft.createdMs,
        started_ms: done ? draft.createdMs : null,
        finished_ms: done ? draft.createdMs : null,
        points_total: chunksPerPoint(draft.plan.chunks).size,
        trials_total: trialsTotal,
        chunks_total: draft.plan.chunks.length,
        points_done: done ? chunksPerPoint(draft.plan.chunks).size : 0,
        trials_done: done ? trialsTotal : 0,
        chunks_done: done ? draft.plan.chunks.length : 0,
        reused_from: reusedFrom
      })
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
    const row = this.#statements.findReusable.get(owner, specHash) as { id: string, reused_from: string | null } | undefined
    return row === undefined ? null : (row.reused_from ?? row.id)
  }

  async plan (id: string): Promise<SweepPlan | null> {
    return this.#planView(id)?.plan ?? null
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
    return this.#db.transaction((): ChunkOutcome => {
      const status = this.#status(id)
      if (status === null) return { status: '', stored: false, complete: false }
      if (isTerminal(status)) return { status, stored: false, complete: false }
      const view = this.#planView(id)
      const planned = view?.plan.chunks[chunk.index]
      if (view === undefined || planned === undefined || planned.point !== chunk.point || planned.firstTrial !== chunk.firstTrial || planned.count !== chunk.count) {
        throw new RangeError(`invalid argument. Chunk ${JSON.stringify(chunk)} is not in the stored plan of sweep ${id}.`)
      }
      if (status === 'queued') this.#statements.markRunning.run(nowMs, id)
      const isNew = this.#statements.chunkExists.get(id, chunk.index) === undefined
      this.#statements.upsertChunk.run({
        sweep_id: id,
        chunk_index: chunk.index,
        point: chunk.point,
        trials: chunk.count,
        compute_ms: computeMs,
        codec: CODEC_NAME,
        body,
        finished_ms: nowMs
      })
      if (isNew) {
        const storedOfPoint = (this.#statements.chunksOfPoint.get(id, chunk.point) as { n: number }).n
        this.#statements.addChunk.run({ id, points: storedOfPoint === view.perPoint.get(chunk.point) ? 1 : 0, trials: chunk.count })
        this.#partials.get(id)?.delete(chunk.index)
      }
      this.#raiseHighWater(id)
      const counters = this.#statements.counters.get(id) as { chunks_done: number, chunks_total: number }
      return { status: 'running', stored: isNew, complete: counters.chunks_done === counters.chunks_total }
    })()
  }

  async storedChunks (id: string): Promise<{ chunks: StoredChunk[], computeMs: number }> {
    return this.storedChunksNow(id)
  }

  /** Up to `limit` stored chunks from index `fromIndex` on (following a reuse to its original), ascending. */
  storedChunksFrom (id: string, fromIndex: number, limit: number): StoredChunk[] {
    const rows = this.#statements.chunkBodiesFrom.all(this.#resultOwner(id), fromIndex, limit) as Array<{ chunk_index: number, codec: string, body: Uint8Array }>
    for (const row of rows) if (row.codec !== CODEC_NAME) throw new Error(`Unknown chunk codec '${row.codec}'.`)
    return rows.map((row) => ({ index: row.chunk_index, body: row.body }))
  }

  /** The plan of the sweep whose chunks hold this sweep's trials (itself, or the original it reuses). */
  async trialsPlan (id: string): Promise<SweepPlan | null> {
    return await this.plan(this.#resultOwner(id))
  }

  storedChunksNow (id: string): { chunks: StoredChunk[], computeMs: number } {
    const rows = this.#statements.chunkBodies.all(this.#resultOwner(id)) as Array<{ chunk_index: number, codec: string, body: Uint8Array, compute_ms: number }>
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

  /** @throws {Error} when some chunk of the plan is not stored. */
  succeedNow (id: string, resultBody: Uint8Array, nowMs: number): Transition {
    return this.#db.transaction((): Transition => {
      const status = this.#status(id)
      if (status === null) return { changed: false, status: '' }
      if (isTerminal(status)) return { changed: false, status }
      const counters = this.#statements.counters.get(id) as { chunks_done: number, chunks_total: number }
      if (counters.chunks_done !== counters.chunks_total) throw new Error(`Sweep ${id} is not complete: cannot store its result.`)
      this.#statements.markSucceeded.run(nowMs, nowMs, id)
      this.#statements.insertResult.run(id, CODEC_NAME, resultBody, nowMs)
      this.#forget(id)
      return { changed: true, status: 'succeeded' }
    })()
  }

  async stop (id: string, to: 'failed' | 'canceled', failure: SweepFailure | null, nowMs: number): Promise<Transition> {
    return this.stopNow(id, to, failure, nowMs)
  }

  /** Ends an active sweep; its stored chunks stay (partial results, resume). */
  stopNow (id: string, to: 'failed' | 'canceled', failure: SweepFailure | null, nowMs: number): Transition {
    const changes = this.#statements.markStopped.run({
      id,
      status: to,
      finished_ms: nowMs,
      error_kind: failure?.kind ?? null,
      error_message: failure?.message ?? null
    }).changes
    if (changes === 1) {
      this.#forget(id)
      return { changed: true, status: to }
    }
    return { changed: false, status: this.#status(id) ?? '' }
  }

  async resultBody (id: string): Promise<Uint8Array | null> {
    const row = this.#statements.resultFor.get(id) as { codec: string, body: Uint8Array } | undefined
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

  #countActive (owner: string | null): number {
    return (this.#statements.countActive.get(owner) as { n: number }).n
  }

  #status (id: string): SweepStatus | null {
    const row = this.#statements.status.get(id) as { status: SweepStatus } | undefined
    return row?.status ?? null
  }

  /** The sweep whose chunks hold this sweep's trials: itself, or the original it reuses. */
  #resultOwner (id: string): string {
    const row = this.#statements.reusedFrom.get(id) as { reused_from: string | null } | undefined
    return row?.reused_from ?? id
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
      reusedFrom: row.reused_from
    }
  }
}

function prepareStatements (db: Database.Database) {
  return {
    insertSweep: db.prepare(`
      INSERT INTO sweeps (id, owner, label, spec_hash, spec_json, plan_json, status, created_ms, started_ms, finished_ms,
        points_total, trials_total, chunks_total, points_done, trials_done, chunks_done, reused_from)
      VALUES (@id, @owner, @label, @spec_hash, @spec_json, @plan_json, @status, @created_ms, @started_ms, @finished_ms,
        @points_total, @trials_total, @chunks_total, @points_done, @trials_done, @chunks_done, @reused_from)`),
    getSweep: db.prepare('SELECT * FROM sweeps WHERE id = ?'),
    status: db.prepare('SELECT status FROM sweeps WHERE id = ?'),
    planOf: db.prepare('SELECT plan_json, status FROM sweeps WHERE id = ?'),
    reusedFrom: db.prepare('SELECT reused_from FROM sweeps WHERE id = ?'),
    // Newest first; `owner IS @owner` matches NULL (tokens off) as well as a name.
    list: db.prepare(`
      SELECT * FROM sweeps
      WHERE (@any_owner = 1 OR owner IS @owner)
        AND (@status IS NULL OR status = @status)
        AND (@after_created IS NULL OR created_ms < @after_created OR (created_ms = @after_created AND seq < @after_seq))
      ORDER BY created_ms DESC, seq DESC
      LIMIT @limit`),
    countActive: db.prepare("SELECT COUNT(*) AS n FROM sweeps WHERE owner IS ? AND status IN ('queued', 'running')"),
    purgeIdempotency: db.prepare('DELETE FROM idempotency_keys WHERE created_ms < ?'),
    getIdempotency: db.prepare('SELECT spec_hash, sweep_id FROM idempotency_keys WHERE owner_key = ? AND key = ?'),
    insertIdempotency: db.prepare('INSERT INTO idempotency_keys (owner_key, key, spec_hash, sweep_id, created_ms) VALUES (?, ?, ?, ?, ?)'),
    findReusable: db.prepare(`
      SELECT id, reused_from FROM sweeps
      WHERE owner IS ? AND spec_hash = ? AND status = 'succeeded'
      ORDER BY created_ms DESC, seq DESC LIMIT 1`),
    active: db.prepare("SELECT * FROM sweeps WHERE status IN ('queued', 'running') ORDER BY created_ms, seq"),
    adoptPlan: db.prepare(`
      UPDATE sweeps SET plan_json = @plan_json, points_total = @points_total, trials_total = @trials_total,
        chunks_total = @chunks_total, points_done = 0, chunks_done = 0
      WHERE id = @id`),
    doneChunks: db.prepare('SELECT chunk_index FROM chunk_results WHERE sweep_id = ? ORDER BY chunk_index'),
    chunkExists: db.prepare('SELECT 1 FROM chunk_results WHERE sweep_id = ? AND chunk_index = ?'),
    chunksOfPoint: db.prepare('SELECT COUNT(*) AS n FROM chunk_results WHERE sweep_id = ? AND point = ?'),
    markRunning: db.prepare("UPDATE sweeps SET status = 'running', started_ms = ? WHERE id = ? AND status = 'queued'"),
    addChunk: db.prepare(`
      UPDATE sweeps SET points_done = points_done + @points, chunks_done = chunks_done + 1
      WHERE id = @id AND status = 'running'`),
    raiseTrials: db.prepare(`
      UPDATE sweeps SET trials_done = MAX(trials_done, MIN(trials_total,
        COALESCE((SELECT SUM(trials) FROM chunk_results WHERE sweep_id = @id), 0) + @partial))
      WHERE id = @id`),
    counters: db.prepare('SELECT chunks_done, chunks_total FROM sweeps WHERE id = ?'),
    upsertChunk: db.prepare(`
      INSERT OR REPLACE INTO chunk_results (sweep_id, chunk_index, point, trials, compute_ms, codec, body, finished_ms)
      VALUES (@sweep_id, @chunk_index, @point, @trials, @compute_ms, @codec, @body, @finished_ms)`),
    chunkBodies: db.prepare('SELECT chunk_index, codec, body, compute_ms FROM chunk_results WHERE sweep_id = ? ORDER BY chunk_index'),
    chunkBodiesFrom: db.prepare('SELECT chunk_index, codec, body FROM chunk_results WHERE sweep_id = ? AND chunk_index >= ? ORDER BY chunk_index LIMIT ?'),
    deleteChunks: db.prepare('DELETE FROM chunk_results WHERE sweep_id = ?'),
    markSucceeded: db.prepare(`
      UPDATE sweeps SET status = 'succeeded', finished_ms = ?, started_ms = COALESCE(started_ms, ?)
      WHERE id = ? AND status IN ('queued', 'running')`),
    insertResult: db.prepare('INSERT OR REPLACE INTO sweep_results (sweep_id, codec, body, created_ms) VALUES (?, ?, ?, ?)'),
    markStopped: db.prepare(`
      UPDATE sweeps SET status = @status, finished_ms = @finished_ms, error_kind = @error_kind, error_message = @error_message
      WHERE id = @id AND status IN ('queued', 'running')`),
    resultFor: db.prepare(`
      SELECT r.codec, r.body FROM sweeps s
      JOIN sweep_results r ON r.sweep_id = COALESCE(s.reused_from, s.id)
      WHERE s.id = ? AND s.status = 'succeeded'`),
    countByStatus: db.prepare('SELECT status, COUNT(*) AS n FROM sweeps GROUP BY status')
  }
}

function isoTime (ms: number): string {
  return new Date(ms).toISOString()
}
