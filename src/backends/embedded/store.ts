/**
 * Durable state of the embedded backend: one SQLite file in the data directory, in WAL
 * mode. Every state change is one transaction, so a crash leaves either the old state or
 * the new one; a finished chunk is recorded together with the progress it adds.
 */
import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import Database from 'better-sqlite3'
import type { NormalisedSpec } from '../../spec/index.js'
import { ANY_OWNER, type ListQuery, type SweepFailure, type SweepRecord, type SweepStatus } from '../port.js'
import { CODEC_NAME } from '../shared/trial-codec.js'
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

export interface NewSweep {
  id: string
  owner: string | null
  label: string | null
  specHash: string
  specJson: string
  createdMs: number
  pointsTotal: number
  trialsTotal: number
  chunksTotal: number
  /** Set for a sweep that reuses a finished one: it is stored already succeeded. */
  reusedFrom: string | null
}

export interface FinishedChunk {
  index: number
  point: number
  trials: number
  computeMs: number
  body: Uint8Array
}

/** An active sweep as stored: what the scheduler needs to pick it up after a restart. */
export interface ActiveSweepRow {
  id: string
  owner: string | null
  seq: number
  status: 'queued' | 'running'
  specJson: string
  specHash: string
  startedMs: number | null
}

export class SweepStore {
  readonly path: string
  #db: Database.Database
  #statements: ReturnType<typeof prepareStatements>

  constructor (dataDir: string) {
    mkdirSync(dataDir, { recursive: true })
    this.path = join(dataDir, DATABASE_FILE)
    this.#db = new Database(this.path, { timeout: 2000 })
    try {
      this.#db.pragma('journal_mode = WAL')
      // A committed chunk must survive power loss too; commits are seconds apart, so cheap.
      this.#db.pragma('synchronous = FULL')
      this.#db.pragma('foreign_keys = ON')
      // Two processes resuming the same sweeps would run them twice: one owner per directory.
      this.#db.pragma('locking_mode = EXCLUSIVE')
      migrate(this.#db)
    } catch (error) {
      this.#db.close()
      if (error instanceof Database.SqliteError && error.code === 'SQLITE_BUSY') {
        throw new Error(`The data directory ${dataDir} is in use by another memsweep process.`, { cause: error })
      }
      throw error
    }
    this.#statements = prepareStatements(this.#db)
  }

  transaction<T> (fn: () => T): T {
    return this.#db.transaction(fn)()
  }

  ping (): void {
    this.#db.prepare('SELECT 1').get()
  }

  close (): void {
    if (this.#db.open) this.#db.close()
  }

  /** Stores a new sweep; returns its insertion sequence number. */
  insertSweep (sweep: NewSweep): number {
    const done = sweep.reusedFrom !== null
    const info = this.#statements.insertSweep.run({
      id: sweep.id,
      owner: sweep.owner,
      label: sweep.label,
      spec_hash: sweep.specHash,
      spec_json: sweep.specJson,
      status: done ? 'succeeded' : 'queued',
      created_ms: sweep.createdMs,
      started_ms: done ? sweep.createdMs : null,
      finished_ms: done ? sweep.createdMs : null,
      points_total: sweep.pointsTotal,
      trials_total: sweep.trialsTotal,
      chunks_total: sweep.chunksTotal,
      points_done: done ? sweep.pointsTotal : 0,
      trials_done: done ? sweep.trialsTotal : 0,
      chunks_done: done ? sweep.chunksTotal : 0,
      reused_from: sweep.reusedFrom
    })
    return Number(info.lastInsertRowid)
  }

  get (id: string): SweepRecord | null {
    const row = this.#statements.getSweep.get(id) as SweepRow | undefined
    return row === undefined ? null : toRecord(row)
  }

  list (query: ListQuery): { items: SweepRecord[], nextCursor: string | null } {
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
    return { items: page.map(toRecord), nextCursor }
  }

  /** The binding of an Idempotency-Key, if one younger than `ttlMs` exists. */
  findIdempotencyKey (ownerKey: string, key: string, nowMs: number, ttlMs: number): { specHash: string, sweepId: string } | null {
    this.#statements.purgeIdempotency.run(nowMs - ttlMs)
    const row = this.#statements.getIdempotency.get(ownerKey, key) as { spec_hash: string, sweep_id: string } | undefined
    return row === undefined ? null : { specHash: row.spec_hash, sweepId: row.sweep_id }
  }

