/**
 * `npm run bench`: times the standard workloads W1–W4 on the engine (fresh processes, medians),
 * runs the numpy and C peers from a temporary copy of ../shared/bench in the same invocation
 * when their toolchains exist, adds the N = 100,000 scale run, the multi-core scaling with the
 * machine's two-process ceiling, the memory estimate check and the memory report, and writes
 * bench/RESULTS.md.
 *
 * Environment: ENGINE_REPS (11), PLAIN_REPS (3), C_REPS (11), NP_REPS (3), WARM_REPEATS (5),
 * DENSE_REPS (3), MODEL_REPS (5), MODEL_PLAIN_REPS (3), PEERS_DIR (../shared/bench), SKIP_PEERS,
 * SKIP_PLAIN, SKIP_DENSE, SKIP_MODELS, SKIP_SCALE,
 * SKIP_SCALING, SKIP_MEMORY, SKIP_SERVICE_OVERHEAD, SKIP_QUEUE_CEILING, SKIP_ESTIMATE, SKIP_HEALTHZ,
 * TRIALS, REPS and CEILING_TRIALS (for bench/scaling.ts), and the variables of each part
 * (bench/README.md), RESULTS (bench/RESULTS.md).
 */
import { cpus, freemem, loadavg, totalmem } from 'node:os'
import { readFileSync, rmSync, writeFileSync } from 'node:fs'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { measure, median, type Run } from './measure.js'
import { preparePeers } from './peers.js'
import { buildWorkloadRunner } from './build.js'
import { renderReport, timeOf, type Context, type QueueCeilingReport, type ScalingReport, type ServiceOverheadReport } from './report.js'
import type { EstimateMeasurement } from './estimate-error.js'
import type { HealthzReport } from './healthz.js'
import { spawnSync } from 'node:child_process'
import type { MemoryMeasurement } from './memory.js'
import { ENGINE_PROCESS_FLAGS } from '../src/runtime/node-flags.js'

const here = dirname(fileURLToPath(import.meta.url))
const root = resolve(here, '..')
const env = process.env
const reps = {
  ENGINE_REPS: Number(env.ENGINE_REPS ?? 11),
  PLAIN_REPS: env.SKIP_PLAIN ? 0 : Number(env.PLAIN_REPS ?? 3),
  C_REPS: env.SKIP_PEERS ? 0 : Number(env.C_REPS ?? 11),
  NP_REPS: env.SKIP_PEERS ? 0 : Number(env.NP_REPS ?? 3),
  DENSE_REPS: env.SKIP_DENSE ? 0 : Number(env.DENSE_REPS ?? 3),
  MODEL_REPS: env.SKIP_MODELS ? 0 : Number(env.MODEL_REPS ?? 5),
  MODEL_PLAIN_REPS: env.SKIP_MODELS || env.SKIP_PLAIN ? 0 : Number(env.MODEL_PLAIN_REPS ?? 3)
}
const started = Date.now()
const loadBefore = loadavg().map((x) => x.toFixed(2)).join(' ')
const peers = env.SKIP_PEERS ? null : preparePeers(resolve(env.PEERS_DIR ?? join(root, '..', 'shared', 'bench')))
const notes = peers?.notes ?? ['peers skipped (SKIP_PEERS set)']
const warm = Number(env.WARM_REPEATS ?? 5)
// Engine processes run the compiled workload runner (bench/build.ts) with the flags the
// service's processes use (src/runtime/node-flags.ts).
const workloadRunner = buildWorkloadRunner()
const engine = (workload: string, path: string, warmRepeats = 0): string[] => [process.execPath, ...ENGINE_PROCESS_FLAGS, workloadRunner, workload, path, '1', String(warmRepeats)]

