/**
 * Every Redis key and channel the Redis backend touches, in one place, under one prefix.
 * docs/redis.md documents the layout; change both together.
 */
import { createHash } from 'node:crypto'
import { SWEEP_ID_PATTERN } from '../../sweep/ids.js'

/** Name of the BullMQ queue that carries chunk and assembly jobs (queue names may not contain ':'). */
export const CHUNK_QUEUE_NAME = 'chunks'

/** Widest createdAt (milliseconds since the epoch) the index member can hold: year 33658. */
const CREATED_MS_DIGITS = 15

export interface SweepKeys {
  /** Hash: the sweep record (status, counters, spec, timestamps). */
  record: string
  /** Hash: chunk index → encoded chunk result. A retried chunk overwrites its own field. */
  chunks: string
  /** Hash: chunk index → trials finished so far by the chunk's current attempt. */
  chunkTrials: string
  /** Hash: grid point index → chunks of that point not yet finished. */
  pointsLeft: string
  /** Hash: the plan stored at submission: `version` → plan version, chunk index → `point,firstTrial,count`. */
  plan: string
  /** Hash: open point (precision targets: its trial blocks are still being decided) → the trial its plan ends at. */
  open: string
  /** Hash: grid point → its reuse key (engine, seed, the point's parameters). */
  reuseKeys: string
  /** String: the encoded assembled result. */
  result: string
  /** Pub/sub channel: hints that the record changed (`progress` or `state`). */
  events: string
}

export interface KeyLayout {
  prefix: string
  /** BullMQ's own key prefix: its keys live under `<prefix>:bull:chunks:*`. */
  bullPrefix: string
  /** Sorted set, all scores 0, members `<createdAt ms, 15 digits>:<id>`: every sweep, ordered by (createdAt, id). */
  index: string
  /** Hash: sweep status → number of sweeps that entered it and have not left it. */
  counts: string
  /** Hash: owner (as the record's JSON `owner` field) → queued and running sweeps: the atomic active cap. */
  active: string
  /** Sorted set: id → createdAt ms of sweeps whose chunk jobs are not yet known to be enqueued. */
  unenqueued: string
  /** Sorted set: sweep id → ms when its completion callback is due (or its claim's lease ends). */
  callbacksDue: string
  /** Pub/sub channel: ids of sweeps whose running chunks must stop (canceled or failed). */
  stopChannel: string
  /** String: a random id shared by every process; its loss means Redis lost its data. */
  epoch: string
  sweep: (id: string) => SweepKeys
  ownerIndex: (owner: string) => string
  idempotency: (owner: string | null, key: string) => string
  /** String: id of the latest succeeded sweep of an owner with this spec hash (reuse is per owner). */
  reuse: (owner: string | null, specHash: string) => string
  /** Set: `<sweep id>:<chunk index>:<first trial>:<count>` of the owner's planned chunks whose point has this reuse key. */
  pointChunks: (owner: string | null, reuseKey: string) => string
}

export function keyLayout (prefix: string): KeyLayout {
  return {
    prefix,
    bullPrefix: `${prefix}:bull`,
    index: `${prefix}:sweeps`,
    counts: `${prefix}:counts`,
    active: `${prefix}:active`,
    unenqueued: `${prefix}:unenqueued`,
    callbacksDue: `${prefix}:callbacks:due`,
    stopChannel: `${prefix}:stop`,
    epoch: `${prefix}:epoch`,
    sweep: (id) => ({
      record: `${prefix}:sweep:${id}`,
      chunks: `${prefix}:sweep:${id}:chunks`,
      chunkTrials: `${prefix}:sweep:${id}:chunk-trials`,
      pointsLeft: `${prefix}:sweep:${id}:points-left`,
      plan: `${prefix}:sweep:${id}:plan`,
      open: `${prefix}:sweep:${id}:open`,
      reuseKeys: `${prefix}:sweep:${id}:reuse-keys`,
      result: `${prefix}:sweep:${id}:result`,
      events: `${prefix}:sweep:${id}:events`
    }),
    // Owners are token names of arbitrary text; encoding keeps the key readable and unambiguous.
    ownerIndex: (owner) => `${prefix}:sweeps:owner:${encodeURIComponent(owner)}`,
    // Clients choose idempotency keys; hashing bounds the key length whatever they send.
    idempotency: (owner, key) => `${prefix}:idempotency:${sha256(`${owner ?? ''}\n${key}`)}`,
    reuse: (owner, specHash) => `${prefix}:reuse:${sha256(owner ?? '').slice(0, 16)}:${specHash}`,
    pointChunks: (owner, reuseKey) => `${prefix}:points:${sha256(owner ?? '').slice(0, 16)}:${sha256(reuseKey).slice(0, 32)}`
  }
}

/** The index member of a sweep: sorts by creation time, then id. */
export function indexMember (createdMs: number, id: string): string {
  return `${String(createdMs).padStart(CREATED_MS_DIGITS, '0')}:${id}`
}

const INDEX_MEMBER = new RegExp(`^\\d{${CREATED_MS_DIGITS}}:${SWEEP_ID_PATTERN.source.slice(1, -1)}$`)

export function isIndexMember (text: string): boolean {
  return INDEX_MEMBER.test(text)
}

export function idFromIndexMember (member: string): string {
  return member.slice(CREATED_MS_DIGITS + 1)
}

/**
 * Job ids: deterministic, so enqueueing the same work twice is a no-op, and never
 * integer-like. `run` counts the sweep's resumes: a resumed sweep's jobs get fresh ids, since
 * BullMQ keeps finished jobs for a while and would ignore a job added under an old id.
 */
export function chunkJobId (sweepId: string, chunkIndex: number, run = 0): string {
  return `sw-${sweepId}${runPart(run)}-c${chunkIndex}`
}

export function decideJobId (sweepId: string, point: number, extent: number, run = 0): string {
  return `sw-${sweepId}${runPart(run)}-p${point}-t${extent}`
}

export function assembleJobId (sweepId: string, run = 0): string {
  return `sw-${sweepId}${runPart(run)}-assemble`
}

function runPart (run: number): string {
  return run === 0 ? '' : `-r${run}`
}

function sha256 (text: string): string {
  return createHash('sha256').update(text).digest('hex')
}
