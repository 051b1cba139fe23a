import { Redis } from 'ioredis'
import { describe } from 'vitest'
import { keyLayout } from '../../../src/backends/redis/keys.js'
import { RedisSweepStore } from '../../../src/backends/redis/store.js'
import { storeContract } from '../../sweep/store-contract.js'
import { redisTraces } from '../../helpers/traces.js'
import { REDIS_URL, redisAvailable, removePrefix, testPrefix } from '../../integration/helpers.js'

const available = await redisAvailable()

describe.runIf(available)('Redis', () => {
  storeContract('Redis with Lua scripts (Redis backend)', async () => {
    const prefix = testPrefix()
    const redis = new Redis(REDIS_URL, { maxRetriesPerRequest: 3 })
    const store = new RedisSweepStore(redis, keyLayout(prefix), 3600)
    return {
      store,
      traces: async (id) => await redisTraces(redis, prefix, id),
      close: async () => {
        redis.disconnect()
        await removePrefix(prefix)
      }
    }
  })
})
