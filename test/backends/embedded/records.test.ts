import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { InvalidCursorError } from '../../../src/backends/embedded/index.js'
import { IdempotencyConflictError } from '../../../src/backends/port.js'
import type { SweepQueue, SweepRecord } from '../../../src/backends/port.js'
import { longChunkSpec, makeDataDir, openQueue, fullResult, resultBytes, roomCodesSpec, waitForTerminal } from './helpers.js'

async function readAllPages (queue: SweepQueue, owner: string | null, limit: number, status?: SweepRecord['status']): Promise<string[][]> {
  const pages: string[][] = []
  let cursor: string | undefined
  do {
    const page = await queue.list({ owner, limit, ...(status ? { status } : {}), ...(cursor ? { cursor } : {}) })
    pages.push(page.items.map(item => item.id))
    cursor = page.nextCursor ?? undefined
  } while (cursor !== undefined)
  return pages
}

describe('embedded queue: listing', () => {
  const data = makeDataDir()
  let queue: SweepQueue
  const ana: string[] = []
  let ben: string

  beforeAll(async () => {
    queue = await openQueue(data.dir, { threads: 1 })
    // One long sweep holds the only thread, so the others stay queued until canceled.
    const blocker = await queue.submit({ spec: longChunkSpec(), owner: 'blocker' })
    for (let seed = 1; seed <= 5; seed++) ana.push((await queue.submit({ spec: roomCodesSpec({ seed }), owner: 'ana' })).id)
    ben = (await queue.submit({ spec: roomCodesSpec({ seed: 1 }), owner: 'ben' })).id
    await queue.cancel(ana[1]!)
    await queue.cancel(ana[3]!)
    await queue.cancel(blocker.id)
  })
  afterAll(async () => {
    await queue.close()
    data.remove()
  })

  it('pages newest first with cursors, neither skipping nor repeating a sweep', async () => {
    const pages = await readAllPages(queue, 'ana', 2)
    expect(pages.map(page => page.length)).toEqual([2, 2, 1])
    expect(pages.flat()).toEqual([...ana].reverse())
  })

  it('keeps its place when new sweeps arrive between two page reads', async () => {
    const first = await queue.list({ owner: 'ana', limit: 2 })
    const newer = await queue.submit({ spec: roomCodesSpec({ seed: 77 }), owner: 'ana' })
    const second = await queue.list({ owner: 'ana', limit: 2, cursor: first.nextCursor! })
    expect(second.items.map(item => item.id)).toEqual([ana[2], ana[1]])
    expect(second.items.map(item => item.id)).not.toContain(newer.id)
    await queue.cancel(newer.id)
    ana.push(newer.id)
  })

  it('filters by status', async () => {
    const canceled = (await readAllPages(queue, 'ana', 10, 'canceled')).flat()
    expect(canceled).toEqual([ana[5], ana[3], ana[1]])
    expect((await readAllPages(queue, 'ana', 10, 'failed')).flat()).toEqual([])
  })

  it('shows each owner only their own sweeps, and tokens-off sweeps only to tokens-off callers', async () => {
    expect((await readAllPages(queue, 'ben', 10)).flat()).toEqual([ben])
    expect((await readAllPages(queue, 'nobody', 10)).flat()).toEqual([])
    expect((await readAllPages(queue, null, 10)).flat()).toEqual([])
    const unowned = await queue.submit({ spec: roomCodesSpec({ seed: 3 }), owner: null })
    expect((await readAllPages(queue, null, 10)).flat()).toEqual([unowned.id])
    await queue.cancel(unowned.id)
  })

  it('rejects a cursor it did not issue', async () => {
    await expect(queue.list({ owner: 'ana', limit: 2, cursor: 'not-a-cursor' })).rejects.toBeInstanceOf(InvalidCursorError)
    await expect(queue.list({ owner: 'ana', limit: 2, cursor: Buffer.from('1.2.3').toString('base64url') })).rejects.toThrow(/cursor/)
  })
})

