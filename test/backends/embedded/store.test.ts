/**
 * What only the SQLite store does (the shared behaviour is in store.contract.test.ts):
 * its file, its migrations, sweeps stored by a release without plans, and the errors that
 * name an unusable data directory.
 */
import Database from 'better-sqlite3'
import { chmodSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { DATABASE_FILE, SqliteSweepStore } from '../../../src/backends/embedded/store.js'
import { normaliseSpec, replicateKey, specHash } from '../../../src/spec/index.js'
import { planSweep } from '../../../src/sweep/index.js'
import { makeDataDir } from './helpers.js'

const spec = normaliseSpec({ neurons: 60, load: { values: [0.05, 0.1] }, trials: 10, seed: 3 })

describe('sweep store (SQLite only)', () => {
  let data: ReturnType<typeof makeDataDir>
  let store: SqliteSweepStore

  beforeEach(() => {
    data = makeDataDir()
    store = new SqliteSweepStore(data.dir)
  })
  afterEach(() => {
    store.close()
    data.remove()
  })

  it('migrates once, keeps data across reopening, and refuses a database from a newer build', async () => {
    await store.create({ id: 'kept', owner: null, label: null, specHash: specHash(spec), spec, createdMs: 1, plan: planSweep(spec), replicateKey: replicateKey(spec), reuseKeys: [] })
    store.close()
    store = new SqliteSweepStore(data.dir)
    expect((await store.get('kept'))?.id).toBe('kept')
    store.close()

    const raw = new Database(join(data.dir, DATABASE_FILE))
    const current = raw.pragma('user_version', { simple: true })
    raw.pragma('user_version = 99')
    raw.close()
    expect(() => new SqliteSweepStore(data.dir)).toThrow(/newer memsweep/)
    const restore = new Database(join(data.dir, DATABASE_FILE))
    restore.pragma(`user_version = ${Number(current)}`)
    restore.close()
    store = new SqliteSweepStore(data.dir)
  })

  it('keeps the database in WAL mode', () => {
    store.close()
    const raw = new Database(join(data.dir, DATABASE_FILE), { readonly: true })
    expect(raw.pragma('journal_mode', { simple: true })).toBe('wal')
    raw.close()
    store = new SqliteSweepStore(data.dir)
  })

  it('gives a sweep stored without a plan a new one, dropping chunks cut by the unknown old plan', async () => {
    await store.create({ id: 'old', owner: null, label: null, specHash: specHash(spec), spec, createdMs: 1, plan: planSweep(spec), replicateKey: replicateKey(spec), reuseKeys: [] })
    const plan = planSweep(spec)
    await store.recordChunk('old', plan.chunks[0]!, new Uint8Array([1]), 1, 2)
    store.close()
    // What a release before stored plans left behind: no plan, a chunk of unknown cut.
    const raw = new Database(join(data.dir, DATABASE_FILE))
    raw.prepare('UPDATE sweeps SET plan_json = NULL WHERE id = ?').run('old')
    raw.close()
    store = new SqliteSweepStore(data.dir)
    const [row] = store.activeSweeps()
    expect(row).toMatchObject({ id: 'old', plan: null })
    const shownBefore = (await store.get('old'))!.progress.trialsDone
    store.adoptPlan('old', plan)
    expect(await store.plan('old')).toEqual(plan)
    expect(await store.doneChunks('old')).toEqual([])
    expect((await store.get('old'))!.progress).toMatchObject({ chunksDone: 0, pointsDone: 0, trialsDone: shownBefore })
  })

  it('names the data directory when it cannot be used', () => {
    const file = join(data.dir, 'not-a-directory')
    writeFileSync(file, '')
    expect(() => new SqliteSweepStore(join(file, 'data'))).toThrow(new RegExp(`data directory ${file.replace(/[/\\]/g, '.')}.*cannot be created.*DATA_DIR`))
    if (process.getuid?.() !== 0) {
      const locked = join(data.dir, 'locked')
      chmodSync(data.dir, 0o500)
      try {
        expect(() => new SqliteSweepStore(locked)).toThrow(/DATA_DIR/)
      } finally {
        chmodSync(data.dir, 0o700)
      }
    }
  })
})
