/**
 * The Redis backend's implementation of the lifecycle's store contract (src/sweep/store.ts):
 * the record hash, the listing indexes, the stored plan, chunk results and the assembled
 * result. Every change that touches more than one key is a Lua script (scripts.ts), so
 * concurrent workers and API instances always see a consistent sweep. Used alike by API
 * instances, worker processes and the sandboxed chunk processors.
 */
import type { Redis } from 'ioredis'
import type { NormalisedSpec } from '../../spec/index.js'
import {
  ANY_OWNER, chunksPerPoint, SWEEP_STATUSES,
  type Annotation, type Chunk, type ChunkOutcome, type CreateOptions, type CreateOutcome, type IdempotencyBinding, type ListQuery, type StoredChunk,
  type StoredRange, type SweepDraft, type SweepFailure, type SweepPage, type SweepPlan, type SweepRecord, type SweepStatus, type SweepStore, type Transition,
  type CallbackDelivery, type CallbackSettlement, type CallbackState
} from '../../sweep/index.js'
import { InvalidCursorError } from '../errors.js'
import { idFromIndexMember, indexMember, isIndexMember, type KeyLayout } from './keys.js'
import { SCRIPTS } from './scripts.js'

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
  /** How often the sweep was resumed (jobs added before the last resume are superseded). */
  run: number
}

/** How many index entries one listing round trip reads. */
const LIST_BATCH = 100

const ADD_REUSE = `
if redis.call('EXISTS', KEYS[1]) == 1 then
  redis.call('HINCRBY', KEYS[1], 'reusedPoints', ARGV[1])
  redis.call('HINCRBY', KEYS[1], 'reusedTrials', ARGV[2])
end
return 0`

export class RedisSweepStore implements SweepStore {
  constructor (
    readonly redis: Redis,
    readonly keys: KeyLayout,
    readonly retentionSeconds: number
  ) {}

