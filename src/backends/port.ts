/**
 * The queue port: the only way the API reaches a backend. The embedded backend (worker
 * threads + SQLite, the default) and the Redis backend (BullMQ, many machines) both
 * implement it, and the same API contract tests run against both. Sweep records, states
 * and failures are the lifecycle's own (src/sweep).
 */
import type { TrialRecord } from '../engine/index.js'
import type { NormalisedSpec } from '../spec/index.js'
import type { SweepResult } from '../results/index.js'
import type { Annotation, CallbackDispatcherOptions, CallbackSender, EncodedResult, ListQuery, StoredProgress, SweepPage, SweepRecord } from '../sweep/index.js'

export {
  SWEEP_STATUSES, TERMINAL_STATUSES, ANY_OWNER, SWEEP_ID_MAX_LENGTH, SWEEP_ID_PATTERN, CALLBACK_STATES,
  type SweepStatus, type SweepProgress, type SweepFailure, type SweepRecord, type ListQuery, type Annotation
} from '../sweep/index.js'
export { IdempotencyConflictError, ActiveSweepCapError, InvalidCursorError, StorageUnavailableError } from './errors.js'

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
  /** Take stored trials of the owner's earlier sweeps point by point (same parameters, seed and trial range). @defaultValue true */
  reusePoints?: boolean
  /** Refuse with ActiveSweepCapError when the owner already has this many queued or running sweeps (checked atomically). */
  maxActive?: number
  /** The sweep this one extends. */
  extends?: string
  tags?: string[]
  notes?: string | null
  /** POST a signed event here when the sweep ends (checked by the API before). */
  callbackUrl?: string
}

/** What is stored of a sweep so far, whatever its state: for partial results. */
/** What an unfinished sweep has stored, and a finished result's stored bytes: read alike by every backend (src/sweep/read.ts). */
export type { EncodedResult, StoredProgress } from '../sweep/index.js'

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

export interface SweepQueue {
  readonly kind: 'embedded' | 'redis'
  /**
   * @throws {IdempotencyConflictError} for a key bound to another spec.
   * @throws {ActiveSweepCapError} when `maxActive` is reached.
   */
  submit (input: SubmitInput): Promise<SweepRecord>
  get (id: string): Promise<SweepRecord | null>
  list (query: ListQuery): Promise<SweepPage>
  /** Cancels a queued or running sweep; a no-op on a terminal one. Returns the record after the change. */
  cancel (id: string): Promise<SweepRecord | null>
  /**
   * Lets a canceled or failed sweep run on from what it stored (nothing finished is computed
   * again). Returns the record after the change; a no-op on any other state.
   * @throws {ActiveSweepCapError} when `maxActive` is reached (checked atomically).
   */
  resume (id: string, options?: { maxActive?: number }): Promise<SweepRecord | null>
  /** Changes a sweep's label, tags or notes. */
  annotate (id: string, patch: Annotation): Promise<SweepRecord | null>
  /** Removes a finished sweep with everything stored for it; false for an active or unknown one. */
  purge (id: string): Promise<boolean>
  /** The stored chunks of a sweep in any state (null for an unknown one), read in batches. */
  storedProgress (id: string): Promise<StoredProgress | null>
  /** The assembled result of a succeeded sweep (rows or searches, provenance; `trials` empty), else null. */
  results (id: string): Promise<SweepResult | null>
  /** trials[point][trial] of a succeeded sweep, read from its stored chunks; null when it has none. */
  trials (id: string): Promise<TrialRecord[][] | null>
  /**
   * The stored bytes of a succeeded sweep's result (and, with `trials`, of its chunks), not
   * decoded: the API renders them on a thread of their own. Large reads are done in batches
   * that let the event loop breathe. Null unless the sweep succeeded.
   */
  encodedResult (id: string, options: { trials: boolean }): Promise<EncodedResult | null>
  /** Listen to one sweep's progress and state changes; returns the unsubscribe function. */
  subscribe (id: string, listener: (event: SweepEvent) => void): () => void
  stats (): Promise<QueueStats>
  /**
   * Starts sending due completion callbacks through `send` (src/sweep/callbacks.ts) until the
   * queue closes; any number of API instances may, each delivery goes to one at a time.
   */
  startCallbacks (send: CallbackSender, options?: CallbackDispatcherOptions): void
  /** Readiness: storage and (Redis) connections answer. */
  ready (): Promise<{ ok: boolean, detail?: string }>
  close (): Promise<void>
}
