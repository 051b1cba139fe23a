/**
 * Multi-core scaling of a whole sweep through the service's backends: the W2 capacity curve
 * (N = 500, α = 0.02 … 0.24, 5 % of the bits flipped, a new network per trial) with
 * TRIALS trials per load, run to completion on
 *   - the embedded backend with 1 and with 2 compute threads, and
 *   - the Redis backend with 1 and with 2 worker processes (one chunk at a time each),
 * timing submit → succeeded after a warm-up sweep (threads and sandboxes load the engine
 * first). Every run's result must be byte-identical. Prints one JSON line.
 *
 * Environment: TRIALS (500), REPS (3, median), REDIS_URL (redis://127.0.0.1:6379; the Redis
 * part is skipped with a note when it does not answer).
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { randomUUID } from 'node:crypto'
import { pino } from 'pino'
import { Redis } from 'ioredis'
import { normaliseSpec, resultToJson, type NormalisedSpec } from '../src/spec/index.js'
import type { SweepQueue } from '../src/backends/port.js'
import { createEmbeddedQueue } from '../src/backends/embedded/index.js'
import { createRedisQueue } from '../src/backends/redis/index.js'
import { spawnWorker, stopWorker } from '../test/integration/worker-processes.js'
import { median } from './measure.js'

const TRIALS = Number(process.env.TRIALS ?? 500)
const REPS = Number(process.env.REPS ?? 3)
const REDIS_URL = process.env.REDIS_URL ?? 'redis://127.0.0.1:6379'
const logger = pino({ level: 'silent' })

const curve = (trials: number, seed: number): NormalisedSpec => normaliseSpec({
  label: `W2 capacity curve, ${trials} trials per load`,
  seed,
  neurons: 500,
  load: { from: 0.02, to: 0.24, step: 0.02 },
  cue: { kind: 'flip', fraction: 0.05 },
  dynamics: { update: 'async-random', temperature: 0, maxSweeps: 50 },
  successThreshold: 0.95,
  trials
})

async function finish (queue: SweepQueue, spec: NormalisedSpec): Promise<{ seconds: number, bytes: string }> {
  const started = performance.now()
  const record = await queue.submit({ spec, owner: null })
  for (;;) {
    const now = await queue.get(record.id)
    if (now === null) throw new Error('sweep vanished')
    if (now.status === 'succeeded') break
    if (now.status === 'failed' || now.status === 'canceled') throw new Error(`sweep ${now.status}: ${now.error?.message ?? ''}`)
    await new Promise((resolve) => setTimeout(resolve, 20))
  }
  const seconds = (performance.now() - started) / 1000
  const result = await queue.results(record.id)
  return { seconds, bytes: resultToJson(result!, { perTrial: true }) }
}

async function timeRuns (queue: SweepQueue): Promise<{ seconds: number[], bytes: string }> {
  await finish(queue, curve(4, 99))
  const seconds: number[] = []
  let bytes = ''
  for (let rep = 0; rep < REPS; rep++) {
    const run = await finish(queue, curve(TRIALS, 1))
    seconds.push(run.seconds)
    bytes = run.bytes
  }
  return { seconds, bytes }
}

async function embedded (threads: number): Promise<{ seconds: number[], bytes: string }> {
  const dataDir = mkdtempSync(join(tmpdir(), 'memsweep-scaling-'))
  const queue = await createEmbeddedQueue({ dataDir, threads, logger })
  try {
    return await timeRuns(queue)
  } finally {
    await queue.close()
    rmSync(dataDir, { recursive: true, force: true })
  }
}

async function redisAnswers (): Promise<boolean> {
  const client = new Redis(REDIS_URL, { lazyConnect: true, maxRetriesPerRequest: 1, enableOfflineQueue: false })
  try {
    await client.connect()
    return (await client.ping()) === 'PONG'
  } catch {
    return false
  } finally {
    client.disconnect()
  }
}

async function redis (workers: number): Promise<{ seconds: number[], bytes: string }> {
  const prefix = `bench-${randomUUID()}`
  const queue = await createRedisQueue({ url: REDIS_URL, prefix, logger })
  const processes = Array.from({ length: workers }, () => spawnWorker({ url: REDIS_URL, prefix, concurrency: 1 }))
  try {
    await Promise.all(processes.map((p) => p.waitFor((line) => line.type === 'ready', 60_000)))
    return await timeRuns(queue)
  } finally {
    await Promise.all(processes.map((p) => stopWorker(p)))
    await queue.close()
    const client = new Redis(REDIS_URL)
    const keys = await client.keys(`${prefix}:*`)
    if (keys.length > 0) await client.del(...keys)
    client.disconnect()
  }
}

const report: Record<string, unknown> = { trialsPerLoad: TRIALS, reps: REPS, notes: [] as string[] }
const e1 = await embedded(1)
const e2 = await embedded(2)
report.embedded = { one: median(e1.seconds), two: median(e2.seconds), speedup: median(e1.seconds) / median(e2.seconds), identical: e1.bytes === e2.bytes, runs: { one: e1.seconds, two: e2.seconds } }
if (await redisAnswers()) {
  const r1 = await redis(1)
  const r2 = await redis(2)
  report.redis = { one: median(r1.seconds), two: median(r2.seconds), speedup: median(r1.seconds) / median(r2.seconds), identical: r1.bytes === r2.bytes && r1.bytes === e1.bytes, runs: { one: r1.seconds, two: r2.seconds } }
} else {
  (report.notes as string[]).push(`Redis at ${REDIS_URL} did not answer: the Redis scaling was not measured`)
}
process.stdout.write(`${JSON.stringify(report)}\n`)
process.exit(0)
