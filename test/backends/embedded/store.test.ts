import Database from 'better-sqlite3'
import { join } from 'node:path'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { DATABASE_FILE, SweepStore, type NewSweep } from '../../../src/backends/embedded/store.js'
import { makeDataDir } from './helpers.js'

function newSweep (id: string, overrides: Partial<NewSweep> = {}): NewSweep {
  return {
    id,
    owner: 'ana',
    label: null,
    specHash: `hash-${id}`,
    specJson: '{"trials":4}',
    createdMs: 1_790_000_000_000,
    pointsTotal: 2,
    trialsTotal: 8,
    chunksTotal: 2,
    reusedFrom: null,
    ...overrides
  }
}

const chunk = (index: number, trials = 4) => ({ index, point: index, trials, computeMs: 5, body: new Uint8Array([1, 2, index]) })

describe('sweep store (SQLite)', () => {
  let data: ReturnType<typeof makeDataDir>
  let store: SweepStore

  beforeEach(() => {
    data = makeDataDir()
    store = new SweepStore(data.dir)
  })
  afterEach(() => {
    store.close()
    data.remove()
  })

  it('replaces a chunk delivered twice instead of adding it, and counts its progress once', () => {
    store.insertSweep(newSweep('s1'))
    expect(store.markRunning('s1', 1)).toBe(true)
    expect(store.commitChunk('s1', chunk(0), 1, 2)).toBe(true)
    expect(store.commitChunk('s1', chunk(0), 0, 3)).toBe(true)
    expect(store.doneChunkIndices('s1')).toEqual([0])
    expect(store.get('s1')?.progress).toMatchObject({ chunksDone: 1, trialsDone: 4, pointsDone: 1 })
  })

  it('writes nothing for a sweep that is no longer running', () => {
    store.insertSweep(newSweep('s1'))
    expect(store.commitChunk('s1', chunk(0), 1, 2)).toBe(false)
    store.markRunning('s1', 1)
    expect(store.finishUnsuccessfully('s1', 'canceled', null, 5)).toBe(true)
    expect(store.commitChunk('s1', chunk(1), 1, 6)).toBe(false)
    expect(store.finishUnsuccessfully('s1', 'failed', { kind: 'system', message: 'late' }, 7)).toBe(false)
    expect(store.get('s1')).toMatchObject({ status: 'canceled', error: null })
  })

  it('stores the result once, drops the chunk rows, and serves the result to reuses', () => {
    store.insertSweep(newSweep('s1'))
    store.markRunning('s1', 1)
    store.commitChunk('s1', chunk(0), 1, 2)
    store.commitChunk('s1', chunk(1), 1, 3)
    expect(store.chunkBodies('s1')).toEqual({ bodies: [Buffer.from([1, 2, 0]), Buffer.from([1, 2, 1])], computeMs: 10 })
    expect(store.completeSweep('s1', new Uint8Array([9]), 4)).toBe(true)
    expect(store.completeSweep('s1', new Uint8Array([8]), 5)).toBe(false)
    expect(store.doneChunkIndices('s1')).toEqual([])
    expect(store.resultBody('s1')?.body).toEqual(Buffer.from([9]))

    expect(store.findReusable('ana', 'hash-s1')).toBe('s1')
    expect(store.findReusable('ben', 'hash-s1')).toBeNull()
    store.insertSweep(newSweep('s2', { specHash: 'hash-s1', reusedFrom: 's1', createdMs: 1_790_000_000_500 }))
    expect(store.get('s2')).toMatchObject({ status: 'succeeded', reusedFrom: 's1', progress: { trialsDone: 8, chunksDone: 2 } })
    expect(store.resultBody('s2')?.body).toEqual(Buffer.from([9]))
    expect(store.findReusable('ana', 'hash-s1')).toBe('s1')
  })

  it('lists the active sweeps oldest first for resumption', () => {
    store.insertSweep(newSweep('late', { createdMs: 2000 }))
    store.insertSweep(newSweep('early', { createdMs: 1000 }))
    store.insertSweep(newSweep('done', { createdMs: 500, reusedFrom: null }))
    store.markRunning('done', 1)
    store.finishUnsuccessfully('done', 'failed', { kind: 'user', message: 'bad' }, 2)
    expect(store.activeSweeps().map(row => row.id)).toEqual(['early', 'late'])
    expect(store.countByStatus()).toEqual({ queued: 2, running: 0, succeeded: 0, failed: 1, canceled: 0 })
  })

  it('migrates once, keeps data across reopening, and refuses a database from a newer build', () => {
    store.insertSweep(newSweep('kept'))
    store.close()
    store = new SweepStore(data.dir)
    expect(store.get('kept')?.id).toBe('kept')
    store.close()

    const raw = new Database(join(data.dir, DATABASE_FILE))
    const current = raw.pragma('user_version', { simple: true })
    raw.pragma('user_version = 99')
    raw.close()
    expect(() => new SweepStore(data.dir)).toThrow(/newer memsweep/)
    const restore = new Database(join(data.dir, DATABASE_FILE))
    restore.pragma(`user_version = ${Number(current)}`)
    restore.close()
    store = new SweepStore(data.dir)
  })

  it('keeps the database in WAL mode', () => {
    store.close()
    const raw = new Database(join(data.dir, DATABASE_FILE), { readonly: true })
    expect(raw.pragma('journal_mode', { simple: true })).toBe('wal')
    raw.close()
    store = new SweepStore(data.dir)
  })
})
