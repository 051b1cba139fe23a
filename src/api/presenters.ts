/** Sweep records as the API shows them. */
import { createHash } from 'node:crypto'
import type { SweepRecord } from '../backends/port.js'
import type { SweepBody } from './schemas/sweep.js'

export function sweepPath (id: string): string {
  return `/v1/sweeps/${encodeURIComponent(id)}`
}

/** Public status body; `now` is injectable so elapsed times are testable. */
export function presentSweep (record: SweepRecord, now: number = Date.now()): SweepBody {
  const p = record.progress
  const started = record.startedAt === null ? null : Date.parse(record.startedAt)
  const finished = record.finishedAt === null ? null : Date.parse(record.finishedAt)
  const elapsedSeconds = started === null ? null : Math.max(0, ((finished ?? now) - started) / 1000)
  let estimatedSecondsLeft: number | null = null
  if (finished !== null) estimatedSecondsLeft = 0
  else if (record.status === 'running' && elapsedSeconds !== null && p.trialsDone > 0) {
    estimatedSecondsLeft = elapsedSeconds * (p.trialsTotal - p.trialsDone) / p.trialsDone
  }
  const self = sweepPath(record.id)
  return {
    id: record.id,
    status: record.status,
    label: record.label,
    owner: record.owner,
    specHash: record.specHash,
    createdAt: record.createdAt,
    startedAt: record.startedAt,
    finishedAt: record.finishedAt,
    progress: {
      ...p,
      fraction: progressFraction(record),
      elapsedSeconds: elapsedSeconds === null ? null : round3(elapsedSeconds),
      estimatedSecondsLeft: estimatedSecondsLeft === null ? null : round3(estimatedSecondsLeft)
    },
    error: record.error,
    reusedFrom: record.reusedFrom,
    extends: record.extends,
    reused: record.reused,
    tags: record.tags,
    notes: record.notes,
    replicateKey: record.replicateKey,
    callback: record.callback,
    links: { self, events: `${self}/events`, results: `${self}/results` }
  }
}

/**
 * trialsDone / trialsTotal; with precision targets trialsTotal grows block by block, so the
 * fraction is taken of the ceiling (points × trials) instead and is 1 once the sweep
 * succeeded: it never goes back when a block is added.
 */
function progressFraction (record: SweepRecord): number {
  const p = record.progress
  if (record.status === 'succeeded') return 1
  const ceiling = record.spec.precision === undefined ? p.trialsTotal : Math.max(p.trialsTotal, p.pointsTotal * record.spec.trials)
  return ceiling === 0 ? 0 : Math.min(1, p.trialsDone / ceiling)
}

function round3 (x: number): number {
  return Math.round(x * 1000) / 1000
}

/**
 * Weak validator of a sweep's state: changes exactly when the stored record does, so pollers
 * get 304s between changes although the derived elapsed time keeps moving.
 */
export function sweepStateTag (record: SweepRecord): string {
  const { spec: _spec, ...state } = record
  return `W/"${createHash('sha256').update(JSON.stringify(state)).digest('base64url').slice(0, 27)}"`
}

/** Whether an If-None-Match header value matches an entity tag (weak comparison, RFC 9110 §8.8.3.2). */
export function ifNoneMatchHits (header: string | undefined, tag: string): boolean {
  if (header === undefined) return false
  const opaque = (t: string): string => t.trim().replace(/^W\//, '')
  const wanted = opaque(tag)
  return header.split(',').some((candidate) => candidate.trim() === '*' || opaque(candidate) === wanted)
}
