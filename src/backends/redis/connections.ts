/**
 * The three kinds of Redis connection the backend opens, each with the settings its job
 * needs (BullMQ's production guide):
 * - producer: API-side commands fail at once while Redis is away (`enableOfflineQueue:
 *   false`), so a request answers 503 instead of hanging;
 * - worker: commands wait for Redis to come back (`maxRetriesPerRequest: null`), so a chunk
 *   in flight survives a Redis restart;
 * - subscriber: a dedicated connection in pub/sub mode, re-subscribed after a reconnect.
 */
import type { RedisOptions as BullRedisOptions } from 'bullmq'
import { Redis, type RedisOptions } from 'ioredis'

export type ConnectionRole = 'producer' | 'worker' | 'subscriber'

const ROLE_OPTIONS: Record<ConnectionRole, RedisOptions> = {
  producer: { enableOfflineQueue: false, maxRetriesPerRequest: 1 },
  worker: { maxRetriesPerRequest: null },
  subscriber: { maxRetriesPerRequest: null, autoResubscribe: true }
}

/** Options BullMQ's Worker takes to open its own (blocking) connections. */
export function workerConnectionOptions (url: string, name: string): BullRedisOptions {
  return { url, maxRetriesPerRequest: null, connectionName: name }
}

/** Opens a connection and resolves once it is ready; rejects if Redis does not answer within `timeoutMs`. */
export async function openConnection (url: string, role: ConnectionRole, name: string, timeoutMs = 10_000): Promise<Redis> {
  const redis = new Redis(url, { ...ROLE_OPTIONS[role], connectionName: name, lazyConnect: true })
  // Without a listener ioredis prints every reconnect error; callers attach their own logger.
  redis.on('error', () => {})
  let timer: NodeJS.Timeout | undefined
  try {
    await Promise.race([
      redis.connect(),
      new Promise((_resolve, reject) => {
        timer = setTimeout(() => reject(new Error(`Redis at ${redactUrl(url)} did not answer within ${timeoutMs} ms.`)), timeoutMs)
      })
    ])
  } catch (error) {
    redis.disconnect()
    throw error
  } finally {
    clearTimeout(timer)
  }
  return redis
}

/** Closes a connection politely, falling back to a hard disconnect when Redis is away. */
export async function closeConnection (redis: Redis): Promise<void> {
  if (redis.status === 'end') return
  try {
    if (redis.status === 'ready') {
      await redis.quit()
      return
    }
  } catch {
    // Redis went away between the check and the QUIT: nothing left to close politely.
  }
  redis.disconnect()
}

/** The URL without its password, for logs and error messages. */
export function redactUrl (url: string): string {
  try {
    const parsed = new URL(url)
    if (parsed.password !== '') parsed.password = '***'
    return parsed.toString()
  } catch {
    return '(unparsable Redis URL)'
  }
}