  async create (draft: SweepDraft, options: CreateOptions = {}): Promise<CreateOutcome> {
    const keys = this.keys.sweep(draft.id)
    const owner = draft.owner
    const idempotencyKey = options.idempotency === undefined ? this.keys.idempotency(owner, '') : this.keys.idempotency(owner, options.idempotency.key)
    const reuseFrom = options.reuseFrom ?? ''
    const source = this.keys.sweep(reuseFrom === '' ? draft.id : reuseFrom)
    const perPoint = chunksPerPoint(draft.plan.chunks)
    const trialsTotal = draft.plan.chunks.reduce((sum, chunk) => sum + chunk.count, 0)
    const fields: string[] = [
      'id', draft.id,
      'owner', JSON.stringify(owner),
      'label', JSON.stringify(draft.label),
      'specHash', draft.specHash,
      'spec', JSON.stringify(draft.spec),
      'createdMs', String(draft.createdMs),
      'startedMs', '',
      'finishedMs', '',
      'pointsTotal', String(perPoint.size),
      'pointsDone', '0',
      'trialsTotal', String(trialsTotal),
      'trialsDone', '0',
      'chunksTotal', String(draft.plan.chunks.length),
      'chunksDone', '0',
      'error', '',
      'reusedFrom', '',
      'extends', draft.extends ?? '',
      'tags', JSON.stringify(draft.tags ?? []),
      'notes', JSON.stringify(draft.notes ?? null),
      'replicateKey', draft.replicateKey,
      'reusedPoints', '0',
      'reusedTrials', '0',
      'reusePoints', draft.reusePoints === false ? '0' : '1',
      // Purge removes the key's binding to this sweep, found from here.
      'idempotencyRef', options.idempotency === undefined ? '' : idempotencyKey,
      ...(draft.callbackUrl === undefined || draft.callbackUrl === null ? [] : ['callbackUrl', draft.callbackUrl, 'callbackState', 'waiting', 'callbackAttempts', '0', 'callbackGen', '0'])
    ]
    const pointsLeft: string[] = []
    for (const [point, count] of perPoint) pointsLeft.push(String(point), String(count))
    const plan: string[] = ['version', String(draft.plan.version)]
    for (const chunk of draft.plan.chunks) plan.push(String(chunk.index), `${chunk.point},${chunk.firstTrial},${chunk.count}`)
    const extents = new Map<number, number>()
    for (const chunk of draft.plan.chunks) extents.set(chunk.point, Math.max(extents.get(chunk.point) ?? 0, chunk.firstTrial + chunk.count))
    const open: string[] = (draft.openPoints ?? []).flatMap((point) => [String(point), String(extents.get(point) ?? 0)])
    const reply = await SCRIPTS.submit.run(this.redis, [
      keys.record, this.keys.index, owner === null ? this.keys.index : this.keys.ownerIndex(owner), this.keys.counts,
      idempotencyKey, this.keys.unenqueued, keys.pointsLeft, source.result, keys.result, keys.plan, this.keys.active,
      source.chunks, keys.chunks, source.plan, keys.open, this.keys.callbacksDue
    ], [
      options.idempotency === undefined ? '0' : '1',
      JSON.stringify({ specHash: draft.specHash, sweepId: draft.id } satisfies IdempotencyBinding),
      options.idempotency?.ttlSeconds ?? 0,
      JSON.stringify(fields),
      indexMember(draft.createdMs, draft.id),
      draft.createdMs,
      JSON.stringify(pointsLeft),
      reuseFrom,
      this.retentionSeconds,
      draft.id,
      JSON.stringify(plan),
      options.maxActive === undefined ? '' : String(options.maxActive),
      JSON.stringify(owner),
      JSON.stringify(open)
    ]) as [string, string]
    if (reply[0] === 'existing') return { kind: 'existing', binding: JSON.parse(reply[1]) as IdempotencyBinding }
    if (reply[0] === 'over-cap') return { kind: 'over-cap', active: Number(reply[1]) }
    if (reply[0] === 'queued') await this.#indexPointChunks(draft.id, owner, draft.reuseKeys, draft.plan.chunks)
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
    const [status, owner, specHash, specJson, chunksTotal, startedMs, computeMs, run] = await this.redis.hmget(this.keys.sweep(id).record,
      'status', 'owner', 'specHash', 'spec', 'chunksTotal', 'startedMs', 'computeMs', 'run')
    if (status == null || specHash == null || specJson == null) return null
    return {
      status: status as SweepStatus,
      startedMs: startedMs == null || startedMs === '' ? null : Number(startedMs),
      computeMs: Number(computeMs ?? 0),
      owner: owner == null ? null : JSON.parse(owner) as string | null,
      specHash,
      specJson,
      chunksTotal: Number(chunksTotal),
      run: Number(run ?? 0)
    }
  }

  async status (id: string): Promise<SweepStatus | null> {
    return await this.redis.hget(this.keys.sweep(id).record, 'status') as SweepStatus | null
  }

  async countActive (owner: string | null): Promise<number> {
    return Math.max(0, Number(await this.redis.hget(this.keys.active, JSON.stringify(owner)) ?? 0))
  }

  /** The stored plan; null for an unknown sweep or one stored before plans were. */
  async plan (id: string): Promise<SweepPlan | null> {
    const stored = await this.redis.hgetall(this.keys.sweep(id).plan)
    const version = stored.version
    if (version === undefined) return null
    const chunks: Chunk[] = []
    for (const [field, value] of Object.entries(stored)) {
      if (field === 'version') continue
      const index = Number(field)
      const [point, firstTrial, count] = value.split(',').map(Number) as [number, number, number]
      chunks[index] = { index, point, firstTrial, count }
    }
    if (chunks.length !== Object.keys(stored).length - 1 || chunks.some((chunk) => chunk === undefined)) {
      throw new Error(`The stored plan of sweep ${id} is not indexed 0 … n − 1.`)
    }
    return { version: Number(version), chunks }
  }

  async doneChunks (id: string): Promise<number[]> {
    return (await this.redis.hkeys(this.keys.sweep(id).chunks)).map(Number).sort((a, b) => a - b)
  }

  async markRunning (id: string, nowMs: number): Promise<SweepStatus | null> {
    const keys = this.keys.sweep(id)
    return await SCRIPTS.markRunning.run(this.redis, [keys.record, this.keys.counts], [nowMs]) as SweepStatus | null
  }

