/**
 * Purge leaves nothing of a sweep behind, through the whole backend (queue, workers, store):
 * no row in SQLite, no key under the Redis prefix (BullMQ's job hashes and sets included) whose
 * name or content mentions it. The sweep was extended and resumed first, so every kind of
 * record a sweep can leave exists.
 */
import { Redis } from 'ioredis'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { createEmbeddedQueue } from '../../src/backends/embedded/index.js'
import { createRedisQueue } from '../../src/backends/redis/index.js'
import { startWorker } from '../../src/backends/redis/worker/worker.js'
import type { SweepQueue } from '../../src/backends/port.js'
import { normaliseSpec } from '../../src/spec/index.js'
import { installChunkGate } from '../helpers/chunk-gate.js'
import { redisTraces, sqliteTraces } from '../helpers/traces.js'
import { DATABASE_FILE } from '../../src/backends/embedded/store.js'
import { makeDataDir } from './embedded/helpers.js'
import { quietLogger, REDIS_URL, redisAvailable, removePrefix, testPrefix, waitForRecord, waitForTerminal } from '../integration/helpers.js'

const available = await redisAvailable()
const gate = installChunkGate()
afterAll(() => gate.remove())

/** Room codes at four loads, one chunk each: canceled after one, resumed, then purged. */
const spec = normaliseSpec({ label: 'rooms to forget', neurons: 80, load: { values: [0.04, 0.06, 0.08, 0.1] }, trials: 12, seed: 515 })

/** Submits with an idempotency key, cancels after one chunk, resumes, finishes, and purges. */
async function leaveEverythingThenPurge (queue: SweepQueue): Promise<string> {
  gate.hold()
  const submitted = await queue.submit({ spec, owner: 'ana', reusePoints: true, idempotencyKey: `forget-${Math.random()}` })
  gate.release(1)
  await waitForRecord(queue, submitted.id, (record) => record.progress.chunksDone >= 1)
  await queue.cancel(submitted.id)
  await waitForTerminal(queue, submitted.id)
  await queue.resume(submitted.id)
  gate.open()
  expect((await waitForTerminal(queue, submitted.id)).status).toBe('succeeded')
  expect(await queue.purge(submitted.id)).toBe(true)
  expect(await queue.get(submitted.id)).toBeNull()
  expect(await queue.purge(submitted.id)).toBe(false)
  return submitted.id
}

describe('purge leaves no trace', () => {
  it('in the embedded backend\'s SQLite file', async () => {
    const data = makeDataDir()
    const queue = await createEmbeddedQueue({ dataDir: data.dir, threads: 2 })
    let id: string
    try {
      id = await leaveEverythingThenPurge(queue)
    } finally {
      await queue.close()
    }
    expect(sqliteTraces(join(data.dir, DATABASE_FILE), id)).toEqual([])
    data.remove()
  })

  it.runIf(available)('under the Redis prefix, BullMQ\'s keys included', async () => {
    const logger = quietLogger()
    const prefix = testPrefix()
    const queue = await createRedisQueue({ url: REDIS_URL, prefix, logger })
    const worker = await startWorker({ url: REDIS_URL, prefix, logger, concurrency: 2 })
    const redis = new Redis(REDIS_URL)
    try {
      const id = await leaveEverythingThenPurge(queue)
      // A job of the canceled run may still be in flight (handed back, then skipped): once it
      // ends, the worker removes it too.
      await expect.poll(async () => await redisTraces(redis, prefix, id), { timeout: 30_000, interval: 100 }).toEqual([])
    } finally {
      await queue.close()
      await worker.close()
      redis.disconnect()
      await removePrefix(prefix)
    }
  })
})
