/**
 * What the service adds to the engine: the 24,000-trial capacity curve (the W2 curve, N = 500,
 * α = 0.02 … 0.24, 12 loads × 2000 trials, 5 % flipped, a new network per trial) timed from
 * POST /v1/sweeps to the `succeeded` event of the sweep's event stream, through
 *   - a real embedded server process (WORKER_THREADS = THREADS), and
 *   - a real Redis-backed API process with THREADS worker processes of one compute thread each,
 * against the engine alone on the same number of threads: the same plan's chunks, in the same
 * costliest-first order, run by the lifecycle core's one chunk runner on the embedded
 * backend's compute threads (ChunkThreadPool with its chunk-worker module), then assembled on
 * one of them, in this process, with no HTTP, no store and no queue. That peer does every
 * computation the service does (trials, encoding of chunk records, assembly and theory) and
 * nothing else, so the ratio is the service's own cost: HTTP, validation, SQLite or Redis,
 * scheduling, progress, the result's storage and the event. Prints one JSON line.
 *
 * Rounds time the engine alone, the embedded server and the Redis service once each, in turn.
 *
 * Environment: SERVICE_TRIALS (2000 per load), SERVICE_REPS (5 rounds, median), THREADS (2),
 * REDIS_URL (redis://127.0.0.1:6379; the Redis part is skipped with a note when it does not answer).
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { randomUUID } from 'node:crypto'
import { normaliseSpec } from '../src/spec/index.js'
import { dispatchOrder, planSweep, type StoredChunk } from '../src/sweep/index.js'
import { ChunkThreadPool } from '../src/backends/embedded/thread-pool.js'
import { workerEntryFor } from '../src/runtime/worker-entry.js'
import { ENGINE_PROCESS_FLAGS } from '../src/runtime/node-flags.js'
import { startServerProcess, type ServerProcess } from '../test/api/helpers/server-process.js'
import { spawnWorker, stopWorker } from '../test/integration/worker-processes.js'
import { median } from './measure.js'
import { capacityCurve, redisAnswers } from './sweep-clock.js'
import { removePrefix } from '../test/integration/helpers.js'
import type { ServiceOverheadReport } from './report.js'

const TRIALS = Number(process.env.SERVICE_TRIALS ?? 2000)
const REPS = Number(process.env.SERVICE_REPS ?? 5)
const THREADS = Number(process.env.THREADS ?? 2)
const REDIS_URL = process.env.REDIS_URL ?? 'redis://127.0.0.1:6379'

const curve = capacityCurve

/** The engine alone: the plan's chunks on THREADS compute threads, costliest first, then assembly. */
async function engineAlone (pool: ChunkThreadPool, raw: Record<string, unknown>): Promise<number> {
  const started = performance.now()
  const spec = normaliseSpec(raw)
  const plan = planSweep(spec)
  const order = dispatchOrder(spec, plan.chunks)
  const stopFlag = new SharedArrayBuffer(4)
  const stored: StoredChunk[] = []
  let next = 0
  const runner = async (): Promise<void> => {
    while (next < order.length) {
      const chunk = plan.chunks[order[next++]!]!
      const outcome = await pool.runChunk({ kind: 'run', spec, chunk, attempt: 1, stopFlag, progressIntervalMs: 250 }, () => {})
      if (outcome.kind !== 'done') throw new Error(`chunk ${chunk.index}: ${outcome.kind}`)
      stored.push({ index: chunk.index, body: outcome.body })
    }
  }
  await Promise.all(Array.from({ length: pool.threads }, runner))
  stored.sort((a, b) => a.index - b.index)
  const assembled = await pool.assemble({ kind: 'assemble', spec, plan: plan.chunks, chunks: stored, timing: { wallSeconds: 0, cpuSeconds: 0, workers: pool.threads } })
  if (assembled.kind !== 'assembled') throw new Error(`assembly: ${assembled.kind}`)
  return (performance.now() - started) / 1000
}

