/**
 * The API contract against the Redis backend: a fresh key prefix per app, one worker (two
 * sandbox threads) in this process, everything under the prefix removed afterwards. Needs
 * Redis at REDIS_TEST_URL (default 127.0.0.1:6379); with MEMSWEEP_REQUIRE_REDIS=1 a missing
 * server fails the file instead of skipping it.
 */
import { describe } from 'vitest'
import { createRedisQueue } from '../../src/backends/redis/index.js'
import { startWorker } from '../../src/backends/redis/worker/worker.js'
import { quietLogger, REDIS_URL, redisAvailable, removePrefix, testPrefix } from '../integration/helpers.js'
import { withOverrides } from '../helpers/queue-overrides.js'
import { defineApiContract } from './contract.js'

const available = await redisAvailable()

describe.runIf(available)('Redis backend', () => {
  defineApiContract(async () => {
    const logger = quietLogger()
    const prefix = testPrefix()
    const queue = await createRedisQueue({ url: REDIS_URL, prefix, logger })
    const worker = await startWorker({ url: REDIS_URL, prefix, logger, concurrency: 2 })
    let closed: Promise<void> | null = null
    const withWorker = withOverrides(queue, {
      close: () => {
        closed ??= (async () => {
          await queue.close()
          await worker.close()
          await removePrefix(prefix)
        })()
        return closed
      }
    })
    return withWorker
  })
})