describe('embedded queue: Idempotency-Key and reuse', () => {
  const data = makeDataDir()
  let queue: SweepQueue

  beforeAll(async () => {
    queue = await openQueue(data.dir, { threads: 1 })
  })
  afterAll(async () => {
    await queue.close()
    data.remove()
  })

  it('returns the same sweep for a repeated key with the same work, even under another label', async () => {
    const first = await queue.submit({ spec: roomCodesSpec({ seed: 11 }), owner: 'ana', idempotencyKey: 'k-1' })
    const again = await queue.submit({ spec: roomCodesSpec({ seed: 11, label: 'renamed' }), owner: 'ana', idempotencyKey: 'k-1' })
    expect(again.id).toBe(first.id)
    expect(again.label).toBe('room codes')
    expect((await queue.list({ owner: 'ana', limit: 10 })).items).toHaveLength(1)
  })

  it('refuses the key with different work, and keeps keys apart per owner', async () => {
    const error = await queue.submit({ spec: roomCodesSpec({ seed: 12 }), owner: 'ana', idempotencyKey: 'k-1' }).catch((e: unknown) => e)
    expect(error).toBeInstanceOf(IdempotencyConflictError)
    expect((error as IdempotencyConflictError).key).toBe('k-1')
    const ben = await queue.submit({ spec: roomCodesSpec({ seed: 12 }), owner: 'ben', idempotencyKey: 'k-1' })
    expect(ben.owner).toBe('ben')
    expect((await queue.list({ owner: 'ana', limit: 10 })).items).toHaveLength(1)
  })

  it('forgets a key after its time to live', async () => {
    const shortLived = makeDataDir()
    const other = await openQueue(shortLived.dir, { threads: 1, tuning: { idempotencyTtlSeconds: 1 } })
    try {
      const first = await other.submit({ spec: roomCodesSpec({ seed: 13 }), owner: null, idempotencyKey: 'k' })
      await new Promise(resolve => setTimeout(resolve, 1100))
      const second = await other.submit({ spec: roomCodesSpec({ seed: 14 }), owner: null, idempotencyKey: 'k' })
      expect(second.id).not.toBe(first.id)
    } finally {
      await other.close()
      shortLived.remove()
    }
  })

  it('reuses a succeeded identical sweep of the same owner: succeeded at once, same results', async () => {
    const original = await queue.submit({ spec: roomCodesSpec({ seed: 21 }), owner: 'ana' })
    expect((await waitForTerminal(queue, original.id)).status).toBe('succeeded')

    const reused = await queue.submit({ spec: roomCodesSpec({ seed: 21, label: 'second look' }), owner: 'ana', reuse: true })
    expect(reused.status).toBe('succeeded')
    expect(reused.reusedFrom).toBe(original.id)
    expect(reused.label).toBe('second look')
    expect(reused.progress.trialsDone).toBe(reused.progress.trialsTotal)
    expect(await queue.results(reused.id)).toEqual(await queue.results(original.id))

    // A reuse of a reuse points at the sweep that actually ran.
    const third = await queue.submit({ spec: roomCodesSpec({ seed: 21 }), owner: 'ana', reuse: true })
    expect(third.reusedFrom).toBe(original.id)
  })

  it('runs afresh without reuse, for another owner, or when nothing identical succeeded', async () => {
    const plain = await queue.submit({ spec: roomCodesSpec({ seed: 21 }), owner: 'ana' })
    expect(plain.reusedFrom).toBeNull()
    const otherOwner = await queue.submit({ spec: roomCodesSpec({ seed: 21 }), owner: 'ben', reuse: true })
    expect(otherOwner.reusedFrom).toBeNull()
    const fresh = await queue.submit({ spec: roomCodesSpec({ seed: 22 }), owner: 'ana', reuse: true })
    expect(fresh.reusedFrom).toBeNull()
    for (const sweep of [plain, otherOwner, fresh]) expect((await waitForTerminal(queue, sweep.id)).status).toBe('succeeded')
    expect(resultBytes(await fullResult(queue, otherOwner.id))).toEqual(resultBytes(await fullResult(queue, plain.id)))
  })
})
