/**
 * Sweep state in Redis: the record hash, the listing index, chunk results and the
 * assembled result. Every change that touches more than one key is a Lua script
 * (scripts.ts), so concurrent workers and API instances always see a consistent sweep.
 * Used alike by API instances, worker processes and the sandboxed chunk processors.
 */
import type { Redis } from 'ioredis'
import type { NormalisedSpec } from '../../spec/index.js'
import { InvalidCursorError } from '../embedded/cursor.js'
import { SWEEP_STATUSES } from '../port.js'
import { ANY_OWNER, type ListQuery, type SweepFailure, type SweepRecord, type SweepStatus } from '../port.js'
import { idFromIndexMember, indexMember, isIndexMember, type KeyLayout } from './keys.js'
import { SCRIPTS } from './scripts.js'

export interface NewSweep {
  id: string
  owner: string | null
  label: string | null
  specHash: string
  spec: NormalisedSpec
  createdMs: number
  pointsTotal: number
  trialsTotal: number
  chunksTotal: number
  /** Grid point index → number of chunks covering it. */
  chunksPerPoint: Map<number, number>
}

export interface IdempotencyBinding {
  specHash: string
  sweepId: string
}

export type CreateOutcome =
  | { kind: 'created', status: 'queued' | 'succeeded' }
  | { kind: 'existing', binding: IdempotencyBinding }

/** What a chunk processor needs of a sweep before running one of its chunks. */
export interface SweepWorkView {
  status: SweepStatus
  startedMs: number | null
  /** Compute time summed over the distinct chunks stored so far. */
  computeMs: number
  owner: string | null
  specHash: string
  specJson: string
  chunksTotal: number
}

export interface ChunkOutcome {
  /** Status after recording; '' when the sweep no longer exists. */
  status: SweepStatus | ''
  chunksDone: number
  chunksTotal: number
}

/** A change this call made, or the status it found instead. */
export interface Transition {
  changed: boolean
  status: SweepStatus | ''
}

/** How many index entries one listing round trip reads. */
const LIST_BATCH = 100

export class RedisSweepStore {
  constructor (
    readonly redis: Redis,
    readonly keys: KeyLayout,
    readonly retentionSeconds: number
  ) {}

  async create (sweep: NewSweep, options: { idempotency?: { key: string, ttlSeconds: number }, reuseFrom?: string | null } = {}): Promise<CreateOutcome> {
    const keys = this.keys.sweep(sweep.id)
    const owner = sweep.owner
    const idempotencyKey = options.idempotency === undefined ? this.keys.idempotency(owner, '') : this.keys.idempotency(owner, options.idempotency.key)
    const reuseFrom = options.reuseFrom ?? ''
    const sourceResult = reuseFrom === '' ? keys.result : this.keys.sweep(reuseFrom).result
    const fields: string[] = [
      'id', sweep.id,
      'owner', JSON.stringify(owner),
      'label', JSON.stringify(sweep.label),
      'specHash', sweep.specHash,
      'spec', JSON.stringify(sweep.spec),
      'createdMs', String(sweep.createdMs),
      'startedMs', '',
      'finishedMs', '',
      'pointsTotal', String(sweep.pointsTotal),
      'pointsDone', '0',
      'trialsTotal', String(sweep.trialsTotal),
      'trialsDone', '0',
      'chunksTotal', String(sweep.chunksTotal),
      'chunksDone', '0',
      'error', '',
      'reusedFrom', ''
    ]
    const pointsLeft: string[] = []
    for (const [point, count] of sweep.chunksPerPoint) pointsLeft.push(String(point), String(count))
    const member = indexMember(sweep.createdMs, sweep.id)
    const reply = await SCRIPTS.submit.run(this.redis, [
      keys.record, this.keys.index, owner === null ? this.keys.index : this.keys.ownerIndex(owner), this.keys.counts,
      idempotencyKey, this.keys.unenqueued, keys.pointsLeft, sourceResult, keys.result
    ], [
      options.idempotency === undefined ? '0' : '1',
      JSON.stringify({ specHash: sweep.specHash, sweepId: sweep.id } satisfies IdempotencyBinding),
      options.idempotency?.ttlSeconds ?? 0,
      JSON.stringify(fields),
      member,
      sweep.createdMs,
      JSON.stringify(pointsLeft),
      reuseFrom,
      this.retentionSeconds,
      sweep.id
    ]) as [string, string]
    if (reply[0] === 'existing') return { kind: 'existing', binding: JSON.parse(reply[1]) as IdempotencyBinding }
    return { kind: 'created', status: reply[0] as 'queued' | 'succeeded' }
  }

  /** Forgets an idempotency key whose sweep has expired, so the key can start a new one. */
  async releaseIdempotencyKey (owner: string | null, key: string): Promise<void> {
    await this.redis.del(this.keys.idempotency(owner, key))
  }

