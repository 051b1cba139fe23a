/**
 * Memory estimate against measured peak: for each case, a fresh process starts one compute
 * thread (as the service does), lets it run a tiny sweep of the same model so the engine is
 * loaded and its code compiled, then has it run one grid point of the case while the main
 * thread samples the process's resident set every millisecond. The point's peak is the
 * highest sample minus the resident set just before the point started; the estimate is the
 * validator's `peakBytes` (spec/work.ts → engine/cost.ts) for the same spec.
 *
 *   node --import tsx bench/memory.ts            all cases, one fresh process each; one JSON line
 *   node --import tsx bench/memory.ts <index>    one case in this process (what the former spawns)
 *
 * Cases are large (tens to hundreds of MB) so that the process's own fluctuations (a few MB
 * of heap and code) stay small beside them.
 */
import { spawnSync } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { isMainThread, parentPort, Worker, workerData } from 'node:worker_threads'
import { DEFAULT_LIMITS, estimateWork, normaliseSpec, type WorkLimits } from '../src/spec/index.js'
import { planSweep, computeChunk } from '../src/sweep/index.js'
import { compileEngineEagerly } from '../src/runtime/engine-compilation.js'
import { explicitCollector } from '../src/runtime/reclaim.js'
import { ENGINE_PROCESS_FLAGS, threadExecArgv } from '../src/runtime/node-flags.js'

export interface MemoryCase {
  name: string
  /** Representation the engine picks, for the report. */
  representation: string
  spec: Record<string, unknown>
}

const base = { seed: 5, cue: { kind: 'flip', fraction: 0.05 }, dynamics: { update: 'sync', maxSweeps: 3 }, trials: 2 }

export const MEMORY_CASES: MemoryCase[] = [
  { name: 'Hebbian, N = 40,000, P = 2000, 6 networks', representation: 'overlap space', spec: { ...base, neurons: 40_000, patterns: 2000, trials: 6 } },
  { name: 'Hebbian, N = 100,000, P = 5000', representation: 'overlap space', spec: { ...base, neurons: 100_000, patterns: 5000, trials: 1 } },
  { name: 'pseudo-inverse, N = 2000, P = 100', representation: 'dense float64', spec: { ...base, neurons: 2000, patterns: 100, rule: { kind: 'pseudo-inverse' } } },
  { name: 'Storkey, N = 1500, P = 75', representation: 'dense float64', spec: { ...base, neurons: 1500, patterns: 75, rule: { kind: 'storkey' } } },
  { name: 'clipped, N = 3000, P = 100', representation: 'dense int16', spec: { ...base, neurons: 3000, patterns: 100, rule: { kind: 'clipped' } } },
  { name: 'covariance, 0/1 neurons, a = 0.1, N = 2500, P = 125', representation: 'dense float64', spec: { ...base, neurons: 2500, patterns: 125, coding: 'binary', family: { kind: 'random', activity: 0.1 }, rule: { kind: 'covariance' } } },
  { name: 'Hebbian, random dilution 0.5 asymmetric, N = 2500, P = 125', representation: 'dense float64', spec: { ...base, neurons: 2500, patterns: 125, dilution: { keep: 0.5, symmetric: false } } },
  { name: 'fixed in-degree K = 400, N = 20,000, P = 40', representation: 'adjacency lists', spec: { ...base, neurons: 20_000, patterns: 40, dilution: { kind: 'fixed-in-degree', inDegree: 400 } } },
  { name: 'dense polynomial n = 3, N = 20,000, P = 2000', representation: 'dense memory', spec: { ...base, neurons: 20_000, patterns: 2000, rule: { kind: 'dense-polynomial', degree: 3 }, dynamics: { update: 'sync', maxSweeps: 1 } } },
  { name: 'modern softmax β = 8, N = 20,000, P = 2000', representation: 'softmax', spec: { ...base, neurons: 20_000, patterns: 2000, rule: { kind: 'modern-softmax', beta: 8 }, dynamics: { maxSweeps: 2 } } }
]

/**
 * The largest point the default limits allow: N at maxNeurons (Hebbian, overlap space, the
 * default model) with the most patterns whose estimated peak stays within maxBytes. It is
 * the memory a worker of a default install may be asked to hold.
 */
