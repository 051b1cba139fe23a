/**
 * The sweep lifecycle as pure data: its states, the moves between them, and its progress
 * counters as functions of the plan and the chunks done. Both stores (SQL in the embedded
 * backend, Lua scripts in Redis) implement exactly these rules; the store contract suite
 * (test/sweep/store-contract.ts) holds them to it.
 *
 *   queued ──start──▶ running ──last chunk stored, result assembled──▶ succeeded
 *     │                  │
 *     └──────────────────┴──cancel──▶ canceled        └──failure──▶ failed
 *
 * Terminal states are final: no move leaves them. A chunk stored after a sweep ended
 * changes nothing. Counters never go down (see progressCounters).
 */

// VARIABLES //

/** Public sweep states (never a queue library's own state names). */
export const SWEEP_STATUSES = ['queued', 'running', 'succeeded', 'failed', 'canceled'] as const
export type SweepStatus = typeof SWEEP_STATUSES[number]

export const ACTIVE_STATUSES = ['queued', 'running'] as const satisfies readonly SweepStatus[]
export const TERMINAL_STATUSES: ReadonlySet<SweepStatus> = new Set<SweepStatus>(['succeeded', 'failed', 'canceled'])

/** `user`: the spec could not run (the user should change it); `system`: infrastructure failed. */
export const FAILURE_KINDS = ['user', 'system'] as const
export type FailureKind = typeof FAILURE_KINDS[number]

export interface SweepFailure {
  kind: FailureKind
  message: string
}

export interface SweepProgress {
  pointsDone: number
  pointsTotal: number
  /**
   * Trials of stored chunks plus the most any running attempt of an unstored chunk has
   * reported: a high-water mark, so a retried or abandoned attempt never takes it back.
   */
  trialsDone: number
  trialsTotal: number
  chunksDone: number
  chunksTotal: number
}

/** The moves of the lifecycle: from → the states it may move to. */
const MOVES: Readonly<Record<SweepStatus, readonly SweepStatus[]>> = {
  queued: ['running', 'canceled', 'failed', 'succeeded'],
  running: ['succeeded', 'failed', 'canceled'],
  succeeded: [],
  failed: [],
  canceled: []
}

// MAIN //

export function isTerminal (status: SweepStatus): boolean {
  return TERMINAL_STATUSES.has(status)
}

/** Whether the lifecycle allows moving from one state to another (queued → succeeded: a sweep that reuses a finished one). */
export function canMove (from: SweepStatus, to: SweepStatus): boolean {
  return MOVES[from].includes(to)
}

/**
 * Progress counters from the plan and the chunks stored: points whose every chunk is
 * stored, trials and chunks stored. `partialTrials` adds the trials running attempts have
 * reported (chunk index → trials), counted only for chunks not yet stored and never beyond
 * a chunk's size.
 */
export function progressCounters (
  plan: ReadonlyArray<{ index: number, point: number, count: number }>,
  done: ReadonlySet<number>,
  partialTrials: ReadonlyMap<number, number> = new Map()
): SweepProgress {
  const pointChunksLeft = new Map<number, number>()
  let trialsTotal = 0
  let trialsDone = 0
  let chunksDone = 0
  for (const chunk of plan) {
    trialsTotal += chunk.count
    const stored = done.has(chunk.index)
    if (stored) {
      chunksDone++
      trialsDone += chunk.count
    } else {
      trialsDone += Math.min(chunk.count, Math.max(0, partialTrials.get(chunk.index) ?? 0))
    }
    pointChunksLeft.set(chunk.point, (pointChunksLeft.get(chunk.point) ?? 0) + (stored ? 0 : 1))
  }
  let pointsDone = 0
  for (const left of pointChunksLeft.values()) if (left === 0) pointsDone++
  return { pointsDone, pointsTotal: pointChunksLeft.size, trialsDone, trialsTotal, chunksDone, chunksTotal: plan.length }
}

/** A sweep is complete when every chunk of its plan is stored: a comparison of sets, never of counts. */
export function planComplete (plan: ReadonlyArray<{ index: number }>, done: ReadonlySet<number>): boolean {
  return plan.every((chunk) => done.has(chunk.index))
}
