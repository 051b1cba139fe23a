/**
 * What the service benchmarks share: timing a sweep through a queue to its end, and the
 * shared Redis (is it there, and removing a benchmark's own keys; never FLUSHDB: other
 * programs use the same server).
 */
import { Redis } from 'ioredis'
import { resultToJson } from '../src/results/index.js'
import { TERMINAL_STATUSES, type SweepQueue, type SweepRecord } from '../src/backends/port.js'
import type { NormalisedSpec } from '../src/spec/index.js'

/**
 * Submits and waits for the end through the queue's event subscription, as the API's event
 * stream does, so the measuring client costs the cores next to nothing; a slow poll guards
 * against a missed event. `bytes` is the result's JSON with trial rows, for identity checks.
 */
export async function finishSweep (queue: SweepQueue, spec: NormalisedSpec, options: { bytes?: boolean } = {}): Promise<{ seconds: number, bytes: string }> {
  const started = performance.now()
  const record = await queue.submit({ spec, owner: null })
  await new Promise<void>((resolve, reject) => {
    let settled = false
    const settle = (sweep: SweepRecord | null): void => {
      if (settled || (sweep !== null && !TERMINAL_STATUSES.has(sweep.status))) return
      settled = true
      unsubscribe()
      clearInterval(poll)
      if (sweep?.status === 'succeeded') resolve()
      else reject(new Error(sweep === null ? 'sweep vanished' : `sweep ${sweep.status}: ${sweep.error?.message ?? ''}`))
    }
    const unsubscribe = queue.subscribe(record.id, (event) => settle(event.sweep))
    const check = (): void => { queue.get(record.id).then(settle, reject) }
    const poll = setInterval(check, 500)
    check()
  })
  const seconds = (performance.now() - started) / 1000
  if (options.bytes === false) return { seconds, bytes: '' }
  const result = await queue.results(record.id)
  return { seconds, bytes: resultToJson(result!, { perTrial: true }) }
}

export async function redisAnswers (url: string): Promise<boolean> {
  const client = new Redis(url, { lazyConnect: true, maxRetriesPerRequest: 1, enableOfflineQueue: false })
  try {
    await client.connect()
    return (await client.ping()) === 'PONG'
  } catch {
    return false
  } finally {
    client.disconnect()
  }
}

/** Deletes every key under `prefix:` (SCAN, so a large shared keyspace is not blocked). */
export async function dropPrefix (url: string, prefix: string): Promise<void> {
  const client = new Redis(url)
  try {
    let cursor = '0'
    do {
      const [next, keys] = await client.scan(cursor, 'MATCH', `${prefix}:*`, 'COUNT', 1000)
      cursor = next
      if (keys.length > 0) await client.del(...keys)
    } while (cursor !== '0')
  } finally {
    client.disconnect()
  }
}

/** The Redis server's own CPU seconds so far (INFO cpu: used_cpu_user + used_cpu_sys). */
export async function redisCpuSeconds (client: Redis): Promise<number> {
  const info = await client.info('cpu')
  const field = (name: string): number => Number(new RegExp(`^${name}:([\\d.]+)`, 'm').exec(info)?.[1] ?? Number.NaN)
  return field('used_cpu_user') + field('used_cpu_sys')
}