  async reportProgress (id: string, chunkIndex: number, trialsDone: number, nowMs: number): Promise<SweepStatus | null> {
    const keys = this.keys.sweep(id)
    return await SCRIPTS.reportProgress.run(this.redis, [keys.record, keys.chunks, keys.chunkTrials, this.keys.counts, keys.plan], [chunkIndex, trialsDone, nowMs]) as SweepStatus | null
  }

  async recordChunk (id: string, chunk: Chunk, body: Uint8Array, computeMs: number, nowMs: number): Promise<ChunkOutcome> {
    const keys = this.keys.sweep(id)
    const reply = await SCRIPTS.recordChunk.run(this.redis,
      [keys.record, keys.chunks, keys.chunkTrials, keys.pointsLeft, this.keys.counts, keys.plan, keys.open],
      [chunk.index, asBuffer(body), chunk.count, chunk.point, nowMs, computeMs.toFixed(3), chunk.firstTrial]) as [string, number, number, number]
    return chunkOutcome(reply)
  }

  async storedChunks (id: string): Promise<{ chunks: StoredChunk[], computeMs: number }> {
    const keys = this.keys.sweep(id)
    const [stored, computeMs] = await Promise.all([this.redis.hgetallBuffer(keys.chunks), this.redis.hget(keys.record, 'computeMs')])
    const chunks = Object.entries(stored)
      .map(([index, body]) => ({ index: Number(index), body: new Uint8Array(body.buffer, body.byteOffset, body.byteLength) }))
      .sort((a, b) => a.index - b.index)
    return { chunks, computeMs: Number(computeMs ?? 0) }
  }

  async chunksBetween (id: string, from: number, count: number): Promise<StoredChunk[]> {
    if (count <= 0) return []
    const fields = Array.from({ length: count }, (_, offset) => String(from + offset))
    const bodies = await this.redis.hmgetBuffer(this.keys.sweep(id).chunks, ...fields)
    const chunks: StoredChunk[] = []
    bodies.forEach((body, offset) => {
      if (body !== null) chunks.push({ index: from + offset, body: new Uint8Array(body.buffer, body.byteOffset, body.byteLength) })
    })
    return chunks
  }

  async trialsPlan (id: string): Promise<SweepPlan | null> {
    return await this.plan(id)
  }

  /** The stored chunks among these indices (missing ones left out). */
  async chunksOf (id: string, indices: readonly number[]): Promise<StoredChunk[]> {
    if (indices.length === 0) return []
    const bodies = await this.redis.hmgetBuffer(this.keys.sweep(id).chunks, ...indices.map(String))
    return bodies.flatMap((body, k) => body === null ? [] : [{ index: indices[k]!, body: new Uint8Array(body.buffer, body.byteOffset, body.byteLength) }])
  }

  async succeed (id: string, resultBody: Uint8Array, nowMs: number): Promise<Transition> {
    const keys = this.keys.sweep(id)
    const owner = await this.redis.hget(keys.record, 'owner')
    const specHash = await this.redis.hget(keys.record, 'specHash')
    if (owner === null || specHash === null) return { changed: false, status: '' }
    const [changed, status] = await SCRIPTS.succeed.run(this.redis,
      [keys.record, keys.result, this.keys.counts, this.keys.reuse(JSON.parse(owner) as string | null, specHash), keys.chunks, keys.chunkTrials, keys.pointsLeft, keys.plan, this.keys.active, keys.open, this.keys.callbacksDue],
      [asBuffer(resultBody), nowMs, this.retentionSeconds, id]) as [number, string]
    return { changed: changed === 1, status: status as Transition['status'] }
  }

  /** Ends a queued or running sweep; a no-op (changed: false) on a finished one. */
  async stop (id: string, to: 'canceled' | 'failed', failure: SweepFailure | null, nowMs: number): Promise<Transition> {
    const keys = this.keys.sweep(id)
    const [changed, status] = await SCRIPTS.stop.run(this.redis,
      [keys.record, this.keys.counts, keys.chunks, keys.chunkTrials, keys.pointsLeft, this.keys.unenqueued, keys.plan, this.keys.active, keys.open, this.keys.callbacksDue],
      [to, nowMs, failure === null ? '' : JSON.stringify(failure), this.retentionSeconds, id]) as [number, string]
    return { changed: changed === 1, status: status as Transition['status'] }
  }

