/**
 * Redis itself misbehaving: a crash and restart in the middle of a sweep, and servers
 * whose settings would lose work. Each test runs a private redis-server of its own.
 */
import { afterEach, describe, expect, it } from 'vitest'
import { Writable } from 'node:stream'
import { Redis } from 'ioredis'
import { pino } from 'pino'
import type { SweepQueue } from '../../src/backends/port.js'
import { createRedisQueue, RedisSettingsError } from '../../src/backends/redis/index.js'
import { inspectRedisSettings } from '../../src/backends/redis/settings.js'
import { normaliseSpec } from '../../src/spec/index.js'
import { startWorker } from '../../src/backends/redis/worker/worker.js'
import { computeInProcess, quietLogger, fullResult, resultBytes, testPrefix, waitForRecord, waitForTerminal } from './helpers.js'
import { redisServerInstalled, startPrivateRedis, type PrivateRedis } from './redis-server.js'

const installed = redisServerInstalled()
if (!installed && process.env.MEMSWEEP_REQUIRE_REDIS === '1') {
  throw new Error('MEMSWEEP_REQUIRE_REDIS=1 but redis-server is not installed: the Redis restart tests cannot run.')
}

/** A log destination that keeps parsed lines, to assert on what was logged. */
function collect (lines: Array<{ level: number, msg: string }>): Writable {
  return new Writable({
    write (chunk: Buffer, _encoding, done) {
      lines.push(JSON.parse(chunk.toString()) as { level: number, msg: string })
      done()
    }
  })
}

describe.runIf(installed)('Redis backend: Redis restarts and settings', () => {
  const logger = quietLogger()
  const cleanups: Array<() => Promise<void>> = []

  afterEach(async () => {
    for (const cleanup of cleanups.splice(0).reverse()) await cleanup()
  })

  const privateRedis = async (extraArgs: string[] = []): Promise<PrivateRedis> => {
    const server = await startPrivateRedis(extraArgs)
    cleanups.push(() => server.stop())
    return server
  }

  it('finishes a sweep with byte-identical results when Redis (AOF on) crashes and restarts mid-sweep', async () => {
    const server = await privateRedis()
    const prefix = testPrefix()
    const queue: SweepQueue = await createRedisQueue({ url: server.url, prefix, logger })
    cleanups.push(() => queue.close())
    // A job taken from the queue just as Redis dies is moved to active by the server but never
    // reaches the worker; BullMQ's stalled-job check returns it to the queue once its lock
    // expires. Short locks make that seconds instead of the production default's minute.
    const worker = await startWorker({ url: server.url, prefix, logger, concurrency: 2, lockDurationMs: 2000, stalledIntervalMs: 1000 })
    cleanups.push(() => worker.close())

    const spec = normaliseSpec({
      label: 'room recall through an outage',
      neurons: 300,
      load: { values: [0.05, 0.08, 0.11, 0.14, 0.17, 0.2] },
      dynamics: { temperature: 0.3, maxSweeps: 100, burnIn: 20 },
      trials: 120,
      seed: 41
    })
    const submitted = await queue.submit({ spec, owner: null })
    const before = await waitForRecord(queue, submitted.id, record => record.progress.chunksDone >= 1)
    expect(before.progress.chunksDone).toBeLessThan(before.progress.chunksTotal)

    await server.crash()
    await server.restart()
    // The API side fails fast while Redis is away (a request would get 503); wait until it answers again.
    await expect.poll(() => queue.ready(), { timeout: 10_000, interval: 100 }).toEqual({ ok: true })

    const done = await waitForTerminal(queue, submitted.id)
    expect(done.status).toBe('succeeded')
    expect(done.progress.chunksDone).toBe(done.progress.chunksTotal)
    expect(done.progress.trialsDone).toBe(done.progress.trialsTotal)
    expect(resultBytes(await fullResult(queue, submitted.id))).toBe(resultBytes(computeInProcess(spec)))
    expect(await queue.ready()).toEqual({ ok: true })
  })

  it('answers not ready while Redis is down and ready again once it is back', async () => {
    const server = await privateRedis()
    const queue = await createRedisQueue({ url: server.url, prefix: testPrefix(), logger })
    cleanups.push(() => queue.close())
    expect(await queue.ready()).toEqual({ ok: true })
    await server.crash()
    const down = await queue.ready()
    expect(down.ok).toBe(false)
    expect(down.detail).toMatch(/Redis/)
    await server.restart()
    await expect.poll(() => queue.ready(), { timeout: 10_000, interval: 100 }).toEqual({ ok: true })
  })

  it('says loudly that Redis lost its data when it restarts without persistence, and fails the lost sweep with a system error', async () => {
    const server = await privateRedis(['--appendonly', 'no'])
    const lines: Array<{ level: number, msg: string }> = []
    const queue = await createRedisQueue({ url: server.url, prefix: testPrefix(), logger: pino({ level: 'warn' }, collect(lines)) })
    cleanups.push(() => queue.close())
    const submitted = await queue.submit({ spec: normaliseSpec({ label: 'lost room', neurons: 60, patterns: 3, trials: 4, seed: 1 }), owner: null })

    await server.crash()
    await server.restart()
    await expect.poll(() => queue.ready(), { timeout: 10_000, interval: 100 }).toEqual({ ok: true })
    expect(lines.some(line => line.level === 50 && /REDIS LOST MEMSWEEP DATA/.test(line.msg))).toBe(true)
    // Never silently: the sweep this instance knew as unfinished is now failed, kind system.
    const after = await queue.get(submitted.id)
    expect(after?.status).toBe('failed')
    expect(after?.error?.kind).toBe('system')
    expect(after?.error?.message).toMatch(/Redis lost/)
  })

  it('refuses a Redis that may evict keys, unless explicitly allowed', async () => {
    const server = await privateRedis(['--maxmemory-policy', 'allkeys-lru'])
    const prefix = testPrefix()
    await expect(createRedisQueue({ url: server.url, prefix, logger })).rejects.toBeInstanceOf(RedisSettingsError)
    await expect(startWorker({ url: server.url, prefix, logger })).rejects.toBeInstanceOf(RedisSettingsError)
    const allowed = await createRedisQueue({ url: server.url, prefix, logger, requireNoEviction: false })
    await allowed.close()
  })

  it('reports persistence and warns loudly when Redis keeps nothing on disk', async () => {
    const server = await privateRedis()
    const redis = new Redis(server.url)
    cleanups.push(async () => { redis.disconnect() })
    expect(await inspectRedisSettings(redis)).toEqual({ evictionPolicy: 'noeviction', persistence: 'aof' })

    await redis.config('SET', 'appendonly', 'no')
    expect((await inspectRedisSettings(redis)).persistence).toBe('off')
    const lines: Array<{ level: number, msg: string }> = []
    const queue = await createRedisQueue({ url: server.url, prefix: testPrefix(), logger: pino({ level: 'warn' }, collect(lines)) })
    await queue.close()
    expect(lines.some(line => line.level === 40 && /persistence is OFF/.test(line.msg))).toBe(true)
  })
})