  /** Id of the owner's latest succeeded sweep with this spec hash, if its result is still stored. */
  async findReusable (owner: string | null, specHash: string): Promise<string | null> {
    return await this.redis.get(this.keys.reuse(owner, specHash))
  }

  async isEnqueued (id: string): Promise<boolean> {
    return await this.redis.hget(this.keys.sweep(id).record, 'enqueued') !== '0'
  }

  async markEnqueued (id: string): Promise<void> {
    await this.redis.multi()
      .hset(this.keys.sweep(id).record, 'enqueued', '1')
      .zrem(this.keys.unenqueued, id)
      .exec()
  }

  /** Sweeps created at least `olderThanMs` ago whose chunk jobs were never confirmed enqueued. */
  async unenqueuedBefore (cutoffMs: number, limit = 100): Promise<string[]> {
    return await this.redis.zrangebyscore(this.keys.unenqueued, 0, cutoffMs, 'LIMIT', 0, limit)
  }

  async get (id: string): Promise<SweepRecord | null> {
    const fields = await this.redis.hgetall(this.keys.sweep(id).record)
    return parseRecord(fields)
  }

  /** The few fields a chunk processor reads, without parsing the spec twice. */
  async workView (id: string): Promise<SweepWorkView | null> {
    const [status, owner, specHash, specJson, chunksTotal, startedMs, computeMs] = await this.redis.hmget(this.keys.sweep(id).record,
      'status', 'owner', 'specHash', 'spec', 'chunksTotal', 'startedMs', 'computeMs')
    if (status == null || specHash == null || specJson == null) return null
    return {
      status: status as SweepStatus,
      startedMs: startedMs == null || startedMs === '' ? null : Number(startedMs),
      computeMs: Number(computeMs ?? 0),
      owner: owner == null ? null : JSON.parse(owner) as string | null,
      specHash,
      specJson,
      chunksTotal: Number(chunksTotal)
    }
  }

  async status (id: string): Promise<SweepStatus | null> {
    return await this.redis.hget(this.keys.sweep(id).record, 'status') as SweepStatus | null
  }

  async list (query: ListQuery): Promise<{ items: SweepRecord[], nextCursor: string | null }> {
    // Every sweep is in the global index and an owned one also in its owner's.
    const owner = query.owner
    const index = owner === null || owner === ANY_OWNER ? this.keys.index : this.keys.ownerIndex(owner)
    let upper = query.cursor === undefined ? '+' : `(${decodeListCursor(query.cursor)}`
    const items: SweepRecord[] = []
    let lastMember: string | null = null
    let more = false
    while (items.length <= query.limit) {
      const members = await this.redis.zrange(index, upper, '-', 'BYLEX', 'REV', 'LIMIT', 0, LIST_BATCH)
      if (members.length === 0) break
      const pipeline = this.redis.pipeline()
      for (const member of members) pipeline.hgetall(this.keys.sweep(idFromIndexMember(member)).record)
      const replies = await pipeline.exec() ?? []
      const expired: string[] = []
      for (let i = 0; i < members.length; i++) {
        const member = members[i] as string
        const [error, fields] = replies[i] ?? [null, null]
        if (error !== null) throw error
        const record = parseRecord(fields as Record<string, string>)
        if (record === null) {
          expired.push(member)
          continue
        }
        if (query.status !== undefined && record.status !== query.status) continue
        if (owner === null && record.owner !== null) continue
        if (items.length === query.limit) {
          more = true
          break
        }
        items.push(record)
        lastMember = member
      }
      // Records leave by retention expiry; their index entries are pruned as listings meet them.
      if (expired.length > 0) await this.redis.zrem(index, ...expired)
      if (more || members.length < LIST_BATCH) break
      upper = `(${members[members.length - 1] as string}`
    }
    return { items, nextCursor: more && lastMember !== null ? encodeListCursor(lastMember) : null }
  }

  async markRunning (id: string, nowMs: number): Promise<SweepStatus | null> {
    const keys = this.keys.sweep(id)
    return await SCRIPTS.markRunning.run(this.redis, [keys.record, this.keys.counts], [nowMs]) as SweepStatus | null
  }

  async reportProgress (id: string, chunkIndex: number, trialsDone: number, nowMs: number): Promise<SweepStatus | null> {
    const keys = this.keys.sweep(id)
    return await SCRIPTS.reportProgress.run(this.redis, [keys.record, keys.chunks, keys.chunkTrials, this.keys.counts], [chunkIndex, trialsDone, nowMs]) as SweepStatus | null
  }

