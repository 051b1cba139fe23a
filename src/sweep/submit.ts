/**
 * Submission, once for both backends: plan the sweep taking every trial it can from the
 * owner's earlier sweeps (an extension's parent included), store it with its plan, copy the
 * reusable chunks in, and say what is left to compute. The backend then starts what is left
 * (its scheduler, or chunk jobs).
 */
import { countPoints, replicateKey, specHash, type NormalisedSpec } from '../spec/index.js'
import { inheritStored } from './inherit.js'
import { planWithReuse, type Chunk, type SweepPlan } from './plan.js'
import { reuseKeysOf } from './reuse.js'
import type { CreateOutcome, IdempotencyBinding, SweepStore } from './store.js'

export interface SubmitRequest {
  id: string
  spec: NormalisedSpec
  owner: string | null
  createdMs: number
  idempotency?: { key: string, ttlSeconds: number }
  /** Id of an earlier succeeded sweep with the same spec hash whose result to take whole (`?reuse=true`). */
  reuseFrom?: string | null
  /** Take stored trials of earlier sweeps of the owner, point by point. @defaultValue true */
  reusePoints?: boolean
  maxActive?: number
  extends?: string | null
  tags?: string[]
  notes?: string | null
  callbackUrl?: string | null
}

export type SubmitOutcome =
  | { kind: 'existing', binding: IdempotencyBinding }
  | { kind: 'over-cap', active: number }
  | {
    kind: 'created'
    status: 'queued' | 'succeeded'
    plan: SweepPlan
    /** Chunks of the plan still to compute (empty for a whole reuse). */
    pending: Chunk[]
    /** Every chunk stored and no point open: assemble at once. */
    complete: boolean
    /** Open points (precision targets) whose current chunks are all stored: decide on them now. */
    duePoints: number[]
    reused: { points: number, trials: number }
  }

export async function submitToStore (store: SweepStore, request: SubmitRequest): Promise<SubmitOutcome> {
  const spec = request.spec
  const reuseKeys = reuseKeysOf(spec)
  const wholeReuse = request.reuseFrom ?? null
  const available = wholeReuse === null && request.reusePoints !== false && reuseKeys.length > 0
    ? await store.storedRanges(request.owner, reuseKeys)
    : new Map()
  const { plan, inherit } = planWithReuse(spec, (point) => available.get(reuseKeys[point]!) ?? [])
  const created: CreateOutcome = await store.create({
    id: request.id,
    owner: request.owner,
    label: spec.label,
    specHash: specHash(spec),
    spec,
    createdMs: request.createdMs,
    plan,
    replicateKey: replicateKey(spec),
    reuseKeys,
    ...(request.extends === undefined ? {} : { extends: request.extends }),
    ...(request.tags === undefined ? {} : { tags: request.tags }),
    ...(request.notes === undefined ? {} : { notes: request.notes }),
    ...(request.callbackUrl === undefined ? {} : { callbackUrl: request.callbackUrl }),
    ...(request.reusePoints === false ? { reusePoints: false } : {}),
    ...(spec.precision === undefined ? {} : { openPoints: Array.from({ length: countPoints(spec) }, (_, point) => point) })
  }, {
    ...(request.idempotency === undefined ? {} : { idempotency: request.idempotency }),
    reuseFrom: wholeReuse,
    ...(request.maxActive === undefined ? {} : { maxActive: request.maxActive })
  })
  if (created.kind !== 'created') return created
  if (created.status === 'succeeded') {
    const stored = await store.plan(request.id) ?? plan
    return { kind: 'created', status: 'succeeded', plan: stored, pending: [], complete: true, duePoints: [], reused: { points: countPoints(spec), trials: stored.chunks.reduce((sum, chunk) => sum + chunk.count, 0) } }
  }

  const dueAfterInherit = new Set<number>()
  const inheritedOfPoint = new Map<number, number>()
  let trials = 0
  for (const { chunk, from } of inherit) {
    const outcome = await inheritStored(store, request.id, chunk, from, request.createdMs)
    if (outcome === null || !outcome.stored) continue
    trials += chunk.count
    inheritedOfPoint.set(chunk.point, (inheritedOfPoint.get(chunk.point) ?? 0) + 1)
    if (outcome.pointDue) dueAfterInherit.add(chunk.point)
  }
  const chunksOfPoint = new Map<number, number>()
  for (const chunk of plan.chunks) chunksOfPoint.set(chunk.point, (chunksOfPoint.get(chunk.point) ?? 0) + 1)
  const points = [...inheritedOfPoint].filter(([point, n]) => n === chunksOfPoint.get(point)).length
  const reused = { points, trials }
  if (trials > 0) await store.recordReuse(request.id, reused)
  const done = new Set(await store.doneChunks(request.id))
  const pending = plan.chunks.filter((chunk) => !done.has(chunk.index))
  const open = new Set(await store.openPoints(request.id))
  return {
    kind: 'created',
    status: 'queued',
    plan,
    pending,
    complete: pending.length === 0 && open.size === 0,
    duePoints: [...dueAfterInherit].filter((point) => open.has(point)).sort((a, b) => a - b),
    reused
  }
}