  insertIdempotencyKey (ownerKey: string, key: string, specHash: string, sweepId: string, nowMs: number): void {
    this.#statements.insertIdempotency.run(ownerKey, key, specHash, sweepId, nowMs)
  }

  /** The original (never itself a reuse) of the newest succeeded sweep of this owner with this hash. */
  findReusable (owner: string | null, specHash: string): string | null {
    const row = this.#statements.findReusable.get(owner, specHash) as { id: string, reused_from: string | null } | undefined
    return row === undefined ? null : (row.reused_from ?? row.id)
  }

  activeSweeps (): ActiveSweepRow[] {
    const rows = this.#statements.active.all() as SweepRow[]
    return rows.map(row => ({
      id: row.id,
      owner: row.owner,
      seq: row.seq,
      status: row.status as ActiveSweepRow['status'],
      specJson: row.spec_json,
      specHash: row.spec_hash,
      startedMs: row.started_ms
    }))
  }

  doneChunkIndices (sweepId: string): number[] {
    return (this.#statements.doneChunks.all(sweepId) as Array<{ chunk_index: number }>).map(row => row.chunk_index)
  }

  markRunning (sweepId: string, nowMs: number): boolean {
    return this.#statements.markRunning.run(nowMs, sweepId).changes === 1
  }

  /**
   * Records a finished chunk and the progress it adds, atomically. Returns false (and
   * writes nothing) when the sweep is no longer running, e.g. canceled meanwhile.
   */
  commitChunk (sweepId: string, chunk: FinishedChunk, pointsCompleted: number, nowMs: number): boolean {
    return this.transaction(() => {
      const previous = this.#statements.chunkTrials.get(sweepId, chunk.index) as { trials: number } | undefined
      const isNew = previous === undefined
      const changes = this.#statements.addProgress.run({
        id: sweepId,
        points: pointsCompleted,
        trials: isNew ? chunk.trials : chunk.trials - previous.trials,
        chunks: isNew ? 1 : 0
      }).changes
      if (changes !== 1) return false
      this.#statements.upsertChunk.run({
        sweep_id: sweepId,
        chunk_index: chunk.index,
        point: chunk.point,
        trials: chunk.trials,
        compute_ms: chunk.computeMs,
        codec: CODEC_NAME,
        body: chunk.body,
        finished_ms: nowMs
      })
      return true
    })
  }

  /** Encoded chunk results in chunk-index order, and their total compute time. */
  chunkBodies (sweepId: string): { bodies: Uint8Array[], computeMs: number } {
    const rows = this.#statements.chunkBodies.all(sweepId) as Array<{ codec: string, body: Uint8Array, compute_ms: number }>
    let computeMs = 0
    for (const row of rows) {
      if (row.codec !== CODEC_NAME) throw new Error(`Unknown chunk codec '${row.codec}'.`)
      computeMs += row.compute_ms
    }
    return { bodies: rows.map(row => row.body), computeMs }
  }

  /**
   * Stores the assembled result and marks the sweep succeeded, atomically. The chunk rows
   * go: the result holds every trial record, in order.
   */
  completeSweep (sweepId: string, body: Uint8Array, nowMs: number): boolean {
    return this.transaction(() => {
      if (this.#statements.markSucceeded.run(nowMs, sweepId).changes !== 1) return false
      this.#statements.insertResult.run(sweepId, CODEC_NAME, body, nowMs)
      this.#statements.deleteChunks.run(sweepId)
      return true
    })
  }

  /**
   * Moves an active sweep to failed or canceled and drops its partial chunk results, which
   * nothing can read any more. Returns false when the sweep was already terminal.
   */
  finishUnsuccessfully (sweepId: string, status: 'failed' | 'canceled', failure: SweepFailure | null, nowMs: number): boolean {
    return this.transaction(() => {
      const changes = this.#statements.markFinished.run({
        id: sweepId,
        status,
        finished_ms: nowMs,
        error_kind: failure?.kind ?? null,
        error_message: failure?.message ?? null
      }).changes
      if (changes !== 1) return false
      this.#statements.deleteChunks.run(sweepId)
      return true
    })
  }

  /** The stored result of a succeeded sweep, following a reuse to its original. */
  resultBody (sweepId: string): { codec: string, body: Uint8Array } | null {
    const row = this.#statements.resultFor.get(sweepId) as { codec: string, body: Uint8Array } | undefined
    return row ?? null
  }

  countByStatus (): Record<SweepStatus, number> {
    const counts: Record<SweepStatus, number> = { queued: 0, running: 0, succeeded: 0, failed: 0, canceled: 0 }
    for (const row of this.#statements.countByStatus.all() as Array<{ status: SweepStatus, n: number }>) {
      counts[row.status] = row.n
    }
    return counts
  }
}

