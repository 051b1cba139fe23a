/**
 * The storage contract of the sweep lifecycle. The embedded backend keeps sweeps in SQLite
 * (src/backends/embedded/store.ts), the Redis backend in Redis with Lua scripts
 * (src/backends/redis/store.ts); both implement this interface, and one contract suite
 * (test/sweep/store-contract.ts) runs against both: every move of state.ts, retries,
 * cancels, crashes, idempotency, the active cap and monotone progress.
 *
 * What the two still do differently behind it (documented in src/backends/README.md and
 * tested there): retention of finished sweeps (embedded: kept until deleted; Redis:
 * SWEEP_RETENTION_DAYS), and where partial progress of running attempts lives (embedded:
 * the scheduler's memory, folded into the record's high-water mark; Redis: a hash).
 */
import type { NormalisedSpec } from '../spec/index.js'
import type { Chunk, SweepPlan } from './plan.js'
import type { SweepFailure, SweepProgress, SweepStatus } from './state.js'
import type { StoredChunk } from './assemble.js'
import type { CallbackOutbox, CallbackStatus } from './callbacks.js'

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
  /** Id of the sweep this one extends (more trials, more axis values), if any. */
  extends: string | null
  /** Points and trials taken from earlier sweeps of the owner instead of computed (a point counts when all its trials were taken). */
  reused: { points: number, trials: number }
  tags: string[]
  notes: string | null
  /** Hash of the spec without its seed and label: sweeps that differ only in those are replicates of each other. */
  replicateKey: string
  /** The completion callback, if one was asked for (src/sweep/callbacks.ts). */
  callback: CallbackStatus | null
}

/** A sweep as the lifecycle stores it on submission. */
export interface SweepDraft {
  id: string
  owner: string | null
  label: string | null
  specHash: string
  spec: NormalisedSpec
  createdMs: number
  plan: SweepPlan
  /** Hash of the spec without its seed and label. */
  replicateKey: string
  /**
   * Per grid point, the key under which its stored trials can serve another sweep of the same
   * owner (engine version, seed and the point's stream key); empty for a threshold search.
   */
  reuseKeys: string[]
  extends?: string | null
  tags?: string[]
  notes?: string | null
  /**
   * Points whose trial blocks are decided as results come in (precision targets): the sweep
   * is complete only when every one of them is closed. Absent: every point is closed.
   */
  openPoints?: number[]
  /** POST an event here on each terminal state (src/sweep/callbacks.ts). */
  callbackUrl?: string | null
  /**
   * Whether the sweep takes stored trials of the owner's earlier sweeps, at submission and for
   * the later blocks of a precision target (`?reusePoints=false` says no). @defaultValue true
   */
  reusePoints?: boolean
}

/** What a caller may change of a stored sweep's description. */
export interface Annotation {
  label?: string | null
  tags?: string[]
  notes?: string | null
}

/** A stored chunk of some sweep of the owner that holds the trials [firstTrial, firstTrial + count) of a point. */
export interface StoredRange {
  sweepId: string
  chunkIndex: number
  firstTrial: number
  count: number
}

export interface CreateOptions {
  idempotency?: { key: string, ttlSeconds: number }
  /** Reuse the result of this finished sweep (same owner and spec hash): the new sweep is stored succeeded. */
  reuseFrom?: string | null
  /** Refuse (kind 'over-cap') when the owner already has this many queued or running sweeps; checked atomically with the insert. */
  maxActive?: number
}

export interface IdempotencyBinding {
  specHash: string
  sweepId: string
}

export type CreateOutcome =
  | { kind: 'created', status: 'queued' | 'succeeded' }
  | { kind: 'existing', binding: IdempotencyBinding }
  | { kind: 'over-cap', active: number }

export interface ChunkOutcome {
  /** Status after recording; '' when the sweep no longer exists. */
  status: SweepStatus | ''
  /** True when this call stored the chunk for the first time (a retry's repeat counts nothing). */
  stored: boolean
  /** True when every chunk of the plan is stored (set comparison) and no point is open. */
  complete: boolean
  /** True when the chunk's point is open and its planned chunks are all stored: a decision on it is due (asked again on a repeat). */
  pointDue: boolean
}

/** A change this call made, or the status it found instead. */
export interface Transition {
  changed: boolean
  status: SweepStatus | ''
}

/** ListQuery.owner that matches every owner's sweeps (the admin's view of a shared server). */
export const ANY_OWNER = Symbol('any owner')

export interface ListQuery {
  /** Whose sweeps: an owner's, null for those without an owner (a server without tokens), or ANY_OWNER for all. */
  owner: string | null | typeof ANY_OWNER
  status?: SweepStatus
  /** Only sweeps with this tag. */
  tag?: string
  /** Only sweeps whose label or notes contain this text (case-insensitive). */
  text?: string
  /** Only replicates of each other: sweeps with this replicate key. */
  replicateKey?: string
  /** Opaque cursor from a previous page. */
  cursor?: string
  limit: number
}

export interface SweepPage {
  items: SweepRecord[]
  nextCursor: string | null
}

