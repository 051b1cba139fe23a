/**
 * With Redis, API instances share their rate-limit counters: a client spreading requests
 * over two instances gets no more than RATE_LIMIT_MAX in total, and an address no more than
 * AUTH_FAILURE_MAX failed authentications. Needs Redis at
 * REDIS_TEST_URL (fails instead of skipping under MEMSWEEP_REQUIRE_REDIS=1).
 */
import { mkdtemp, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { FastifyInstance } from 'fastify'
import type { Redis } from 'ioredis'
import { pino } from 'pino'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { buildApp } from '../../src/api/app.js'
import { parseTokens } from '../../src/api/tokens.js'
import { createEmbeddedQueue } from '../../src/backends/embedded/index.js'
import type { SweepQueue } from '../../src/backends/port.js'
import { closeConnection, openConnection } from '../../src/backends/redis/connections.js'
import { loadConfig } from '../../src/config.js'
import { REDIS_URL, redisAvailable, removePrefix, testPrefix } from '../integration/helpers.js'
import { expectProblem } from './helpers/problems.js'

const available = await redisAvailable()
const ALICE = 'alice-laptop-token-4f2e'

describe.runIf(available)('rate limit shared through Redis', () => {
  const prefix = testPrefix()
  let redis: Redis
  const instances: Array<{ app: FastifyInstance, queue: SweepQueue, dataDir: string }> = []

  beforeAll(async () => {
    redis = await openConnection(REDIS_URL, 'producer', 'memsweep:test-rate-limit')
    for (let i = 0; i < 2; i++) {
      const dataDir = await mkdtemp(join(tmpdir(), 'memsweep-rate-'))
      const queue = await createEmbeddedQueue({ dataDir, threads: 1 })
      const config = loadConfig({ DATA_DIR: dataDir, RATE_LIMIT_MAX: '3', RATE_LIMIT_WINDOW: '60', AUTH_FAILURE_MAX: '2', AUTH_FAILURE_WINDOW: '60', REDIS_PREFIX: prefix })
      instances.push({ app: buildApp({ config, queue, logger: pino({ level: 'silent' }), rateLimitRedis: redis, tokens: parseTokens(`alice:${ALICE}`) }), queue, dataDir })
    }
  })

  afterAll(async () => {
    for (const { app, queue, dataDir } of instances) {
      await app.close()
      await queue.close()
      await rm(dataDir, { recursive: true, force: true })
    }
    await removePrefix(prefix)
    await closeConnection(redis)
  })

  it('counts requests to both instances against one budget', async () => {
    const [a, b] = instances.map((instance) => async () => await instance.app.inject({ method: 'GET', url: '/v1/sweeps', headers: { authorization: `Bearer ${ALICE}` } }))
    for (const call of [a!, b!, a!]) expect((await call()).statusCode).toBe(200)
    expectProblem(await b!(), 429, 'MEMSWEEP_RATE_LIMITED')
    expect(await redis.keys(`${prefix}:rate:*`)).toEqual([`${prefix}:rate:owner:alice`])
  })

  it('counts failed authentications at both instances against one budget per address', async () => {
    const [a, b] = instances.map((instance) => async () => await instance.app.inject({
      method: 'GET', url: '/metrics', headers: { authorization: 'Bearer a-guessed-token-000' }, remoteAddress: '192.0.2.44'
    }))
    expectProblem(await a!(), 401, 'MEMSWEEP_UNAUTHENTICATED')
    expectProblem(await b!(), 401, 'MEMSWEEP_UNAUTHENTICATED')
    expectProblem(await a!(), 429, 'MEMSWEEP_TOO_MANY_AUTH_FAILURES')
    expect(await redis.keys(`${prefix}:auth-failures:*`)).toEqual([`${prefix}:auth-failures:192.0.2.44`])
  })
})