export function largestAllowedCase (limits: Pick<WorkLimits, 'maxNeurons' | 'maxBytes'> = DEFAULT_LIMITS): MemoryCase {
  const neurons = limits.maxNeurons
  const fits = (patterns: number): boolean => estimateWork(normaliseSpec({ ...base, neurons, patterns, trials: 1 })).peakBytes <= limits.maxBytes
  let low = 1
  let high = 2
  while (fits(high)) {
    low = high
    high *= 2
  }
  while (high - low > 1) {
    const mid = Math.floor((low + high) / 2)
    if (fits(mid)) low = mid
    else high = mid
  }
  return { name: `largest the default limits allow: Hebbian, N = ${neurons.toLocaleString('en')}, P = ${low.toLocaleString('en')}`, representation: 'overlap space', spec: { ...base, neurons, patterns: low, trials: 1 } }
}

MEMORY_CASES.push(largestAllowedCase())

export interface MemoryMeasurement {
  name: string
  representation: string
  estimateBytes: number
  measuredBytes: number
  /** measured ÷ estimate. */
  ratio: number
  baselineBytes: number
  seconds: number
}

/** The same model at a toy size: loads and compiles everything the real point will use. */
function warmUpSpec (spec: Record<string, unknown>): Record<string, unknown> {
  const dilution = spec.dilution as { kind?: string } | undefined
  return { ...spec, neurons: 64, patterns: 4, trials: 1, ...(dilution?.kind === 'fixed-in-degree' ? { dilution: { kind: 'fixed-in-degree', inDegree: 8 } } : {}) }
}

function runFirstPoint (raw: Record<string, unknown>): void {
  const spec = normaliseSpec(raw)
  for (const chunk of planSweep(spec).chunks.filter((c) => c.point === 0)) computeChunk(spec, chunk, { reclaim: process.env.NO_RECLAIM === '1' ? undefined : explicitCollector() })
}

if (!isMainThread) {
  compileEngineEagerly()
  const { index } = workerData as { index: number }
  const spec = MEMORY_CASES[index]!.spec
  runFirstPoint(warmUpSpec(spec))
  parentPort!.postMessage('warm')
  parentPort!.once('message', () => {
    const started = performance.now()
    runFirstPoint(spec)
    parentPort!.postMessage({ seconds: (performance.now() - started) / 1000 })
  })
} else if (process.argv[2] !== undefined) {
  const index = Number(process.argv[2])
  const entry = MEMORY_CASES[index]!
  const estimateBytes = estimateWork(normaliseSpec(entry.spec)).peakBytes
  // A worker thread does not inherit tsx's loader hooks: the thread registers them itself.
  const source = `import('tsx/esm/api').then((tsx) => { tsx.register(); return import(${JSON.stringify(import.meta.url)}) })`
  const worker = new Worker(source, { eval: true, workerData: { index }, execArgv: threadExecArgv() })
  await new Promise<void>((resolve, reject) => {
    worker.once('message', () => resolve())
    worker.once('error', reject)
  })
  await new Promise((resolve) => setTimeout(resolve, 50))
  const baselineBytes = process.memoryUsage.rss()
  let peak = baselineBytes
  const sampler = setInterval(() => { peak = Math.max(peak, process.memoryUsage.rss()) }, 1)
  const done = new Promise<{ seconds: number }>((resolve, reject) => {
    worker.once('message', resolve)
    worker.once('error', reject)
  })
  worker.postMessage('go')
  const { seconds } = await done
  clearInterval(sampler)
  peak = Math.max(peak, process.memoryUsage.rss())
  await worker.terminate()
  const measuredBytes = peak - baselineBytes
  const out: MemoryMeasurement = { name: entry.name, representation: entry.representation, estimateBytes, measuredBytes, ratio: measuredBytes / estimateBytes, baselineBytes, seconds }
  process.stdout.write(`${JSON.stringify(out)}\n`)
} else {
  const here = fileURLToPath(import.meta.url)
  const results: MemoryMeasurement[] = []
  for (let index = 0; index < MEMORY_CASES.length; index++) {
    const run = spawnSync(process.execPath, [...ENGINE_PROCESS_FLAGS, '--import', 'tsx', here, String(index)], { encoding: 'utf8', maxBuffer: 1 << 22 })
    const line = run.stdout.trim().split('\n').at(-1) ?? ''
    if (run.status !== 0 || !line.startsWith('{')) throw new Error(`memory case ${index} failed: ${run.stderr.trim().split('\n').slice(-3).join(' ')}`)
    results.push(JSON.parse(line) as MemoryMeasurement)
    process.stderr.write(`[memory] ${line}\n`)
  }
  process.stdout.write(`${JSON.stringify(results)}\n`)
}