interface Job { label: string, reps: number, workload: string, command: string[], cwd?: string }
const jobs: Job[] = []
for (const w of ['W1', 'W2', 'W3', 'W4']) {
  jobs.push({ label: 'memsweep', reps: reps.ENGINE_REPS, workload: w, command: engine(w, 'fast', warm) })
  jobs.push({ label: 'memsweep', reps: reps.PLAIN_REPS, workload: w, command: engine(w, 'plain') })
  if (peers?.cBinary) {
    jobs.push({ label: 'c', reps: reps.C_REPS, workload: w, command: [peers.cBinary, w, 'ovl', '1'] })
    jobs.push({ label: 'c', reps: reps.C_REPS, workload: w, command: [peers.cBinary, w, w === 'W4' ? 'i16' : 'i16inc', '1'] })
  }
  if (peers?.numpy && peers.dir !== null) {
    for (const v of w === 'W4' ? ['sync', 'syncbatch'] : ['inc']) {
      jobs.push({ label: 'numpy', reps: reps.NP_REPS, workload: w, command: ['python3', 'peer_numpy.py', w, v, '--seed', '1'], cwd: peers.dir })
    }
  }
}

for (const d of ['D1', 'D2', 'D3']) {
  jobs.push({ label: 'memsweep', reps: reps.DENSE_REPS, workload: d, command: engine(d, 'fast') })
  jobs.push({ label: 'memsweep', reps: reps.DENSE_REPS, workload: d, command: engine(d, 'plain') })
}
// The model kernels (D4–D7) against the plain path and our numpy peer, numpy with its default
// BLAS threads and with one.
for (const d of ['D4', 'D5', 'D6', 'D7']) {
  jobs.push({ label: 'memsweep', reps: reps.MODEL_REPS, workload: d, command: engine(d, 'fast') })
  jobs.push({ label: 'memsweep', reps: reps.MODEL_PLAIN_REPS, workload: d, command: engine(d, 'plain') })
  if (peers?.modelsScript) {
    jobs.push({ label: 'numpy', reps: reps.NP_REPS, workload: d, command: ['python3', peers.modelsScript, d, '--seed', '1'] })
    jobs.push({ label: 'numpy-1t', reps: reps.NP_REPS, workload: d, command: ['env', 'OPENBLAS_NUM_THREADS=1', 'OMP_NUM_THREADS=1', 'python3', peers.modelsScript, d, '--seed', '1'] })
  }
}
// What 128-bit vectors can do with D6's arithmetic at best (bench/peers/softmax128.c).
if (peers?.softmaxBoundBinary) jobs.push({ label: 'c-128', reps: reps.MODEL_REPS, workload: 'D6', command: [peers.softmaxBoundBinary] })
// Glauber dynamics (G1) against our C peer, exp per visit and tabulated.
jobs.push({ label: 'memsweep', reps: reps.ENGINE_REPS, workload: 'G1', command: engine('G1', 'fast') })
jobs.push({ label: 'memsweep', reps: reps.MODEL_PLAIN_REPS, workload: 'G1', command: engine('G1', 'plain') })
if (peers?.glauberBinary) {
  for (const v of ['exp', 'table']) jobs.push({ label: 'c', reps: reps.C_REPS, workload: 'G1', command: [peers.glauberBinary, v, '1'] })
}

const runs: Run[] = []
const rounds = Math.max(...jobs.map((j) => j.reps))
for (let round = 1; round <= rounds; round++) {
  process.stderr.write(`[bench] round ${round}/${rounds}, ${((Date.now() - started) / 1000).toFixed(0)} s elapsed\n`)
  for (const job of jobs) {
    if (round > job.reps) continue
    const run = measure(job.label, job.command, job.cwd !== undefined ? { cwd: job.cwd } : {})
    runs.push(run)
    process.stderr.write(`  ${job.label} ${job.workload} ${run.variant}: ${(timeOf(run) * 1000).toFixed(1)} ms, ${(run.maxrss_kb / 1024).toFixed(0)} MiB\n`)
  }
}

