/**
 * What the service benchmarks share: the W2 capacity curve as a spec, timing a sweep through
 * a queue to its end, and the shared Redis (is it there, its CPU so far). A benchmark removes
 * only its own keys (test/integration/helpers.ts removePrefix), never FLUSHDB: other programs
 * use the same server.
 */
import { Redis } from 'ioredis'
import { resultToJson } from '../src/results/index.js'
import { TERMINAL_STATUSES, type SweepQueue, type SweepRecord } from '../src/backends/port.js'
import type { NormalisedSpec } from '../src/spec/index.js'

/** The W2 capacity curve (N = 500, α = 0.02 … 0.24, 5 % flipped, a new network per trial) with `trials` trials per load. */
export function capacityCurve (trials: number, seed: number): Record<string, unknown> {
  return {
    label: `W2 capacity curve, ${trials} trials per load`,
    seed,
    neurons: 500,
    load: { from: 0.02, to: 0.24, step: 0.02 },
    cue: { kind: 'flip', fraction: 0.05 },
    dynamics: { update: 'async-random', temperature: 0, maxSweeps: 50 },
    successThreshold: 0.95,
    trials
  }
}

/**
 * Submits and waits for the end through the queue's event subscription, as the API's event
 * stream does, so the measuring client costs the cores next to nothing; a slow poll guards
 * against a missed event. `bytes` is the result's JSON with trial rows, for identity checks.
 */
export async function finishSweep (queue: SweepQueue, spec: NormalisedSpec, options: { bytes?: boolean } = {}): Promise<{ seconds: number, bytes: string }> {
  const started = performance.now()
  // Every run computes all its trials: a repeated spec would otherwise take the stored points.
  const record = await queue.submit({ spec, owner: null, reusePoints: false })
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

/** The Redis server's own CPU seconds so far (INFO cpu: used_cpu_user + used_cpu_sys). */
export async function redisCpuSeconds (client: Redis): Promise<number> {
  const info = await client.info('cpu')
  const field = (name: string): number => Number(new RegExp(`^${name}:([\\d.]+)`, 'm').exec(info)?.[1] ?? Number.NaN)
  return field('used_cpu_user') + field('used_cpu_sys')
}
