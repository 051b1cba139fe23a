/**
 * The CPU estimate's measured error: for a spread of specs (tiny to large networks, learning
 * rules, dynamics, model families), the validator's `cpuSeconds` (spec/work.ts) against the
 * CPU time this process spends running every chunk of the sweep through the lifecycle core
 * (process.cpuUsage, user + system, one thread), after a toy-sized run of the same model has
 * loaded and compiled the engine. Prints one JSON line.
 *
 * Environment: ESTIMATE_SCALE (1): multiplies every case's trials (0.1 for a quick look).
 */
import { estimateWork, normaliseSpec } from '../src/spec/index.js'
import { computeChunk, planSweep } from '../src/sweep/index.js'
import { compileEngineEagerly } from '../src/runtime/engine-compilation.js'

const SCALE = Number(process.env.ESTIMATE_SCALE ?? 1)

interface EstimateCase { name: string, spec: Record<string, unknown> }

const flip = { kind: 'flip', fraction: 0.1 }
/** Sized to take about a second each on the development machine. */
export const ESTIMATE_CASES: EstimateCase[] = [
  { name: 'tiny: N = 10, P = 1, 3 sweeps', spec: { neurons: 10, patterns: 1, trials: 40_000, dynamics: { maxSweeps: 3 } } },
  { name: 'tiny with stability and trajectories: N = 16, P = 2', spec: { neurons: 16, patterns: 2, trials: 20_000, measures: { stability: true, overlapTrajectory: true, energyTrajectory: true } } },
  { name: 'small: N = 100, P = 5', spec: { neurons: 100, patterns: 5, trials: 10_000 } },
  { name: 'W2 point: N = 500, α = 0.14, async', spec: { neurons: 500, load: 0.14, trials: 600, cue: { kind: 'flip', fraction: 0.05 } } },
  { name: 'N = 2000, P = 100, sync', spec: { neurons: 2000, patterns: 100, trials: 400, dynamics: { update: 'sync' } } },
  { name: 'N = 4000, P = 400, 20 trials per network', spec: { neurons: 4000, patterns: 400, trials: 200, trialsPerNetwork: 20 } },
  { name: 'Glauber T = 0.3, N = 500, P = 25', spec: { neurons: 500, patterns: 25, trials: 400, dynamics: { temperature: 0.3, maxSweeps: 20 } } },
  { name: 'pseudo-inverse N = 400, P = 40', spec: { neurons: 400, patterns: 40, trials: 30, rule: { kind: 'pseudo-inverse' } } },
  { name: 'Storkey N = 300, P = 20', spec: { neurons: 300, patterns: 20, trials: 30, rule: { kind: 'storkey' } } },
  { name: 'diluted 0.5, N = 800, P = 20', spec: { neurons: 800, patterns: 20, trials: 40, dilution: { keep: 0.5, symmetric: true } } },
  { name: 'dense polynomial n = 3, N = 200, P = 400', spec: { neurons: 200, patterns: 400, trials: 200, rule: { kind: 'dense-polynomial', degree: 3 } } },
  { name: 'modern softmax β = 8, N = 400, P = 500', spec: { neurons: 400, patterns: 500, trials: 300, rule: { kind: 'modern-softmax', beta: 8 } } },
  { name: 'fixed in-degree K = 50, N = 5000, P = 5', spec: { neurons: 5000, patterns: 5, trials: 20, dilution: { kind: 'fixed-in-degree', inDegree: 50 } } }
]

export interface EstimateMeasurement { name: string, trials: number, estimatedCpuSeconds: number, measuredCpuSeconds: number, ratio: number }

function cpuSeconds (): number {
  const usage = process.cpuUsage()
  return (usage.user + usage.system) / 1e6
}

function runAll (raw: Record<string, unknown>): void {
  const spec = normaliseSpec(raw)
  for (const chunk of planSweep(spec).chunks) computeChunk(spec, chunk, {})
}

compileEngineEagerly()
const results: EstimateMeasurement[] = []
for (const entry of ESTIMATE_CASES) {
  const base: Record<string, unknown> = { seed: 7, cue: flip, ...entry.spec }
  const trials = Math.max(1, Math.round((entry.spec.trials as number) * SCALE))
  const spec = { ...base, trials, ...(typeof base.trialsPerNetwork === 'number' ? { trialsPerNetwork: Math.min(trials, base.trialsPerNetwork) } : {}) }
  // Warm-up: a tenth of the case, at least 3 trials: enough for the JIT and the kernels' tier-up
  // (the first thousand trials of a tiny network run about 10× slower than the rest).
  const warm = Math.min(trials, Math.max(3, Math.round(trials / 10)))
  runAll({ ...spec, trials: warm, ...(typeof base.trialsPerNetwork === 'number' ? { trialsPerNetwork: warm } : {}) })
  const estimatedCpuSeconds = estimateWork(normaliseSpec(spec)).cpuSeconds
  const before = cpuSeconds()
  runAll(spec)
  const measuredCpuSeconds = cpuSeconds() - before
  results.push({ name: entry.name, trials, estimatedCpuSeconds, measuredCpuSeconds, ratio: estimatedCpuSeconds / measuredCpuSeconds })
  process.stderr.write(`[estimate] ${JSON.stringify(results.at(-1))}\n`)
}
process.stdout.write(`${JSON.stringify(results)}\n`)