const baseline = [1, 2, 3].map(() => measure('memsweep', engine('BASELINE', 'fast')))
let scale: Run | null = null
if (!env.SKIP_SCALE) {
  process.stderr.write('[bench] scale run: N = 100000, P = 5000\n')
  scale = measure('memsweep', engine('SCALE', 'fast'))
}
/** Runs one part of the bench in a fresh process with the engine's flags; its last stdout line is its JSON report (null and a note when it fails). */
function runPart<T> (script: string, what: string, extraEnv: NodeJS.ProcessEnv = {}): T | null {
  const out = spawnSync(process.execPath, [...ENGINE_PROCESS_FLAGS, '--import', 'tsx', join(here, script)], { cwd: root, encoding: 'utf8', env: { ...env, ...extraEnv }, maxBuffer: 1 << 24 })
  try {
    return JSON.parse(out.stdout.trim().split('\n').at(-1) ?? '') as T
  } catch {
    notes.push(`${what} run failed: ${out.stderr.trim().split('\n').at(-1) ?? `exit ${String(out.status)}`}`)
    return null
  }
}

let scaling: ScalingReport | null = null
if (!env.SKIP_SCALING) {
  process.stderr.write('[bench] multi-core scaling: W2 curve through the embedded and Redis backends, 1 and 2 cores, and the two-process ceiling\n')
  scaling = runPart<ScalingReport>('scaling.ts', 'multi-core scaling', peers?.cBinary ? { C_PEER: peers.cBinary } : {})
}

if (peers?.dir) rmSync(dirname(peers.dir), { recursive: true, force: true })

let memory: MemoryMeasurement[] | null = null
if (!env.SKIP_MEMORY) {
  process.stderr.write('[bench] memory: estimate against measured peak, one fresh process per case\n')
  memory = runPart<MemoryMeasurement[]>('memory.ts', 'memory estimate')
}
let overhead: ServiceOverheadReport | null = null
if (!env.SKIP_SERVICE_OVERHEAD) {
  process.stderr.write('[bench] service overhead: the 24,000-trial curve through both backends against the engine alone\n')
  overhead = runPart<ServiceOverheadReport>('service-overhead.ts', 'service overhead')
}
let queueCeiling: QueueCeilingReport | null = null
if (!env.SKIP_QUEUE_CEILING) {
  process.stderr.write('[bench] many workers: 1, 4, 16 worker processes on tiny chunks, Redis CPU per chunk\n')
  queueCeiling = runPart<QueueCeilingReport>('queue-ceiling.ts', 'many-workers ceiling')
}
let estimates: EstimateMeasurement[] | null = null
if (!env.SKIP_ESTIMATE) {
  process.stderr.write('[bench] CPU estimate against measured CPU time\n')
  estimates = runPart<EstimateMeasurement[]>('estimate-error.ts', 'CPU estimate error')
}
let healthz: HealthzReport | null = null
if (!env.SKIP_HEALTHZ) {
  process.stderr.write('[bench] /healthz latency while large results are downloaded\n')
  healthz = runPart<HealthzReport>('healthz.ts', '/healthz under downloads')
}

const cpuLine = readFileSync('/proc/cpuinfo', 'utf8').split('\n').find((l) => l.startsWith('model name'))?.split(':')[1]?.trim() ?? cpus()[0]?.model ?? 'unknown'
const ctx: Context = {
  date: new Date().toISOString(),
  cpu: cpuLine,
  cores: cpus().length,
  memoryGiB: totalmem() / 2 ** 30,
  node: process.version,
  v8: process.versions.v8,
  gcc: peers?.gcc ?? 'gcc not probed',
  python: peers?.python ?? 'not probed',
  loadBefore,
  loadAfter: loadavg().map((x) => x.toFixed(2)).join(' '),
  reps: { ...reps, WARM_REPEATS: warm },
  notes: [...notes, `free memory at the end ${(freemem() / 2 ** 30).toFixed(1)} GiB`],
  seconds: (Date.now() - started) / 1000
}
const target = resolve(env.RESULTS ?? join(here, 'RESULTS.md'))
writeFileSync(target, renderReport(runs, { scale, baseline, scaling, memory, overhead, queueCeiling, estimates, healthz, ctx }))
process.stderr.write(`[bench] wrote ${target} in ${ctx.seconds.toFixed(0)} s\n`)
for (const w of ['W1', 'W2', 'W3', 'W4']) {
  const ours = runs.filter((r) => r.workload === w && r.label === 'memsweep' && r.variant === 'fast')
  if (ours.length > 0) process.stdout.write(`${w}: memsweep ${(median(ours.map(timeOf)) * 1000).toFixed(1)} ms\n`)
}