  async resultBody (id: string): Promise<Uint8Array | null> {
    const body = await this.redis.getBuffer(this.keys.sweep(id).result)
    return body === null ? null : new Uint8Array(body.buffer, body.byteOffset, body.byteLength)
  }

  async counts (): Promise<Record<SweepStatus, number>> {
    const stored = await this.redis.hgetall(this.keys.counts)
    const counts = {} as Record<SweepStatus, number>
    for (const status of SWEEP_STATUSES) counts[status] = Math.max(0, Number(stored[status] ?? 0))
    return counts
  }

  async annotate (id: string, patch: Annotation): Promise<SweepRecord | null> {
    const record = this.keys.sweep(id).record
    const fields: string[] = []
    if (patch.label !== undefined) fields.push('label', JSON.stringify(patch.label))
    if (patch.tags !== undefined) fields.push('tags', JSON.stringify(patch.tags))
    if (patch.notes !== undefined) fields.push('notes', JSON.stringify(patch.notes))
    // Only an existing record: HSET on a gone one would leave a half record behind.
    if (fields.length > 0 && await this.redis.exists(record) === 1) await this.redis.hset(record, ...fields)
    return await this.get(id)
  }

  async recordReuse (id: string, reused: { points: number, trials: number }): Promise<void> {
    const record = this.keys.sweep(id).record
    // In one script: a sweep purged meanwhile must not come back as a stub record.
    await this.redis.eval(ADD_REUSE, 1, record, String(reused.points), String(reused.trials))
  }

  async reusesPoints (id: string): Promise<boolean> {
    // Sweeps stored before the field existed took stored trials.
    const value = await this.redis.hget(this.keys.sweep(id).record, 'reusePoints')
    return value === '1' || (value === null && await this.redis.exists(this.keys.sweep(id).record) === 1)
  }

  /** How often the sweep was resumed: its jobs' ids carry it (keys.ts chunkJobId). */
  async dispatchRun (id: string): Promise<number> {
    return Number(await this.redis.hget(this.keys.sweep(id).record, 'run') ?? 0)
  }

  async purge (id: string): Promise<boolean> {
    const record = await this.get(id)
    if (record === null) return false
    const keys = this.keys.sweep(id)
    // Read before the script deletes them: what points at this sweep from keys of other sweeps.
    const [reuseKeys, plan, idempotencyRef] = await Promise.all([
      this.redis.hgetall(keys.reuseKeys), this.plan(id), this.redis.hget(keys.record, 'idempotencyRef')
    ])
    const removed = await SCRIPTS.purge.run(this.redis, [
      keys.record, this.keys.counts, this.keys.index, record.owner === null ? this.keys.index : this.keys.ownerIndex(record.owner),
      keys.chunks, keys.chunkTrials, keys.pointsLeft, keys.plan, keys.result, keys.open, keys.reuseKeys
    ], [indexMember(Date.parse(record.createdAt), id)]) as number
    if (removed !== 1) return false
    const pipeline = this.redis.pipeline()
    for (const chunk of plan?.chunks ?? []) {
      const reuseKey = reuseKeys[String(chunk.point)]
      if (reuseKey !== undefined) pipeline.srem(this.keys.pointChunks(record.owner, reuseKey), `${id}:${chunk.index}:${chunk.firstTrial}:${chunk.count}`)
    }
    pipeline.zrem(this.keys.unenqueued, id)
    pipeline.zrem(this.keys.callbacksDue, id)
    await pipeline.exec()
    await this.#deleteIfPointsAt(this.keys.reuse(record.owner, record.specHash), id)
    if (idempotencyRef !== null && idempotencyRef !== '') await this.#deleteIfPointsAt(idempotencyRef, id)
    return true
  }

