/**
 * Does the event loop stay free while big results are downloaded? A real embedded server
 * process computes a HEALTHZ_TRIALS-trial result (N = 10, one and two patterns, trial rows
 * stored) and a trajectory result (N = 400, four loads, overlap and energy after every
 * sweep); then one client downloads them over and over for HEALTHZ_SECONDS, every request
 * with options not asked before (JSON, CSV, trial rows, timing, the trajectory series,
 * figures of a new width, a figure the options make the server refuse), while a sequential
 * prober times GET /healthz every 10 ms. The prober also runs alone before, for the baseline.
 * Prints one JSON line.
 *
 * Environment: HEALTHZ_TRIALS (1,000,000), HEALTHZ_SECONDS (10).
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { ENGINE_PROCESS_FLAGS } from '../src/runtime/node-flags.js'
import { startServerProcess } from '../test/api/helpers/server-process.js'

const TRIALS = Number(process.env.HEALTHZ_TRIALS ?? 1_000_000)
const SECONDS = Number(process.env.HEALTHZ_SECONDS ?? 10)

const bigSpec = {
  label: `${TRIALS} tiny trials`,
  seed: 3,
  neurons: 10,
  patterns: { values: [1, 2] },
  dynamics: { maxSweeps: 3 },
  trials: Math.ceil(TRIALS / 2)
}
const trajectorySpec = {
  label: 'trajectories',
  seed: 4,
  neurons: 400,
  load: { values: [0.05, 0.1, 0.15, 0.2] },
  dynamics: { maxSweeps: 60 },
  measures: { overlapTrajectory: true, energyTrajectory: true },
  trials: 100
}

export interface LatencySummary { count: number, p50: number, p99: number, max: number }
export interface HealthzReport {
  trials: number
  seconds: number
  /** Seconds the server took to compute both sweeps. */
  computeSeconds: number
  idle: LatencySummary
  loaded: LatencySummary
  downloads: { count: number, bytes: number, byStatus: Record<string, number> }
  /** Peak resident set of the server process over its life (computing, storing, rendering), bytes; null off Linux. */
  serverPeakRssBytes: number | null
}

/** VmHWM of a process: its peak resident set so far. */
function peakRss (pid: number | undefined): number | null {
  try {
    const kb = /^VmHWM:\s+(\d+) kB/m.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1]
    return kb === undefined ? null : Number(kb) * 1024
  } catch {
    return null
  }
}

function summary (ms: number[]): LatencySummary {
  const sorted = [...ms].sort((a, b) => a - b)
  const at = (q: number): number => sorted[Math.min(sorted.length - 1, Math.ceil(q * sorted.length) - 1)] ?? Number.NaN
  return { count: sorted.length, p50: at(0.5), p99: at(0.99), max: sorted.at(-1) ?? Number.NaN }
}

async function submit (base: string, spec: unknown): Promise<string> {
  const res = await fetch(`${base}/v1/sweeps`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(spec) })
  if (res.status !== 202) throw new Error(`POST answered ${res.status}: ${await res.text()}`)
  return (await res.json() as { id: string }).id
}

async function waitSucceeded (base: string, id: string): Promise<void> {
  for (;;) {
    const { status } = await (await fetch(`${base}/v1/sweeps/${id}`)).json() as { status: string }
    if (status === 'succeeded') return
    if (status === 'failed' || status === 'canceled') throw new Error(`sweep ${id} ${status}`)
    await new Promise((resolve) => setTimeout(resolve, 250))
  }
}

/** GET /healthz one after another, 10 ms apart, until `until()`; latencies in ms. */
async function probe (base: string, until: () => boolean): Promise<number[]> {
  const latencies: number[] = []
  while (!until()) {
    const started = performance.now()
    const res = await fetch(`${base}/healthz`)
    await res.arrayBuffer()
    latencies.push(performance.now() - started)
    await new Promise((resolve) => setTimeout(resolve, 10))
  }
  return latencies
}

/** The n-th download: a new combination every time (figure widths make every figure a cache miss). */
function download (n: number, big: string, traj: string): string {
  const width = 400 + (n % 3000)
  const options = [
    `/v1/sweeps/${big}/results?format=json&trials=true`,
    `/v1/sweeps/${big}/results?format=csv&trials=true`,
    `/v1/sweeps/${big}/figure.svg?width=${width}`,
    `/v1/sweeps/${big}/results?format=json&timing=${n % 2 === 0 ? 'true' : 'false'}`,
    `/v1/sweeps/${traj}/results?series=trajectory&format=${n % 2 === 0 ? 'csv' : 'json'}`,
    `/v1/sweeps/${traj}/results?format=json&trials=true`,
    `/v1/sweeps/${traj}/results?format=csv&trials=true`,
    `/v1/sweeps/${traj}/figure.svg?measure=overlap&width=${width}`,
    // Refused (the sweep does not vary neurons): must be answered before the result is loaded.
    `/v1/sweeps/${big}/figure.svg?x=neurons&width=${width}`
  ]
  return options[n % options.length]!
}

const dataDir = mkdtempSync(join(tmpdir(), 'memsweep-healthz-'))
// HEALTHZ_NODE_FLAGS: extra flags for the server (e.g. --cpu-prof to find what holds its event loop).
const extraFlags = (process.env.HEALTHZ_NODE_FLAGS ?? '').split(' ').filter((flag) => flag !== '')
const server = await startServerProcess({ DATA_DIR: dataDir, WORKER_THREADS: '2', RATE_LIMIT_MAX: '1000000' }, 120_000, [...ENGINE_PROCESS_FLAGS, ...extraFlags])
try {
  const base = server.url
  const started = performance.now()
  const [big, traj] = [await submit(base, bigSpec), await submit(base, trajectorySpec)]
  await waitSucceeded(base, big)
  await waitSucceeded(base, traj)
  const computeSeconds = (performance.now() - started) / 1000
  const idleEnd = performance.now() + 2000
  const idle = await probe(base, () => performance.now() > idleEnd)
  const state = { done: false }
  const byStatus: Record<string, number> = {}
  let bytes = 0
  let count = 0
  const downloader = (async () => {
    while (!state.done) {
      const res = await fetch(`${base}${download(count++, big, traj)}`)
      bytes += (await res.arrayBuffer()).byteLength
      byStatus[res.status] = (byStatus[res.status] ?? 0) + 1
    }
  })()
  const loadEnd = performance.now() + SECONDS * 1000
  const loaded = await probe(base, () => performance.now() > loadEnd)
  state.done = true
  await downloader
  const report: HealthzReport = { trials: TRIALS, seconds: SECONDS, computeSeconds, idle: summary(idle), loaded: summary(loaded), downloads: { count, bytes, byStatus }, serverPeakRssBytes: peakRss(server.child.pid) }
  process.stdout.write(`${JSON.stringify(report)}\n`)
} finally {
  server.child.kill('SIGTERM')
  await server.exited
  rmSync(dataDir, { recursive: true, force: true })
}
process.exit(0)
