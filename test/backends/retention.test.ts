/**
 * The differences between the two backends that remain behind the one port (listed in
 * src/backends/README.md), each shown here: retention of finished sweeps, and the order in
 * which different owners' sweeps are served.
 */
import { Redis } from 'ioredis'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import type { SweepQueue } from '../../src/backends/port.js'
import { createRedisQueue } from '../../src/backends/redis/index.js'
import { keyLayout } from '../../src/backends/redis/keys.js'
import { startWorker } from '../../src/backends/redis/worker/worker.js'
import { normaliseSpec } from '../../src/spec/index.js'
import { installChunkGate, type ChunkGate } from '../helpers/chunk-gate.js'
import { quietLogger, REDIS_URL, redisAvailable, removePrefix, testPrefix, waitForTerminal } from '../integration/helpers.js'
import { makeDataDir, openQueue } from './embedded/helpers.js'

/** One room code each, one chunk each. */
const oneChunk = (seed: number) => normaliseSpec({ label: `room ${seed}`, neurons: 64, patterns: 3, trials: 8, seed })

/**
 * Owner ana submits three sweeps, then ben one, while the only compute slot is held; then the
 * slot serves them one chunk at a time. Returns the owners in the order their sweeps started.
 */
async function serviceOrder (queue: SweepQueue, gate: ChunkGate): Promise<string[]> {
  gate.hold()
  const submitted = []
  for (const [owner, seed] of [['ana', 1], ['ana', 2], ['ana', 3], ['ben', 4]] as const) submitted.push(await queue.submit({ spec: oneChunk(seed), owner }))
  // One slot: chunks start one at a time, in the order the backend picks them.
  await gate.untilWaiting()
  gate.open()
  const finished = await Promise.all(submitted.map((sweep) => waitForTerminal(queue, sweep.id)))
  return finished.sort((a, b) => Date.parse(a.startedAt!) - Date.parse(b.startedAt!)).map((record) => record.owner!)
}

describe('embedded backend', () => {
  let gate: ChunkGate
  beforeEach(() => { gate = installChunkGate() })
  afterEach(() => gate.remove())

  it('keeps a finished sweep, its result and its trial records until the data directory goes', async () => {
    const data = makeDataDir()
    const first = await openQueue(data.dir, { threads: 1 })
    const sweep = await first.submit({ spec: oneChunk(9), owner: null })
    await waitForTerminal(first, sweep.id)
    await first.close()
    const second = await openQueue(data.dir, { threads: 1 })
    try {
      expect((await second.get(sweep.id))?.status).toBe('succeeded')
      expect((await second.trials(sweep.id))?.[0]).toHaveLength(8)
    } finally {
      await second.close()
      data.remove()
    }
  })

  it('serves owners in turn: a late owner is not stuck behind an earlier owner\'s queue', async () => {
    const data = makeDataDir()
    const queue = await openQueue(data.dir, { threads: 1 })
    try {
      expect(await serviceOrder(queue, gate)).toEqual(['ana', 'ben', 'ana', 'ana'])
    } finally {
      await queue.close()
      data.remove()
    }
  })
})

const available = await redisAvailable()

describe.runIf(available)('Redis backend', () => {
  const logger = quietLogger()
  let prefix: string
  let gate: ChunkGate
  beforeEach(() => {
    prefix = testPrefix()
    gate = installChunkGate()
  })
  afterEach(async () => {
    gate.remove()
    await removePrefix(prefix)
  })

  it('lets every key of a finished sweep expire after the retention period, chunks included', async () => {
    const retentionSeconds = 3600
    const queue = await createRedisQueue({ url: REDIS_URL, prefix, logger, retentionSeconds })
    const worker = await startWorker({ url: REDIS_URL, prefix, logger, concurrency: 1, retentionSeconds })
    const redis = new Redis(REDIS_URL)
    try {
      const sweep = await queue.submit({ spec: oneChunk(10), owner: null })
      expect((await waitForTerminal(queue, sweep.id)).status).toBe('succeeded')
      const keys = keyLayout(prefix).sweep(sweep.id)
      for (const key of [keys.record, keys.result, keys.chunks, keys.plan]) {
        const ttl = await redis.ttl(key)
        expect(ttl, key).toBeGreaterThan(retentionSeconds - 60)
        expect(ttl, key).toBeLessThanOrEqual(retentionSeconds)
      }
    } finally {
      redis.disconnect()
      await worker.close()
      await queue.close()
    }
  })

  it('serves sweeps first in, first out, whoever owns them', async () => {
    const queue = await createRedisQueue({ url: REDIS_URL, prefix, logger })
    const worker = await startWorker({ url: REDIS_URL, prefix, logger, concurrency: 1 })
    try {
      expect(await serviceOrder(queue, gate)).toEqual(['ana', 'ana', 'ana', 'ben'])
    } finally {
      await worker.close()
      await queue.close()
    }
  })
})