function prepareStatements (db: Database.Database) {
  return {
    insertSweep: db.prepare(`
      INSERT INTO sweeps (id, owner, label, spec_hash, spec_json, status, created_ms, started_ms, finished_ms,
        points_total, trials_total, chunks_total, points_done, trials_done, chunks_done, reused_from)
      VALUES (@id, @owner, @label, @spec_hash, @spec_json, @status, @created_ms, @started_ms, @finished_ms,
        @points_total, @trials_total, @chunks_total, @points_done, @trials_done, @chunks_done, @reused_from)`),
    getSweep: db.prepare('SELECT * FROM sweeps WHERE id = ?'),
    // Newest first; `owner IS @owner` matches NULL (tokens off) as well as a name.
    list: db.prepare(`
      SELECT * FROM sweeps
      WHERE (@any_owner = 1 OR owner IS @owner)
        AND (@status IS NULL OR status = @status)
        AND (@after_created IS NULL OR created_ms < @after_created OR (created_ms = @after_created AND seq < @after_seq))
      ORDER BY created_ms DESC, seq DESC
      LIMIT @limit`),
    purgeIdempotency: db.prepare('DELETE FROM idempotency_keys WHERE created_ms < ?'),
    getIdempotency: db.prepare('SELECT spec_hash, sweep_id FROM idempotency_keys WHERE owner_key = ? AND key = ?'),
    insertIdempotency: db.prepare('INSERT INTO idempotency_keys (owner_key, key, spec_hash, sweep_id, created_ms) VALUES (?, ?, ?, ?, ?)'),
    findReusable: db.prepare(`
      SELECT id, reused_from FROM sweeps
      WHERE owner IS ? AND spec_hash = ? AND status = 'succeeded'
      ORDER BY created_ms DESC, seq DESC LIMIT 1`),
    active: db.prepare("SELECT * FROM sweeps WHERE status IN ('queued', 'running') ORDER BY created_ms, seq"),
    doneChunks: db.prepare('SELECT chunk_index FROM chunk_results WHERE sweep_id = ? ORDER BY chunk_index'),
    markRunning: db.prepare("UPDATE sweeps SET status = 'running', started_ms = ? WHERE id = ? AND status = 'queued'"),
    chunkTrials: db.prepare('SELECT trials FROM chunk_results WHERE sweep_id = ? AND chunk_index = ?'),
    addProgress: db.prepare(`
      UPDATE sweeps SET points_done = points_done + @points, trials_done = trials_done + @trials,
        chunks_done = chunks_done + @chunks
      WHERE id = @id AND status = 'running'`),
    upsertChunk: db.prepare(`
      INSERT OR REPLACE INTO chunk_results (sweep_id, chunk_index, point, trials, compute_ms, codec, body, finished_ms)
      VALUES (@sweep_id, @chunk_index, @point, @trials, @compute_ms, @codec, @body, @finished_ms)`),
    chunkBodies: db.prepare('SELECT codec, body, compute_ms FROM chunk_results WHERE sweep_id = ? ORDER BY chunk_index'),
    markSucceeded: db.prepare("UPDATE sweeps SET status = 'succeeded', finished_ms = ? WHERE id = ? AND status = 'running'"),
    insertResult: db.prepare('INSERT OR REPLACE INTO sweep_results (sweep_id, codec, body, created_ms) VALUES (?, ?, ?, ?)'),
    markFinished: db.prepare(`
      UPDATE sweeps SET status = @status, finished_ms = @finished_ms, error_kind = @error_kind, error_message = @error_message
      WHERE id = @id AND status IN ('queued', 'running')`),
    deleteChunks: db.prepare('DELETE FROM chunk_results WHERE sweep_id = ?'),
    resultFor: db.prepare(`
      SELECT r.codec, r.body FROM sweeps s
      JOIN sweep_results r ON r.sweep_id = COALESCE(s.reused_from, s.id)
      WHERE s.id = ? AND s.status = 'succeeded'`),
    countByStatus: db.prepare('SELECT status, COUNT(*) AS n FROM sweeps GROUP BY status')
  }
}

function toRecord (row: SweepRow): SweepRecord {
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

function isoTime (ms: number): string {
  return new Date(ms).toISOString()
}
