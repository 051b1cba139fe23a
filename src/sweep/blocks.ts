/**
 * A precision target's next block of trials for a point, applied to the store once for both
 * backends: the block's trials that the owner's earlier sweeps hold (same engine release, seed
 * and point parameters) are taken from them, whole chunks or slices as at submission, and only
 * the rest is appended to be computed. The block itself (where it starts and ends) is the
 * decision's, a function of the point's records alone, so taking trials changes no result.
 */
import type { NormalisedSpec } from '../spec/index.js'
import { inheritStored } from './inherit.js'
import { coverWithReuse, trialsEnd, type Chunk, type InheritSource } from './plan.js'
import type { PointDecision } from './precision.js'
import { reuseKeysOf } from './reuse.js'
import type { SweepStore } from './store.js'

export interface AppliedBlock {
  /** The chunks appended to the plan, in order; null when nothing was (decided already, or the sweep ended). */
  appended: Chunk[] | null
  /** Appended chunks whose trials were taken from earlier sweeps, stored already. */
  taken: Chunk[]
  /** Appended chunks left to compute. */
  toCompute: Chunk[]
  /** Every planned chunk of the point is stored now (the whole block was taken): decide on it again. */
  pointDue: boolean
}

export async function applyBlock (store: SweepStore, sweepId: string, spec: NormalisedSpec, point: number, decision: Extract<PointDecision, { kind: 'extend' }>, nowMs: number): Promise<AppliedBlock> {
  const to = Math.max(decision.fromTrial, trialsEnd(decision.pieces))
  const cover = await blockCover(store, sweepId, spec, point, decision.fromTrial, to) ?? decision.pieces
  const appended = await store.extendPoint(sweepId, point, decision.fromTrial, cover.map(({ firstTrial, count }) => ({ firstTrial, count })))
  if (appended === null) return { appended: null, taken: [], toCompute: [], pointDue: false }
  const taken: Chunk[] = []
  const toCompute: Chunk[] = []
  let pointDue = false
  let trials = 0
  // Once the chunks are appended nothing may throw: the caller's plan must learn of them. A
  // chunk whose trials cannot be taken (its source purged meanwhile, unreadable) is computed.
  for (const [k, chunk] of appended.entries()) {
    const source = (cover[k] as { from?: InheritSource } | undefined)?.from
    const outcome = source === undefined ? null : await inheritStored(store, sweepId, chunk, source, nowMs).catch(() => null)
    if (outcome === null || !outcome.stored) {
      toCompute.push(chunk)
      continue
    }
    taken.push(chunk)
    trials += chunk.count
    pointDue ||= outcome.pointDue
  }
  // The count is for people; losing it must not lose the block.
  if (trials > 0) await store.recordReuse(sweepId, { points: 0, trials }).catch(() => {})
  return { appended, taken, toCompute, pointDue }
}

/** The block's trials, cut where earlier sweeps of the owner hold some; null when the sweep takes none. */
async function blockCover (store: SweepStore, sweepId: string, spec: NormalisedSpec, point: number, from: number, to: number): Promise<ReturnType<typeof coverWithReuse> | null> {
  const key = reuseKeysOf(spec)[point]
  if (key === undefined || !(await store.reusesPoints(sweepId))) return null
  const record = await store.get(sweepId)
  if (record === null) return null
  const ranges = ((await store.storedRanges(record.owner, [key])).get(key) ?? []).filter((range) => range.sweepId !== sweepId)
  return ranges.length === 0 ? null : coverWithReuse(spec, point, from, to, ranges)
}
