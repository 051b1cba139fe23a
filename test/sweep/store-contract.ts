/**
 * The store contract suite: what every implementation of the lifecycle's SweepStore
 * (src/sweep/store.ts) must do, run against SQLite (test/backends/embedded/store.contract.test.ts)
 * and Redis with its Lua scripts (test/backends/redis/store.contract.test.ts). Every move of
 * the state machine, repeats and retries of chunks, cancels, crashes (a chunk delivered
 * after its sweep ended, a progress report from a dead attempt), idempotency, the atomic
 * active cap, reuse, listing, and progress counters that equal the pure model and never go
 * down.
 */
import fc from 'fast-check'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { InvalidCursorError } from '../../src/backends/errors.js'
import { normaliseSpec, replicateKey, specHash } from '../../src/spec/index.js'
import {
  planSweep, progressCounters, type Chunk, type SweepDraft, type SweepPlan, type SweepStatus, type SweepStore
} from '../../src/sweep/index.js'

export interface StoreUnderTest {
  store: SweepStore
  /** Where the storage still mentions this sweep id (test/helpers/traces.ts); the store may be closed by it, so a test calls it last. */
  traces: (id: string) => Promise<string[]>
  close: () => Promise<void>
}

export type StoreFactory = () => Promise<StoreUnderTest>

/** Three loads of a model place-cell network storing room codes, four chunks of sizes 5, 5, 5, 5 over two points. */
const SPEC = normaliseSpec({ label: 'room codes', neurons: 60, load: { values: [0.05, 0.1] }, trials: 10, seed: 3 })

/** A hand-made plan: point 0 in chunks of 4 + 6, point 1 in 3 + 3 + 4 (stores must not care how a plan was cut). */
const PLAN: SweepPlan = {
  version: 1,
  chunks: [
    { index: 0, point: 0, firstTrial: 0, count: 4 },
    { index: 1, point: 0, firstTrial: 4, count: 6 },
    { index: 2, point: 1, firstTrial: 0, count: 3 },
    { index: 3, point: 1, firstTrial: 3, count: 3 },
    { index: 4, point: 1, firstTrial: 6, count: 4 }
  ]
}

let clock = 1_800_000_000_000
const now = (): number => ++clock

/** Reuse keys of the two points: opaque to a store, equal across sweeps that may share trials. */
const REUSE_KEYS = ['engine:3:point-a', 'engine:3:point-b']

function draft (id: string, overrides: Partial<SweepDraft> = {}): SweepDraft {
  return { id, owner: 'ana', label: 'room codes', specHash: specHash(SPEC), spec: SPEC, createdMs: now(), plan: PLAN, replicateKey: replicateKey(SPEC), reuseKeys: REUSE_KEYS, ...overrides }
}

const body = (tag: number): Uint8Array => new Uint8Array([7, 7, tag])

async function recordAll (store: SweepStore, id: string, chunks: readonly Chunk[] = PLAN.chunks): Promise<void> {
  for (const chunk of chunks) await store.recordChunk(id, chunk, body(chunk.index), 2, now())
}