/**
 * Besides the moves below, the outbox of completion callbacks (CallbackOutbox): every move to
 * a terminal state (succeed, stop, a create that reuses a finished result) arms the sweep's
 * callback, if it has one, in the same atomic change: state pending, attempts 0, generation
 * one more, due at once. Purge removes it with the sweep.
 */
export interface SweepStore extends CallbackOutbox {
  create (draft: SweepDraft, options?: CreateOptions): Promise<CreateOutcome>
  get (id: string): Promise<SweepRecord | null>
  list (query: ListQuery): Promise<SweepPage>
  /** Queued and running sweeps of an owner (null: the anonymous owner). */
  countActive (owner: string | null): Promise<number>
  /** The plan stored with the sweep at submission; null for an unknown sweep. */
  plan (id: string): Promise<SweepPlan | null>
  /** Indices of the chunks stored so far, ascending. */
  doneChunks (id: string): Promise<number[]>
  /** queued → running; returns the status after the call, or null when the sweep is gone. */
  markRunning (id: string, nowMs: number): Promise<SweepStatus | null>
  /** Trials a running attempt of a chunk has done; raises the progress high-water mark, never lowers it. */
  reportProgress (id: string, chunkIndex: number, trialsDone: number, nowMs: number): Promise<SweepStatus | null>
  /**
   * Stores a finished chunk with the progress it adds, atomically. The chunk must be the
   * stored plan's chunk at its index (else an error). A repeat replaces the body and counts
   * nothing; after the sweep ended it changes nothing.
   */
  recordChunk (id: string, chunk: Chunk, body: Uint8Array, computeMs: number, nowMs: number): Promise<ChunkOutcome>
  /** Every stored chunk, ascending by index, and the compute time they took. */
  storedChunks (id: string): Promise<{ chunks: StoredChunk[], computeMs: number }>
  /**
   * The stored chunks holding the sweep's trials with index in [from, from + count),
   * ascending: one bounded read, so large sweeps are read in slices (src/sweep/read.ts).
   */
  chunksBetween (id: string, from: number, count: number): Promise<StoredChunk[]>
  /** The plan of the chunks holding the sweep's trials: its own, or for a result reused by an earlier release, the original's. */
  trialsPlan (id: string): Promise<SweepPlan | null>
  /** running (or queued) → succeeded with the assembled result; only when the plan is complete. */
  succeed (id: string, resultBody: Uint8Array, nowMs: number): Promise<Transition>
  /** queued or running → failed or canceled; a no-op on a finished sweep. */
  stop (id: string, to: 'failed' | 'canceled', failure: SweepFailure | null, nowMs: number): Promise<Transition>
  /** The stored result of a succeeded sweep, else null. */
  resultBody (id: string): Promise<Uint8Array | null>
  counts (): Promise<Record<SweepStatus, number>>

  /** Changes the label, tags or notes; returns the record after the change (null: unknown sweep). */
  annotate (id: string, patch: Annotation): Promise<SweepRecord | null>
  /** Adds what the sweep took from earlier sweeps (at submission, and with each precision block) to its counts. */
  recordReuse (id: string, reused: { points: number, trials: number }): Promise<void>
  /** Whether the sweep takes stored trials of earlier sweeps (SweepDraft.reusePoints); false for an unknown sweep. */
  reusesPoints (id: string): Promise<boolean>
  /** Removes a finished sweep and everything stored for it; false (and nothing removed) for an active or unknown one. */
  purge (id: string): Promise<boolean>
  /**
   * canceled or failed → queued, keeping its stored chunks and counters, so it can run on;
   * refused (changed false, `overCap` the owner's active count) when the owner already has
   * `maxActive` queued or running sweeps, checked atomically.
   */
  reopen (id: string, nowMs: number, maxActive?: number): Promise<Transition & { overCap?: number }>
  /** Stored chunks of the owner's sweeps under these reuse keys (see SweepDraft.reuseKeys), by key. */
  storedRanges (owner: string | null, reuseKeys: readonly string[]): Promise<Map<string, StoredRange[]>>
  /**
   * Stores, as this sweep's chunk, a copy of another sweep's stored chunk holding the same
   * trials (counted like recordChunk). `stored` is false when the source is gone.
   */
  inheritChunk (id: string, chunk: Chunk, from: { sweepId: string, chunkIndex: number }, nowMs: number): Promise<ChunkOutcome>
  /**
   * Appends pieces (runs of trials) to an open point's plan as new chunks, indexed after the
   * plan's last, only if the point's planned trials still end at `fromTrial` (a repeated
   * decision appends nothing). Returns the chunks appended, or null.
   */
  extendPoint (id: string, point: number, fromTrial: number, pieces: ReadonlyArray<{ firstTrial: number, count: number }>): Promise<Chunk[] | null>
  /** Closes an open point (it takes no more trials); the outcome says whether the sweep is now complete. */
  closePoint (id: string, point: number): Promise<{ closed: boolean, complete: boolean }>
  /** Points still open. */
  openPoints (id: string): Promise<number[]>
}