  async recordChunk (id: string, chunk: { index: number, point: number }, body: Buffer, trials: number, computeMs: number, nowMs: number): Promise<ChunkOutcome> {
    const keys = this.keys.sweep(id)
    const [status, chunksDone, chunksTotal] = await SCRIPTS.recordChunk.run(this.redis,
      [keys.record, keys.chunks, keys.chunkTrials, keys.pointsLeft, this.keys.counts],
      [chunk.index, body, trials, chunk.point, nowMs, computeMs.toFixed(3)]) as [string, number, number]
    return { status: status as ChunkOutcome['status'], chunksDone, chunksTotal }
  }

  /** Stored chunk results in chunk-index order; throws if any chunk is missing. */
  async chunkBodies (id: string, chunksTotal: number): Promise<Buffer[]> {
    const stored = await this.redis.hgetallBuffer(this.keys.sweep(id).chunks)
    const bodies: Buffer[] = []
    for (let index = 0; index < chunksTotal; index++) {
      const body = stored[String(index)]
      if (body === undefined) throw new Error(`Sweep ${id}: the result of chunk ${index} is missing.`)
      bodies.push(body)
    }
    return bodies
  }

  async finish (id: string, owner: string | null, specHash: string, resultBody: Buffer, nowMs: number): Promise<Transition> {
    const keys = this.keys.sweep(id)
    const [changed, status] = await SCRIPTS.finish.run(this.redis,
      [keys.record, keys.result, this.keys.counts, this.keys.reuse(owner, specHash), keys.chunks, keys.chunkTrials, keys.pointsLeft],
      [resultBody, nowMs, this.retentionSeconds, id]) as [number, string]
    return { changed: changed === 1, status: status as Transition['status'] }
  }

  /** Ends a queued or running sweep; a no-op (changed: false) on a finished one. */
  async stop (id: string, to: 'canceled' | 'failed', nowMs: number, failure: SweepFailure | null = null): Promise<Transition> {
    const keys = this.keys.sweep(id)
    const [changed, status] = await SCRIPTS.stop.run(this.redis,
      [keys.record, this.keys.counts, keys.chunks, keys.chunkTrials, keys.pointsLeft, this.keys.unenqueued],
      [to, nowMs, failure === null ? '' : JSON.stringify(failure), this.retentionSeconds, id]) as [number, string]
    return { changed: changed === 1, status: status as Transition['status'] }
  }

  async resultBody (id: string): Promise<Buffer | null> {
    return await this.redis.getBuffer(this.keys.sweep(id).result)
  }

  async counts (): Promise<Record<SweepStatus, number>> {
    const stored = await this.redis.hgetall(this.keys.counts)
    const counts = {} as Record<SweepStatus, number>
    for (const status of SWEEP_STATUSES) counts[status] = Math.max(0, Number(stored[status] ?? 0))
    return counts
  }
}

/** Turns a record hash into the port's SweepRecord; null for a missing or half-written hash. */
export function parseRecord (fields: Record<string, string> | null | undefined): SweepRecord | null {
  if (fields === null || fields === undefined || fields.id === undefined || fields.status === undefined || fields.spec === undefined) return null
  return {
    id: fields.id,
    owner: JSON.parse(fields.owner ?? 'null') as string | null,
    label: JSON.parse(fields.label ?? 'null') as string | null,
    specHash: fields.specHash ?? '',
    spec: JSON.parse(fields.spec) as NormalisedSpec,
    status: fields.status as SweepStatus,
    createdAt: isoFromMs(fields.createdMs) ?? new Date(0).toISOString(),
    startedAt: isoFromMs(fields.startedMs),
    finishedAt: isoFromMs(fields.finishedMs),
    progress: {
      pointsDone: Number(fields.pointsDone ?? 0),
      pointsTotal: Number(fields.pointsTotal ?? 0),
      trialsDone: Number(fields.trialsDone ?? 0),
      trialsTotal: Number(fields.trialsTotal ?? 0),
      chunksDone: Number(fields.chunksDone ?? 0),
      chunksTotal: Number(fields.chunksTotal ?? 0)
    },
    error: fields.error === undefined || fields.error === '' ? null : JSON.parse(fields.error) as SweepFailure,
    reusedFrom: fields.reusedFrom === undefined || fields.reusedFrom === '' ? null : fields.reusedFrom
  }
}

function isoFromMs (text: string | undefined): string | null {
  if (text === undefined || text === '') return null
  return new Date(Number(text)).toISOString()
}

export function encodeListCursor (member: string): string {
  return Buffer.from(member, 'utf8').toString('base64url')
}

export function decodeListCursor (cursor: string): string {
  const member = Buffer.from(cursor, 'base64url').toString('utf8')
  if (!isIndexMember(member) || encodeListCursor(member) !== cursor) throw new InvalidCursorError(cursor)
  return member
}