export function storeContract (name: string, factory: StoreFactory): void {
  describe(`store contract: ${name}`, () => {
    let subject: StoreUnderTest
    let store: SweepStore

    beforeEach(async () => {
      subject = await factory()
      store = subject.store
    })
    afterEach(async () => { await subject.close() })

    it('stores a new sweep queued, with its plan and totals, counted as active', async () => {
      expect(await store.create(draft('s1'))).toEqual({ kind: 'created', status: 'queued' })
      const record = await store.get('s1')
      expect(record).toMatchObject({
        id: 's1',
        owner: 'ana',
        status: 'queued',
        specHash: specHash(SPEC),
        startedAt: null,
        finishedAt: null,
        error: null,
        reusedFrom: null,
        progress: { pointsDone: 0, pointsTotal: 2, trialsDone: 0, trialsTotal: 20, chunksDone: 0, chunksTotal: 5 }
      })
      expect(record?.spec).toEqual(SPEC)
      expect(await store.plan('s1')).toEqual(PLAN)
      expect(await store.countActive('ana')).toBe(1)
      expect(await store.countActive('ben')).toBe(0)
      expect((await store.counts()).queued).toBe(1)
      expect(await store.get('missing')).toBeNull()
      expect(await store.plan('missing')).toBeNull()
    })

    it('moves queued → running once, and keeps the counts by status in step', async () => {
      await store.create(draft('s1'))
      expect(await store.markRunning('s1', now())).toBe('running')
      const started = (await store.get('s1'))?.startedAt
      expect(started).not.toBeNull()
      expect(await store.markRunning('s1', now())).toBe('running')
      expect((await store.get('s1'))?.startedAt).toBe(started)
      expect(await store.counts()).toMatchObject({ queued: 0, running: 1 })
      expect(await store.markRunning('missing', now())).toBeNull()
    })

    it('stores a chunk once: a repeat replaces its body and counts nothing', async () => {
      await store.create(draft('s1'))
      const first = await store.recordChunk('s1', PLAN.chunks[0]!, body(1), 3, now())
      expect(first).toEqual({ status: 'running', stored: true, complete: false, pointDue: false })
      const repeat = await store.recordChunk('s1', PLAN.chunks[0]!, body(2), 3, now())
      expect(repeat).toEqual({ status: 'running', stored: false, complete: false, pointDue: false })
      expect((await store.get('s1'))?.progress).toMatchObject({ chunksDone: 1, trialsDone: 4, pointsDone: 0 })
      const stored = await store.storedChunks('s1')
      expect(stored.chunks.map((chunk) => [chunk.index, [...chunk.body]])).toEqual([[0, [7, 7, 2]]])
      expect(await store.doneChunks('s1')).toEqual([0])
    })

    it('refuses a chunk that is not the stored plan\'s chunk at its index', async () => {
      await store.create(draft('s1'))
      await expect(store.recordChunk('s1', { index: 1, point: 0, firstTrial: 5, count: 5 }, body(1), 1, now())).rejects.toThrow(/plan/)
      expect((await store.get('s1'))?.progress.chunksDone).toBe(0)
    })

    it('is complete only when every chunk of the plan is stored, whatever the order', async () => {
      await store.create(draft('s1'))
      const order = [4, 1, 3, 0]
      for (const index of order) {
        const outcome = await store.recordChunk('s1', PLAN.chunks[index]!, body(index), 2, now())
        expect(outcome.complete).toBe(false)
      }
      expect((await store.get('s1'))?.progress).toMatchObject({ chunksDone: 4, pointsDone: 1, trialsDone: 17 })
      const last = await store.recordChunk('s1', PLAN.chunks[2]!, body(2), 2, now())
      expect(last).toEqual({ status: 'running', stored: true, complete: true, pointDue: false })
      expect(await store.doneChunks('s1')).toEqual([0, 1, 2, 3, 4])
      expect((await store.get('s1'))?.progress).toEqual({ pointsDone: 2, pointsTotal: 2, trialsDone: 20, trialsTotal: 20, chunksDone: 5, chunksTotal: 5 })
    })

    it('reads stored chunks in bounded slices by index, skipping those not stored', async () => {
      await store.create(draft('s1'))
      for (const index of [0, 2, 3, 4]) await store.recordChunk('s1', PLAN.chunks[index]!, body(index), 2, now())
      const indices = async (from: number, count: number): Promise<number[]> => (await store.chunksBetween('s1', from, count)).map((chunk) => chunk.index)
      expect(await indices(0, 2)).toEqual([0])
      expect(await indices(1, 3)).toEqual([2, 3])
      expect(await indices(3, 10)).toEqual([3, 4])
      expect(Array.from((await store.chunksBetween('s1', 2, 1))[0]!.body)).toEqual(Array.from(body(2)))
      expect(await store.trialsPlan('s1')).toEqual(PLAN)
      expect(await store.trialsPlan('unknown')).toBeNull()
    })

    it('succeeds only once and only when complete; keeps the chunks and frees the active slot', async () => {
      await store.create(draft('s1'))
      await recordAll(store, 's1', PLAN.chunks.slice(0, 4))
      await expect(store.succeed('s1', new Uint8Array([9]), now())).rejects.toThrow(/not complete/)
      await recordAll(store, 's1', PLAN.chunks.slice(4))
      expect(await store.succeed('s1', new Uint8Array([9]), now())).toEqual({ changed: true, status: 'succeeded' })
      expect(await store.succeed('s1', new Uint8Array([8]), now())).toEqual({ changed: false, status: 'succeeded' })
      expect([...(await store.resultBody('s1'))!]).toEqual([9])
      expect((await store.storedChunks('s1')).chunks.map((chunk) => chunk.index)).toEqual([0, 1, 2, 3, 4])
      const record = await store.get('s1')
      expect(record).toMatchObject({ status: 'succeeded' })
      expect(record?.finishedAt).not.toBeNull()
      expect(await store.countActive('ana')).toBe(0)
      expect(await store.counts()).toMatchObject({ running: 0, succeeded: 1 })
    })

    it('ends an active sweep once; later chunks, successes and stops change nothing', async () => {
      await store.create(draft('s1'))
      await store.recordChunk('s1', PLAN.chunks[0]!, body(0), 2, now())
      expect(await store.stop('s1', 'canceled', null, now())).toEqual({ changed: true, status: 'canceled' })
      expect(await store.recordChunk('s1', PLAN.chunks[1]!, body(1), 2, now())).toEqual({ status: 'canceled', stored: false, complete: false, pointDue: false })
      expect(await store.stop('s1', 'failed', { kind: 'system', message: 'late' }, now())).toEqual({ changed: false, status: 'canceled' })
      expect(await store.succeed('s1', new Uint8Array([1]), now())).toEqual({ changed: false, status: 'canceled' })
      expect(await store.markRunning('s1', now())).toBe('canceled')
      const record = await store.get('s1')
      expect(record).toMatchObject({ status: 'canceled', error: null, progress: { chunksDone: 1, trialsDone: 4 } })
      // A stopped sweep keeps what it computed (partial results, resume).
      expect(await store.doneChunks('s1')).toEqual([0])
      expect(await store.resultBody('s1')).toBeNull()
      expect(await store.countActive('ana')).toBe(0)
      expect(await store.counts()).toMatchObject({ queued: 0, running: 0, canceled: 1 })
    })

    it('records why a sweep failed', async () => {
      await store.create(draft('s1'))
      await store.markRunning('s1', now())
      const failure = { kind: 'user' as const, message: 'the engine refused the parameters' }
      expect(await store.stop('s1', 'failed', failure, now())).toEqual({ changed: true, status: 'failed' })
      expect(await store.get('s1')).toMatchObject({ status: 'failed', error: failure })
      expect(await store.stop('missing', 'failed', failure, now())).toEqual({ changed: false, status: '' })
    })

    it('keeps the most trials any attempt reported: retries and abandoned attempts never take progress back', async () => {
      await store.create(draft('s1'))
      expect(await store.reportProgress('s1', 1, 3, now())).toBe('running')
      expect((await store.get('s1'))?.progress.trialsDone).toBe(3)
      // A retried attempt starts again from zero.
      await store.reportProgress('s1', 1, 1, now())
      expect((await store.get('s1'))?.progress.trialsDone).toBe(3)
      await store.reportProgress('s1', 1, 5, now())
      await store.reportProgress('s1', 2, 99, now())
      expect((await store.get('s1'))?.progress.trialsDone).toBe(5 + 3)
      // Storing the chunk counts its size once, not size plus the partial count.
      await store.recordChunk('s1', PLAN.chunks[1]!, body(1), 2, now())
      expect((await store.get('s1'))?.progress.trialsDone).toBe(6 + 3)
      // Reports of a stored chunk (a late message from a dead attempt) are ignored.
      await store.reportProgress('s1', 1, 2, now())
      expect((await store.get('s1'))?.progress.trialsDone).toBe(9)
      // Canceling keeps the progress shown.
      await store.stop('s1', 'canceled', null, now())
      expect((await store.get('s1'))?.progress.trialsDone).toBe(9)
      expect(await store.reportProgress('s1', 3, 2, now())).toBe('canceled')
      expect((await store.get('s1'))?.progress.trialsDone).toBe(9)
    })

    it('counters follow the pure model and never go down, under any interleaving of reports, repeats and stops', async () => {
      let run = 0
      await fc.assert(fc.asyncProperty(
        fc.array(fc.oneof(
          fc.record({ op: fc.constant('report' as const), chunk: fc.integer({ min: 0, max: 4 }), trials: fc.integer({ min: 0, max: 7 }) }),
          fc.record({ op: fc.constant('record' as const), chunk: fc.integer({ min: 0, max: 4 }) }),
          fc.record({ op: fc.constant('stop' as const) })
        ), { maxLength: 14 }),
        async (ops) => {
          const id = `p${run++}`
          await store.create(draft(id))
          const done = new Set<number>()
          const partial = new Map<number, number>()
          let active = true
          let shown = 0
          for (const step of ops) {
            if (step.op === 'report') {
              await store.reportProgress(id, step.chunk, step.trials, now())
              const count = PLAN.chunks[step.chunk]!.count
              if (active && !done.has(step.chunk)) partial.set(step.chunk, Math.max(partial.get(step.chunk) ?? 0, Math.min(count, step.trials)))
            } else if (step.op === 'record') {
              await store.recordChunk(id, PLAN.chunks[step.chunk]!, body(step.chunk), 1, now())
              if (active) done.add(step.chunk)
            } else {
              await store.stop(id, 'canceled', null, now())
              active = false
            }
            const progress = (await store.get(id))!.progress
            const model = progressCounters(PLAN.chunks, done, partial)
            expect(progress).toMatchObject({ chunksDone: model.chunksDone, pointsDone: model.pointsDone })
            expect(progress.trialsDone).toBeGreaterThanOrEqual(shown)
            expect(progress.trialsDone).toBeGreaterThanOrEqual(model.trialsDone)
            expect(progress.trialsDone).toBeLessThanOrEqual(progress.trialsTotal)
            shown = progress.trialsDone
          }
        }
      ), { numRuns: 40 })
    })

    it('binds an idempotency key to its first sweep', async () => {
      const key = { key: 'upload-7', ttlSeconds: 60 }
      expect(await store.create(draft('s1'), { idempotency: key })).toEqual({ kind: 'created', status: 'queued' })
      expect(await store.create(draft('s2'), { idempotency: key })).toEqual({ kind: 'existing', binding: { specHash: specHash(SPEC), sweepId: 's1' } })
      expect(await store.get('s2')).toBeNull()
      // Keys are per owner.
      expect(await store.create(draft('s3', { owner: 'ben' }), { idempotency: key })).toEqual({ kind: 'created', status: 'queued' })
    })

    it('refuses a sweep over the owner\'s active cap atomically, and frees slots as sweeps end', async () => {
      expect(await store.create(draft('a1'), { maxActive: 2 })).toMatchObject({ kind: 'created' })
      expect(await store.create(draft('a2'), { maxActive: 2 })).toMatchObject({ kind: 'created' })
      expect(await store.create(draft('a3'), { maxActive: 2 })).toEqual({ kind: 'over-cap', active: 2 })
      expect(await store.get('a3')).toBeNull()
      expect(await store.create(draft('b1', { owner: 'ben' }), { maxActive: 2 })).toMatchObject({ kind: 'created' })
      expect(await store.create(draft('n1', { owner: null }), { maxActive: 1 })).toMatchObject({ kind: 'created' })
      expect(await store.countActive(null)).toBe(1)
      await store.stop('a1', 'canceled', null, now())
      expect(await store.create(draft('a3'), { maxActive: 2 })).toMatchObject({ kind: 'created' })
      expect(await store.countActive('ana')).toBe(2)
    })

    it('admits exactly the cap when submissions race', async () => {
      const outcomes = await Promise.all(Array.from({ length: 8 }, (_, i) => store.create(draft(`r${i}`, { owner: 'cara' }), { maxActive: 3 })))
      expect(outcomes.filter((outcome) => outcome.kind === 'created')).toHaveLength(3)
      expect(await store.countActive('cara')).toBe(3)
    })

    it('serves a reuse the original\'s result and trials', async () => {
      await store.create(draft('orig'))
      await recordAll(store, 'orig')
      await store.succeed('orig', new Uint8Array([5, 5]), now())
      expect(await store.create(draft('copy'), { reuseFrom: 'orig' })).toEqual({ kind: 'created', status: 'succeeded' })
      expect(await store.get('copy')).toMatchObject({ status: 'succeeded', reusedFrom: 'orig', progress: { trialsDone: 20, chunksDone: 5, pointsDone: 2 } })
      expect([...(await store.resultBody('copy'))!]).toEqual([5, 5])
      expect((await store.storedChunks('copy')).chunks.map((chunk) => chunk.index)).toEqual([0, 1, 2, 3, 4])
      expect(await store.countActive('ana')).toBe(0)
    })

    it('lists an owner\'s sweeps newest first, by status, a page at a time', async () => {
      const ids: string[] = []
      for (let i = 0; i < 5; i++) {
        ids.push(`l${i}`)
        await store.create(draft(`l${i}`, { owner: 'dora' }))
      }
      await store.create(draft('other', { owner: 'eve' }))
      await store.stop('l1', 'canceled', null, now())
      const first = await store.list({ owner: 'dora', limit: 2 })
      expect(first.items.map((record) => record.id)).toEqual(['l4', 'l3'])
      expect(first.nextCursor).not.toBeNull()
      const second = await store.list({ owner: 'dora', limit: 2, cursor: first.nextCursor! })
      expect(second.items.map((record) => record.id)).toEqual(['l2', 'l1'])
      const third = await store.list({ owner: 'dora', limit: 2, cursor: second.nextCursor! })
      expect(third.items.map((record) => record.id)).toEqual(['l0'])
      expect(third.nextCursor).toBeNull()
      const canceled = await store.list({ owner: 'dora', status: 'canceled' as SweepStatus, limit: 10 })
      expect(canceled.items.map((record) => record.id)).toEqual(['l1'])
      await expect(store.list({ owner: 'dora', limit: 2, cursor: 'not-a-cursor' })).rejects.toBeInstanceOf(InvalidCursorError)
    })

    it('keeps a description: label, tags and notes, changed later; lists by tag, text and replicate key', async () => {
      await store.create(draft('d1', { owner: 'fay', tags: ['coarse'], notes: 'first look at the corridor' }))
      await store.create(draft('d2', { owner: 'fay', replicateKey: 'other-model' }))
      expect(await store.get('d1')).toMatchObject({ tags: ['coarse'], notes: 'first look at the corridor', extends: null, reused: { points: 0, trials: 0 } })
      const changed = await store.annotate('d2', { label: 'Hippocampal Maze', tags: ['fine', 'paper'], notes: 'for figure 3' })
      expect(changed).toMatchObject({ label: 'Hippocampal Maze', tags: ['fine', 'paper'], notes: 'for figure 3' })
      expect(await store.annotate('d2', { notes: null })).toMatchObject({ label: 'Hippocampal Maze', tags: ['fine', 'paper'], notes: null })
      expect(await store.annotate('missing', { label: 'x' })).toBeNull()
      const ids = async (query: Partial<Parameters<SweepStore['list']>[0]>): Promise<string[]> =>
        (await store.list({ owner: 'fay', limit: 10, ...query })).items.map((record) => record.id)
      expect(await ids({ tag: 'paper' })).toEqual(['d2'])
      expect(await ids({ text: 'CORRIDOR' })).toEqual(['d1'])
      expect(await ids({ text: 'maze' })).toEqual(['d2'])
      expect(await ids({ text: '%' })).toEqual([])
      expect(await ids({ replicateKey: replicateKey(SPEC) })).toEqual(['d1'])
    })

    it('removes a finished sweep with everything stored for it, never an active one', async () => {
      await store.create(draft('p1'), { idempotency: { key: 'purge-once', ttlSeconds: 600 } })
      expect(await store.purge('p1')).toBe(false)
      await recordAll(store, 'p1')
      await store.succeed('p1', new Uint8Array([1]), now())
      const before = (await store.counts()).succeeded
      expect(await store.purge('p1')).toBe(true)
      expect(await store.get('p1')).toBeNull()
      expect(await store.resultBody('p1')).toBeNull()
      expect((await store.storedChunks('p1')).chunks).toEqual([])
      expect(await store.plan('p1')).toBeNull()
      expect((await store.counts()).succeeded).toBe(before - 1)
      expect((await store.list({ owner: 'ana', limit: 10 })).items.map((record) => record.id)).not.toContain('p1')
      expect(await store.purge('p1')).toBe(false)
      // Its trials no longer serve anyone, and nothing in the storage mentions it.
      expect((await store.storedRanges('ana', REUSE_KEYS)).size).toBe(0)
      expect(await subject.traces('p1')).toEqual([])
    })

    it('lets a canceled sweep run on: back to queued with its stored chunks and progress', async () => {
      await store.create(draft('r1'))
      await store.recordChunk('r1', PLAN.chunks[0]!, body(0), 2, now())
      await store.stop('r1', 'canceled', null, now())
      expect(await store.reopen('r1', now())).toEqual({ changed: true, status: 'queued' })
      expect(await store.reopen('r1', now())).toEqual({ changed: false, status: 'queued' })
      const record = await store.get('r1')
      expect(record).toMatchObject({ status: 'queued', finishedAt: null, error: null, progress: { chunksDone: 1, trialsDone: 4 } })
      expect(await store.countActive('ana')).toBe(1)
      await recordAll(store, 'r1', PLAN.chunks.slice(1))
      expect((await store.succeed('r1', new Uint8Array([2]), now())).changed).toBe(true)
      expect(await store.reopen('r1', now())).toEqual({ changed: false, status: 'succeeded' })
    })

    it('finds an owner\'s stored trials by reuse key and copies them into a new sweep as its own chunks', async () => {
      await store.create(draft('src'))
      await store.recordChunk('src', PLAN.chunks[0]!, body(40), 2, now())
      await store.recordChunk('src', PLAN.chunks[2]!, body(42), 2, now())
      await store.stop('src', 'canceled', null, now())
      const found = await store.storedRanges('ana', [...REUSE_KEYS, 'no-such-key'])
      expect(found.get(REUSE_KEYS[0]!)).toEqual([{ sweepId: 'src', chunkIndex: 0, firstTrial: 0, count: 4 }])
      expect(found.get(REUSE_KEYS[1]!)).toEqual([{ sweepId: 'src', chunkIndex: 2, firstTrial: 0, count: 3 }])
      expect(found.has('no-such-key')).toBe(false)
      // Another owner's trials are not offered.
      expect((await store.storedRanges('ben', REUSE_KEYS)).size).toBe(0)

      await store.create(draft('dst'))
      const copied = await store.inheritChunk('dst', PLAN.chunks[0]!, { sweepId: 'src', chunkIndex: 0 }, now())
      expect(copied).toMatchObject({ status: 'running', stored: true, complete: false, pointDue: false })
      expect(await store.inheritChunk('dst', PLAN.chunks[0]!, { sweepId: 'src', chunkIndex: 0 }, now())).toMatchObject({ stored: false })
      // A source that does not hold exactly the chunk's trials is not copied.
      expect(await store.inheritChunk('dst', PLAN.chunks[1]!, { sweepId: 'src', chunkIndex: 2 }, now())).toMatchObject({ stored: false })
      expect(await store.inheritChunk('dst', PLAN.chunks[3]!, { sweepId: 'gone', chunkIndex: 3 }, now())).toMatchObject({ stored: false })
      const stored = await store.storedChunks('dst')
      expect(stored.chunks.map((chunk) => [chunk.index, [...chunk.body]])).toEqual([[0, [7, 7, 40]]])
      expect((await store.get('dst'))!.progress).toMatchObject({ chunksDone: 1, trialsDone: 4 })
      await store.recordReuse('dst', { points: 0, trials: 4 })
      expect((await store.get('dst'))!.reused).toEqual({ points: 0, trials: 4 })
      // Later precision blocks add to the counts.
      await store.recordReuse('dst', { points: 1, trials: 3 })
      expect((await store.get('dst'))!.reused).toEqual({ points: 1, trials: 7 })
      // Counting on a sweep that is gone brings nothing back.
      await store.recordReuse('gone', { points: 0, trials: 5 })
      expect(await store.get('gone')).toBeNull()
    })

    it('keeps whether a sweep takes stored trials of earlier sweeps, for its later precision blocks', async () => {
      await store.create(draft('takes'))
      await store.create({ ...draft('fresh'), reusePoints: false })
      expect(await store.reusesPoints('takes')).toBe(true)
      expect(await store.reusesPoints('fresh')).toBe(false)
      expect(await store.reusesPoints('missing')).toBe(false)
    })

    it('grows an open point\'s plan block by block and completes only when every point is closed', async () => {
      const firstBlock: SweepPlan = { version: 1, chunks: [{ index: 0, point: 0, firstTrial: 0, count: 4 }, { index: 1, point: 1, firstTrial: 0, count: 4 }] }
      await store.create(draft('g1', { plan: firstBlock, openPoints: [0, 1] }))
      expect(await store.openPoints('g1')).toEqual([0, 1])
      expect(await store.recordChunk('g1', firstBlock.chunks[0]!, body(0), 1, now())).toMatchObject({ stored: true, complete: false, pointDue: true })
      // A repeat asks again (a decision lost in a crash is not lost for good).
      expect(await store.recordChunk('g1', firstBlock.chunks[0]!, body(0), 1, now())).toMatchObject({ stored: false, pointDue: true })
      expect((await store.get('g1'))!.progress.pointsDone).toBe(0)
      const appended = await store.extendPoint('g1', 0, 4, [{ firstTrial: 4, count: 4 }])
      expect(appended).toEqual([{ index: 2, point: 0, firstTrial: 4, count: 4 }])
      // Decided once only: a repeated decision at the old extent appends nothing.
      expect(await store.extendPoint('g1', 0, 4, [{ firstTrial: 4, count: 4 }])).toBeNull()
      expect((await store.plan('g1'))!.chunks).toHaveLength(3)
      expect((await store.get('g1'))!.progress).toMatchObject({ trialsTotal: 12, chunksTotal: 3 })
      expect(await store.recordChunk('g1', appended![0]!, body(2), 1, now())).toMatchObject({ pointDue: true })
      expect(await store.closePoint('g1', 0)).toEqual({ closed: true, complete: false })
      expect(await store.closePoint('g1', 0)).toEqual({ closed: false, complete: false })
      expect(await store.extendPoint('g1', 0, 8, [{ firstTrial: 8, count: 4 }])).toBeNull()
      expect((await store.get('g1'))!.progress.pointsDone).toBe(1)
      // Point 1: closed before its block is stored; the sweep completes with that chunk.
      expect(await store.closePoint('g1', 1)).toEqual({ closed: true, complete: false })
      expect(await store.recordChunk('g1', firstBlock.chunks[1]!, body(1), 1, now())).toMatchObject({ complete: true, pointDue: false })
      expect((await store.get('g1'))!.progress).toMatchObject({ pointsDone: 2, chunksDone: 3, trialsDone: 12 })
      expect((await store.succeed('g1', new Uint8Array([3]), now())).changed).toBe(true)
    })

    it('takes a plan made by the planner as it is', async () => {
      const plan = planSweep(SPEC)
      await store.create(draft('p', { plan }))
      expect(await store.plan('p')).toEqual(plan)
    })

    it('arms a completion callback when a sweep ends, leases it to one caller at a time, and records every attempt', async () => {
      const url = 'https://lab.example/hooks/memsweep'
      await store.create(draft('c1', { callbackUrl: url }))
      await store.create(draft('c0'))
      expect((await store.get('c1'))!.callback).toEqual({ url, state: 'waiting', attempts: 0, lastError: null })
      expect((await store.get('c0'))!.callback).toBeNull()
      expect(await store.claimCallbacks(now(), 30_000, 10)).toEqual([])

      await recordAll(store, 'c1')
      await recordAll(store, 'c0')
      const finishedMs = now()
      expect((await store.succeed('c1', new Uint8Array([1]), finishedMs)).changed).toBe(true)
      await store.succeed('c0', new Uint8Array([1]), now())
      // A repeated move arms nothing more.
      expect((await store.succeed('c1', new Uint8Array([1]), now())).changed).toBe(false)
      const at = now()
      const delivery = { sweepId: 'c1', owner: 'ana', url, generation: 1, status: 'succeeded', finishedMs, attempts: 0 }
      expect(await store.claimCallbacks(at, 30_000, 10)).toEqual([delivery])
      expect((await store.get('c1'))!.callback!.state).toBe('pending')
      // Leased: another instance does not get it, until the lease runs out (its sender died).
      expect(await store.claimCallbacks(at + 1, 30_000, 10)).toEqual([])
      expect(await store.claimCallbacks(at + 30_001, 30_000, 10)).toEqual([delivery])

      const retryAt = at + 60_000
      await store.settleCallback('c1', 1, { delivered: false, error: 'the receiver answered 500', retryAtMs: retryAt })
      expect((await store.get('c1'))!.callback).toEqual({ url, state: 'pending', attempts: 1, lastError: 'the receiver answered 500' })
      expect(await store.claimCallbacks(retryAt - 1, 30_000, 10)).toEqual([])
      expect(await store.claimCallbacks(retryAt, 30_000, 10)).toEqual([{ ...delivery, attempts: 1 }])
      await store.settleCallback('c1', 1, { delivered: true })
      expect((await store.get('c1'))!.callback).toEqual({ url, state: 'delivered', attempts: 2, lastError: null })
      // Settled: a late settle of the same event changes nothing, and nothing is due.
      await store.settleCallback('c1', 1, { delivered: false, error: 'late', retryAtMs: null })
      expect((await store.get('c1'))!.callback!.state).toBe('delivered')
      expect(await store.claimCallbacks(retryAt + 10 ** 9, 30_000, 10)).toEqual([])

      // A sweep stored succeeded at once (a reused result) has its event due at once.
      const reusedMs = now()
      await store.create(draft('c2', { callbackUrl: url, createdMs: reusedMs }), { reuseFrom: 'c1' })
      expect(await store.claimCallbacks(reusedMs, 30_000, 10)).toEqual([{ sweepId: 'c2', owner: 'ana', url, generation: 1, status: 'succeeded', finishedMs: reusedMs, attempts: 0 }])
    })

    it('sends one event per terminal state: canceled, then after a resume succeeded; purge leaves none due', async () => {
      const url = 'https://lab.example/hooks/memsweep'
      await store.create(draft('c3', { callbackUrl: url }))
      const canceledMs = now()
      await store.stop('c3', 'canceled', null, canceledMs)
      const [first] = await store.claimCallbacks(now(), 30_000, 10)
      expect(first).toMatchObject({ sweepId: 'c3', generation: 1, status: 'canceled', finishedMs: canceledMs })
      await store.settleCallback('c3', 1, { delivered: false, error: 'connection refused', retryAtMs: null })
      expect((await store.get('c3'))!.callback).toEqual({ url, state: 'failed', attempts: 1, lastError: 'connection refused' })

      expect((await store.reopen('c3', now())).changed).toBe(true)
      expect((await store.get('c3'))!.callback!.state).toBe('waiting')
      await recordAll(store, 'c3')
      await store.succeed('c3', new Uint8Array([2]), now())
      const [second] = await store.claimCallbacks(now(), 30_000, 10)
      expect(second).toMatchObject({ sweepId: 'c3', generation: 2, status: 'succeeded', attempts: 0 })
      // The first event's settle, arriving late, does not touch the second.
      await store.settleCallback('c3', 1, { delivered: true })
      expect((await store.get('c3'))!.callback).toEqual({ url, state: 'pending', attempts: 0, lastError: null })
      expect(await store.purge('c3')).toBe(true)
      expect(await store.claimCallbacks(now() + 10 ** 9, 30_000, 10)).toEqual([])
    })
  })
}
