/**
 * Where a sweep id is still mentioned in a backend's storage: the proof that a purge removed
 * everything. SQLite: every row of every table whose values mention it. Redis: every key
 * under the prefix whose name or content (string value, set, sorted-set or hash members)
 * mentions it. BullMQ's own event stream (a capped log of job ids, trimmed by BullMQ) is
 * not a sweep's data and is left out.
 */
import Database from 'better-sqlite3'
import type { Redis } from 'ioredis'

export function sqliteTraces (file: string, id: string): string[] {
  const db = new Database(file, { readonly: true, fileMustExist: true })
  try {
    const tables = (db.prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%'").all() as Array<{ name: string }>).map((row) => row.name)
    const found: string[] = []
    for (const table of tables) {
      for (const row of db.prepare(`SELECT * FROM "${table}"`).all() as Array<Record<string, unknown>>) {
        const text = Object.values(row).map((value) => value instanceof Uint8Array ? '' : String(value)).join('\u0000')
        if (text.includes(id)) found.push(`${table}: ${text.slice(0, 120)}`)
      }
    }
    return found
  } finally {
    db.close()
  }
}

export async function redisTraces (redis: Redis, prefix: string, id: string): Promise<string[]> {
  const found: string[] = []
  let cursor = '0'
  do {
    const [next, keys] = await redis.scan(cursor, 'MATCH', `${prefix}:*`, 'COUNT', '500')
    cursor = next
    for (const key of keys) {
      if (key.includes(id)) { found.push(key); continue }
      const type = await redis.type(key)
      let contents: string[] = []
      if (type === 'string') contents = [await redis.get(key) ?? '']
      else if (type === 'set') contents = await redis.smembers(key)
      else if (type === 'zset') contents = await redis.zrange(key, '0', '-1')
      else if (type === 'hash') contents = Object.entries(await redis.hgetall(key)).flat()
      else if (type === 'list') contents = await redis.lrange(key, 0, -1)
      if (contents.some((text) => text.includes(id))) found.push(`${key} (${type})`)
    }
  } while (cursor !== '0')
  return found
}
