/**
 * One benchmark measurement in a fresh process:
 * `node bench/workload.ts <W1|W2|W3|W4|D1…D7|G1|SCALE|BASELINE> <fast|plain> [seed] [warm repeats]`
 * on the compiled runner (bench/build.ts; `node --import tsx bench/workload.ts …` runs it from
 * source). Prints one JSON line with the keys the shared peers print (WORKLOADS.md §8), so
 * engine and peer runs land in the same tables. Timing is in-process with a monotonic clock;
 * module loading is excluded (WORKLOADS.md §6), JIT warm-up inside the timed region counts.
 */
import type { PointParams } from '../src/engine/index.js'
import { loadWithEngineCompiled } from '../src/runtime/engine-compilation.js'

// Loaded as the service's compute threads load their code (src/runtime/engine-compilation.ts).
const [{ runCapacityWorkload, runSharedNetworkWorkload, runSoftmaxWorkload, summarize, workloadParams }, { setFastPathsEnabled }] =
  await loadWithEngineCompiled(async () => await Promise.all([import('./canonical.js'), import('../src/engine/kernels/wasm.js')]))

const [workload = 'W1', path = 'fast', seedArg = '1', warmArg = '0'] = process.argv.slice(2)
const warmRepeats = Number(warmArg)
/** W2 only: trials per load (the standard 50 unless TRIALS_PER_LOAD asks for a longer curve, as the scaling ceiling does). */
const trialsPerLoad = Number(process.env.TRIALS_PER_LOAD ?? 50)
const seed = Number(seedArg)
if (path !== 'fast' && path !== 'plain') throw new Error(`path must be fast or plain, not ${path}`)
setFastPathsEnabled(path === 'fast')
const impl = 'memsweep'
const variant = path
const selfRssKb = (): number => process.resourceUsage().maxRSS

/** Workloads that change the standard Hebbian point (bench/README.md defines them). */
const VARIANTS: Record<string, (p: PointParams) => PointParams> = {
  D1: (p) => ({ ...p, coding: 'binary' }),
  D2: (p) => ({ ...p, rule: { kind: 'pseudo-inverse', selfCoupling: false } }),
  D3: (p) => ({ ...p, dilution: { keep: 0.3, symmetric: true } }),
  D4: (p) => ({ ...p, rule: { kind: 'dense-polynomial', degree: 3 } }),
  D5: (p) => ({ ...p, rule: { kind: 'dense-exponential' } }),
  D6: (p) => ({ ...p, rule: { kind: 'modern-softmax', beta: 32 } }),
  D7: (p) => ({ ...p, dilution: { kind: 'fixed-in-degree', inDegree: 50 } }),
  G1: (p) => ({ ...p, dynamics: { ...p.dynamics, temperature: 0.4, maxSweeps: 20, burnIn: 10 } })
}

function shared (name: string, neurons: number, patterns: number, flips: number, update: 'async-random' | 'sync', trials: number): Record<string, unknown> {
  const base = workloadParams(neurons, patterns, flips, update)
  const p = VARIANTS[name]?.(base) ?? base
  const run = p.rule.kind === 'modern-softmax' ? runSoftmaxWorkload(name, p, trials, seed) : runSharedNetworkWorkload(name, p, trials, seed)
  const s = summarize(run.trials)
  const sweeps = run.trials.reduce((a, r) => a + r.sweeps, 0)
  const updates = sweeps * neurons
  return {
    impl,
    workload: name,
    variant,
    fast_path: run.fastPath,
    representation: run.representation,
    seed,
    N: neurons,
    P: patterns,
    trials,
    mean_overlap: s.meanOverlap,
    sd_overlap: sdSample(run.trials.map((r) => r.overlap)),
    frac_success: s.fracSuccess,
    [update === 'sync' ? 'mean_steps' : 'mean_sweeps']: s.meanSweeps,
    n_maxed: s.maxed,
    ...(update === 'sync' ? { n_fixed: s.fixed, n_cycle2: s.cycle2 } : {}),
    updates,
    sweeps,
    build_s: run.buildSeconds,
    sim_s: run.simSeconds,
    total_s: run.buildSeconds + run.simSeconds,
    trials_per_s: trials / run.simSeconds,
    updates_per_s: updates / run.simSeconds,
    weight_bytes: 0,
    representation_bytes: run.representationBytes,
    self_maxrss_kb: selfRssKb()
  }
}

/** Sample standard deviation (n − 1), as the peers print it. */
function sdSample (xs: number[]): number {
  const n = xs.length
  if (n < 2) return 0
  const mean = xs.reduce((a, b) => a + b, 0) / n
  return Math.sqrt(xs.reduce((a, x) => a + (x - mean) * (x - mean), 0) / (n - 1))
}

function once (): Record<string, unknown> {
  switch (workload) {
    case 'W1': return shared('W1', 1000, 100, 100, 'async-random', 200)
    case 'W3': return shared('W3', 4000, 400, 400, 'async-random', 20)
    case 'W4': return shared('W4', 1000, 100, 100, 'sync', 200)
    case 'SCALE': return shared('SCALE', 100_000, 5000, 10_000, 'async-random', 1)
    case 'D1': return shared('D1', 1000, 50, 100, 'async-random', 100)
    case 'D2': return shared('D2', 500, 100, 50, 'async-random', 50)
    case 'D3': return shared('D3', 1000, 50, 100, 'sync', 100)
    case 'D4': return shared('D4', 400, 2000, 40, 'async-random', 50)
    case 'D5': return shared('D5', 200, 2000, 20, 'async-random', 50)
    case 'D6': return shared('D6', 400, 2000, 40, 'sync', 50)
    case 'D7': return shared('D7', 20_000, 5, 2000, 'async-random', 20)
    case 'G1': return shared('G1', 1000, 50, 100, 'async-random', 100)
    case 'W2': {
      const r = runCapacityWorkload(seed, trialsPerLoad)
      return {
        impl,
        workload: 'W2',
        variant,
        fast_path: r.fastPath,
        seed,
        N: 500,
        trials_per_alpha: trialsPerLoad,
        alpha: r.alphas,
        success: r.success,
        mean_overlap: r.meanOverlap,
        mean_sweeps: r.meanSweeps,
        updates: r.updates,
        total_s: r.totalSeconds,
        trials_per_s: 12 * trialsPerLoad / r.totalSeconds,
        updates_per_s: r.updates / r.totalSeconds,
        self_maxrss_kb: selfRssKb()
      }
    }
    case 'BASELINE': return { impl, workload: 'BASELINE', variant, self_maxrss_kb: selfRssKb() }
    default: throw new Error(`unknown workload ${workload}`)
  }
}

const out = once()
// Peak RSS of the measured run itself, before any warm repeat can raise it.
out.first_maxrss_kb = selfRssKb()
if (warmRepeats > 0) {
  const key = workload === 'W2' ? 'total_s' : 'sim_s'
  const times: number[] = []
  for (let k = 0; k < warmRepeats; k++) times.push(once()[key] as number)
  times.sort((a, b) => a - b)
  out.warm_s = times[times.length >> 1]
  out.warm_repeats = warmRepeats
}
console.log(JSON.stringify(out))
