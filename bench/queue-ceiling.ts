/**
 * How many workers one Redis can feed. With 1, 4 and 16 worker processes (one chunk at a
 * time each; processes may share this machine's cores), a sweep of QUEUE_CHUNKS tiny chunks
 * (N = 16, one pattern, 4 trials per grid point: the queue's cost dominates) runs to its end
 * on a key prefix of its own; measured are chunks per second and the Redis server's CPU per
 * chunk (INFO cpu, used_cpu_user + used_cpu_sys, minus the server's background rate measured
 * just before: the Redis is shared with other programs). From these, bench/queue-model.ts
 * builds the model and computes the largest worker count that keeps 90 % efficiency at the
 * planner's target chunk duration. Prints one JSON line.
 *
 * Environment: REDIS_URL (redis://127.0.0.1:6379), QUEUE_WORKERS (1,4,16), QUEUE_CHUNKS (240).
 */
import { randomUUID } from 'node:crypto'
import { pino } from 'pino'
import { Redis } from 'ioredis'
import { normaliseSpec, TARGET_CHUNK_SECONDS, type NormalisedSpec } from '../src/spec/index.js'
import { createRedisQueue } from '../src/backends/redis/index.js'
import { planSweep, runChunk } from '../src/sweep/index.js'
import { spawnWorker, stopWorker, type WorkerProcess } from '../test/integration/worker-processes.js'
import { chunkSecondsFor, efficiency, fitServiceTime, workerCeiling, type QueueModel } from './queue-model.js'
import { finishSweep, redisAnswers, redisCpuSeconds } from './sweep-clock.js'
import { removePrefix } from '../test/integration/helpers.js'
import type { QueueCeilingReport } from './report.js'

const REDIS_URL = process.env.REDIS_URL ?? 'redis://127.0.0.1:6379'
const WORKER_COUNTS = (process.env.QUEUE_WORKERS ?? '1,4,16').split(',').map(Number).sort((a, b) => a - b)
const CHUNKS = Number(process.env.QUEUE_CHUNKS ?? 240)
const logger = pino({ level: 'silent' })

/** One tiny chunk per grid point: a cue-fraction axis of `points` values. */
const tinySweep = (points: number, seed: number): NormalisedSpec => normaliseSpec({
  label: `queue ceiling, ${points} tiny chunks`,
  seed,
  neurons: 16,
  patterns: 1,
  cue: { kind: 'flip', fraction: { from: 0, to: 0.5, count: points } },
  dynamics: { update: 'async-random', maxSweeps: 5 },
  trials: 4
})

type QueueRun = QueueCeilingReport['runs'][number]

async function backgroundRate (client: Redis, ms: number): Promise<number> {
  const before = await redisCpuSeconds(client)
  await new Promise((resolve) => setTimeout(resolve, ms))
  return Math.max(0, (await redisCpuSeconds(client) - before) / (ms / 1000))
}

/**
 * One prefix for all runs: workers are added between runs (1, then 3 more, then 12 more), so
 * no process is started twice; each run first warms the new sandboxes with a small sweep.
 */
async function measureAll (client: Redis): Promise<QueueRun[]> {
  const prefix = `bench-queue-${randomUUID()}`
  const queue = await createRedisQueue({ url: REDIS_URL, prefix, logger })
  const processes: WorkerProcess[] = []
  const runs: QueueRun[] = []
  try {
    for (const workers of WORKER_COUNTS) {
      const added = Array.from({ length: workers - processes.length }, () => spawnWorker({ url: REDIS_URL, prefix, concurrency: 1 }))
      processes.push(...added)
      await Promise.all(added.map((p) => p.waitFor((line) => line.type === 'ready', 180_000)))
      await finishSweep(queue, tinySweep(4 * workers, 99 + workers), { bytes: false })
      const background = await backgroundRate(client, 1000)
      const cpuBefore = await redisCpuSeconds(client)
      const { seconds } = await finishSweep(queue, tinySweep(CHUNKS, 1), { bytes: false })
      const cpu = await redisCpuSeconds(client) - cpuBefore
      runs.push({ workers, chunks: CHUNKS, seconds, chunksPerSecond: CHUNKS / seconds, redisCpuPerChunk: Math.max(0, cpu - background * seconds) / CHUNKS, backgroundRate: background })
      process.stderr.write(`[queue] ${JSON.stringify(runs.at(-1))}\n`)
    }
    return runs
  } finally {
    await Promise.all(processes.map((p) => stopWorker(p)))
    await queue.close()
    await removePrefix(prefix, REDIS_URL)
  }
}

/** A tiny chunk's own compute time, warm, in this process: what is not queue overhead. */
function computeSeconds (): number {
  const spec = tinySweep(CHUNKS, 1)
  const chunks = planSweep(spec).chunks
  const hooks = { shouldStop: () => false }
  for (const chunk of chunks.slice(0, 20)) runChunk(spec, chunk, hooks)
  const started = performance.now()
  for (const chunk of chunks) runChunk(spec, chunk, hooks)
  return (performance.now() - started) / 1000 / chunks.length
}

if (!(await redisAnswers(REDIS_URL))) {
  process.stderr.write(`Redis at ${REDIS_URL} did not answer\n`)
  process.exit(1)
}
const client = new Redis(REDIS_URL)
const runs = await measureAll(client)
client.disconnect()
const computePerChunk = computeSeconds()
const single = runs.reduce((a, b) => (a.workers <= b.workers ? a : b))
// One worker alone never waits behind another's Redis work: its period is compute + overhead + Redis's own time.
const overhead = Math.max(0, 1 / single.chunksPerSecond - computePerChunk - single.redisCpuPerChunk)
const service = fitServiceTime(runs)
const model: QueueModel = { service, workerOverheadSeconds: overhead, chunkSeconds: TARGET_CHUNK_SECONDS }
const report: QueueCeilingReport = {
  runs,
  computePerChunk,
  model,
  ceiling: workerCeiling(model, 0.9, 1e6),
  efficiencyAt256: efficiency(model, 256),
  chunkSecondsFor256: chunkSecondsFor({ service, workerOverheadSeconds: overhead }, 256),
  notes: ['A chunk of the target duration also sends progress (one report a second from a Redis worker), which tiny chunks never reach: their Redis cost is not in the per-chunk figure.']
}
process.stdout.write(`${JSON.stringify(report)}\n`)
process.exit(0)
