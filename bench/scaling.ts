/**
 * Multi-core scaling of a whole sweep through the service's backends: the W2 capacity curve
 * (N = 500, α = 0.02 … 0.24, 5 % of the bits flipped, a new network per trial) with
 * TRIALS trials per load, run to completion on
 *   - the embedded backend with 1 and with 2 compute threads, and
 *   - the Redis backend with 1 and with 2 worker processes (one chunk at a time each),
 * timing submit → succeeded after a warm-up sweep (threads and sandboxes load the engine
 * first). Every run's result must be byte-identical.
 *
 * The machine's own ceiling is measured beside it: the same curve run by one process alone
 * and by two processes at once, for the C reference (`ovl`, when C_PEER names its binary)
 * and for the engine without the service (bench/workload.ts W2). Two processes at once give
 * a throughput of 2·t_alone / t_together times one; what a second core can add on this
 * machine is bounded by that, whatever the software. Prints one JSON line.
 *
 * Environment: TRIALS (2000), REPS (5, median), REDIS_URL (redis://127.0.0.1:6379; the Redis
 * part is skipped with a note when it does not answer), C_PEER (path of the built C peer),
 * CEILING_TRIALS (trials per load of the ceiling runs; default TRIALS, the same curve).
 */
import { spawn } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { randomUUID } from 'node:crypto'
import { pino } from 'pino'
import { normaliseSpec, type NormalisedSpec } from '../src/spec/index.js'
import type { SweepQueue } from '../src/backends/port.js'
import { createEmbeddedQueue } from '../src/backends/embedded/index.js'
import { createRedisQueue } from '../src/backends/redis/index.js'
import { spawnWorker, stopWorker } from '../test/integration/worker-processes.js'
import { median } from './measure.js'
import { buildWorkloadRunner } from './build.js'
import { capacityCurve, finishSweep, redisAnswers } from './sweep-clock.js'
import { removePrefix } from '../test/integration/helpers.js'
import { ENGINE_PROCESS_FLAGS } from '../src/runtime/node-flags.js'

const TRIALS = Number(process.env.TRIALS ?? 2000)
const CEILING_TRIALS = Number(process.env.CEILING_TRIALS ?? TRIALS)
const REPS = Number(process.env.REPS ?? 5)
const REDIS_URL = process.env.REDIS_URL ?? 'redis://127.0.0.1:6379'
const logger = pino({ level: 'silent' })

const curve = (trials: number, seed: number): NormalisedSpec => normaliseSpec(capacityCurve(trials, seed))

async function timeRuns (queue: SweepQueue): Promise<{ seconds: number[], bytes: string }> {
  await finishSweep(queue, curve(4, 99))
  const seconds: number[] = []
  let bytes = ''
  for (let rep = 0; rep < REPS; rep++) {
    const run = await finishSweep(queue, curve(TRIALS, 1))
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
    await removePrefix(prefix, REDIS_URL)
  }
}

/** Runs `command` and returns the time the process reports for the whole curve (total_s). */
async function curveSeconds (command: string[], env: NodeJS.ProcessEnv): Promise<number> {
  const child = spawn(command[0]!, command.slice(1), { env, stdio: ['ignore', 'pipe', 'inherit'] })
  let out = ''
  child.stdout.on('data', (chunk: Buffer) => { out += chunk.toString() })
  const code = await new Promise<number | null>((resolve) => child.on('close', resolve))
  if (code !== 0) throw new Error(`${command.join(' ')} exited with ${String(code)}`)
  return (JSON.parse(out.trim().split('\n').at(-1)!) as { total_s: number }).total_s
}

/** Throughput of two simultaneous runs relative to one: 2·median(alone) / median(together). */
async function pairCeiling (command: string[], env: NodeJS.ProcessEnv): Promise<{ alone: number, together: number, ceiling: number }> {
  const alone: number[] = []
  const together: number[] = []
  for (let rep = 0; rep < REPS; rep++) {
    alone.push(await curveSeconds(command, env))
    const pair = await Promise.all([curveSeconds(command, env), curveSeconds(command, env)])
    together.push(...pair)
  }
  return { alone: median(alone), together: median(together), ceiling: 2 * median(alone) / median(together) }
}

const report: Record<string, unknown> = { trialsPerLoad: TRIALS, reps: REPS, ceilingTrialsPerLoad: CEILING_TRIALS, notes: [] as string[] }
report.ceilingEngine = await pairCeiling([process.execPath, ...ENGINE_PROCESS_FLAGS, buildWorkloadRunner(), 'W2', 'fast', '1', '0'], { ...process.env, TRIALS_PER_LOAD: String(CEILING_TRIALS) })
if (process.env.C_PEER !== undefined) {
  report.ceilingC = await pairCeiling([process.env.C_PEER, 'W2', 'ovl', '1', String(CEILING_TRIALS)], process.env)
} else {
  (report.notes as string[]).push('C_PEER not set: the C reference\'s two-process ceiling was not measured')
}
const e1 = await embedded(1)
const e2 = await embedded(2)
report.embedded = { one: median(e1.seconds), two: median(e2.seconds), speedup: median(e1.seconds) / median(e2.seconds), identical: e1.bytes === e2.bytes, runs: { one: e1.seconds, two: e2.seconds } }
if (await redisAnswers(REDIS_URL)) {
  const r1 = await redis(1)
  const r2 = await redis(2)
  report.redis = { one: median(r1.seconds), two: median(r2.seconds), speedup: median(r1.seconds) / median(r2.seconds), identical: r1.bytes === r2.bytes && r1.bytes === e1.bytes, runs: { one: r1.seconds, two: r2.seconds } }
} else {
  (report.notes as string[]).push(`Redis at ${REDIS_URL} did not answer: the Redis scaling was not measured`)
}
process.stdout.write(`${JSON.stringify(report)}\n`)
process.exit(0)
