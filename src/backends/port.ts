/**
 * The queue port: the only way the API reaches a backend. The embedded backend (worker
 * threads + SQLite, the default) and the Redis backend (BullMQ, many machines) both
 * implement it, and the same API contract tests run against both.
 */
import type { NormalisedSpec, SweepResult } from '../spec/index.js'

/** Public sweep states (never a queue library's own state names). */
export const SWEEP_STATUSES = ['queued', 'running', 'succeeded', 'failed', 'canceled'] as const
export type SweepStatus = typeof SWEEP_STATUSES[number]
export const TERMINAL_STATUSES: ReadonlySet<SweepStatus> = new Set(['succeeded', 'failed', 'canceled'])

/**
 * Backends issue UUIDs as sweep ids; anything outside this shape cannot name a sweep (and
 * never reaches a key or a query). One definition for the API's routes, its OpenAPI
 * document, its router's path-parameter limit and both backends' guards.
 */
export const SWEEP_ID_MAX_LENGTH = 64
export const SWEEP_ID_PATTERN = new RegExp(`^[A-Za-z0-9_-]{1,${SWEEP_ID_MAX_LENGTH}}$`)

export interface SweepProgress {
  pointsDone: number
  pointsTotal: number
  trialsDone: number
  trialsTotal: number
  chunksDone: number
  chunksTotal: number
}

/** `user`: the spec could not run (the user should change it); `system`: infrastructure failed (retrying may help). */
export interface SweepFailure {
  kind: 'user' | 'system'
  message: string
}

export interface SweepRecord {
  id: string
  /** Token owner when tokens are on, else null. */
  owner: string | null
  label: string | null
  specHash: string
  spec: NormalisedSpec
  status: SweepStatus
  /** ISO 8601 timestamps. */
  createdAt: string
  startedAt: string | null
  finishedAt: string | null
  progress: SweepProgress
  error: SweepFailure | null
  /** Id of an earlier identical sweep whose results this one reuses, if any. */
  reusedFrom: string | null
}

export type SweepEvent =
  | { type: 'progress', sweep: SweepRecord }
  | { type: 'state', sweep: SweepRecord }

export interface SubmitInput {
  spec: NormalisedSpec
  owner: string | null
  /** Optional Idempotency-Key header; the backend binds it to the spec hash. */
  idempotencyKey?: string
  /** Reuse the results of a finished identical spec instead of running again. */
  reuse?: boolean
}

/** ListQuery.owner that matches every owner's sweeps (the admin's view of a shared server). */
export const ANY_OWNER = Symbol('any owner')

export interface ListQuery {
  /** Whose sweeps: an owner's, null for those without an owner (a server without tokens), or ANY_OWNER for all. */
  owner: string | null | typeof ANY_OWNER
  status?: SweepStatus
  /** Opaque cursor from a previous page. */
  cursor?: string
  limit: number
}

export interface QueueStats {
  queued: number
  running: number
  succeeded: number
  failed: number
  canceled: number
  /** Chunks waiting to run and running now. */
  chunksWaiting: number
  chunksActive: number
}

/** Raised by `submit` when an Idempotency-Key is reused with a different spec (→ 422). */
export class IdempotencyConflictError extends Error {
  constructor (readonly key: string) {
    super(`Idempotency-Key '${key}' was already used with a different request body.`)
    this.name = 'IdempotencyConflictError'
  }
}

export interface SweepQueue {
  readonly kind: 'embedded' | 'redis'
  submit (input: SubmitInput): Promise<SweepRecord>
  get (id: string): Promise<SweepRecord | null>
  list (query: ListQuery): Promise<{ items: SweepRecord[], nextCursor: string | null }>
  /** Cancels a queued or running sweep; a no-op on a terminal one. Returns the record after the change. */
  cancel (id: string): Promise<SweepRecord | null>
  /** The assembled result of a succeeded sweep, else null. */
  results (id: string): Promise<SweepResult | null>
  /** Listen to one sweep's progress and state changes; returns the unsubscribe function. */
  subscribe (id: string, listener: (event: SweepEvent) => void): () => void
  stats (): Promise<QueueStats>
  /** Readiness: storage and (Redis) connections answer. */
  ready (): Promise<{ ok: boolean, detail?: string }>
  close (): Promise<void>
}