  /** Deletes a string key whose value names this sweep (its id, or a binding holding it), and no other. */
  async #deleteIfPointsAt (key: string, id: string): Promise<void> {
    const value = await this.redis.get(key)
    if (value === null) return
    let names = value === id
    if (!names && value.startsWith('{')) {
      try { names = (JSON.parse(value) as { sweepId?: unknown }).sweepId === id } catch { names = false }
    }
    if (names) await this.redis.del(key)
  }

  async claimCallbacks (nowMs: number, leaseMs: number, limit: number): Promise<CallbackDelivery[]> {
    const due = await this.redis.zrangebyscore(this.keys.callbacksDue, '-inf', nowMs, 'LIMIT', 0, limit)
    const claimed: CallbackDelivery[] = []
    for (const sweepId of due) {
      const reply = await SCRIPTS.claimCallback.run(this.redis, [this.keys.callbacksDue, this.keys.sweep(sweepId).record], [sweepId, nowMs, nowMs + leaseMs]) as Array<string | null> | null
      if (reply === null) continue
      const [owner, url, generation, status, finishedMs, attempts] = reply
      claimed.push({
        sweepId,
        owner: JSON.parse(owner ?? 'null') as string | null,
        url: url ?? '',
        generation: Number(generation),
        status: status as CallbackDelivery['status'],
        finishedMs: Number(finishedMs),
        attempts: Number(attempts ?? 0)
      })
    }
    return claimed
  }

  async settleCallback (sweepId: string, generation: number, settlement: CallbackSettlement): Promise<void> {
    const [state, error, retryAt] = settlement.delivered
      ? ['delivered', '', '']
      : [settlement.retryAtMs === null ? 'failed' : 'pending', settlement.error, settlement.retryAtMs === null ? '' : String(settlement.retryAtMs)]
    await SCRIPTS.settleCallback.run(this.redis, [this.keys.callbacksDue, this.keys.sweep(sweepId).record], [sweepId, String(generation), state, error, retryAt])
  }

  async reopen (id: string, nowMs: number, maxActive?: number): Promise<Transition & { overCap?: number }> {
    const keys = this.keys.sweep(id)
    const [changed, status, active] = await SCRIPTS.reopen.run(this.redis,
      [keys.record, this.keys.counts, keys.chunks, keys.chunkTrials, keys.pointsLeft, keys.plan, this.keys.active, keys.open, this.keys.unenqueued],
      [nowMs, id, maxActive === undefined ? '' : String(maxActive)]) as [number, string, number | undefined]
    return { changed: changed === 1, status: status as Transition['status'], ...(active === undefined ? {} : { overCap: active }) }
  }

  async storedRanges (owner: string | null, reuseKeys: readonly string[]): Promise<Map<string, StoredRange[]>> {
    const ranges = new Map<string, StoredRange[]>()
    for (const reuseKey of new Set(reuseKeys)) {
      const set = this.keys.pointChunks(owner, reuseKey)
      const members = await this.redis.smembers(set)
      if (members.length === 0) continue
      const parsed = members.map((member) => {
        const [sweepId, chunkIndex, firstTrial, count] = member.split(':') as [string, string, string, string]
        return { member, range: { sweepId, chunkIndex: Number(chunkIndex), firstTrial: Number(firstTrial), count: Number(count) } }
      })
      const pipeline = this.redis.pipeline()
      for (const { range } of parsed) pipeline.hexists(this.keys.sweep(range.sweepId).chunks, String(range.chunkIndex))
      const stored = await pipeline.exec() ?? []
      const found: StoredRange[] = []
      const gone: string[] = []
      parsed.forEach(({ member, range }, i) => {
        if (stored[i]?.[1] === 1) found.push(range)
        else if (this.#sweepGone(range.sweepId, stored[i]?.[1])) gone.push(member)
      })
      if (found.length > 0) ranges.set(reuseKey, found)
      if (gone.length > 0) await this.redis.srem(set, ...gone)
    }
    return ranges
  }

  async inheritChunk (id: string, chunk: Chunk, from: { sweepId: string, chunkIndex: number }, nowMs: number): Promise<ChunkOutcome> {
    const keys = this.keys.sweep(id)
    const source = this.keys.sweep(from.sweepId)
    const reply = await SCRIPTS.inheritChunk.run(this.redis,
      [keys.record, keys.chunks, keys.chunkTrials, keys.pointsLeft, this.keys.counts, keys.plan, keys.open, source.chunks, source.plan],
      [chunk.index, chunk.point, chunk.firstTrial, chunk.count, nowMs, from.chunkIndex]) as [string, number, number, number]
    return chunkOutcome(reply)
  }

  async extendPoint (id: string, point: number, fromTrial: number, pieces: ReadonlyArray<{ firstTrial: number, count: number }>): Promise<Chunk[] | null> {
    const keys = this.keys.sweep(id)
    const first = await SCRIPTS.extendPoint.run(this.redis, [keys.record, keys.plan, keys.open, keys.pointsLeft],
      [point, fromTrial, JSON.stringify(pieces.map((piece) => [piece.firstTrial, piece.count]))]) as number
    if (first < 0) return null
    const chunks = pieces.map((piece, k): Chunk => ({ index: first + k, point, firstTrial: piece.firstTrial, count: piece.count }))
    const [owner, reuseKey] = await Promise.all([this.redis.hget(keys.record, 'owner'), this.redis.hget(keys.reuseKeys, String(point))])
    if (owner !== null && reuseKey !== null) await this.#indexPointChunks(id, JSON.parse(owner) as string | null, { [point]: reuseKey }, chunks)
    return chunks
  }

  async closePoint (id: string, point: number): Promise<{ closed: boolean, complete: boolean }> {
    const keys = this.keys.sweep(id)
    const [closed, complete] = await SCRIPTS.closePoint.run(this.redis, [keys.record, keys.open, keys.pointsLeft], [point]) as [number, number]
    return { closed: closed === 1, complete: complete === 1 }
  }

  async openPoints (id: string): Promise<number[]> {
    return (await this.redis.hkeys(this.keys.sweep(id).open)).map(Number).sort((a, b) => a - b)
  }

  /**
   * Records, for each planned chunk, under its point's reuse key, that this sweep may hold those
   * trials (the chunk counts once it is stored). Written after the record: a crash in between
   * only loses the chance to reuse these trials later.
   */
  async #indexPointChunks (id: string, owner: string | null, reuseKeys: Readonly<Record<number, string>> | readonly string[], chunks: readonly Chunk[]): Promise<void> {
    const keyOf = (point: number): string | undefined => (reuseKeys as Record<number, string>)[point]
    const pipeline = this.redis.pipeline()
    const perPoint = new Map<number, string>()
    for (const chunk of chunks) {
      const reuseKey = keyOf(chunk.point)
      if (reuseKey === undefined || reuseKey === '') continue
      perPoint.set(chunk.point, reuseKey)
      pipeline.sadd(this.keys.pointChunks(owner, reuseKey), `${id}:${chunk.index}:${chunk.firstTrial}:${chunk.count}`)
    }
    if (perPoint.size === 0) return
    pipeline.hset(this.keys.sweep(id).reuseKeys, ...[...perPoint].flatMap(([point, key]) => [String(point), key]))
    await pipeline.exec()
  }

  /** A sweep whose chunks hash is gone altogether (expired or purged) will never hold the chunk. */
  #sweepGone (_sweepId: string, exists: unknown): boolean {
    return exists === 0
  }

  async list (query: ListQuery): Promise<SweepPage> {
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
        if (query.tag !== undefined && !record.tags.includes(query.tag)) continue
        if (query.text !== undefined && !`${record.label ?? ''}\n${record.notes ?? ''}`.toLowerCase().includes(query.text.toLowerCase())) continue
        if (query.replicateKey !== undefined && record.replicateKey !== query.replicateKey) continue
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
}

function chunkOutcome ([status, stored, complete, due]: [string, number, number, number]): ChunkOutcome {
  return { status: status as ChunkOutcome['status'], stored: stored === 1, complete: complete === 1, pointDue: due === 1 }
}

function asBuffer (bytes: Uint8Array): Buffer {
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength)
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
    reusedFrom: fields.reusedFrom === undefined || fields.reusedFrom === '' ? null : fields.reusedFrom,
    extends: fields.extends === undefined || fields.extends === '' ? null : fields.extends,
    reused: { points: Number(fields.reusedPoints ?? 0), trials: Number(fields.reusedTrials ?? 0) },
    tags: JSON.parse(fields.tags ?? '[]') as string[],
    notes: JSON.parse(fields.notes ?? 'null') as string | null,
    replicateKey: fields.replicateKey ?? '',
    callback: fields.callbackUrl === undefined || fields.callbackUrl === ''
      ? null
      : {
          url: fields.callbackUrl,
          state: (fields.callbackState ?? 'waiting') as CallbackState,
          attempts: Number(fields.callbackAttempts ?? 0),
          lastError: fields.callbackError === undefined || fields.callbackError === '' ? null : fields.callbackError
        }
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
