/**
 * A data directory deleted or replaced under a running embedded service: SQLite would go on
 * writing to a file nobody can open again. The queue notices, refuses new work, says so on
 * readiness, and writes a copy of what it stored back, so a restart loses nothing stored.
 */
import { existsSync, rmSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { createEmbeddedQueue, DATABASE_FILE } from '../../../src/backends/embedded/index.js'
import { StorageUnavailableError } from '../../../src/backends/errors.js'
import { createHarness } from '../../api/helpers/harness.js'
import { expectProblem } from '../../api/helpers/problems.js'
import { makeDataDir, openQueue, pollUntil, roomCodesSpec, waitForTerminal } from './helpers.js'

describe('embedded queue: storage health', () => {
  it('notices a deleted data directory, refuses new sweeps, and restores what it had stored', async () => {
    const data = makeDataDir()
    const queue = await openQueue(data.dir, { threads: 1, tuning: { storageCheckMs: 20 } })
    try {
      const done = await queue.submit({ spec: roomCodesSpec({ seed: 31 }), owner: 'ana' })
      expect((await waitForTerminal(queue, done.id)).status).toBe('succeeded')
      expect(await queue.ready()).toEqual({ ok: true })

      rmSync(data.dir, { recursive: true, force: true })
      await pollUntil(async () => !(await queue.ready()).ok, 10_000)
      expect((await queue.ready()).detail).toMatch(/storage is unavailable/)
      await expect(queue.submit({ spec: roomCodesSpec({ seed: 32 }), owner: 'ana' })).rejects.toBeInstanceOf(StorageUnavailableError)
      // The copy written back holds the finished sweep.
      await pollUntil(async () => existsSync(join(data.dir, DATABASE_FILE)), 10_000)
    } finally {
      await queue.close()
    }
    const restarted = await openQueue(data.dir, { threads: 1 })
    try {
      const listed = await restarted.list({ owner: 'ana', limit: 10 })
      expect(listed.items.map((record) => record.status)).toEqual(['succeeded'])
      expect(await restarted.results(listed.items[0]!.id)).not.toBeNull()
      expect(await restarted.ready()).toEqual({ ok: true })
    } finally {
      await restarted.close()
      data.remove()
    }
  })
})

describe('API over an embedded queue that lost its storage', () => {
  it('answers /readyz and submissions with 503 problem documents that do not reveal the path', async () => {
    const h = await createHarness(async ({ dataDir }) => await createEmbeddedQueue({ dataDir: join(dataDir, 'store'), threads: 1, tuning: { storageCheckMs: 20 } }))
    try {
      expect((await h.request({ method: 'GET', url: '/readyz' })).statusCode).toBe(200)
      rmSync(join(h.dataDir, 'store'), { recursive: true, force: true })
      await pollUntil(async () => (await h.request({ method: 'GET', url: '/readyz' })).statusCode === 503, 10_000)
      const submit = await h.request({ method: 'POST', url: '/v1/sweeps', payload: { neurons: 64, patterns: 3, trials: 4 } })
      const problem = expectProblem(submit, 503, 'MEMSWEEP_NOT_READY')
      expect(problem.detail).toMatch(/storage is unavailable/)
      expect(submit.body).not.toContain(h.dataDir)
      expect(submit.headers['retry-after']).toBeDefined()
    } finally {
      await h.close()
    }
  })
})