/** POST the spec, then read the sweep's event stream until it succeeds: what a client waits. */
async function throughService (baseUrl: string, raw: Record<string, unknown>): Promise<number> {
  const started = performance.now()
  const posted = await fetch(`${baseUrl}/v1/sweeps`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(raw) })
  if (posted.status !== 202) throw new Error(`POST answered ${posted.status}: ${await posted.text()}`)
  const { id } = await posted.json() as { id: string }
  const events = await fetch(`${baseUrl}/v1/sweeps/${id}/events`, { headers: { accept: 'text/event-stream' } })
  const reader = events.body!.pipeThrough(new TextDecoderStream()).getReader()
  let buffer = ''
  for (;;) {
    const { value, done } = await reader.read()
    if (done) throw new Error(`event stream of ${id} ended before the sweep did`)
    buffer += value
    const status = /"status":"(succeeded|failed|canceled)"/.exec(buffer)?.[1]
    if (status !== undefined) {
      await reader.cancel()
      if (status !== 'succeeded') throw new Error(`sweep ${id} ${status}`)
      return (performance.now() - started) / 1000
    }
  }
}

async function stopServer (server: ServerProcess): Promise<void> {
  server.child.kill('SIGTERM')
  await server.exited
}

const report: ServiceOverheadReport = { trialsPerLoad: TRIALS, threads: THREADS, reps: REPS, engine: { seconds: [], median: 0 }, notes: [] }
// The compute threads exactly as the embedded backend starts them (embedded/queue.ts).
const pool = new ChunkThreadPool({
  threads: THREADS,
  entry: workerEntryFor(new URL('../src/backends/embedded/chunk-worker.ts', import.meta.url)),
  onIdleThreadError: (error) => { throw error }
})
const dataDir = mkdtempSync(join(tmpdir(), 'memsweep-overhead-'))
const prefix = `bench-overhead-${randomUUID().slice(0, 8)}`
const stops: Array<() => Promise<void>> = [async () => { await pool.destroy() }]
try {
  await pool.warmUp()
  const sides: Array<{ name: 'engine' | 'embedded' | 'redis', time: (raw: Record<string, unknown>) => Promise<number> }> = [
    { name: 'engine', time: async (raw) => await engineAlone(pool, raw) }
  ]
  const embedded = await startServerProcess({ DATA_DIR: dataDir, WORKER_THREADS: String(THREADS) }, 120_000, ENGINE_PROCESS_FLAGS)
  stops.push(async () => { await stopServer(embedded) })
  sides.push({ name: 'embedded', time: async (raw) => await throughService(embedded.url, raw) })
  if (await redisAnswers(REDIS_URL)) {
    const api = await startServerProcess({ REDIS_URL, REDIS_PREFIX: prefix }, 120_000, ENGINE_PROCESS_FLAGS)
    const workers = Array.from({ length: THREADS }, () => spawnWorker({ url: REDIS_URL, prefix, concurrency: 1 }))
    stops.push(async () => {
      await Promise.all(workers.map((w) => stopWorker(w)))
      await stopServer(api)
      await removePrefix(prefix, REDIS_URL)
    })
    await Promise.all(workers.map((w) => w.waitFor((line) => line.type === 'ready', 180_000)))
    sides.push({ name: 'redis', time: async (raw) => await throughService(api.url, raw) })
  } else {
    report.notes.push(`Redis at ${REDIS_URL} did not answer: the Redis backend was not measured`)
  }
  for (const side of sides) await side.time(curve(4, 99))
  // Rounds run every side once, in turn: this machine drifts between faster and slower phases,
  // and a side timed in a block of its own would carry its phase into the ratio.
  const seconds = new Map(sides.map((side) => [side.name, [] as number[]]))
  // A new seed every round: a repeated spec would reuse the stored points.
  for (let rep = 0; rep < REPS; rep++) {
    for (const side of sides) seconds.get(side.name)!.push(await side.time(curve(TRIALS, 1000 + rep)))
  }
  const engine = seconds.get('engine')!
  report.engine = { seconds: engine, median: median(engine) }
  for (const name of ['embedded', 'redis'] as const) {
    const own = seconds.get(name)
    if (own === undefined) continue
    report[name] = { seconds: own, median: median(own), ratio: median(own) / report.engine.median, roundRatio: median(own.map((x, k) => x / engine[k]!)) }
  }
} finally {
  for (const stop of stops.reverse()) await stop()
  rmSync(dataDir, { recursive: true, force: true })
}
process.stdout.write(`${JSON.stringify(report)}\n`)
process.exit(0)
