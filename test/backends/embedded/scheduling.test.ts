import { describe, expect, it } from 'vitest'
import { decodeCursor, encodeCursor, InvalidCursorError } from '../../../src/backends/embedded/cursor.js'
import { FairOrder, type DispatchCandidate } from '../../../src/backends/embedded/fair-order.js'
import { makeDataDir, openQueue, roomCodesSpec, waitForTerminal } from './helpers.js'

describe('fair order between owners', () => {
  const sweep = (id: string, ownerKey: string, seq: number): DispatchCandidate => ({ id, ownerKey, seq })

  it('serves the least recently served owner, oldest sweep first within an owner', () => {
    const order = new FairOrder()
    const candidates = [sweep('a1', 'ana', 1), sweep('a2', 'ana', 2), sweep('b1', 'ben', 3)]
    const picks: string[] = []
    for (let i = 0; i < 4; i++) {
      const next = order.pick(candidates)!
      picks.push(next.id)
      order.served(next.ownerKey)
    }
    expect(picks).toEqual(['a1', 'b1', 'a1', 'b1'])
  })

  it('gives a newcomer the very next turn, and nothing when nothing waits', () => {
    const order = new FairOrder()
    order.served('ana')
    order.served('ben')
    expect(order.pick([sweep('a1', 'ana', 1), sweep('b1', 'ben', 2), sweep('c1', 'cleo', 9)])?.id).toBe('c1')
    expect(order.pick([])).toBeUndefined()
  })
})

describe('list cursors', () => {
  it('round-trips a position and rejects anything else', () => {
    const cursor = encodeCursor({ createdMs: 1_790_000_000_123, seq: 42 })
    expect(decodeCursor(cursor)).toEqual({ createdMs: 1_790_000_000_123, seq: 42 })
    for (const bad of ['', 'x', Buffer.from('12.x').toString('base64url'), Buffer.from('-1.2').toString('base64url'), `${cursor}=`]) {
      expect(() => decodeCursor(bad)).toThrow(InvalidCursorError)
    }
  })
})

describe('embedded queue: dispatch order', () => {
  it('lets a second owner\'s sweep finish before the first owner\'s next sweep starts', async () => {
    const data = makeDataDir()
    const queue = await openQueue(data.dir, { threads: 1 })
    try {
      const log: string[] = []
      const a1 = await queue.submit({ spec: roomCodesSpec({ seed: 31 }), owner: 'ana' })
      const a2 = await queue.submit({ spec: roomCodesSpec({ seed: 32 }), owner: 'ana' })
      const b1 = await queue.submit({ spec: roomCodesSpec({ seed: 33 }), owner: 'ben' })
      for (const [name, id] of [['a1', a1.id], ['a2', a2.id], ['b1', b1.id]] as const) {
        queue.subscribe(id, event => { if (event.type === 'state') log.push(`${name}:${event.sweep.status}`) })
      }
      for (const id of [a1.id, a2.id, b1.id]) expect((await waitForTerminal(queue, id)).status).toBe('succeeded')
      // Strict first-come-first-served would run all of a2 before any of b1.
      expect(log.indexOf('b1:succeeded')).toBeLessThan(log.indexOf('a2:running'))
    } finally {
      await queue.close()
      data.remove()
    }
  })
})
