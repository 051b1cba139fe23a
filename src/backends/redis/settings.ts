/**
 * Start-up checks of the Redis server settings BullMQ relies on. An evicting server drops
 * job and sweep keys under memory pressure, silently losing work, so it is refused. A
 * server that keeps nothing on disk loses every queued sweep when it restarts: allowed
 * (a scratch setup), but said loudly.
 */
import type { Redis } from 'ioredis'
import type { Logger } from 'pino'

export type PersistenceMode = 'aof' | 'rdb' | 'aof+rdb' | 'off' | 'unknown'

export interface RedisSettingsReport {
  /** `null` when neither CONFIG nor INFO would tell (some managed services hide both). */
  evictionPolicy: string | null
  persistence: PersistenceMode
}

export class RedisSettingsError extends Error {
  constructor (readonly evictionPolicy: string) {
    super(`Redis maxmemory-policy is '${evictionPolicy}', which may evict queued jobs and sweep records. ` +
      "Set it to 'noeviction' (redis-server --maxmemory-policy noeviction) before starting memsweep.")
    this.name = 'RedisSettingsError'
  }
}

export async function inspectRedisSettings (redis: Redis): Promise<RedisSettingsReport> {
  const memory = parseInfo(await safeInfo(redis, 'memory'))
  const persistenceInfo = parseInfo(await safeInfo(redis, 'persistence'))
  const evictionPolicy = (await configValue(redis, 'maxmemory-policy')) ?? memory.get('maxmemory_policy') ?? null

  const aofText = (await configValue(redis, 'appendonly')) ?? flagFromInfo(persistenceInfo.get('aof_enabled'))
  const saveRules = await configValue(redis, 'save')
  const aof = aofText === undefined ? undefined : aofText === 'yes'
  const rdb = saveRules === undefined ? undefined : saveRules.trim() !== ''
  return { evictionPolicy, persistence: persistenceMode(aof, rdb) }
}

/**
 * Inspects the server, throws RedisSettingsError on an evicting policy (unless allowed),
 * and logs a warning for anything it could not verify or for a server without persistence.
 */
export async function checkRedisSettings (redis: Redis, logger: Logger, options: { allowEviction?: boolean } = {}): Promise<RedisSettingsReport> {
  const report = await inspectRedisSettings(redis)
  if (report.evictionPolicy === null) {
    logger.warn('could not read the Redis maxmemory-policy (CONFIG and INFO refused); make sure it is noeviction')
  } else if (report.evictionPolicy !== 'noeviction') {
    if (options.allowEviction !== true) throw new RedisSettingsError(report.evictionPolicy)
    logger.error({ evictionPolicy: report.evictionPolicy }, 'Redis may EVICT queue keys: sweeps can be lost silently; set maxmemory-policy noeviction')
  }
  if (report.persistence === 'off') {
    logger.warn('Redis persistence is OFF (no AOF, no RDB snapshots): a Redis restart loses every queued and running sweep; enable appendonly for production')
  } else if (report.persistence === 'unknown') {
    logger.warn('could not tell whether Redis persists to disk; enable appendonly for production')
  }
  return report
}

function persistenceMode (aof: boolean | undefined, rdb: boolean | undefined): PersistenceMode {
  if (aof === true && rdb === true) return 'aof+rdb'
  if (aof === true) return 'aof'
  if (rdb === true) return 'rdb'
  if (aof === false && rdb === false) return 'off'
  return 'unknown'
}

/** CONFIG GET, or undefined where the server disables or renames CONFIG. */
async function configValue (redis: Redis, name: string): Promise<string | undefined> {
  try {
    const reply = await redis.config('GET', name) as unknown
    if (Array.isArray(reply) && reply.length >= 2) return String(reply[1])
    if (reply !== null && typeof reply === 'object' && name in reply) return String((reply as Record<string, unknown>)[name])
    return undefined
  } catch {
    return undefined
  }
}

async function safeInfo (redis: Redis, section: string): Promise<string> {
  try {
    return await redis.info(section)
  } catch {
    return ''
  }
}

function parseInfo (text: string): Map<string, string> {
  const fields = new Map<string, string>()
  for (const line of text.split(/\r?\n/)) {
    const colon = line.indexOf(':')
    if (colon > 0 && !line.startsWith('#')) fields.set(line.slice(0, colon), line.slice(colon + 1).trim())
  }
  return fields
}

function flagFromInfo (value: string | undefined): string | undefined {
  if (value === undefined) return undefined
  return value === '1' ? 'yes' : 'no'
}
