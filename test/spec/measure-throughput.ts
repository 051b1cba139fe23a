/**
 * Measures ENGINE_OPS_PER_CPU_SECOND (src/spec/work.ts): engine operations, as counted by
 * the engine's cost model, per CPU second of one thread, over a mix of workloads. Run by
 * hand after engine changes: `npx tsx test/spec/measure-throughput.ts`. Prints each
 * workload's rate and the median, which is the value to put in work.ts.
 */
import { cpuUsage } from 'node:process'
import { estimatePointCost } from '../../src/engine/index.js'
import { normaliseSpec, pointAt, type SweepSpecInput } from '../../src/spec/index.js'
import { planSweep, computeChunk } from '../../src/sweep/index.js'
import { ENGINE_OPS_PER_CPU_SECOND, pointOps } from '../../src/spec/work.js'

const WORKLOADS: Record<string, SweepSpecInput> = {
  'hebbian N=1000 α=0.1 T=0 (W1-like)': { neurons: 1000, load: 0.1, trials: 400, trialsPerNetwork: 400, cue: { kind: 'flip', fraction: 0.1 } },
  'hebbian N=500 α=0.12 new network per trial': { neurons: 500, load: 0.12, trials: 400 },
  'hebbian N=4000 α=0.1 T=0 (W3-like)': { neurons: 4000, load: 0.1, trials: 20, trialsPerNetwork: 20, cue: { kind: 'flip', fraction: 0.1 } },
  'hebbian N=200 α=0.1 T=0': { neurons: 200, load: 0.1, trials: 400 },
  'hebbian N=1000 P=20 T=0': { neurons: 1000, patterns: 20, trials: 100 },
  'hebbian N=400 α=0.2 sync': { neurons: 400, load: 0.2, trials: 200, dynamics: { update: 'sync' } },
  'hebbian N=200 P=10 T=0.5 Glauber': { neurons: 200, patterns: 10, trials: 40, dynamics: { temperature: 0.5, maxSweeps: 60, burnIn: 20 } },
  'pseudo-inverse N=300 P=60': { neurons: 300, patterns: 60, trials: 20, rule: { kind: 'pseudo-inverse' } },
  'storkey N=200 P=20': { neurons: 200, patterns: 20, trials: 20, rule: { kind: 'storkey' } },
  'covariance N=500 a=0.1 binary': { neurons: 500, load: 0.05, trials: 100, coding: 'binary', family: { kind: 'random', activity: 0.1 }, rule: { kind: 'covariance' } },
  'hebbian N=300 P=30 diluted 0.5': { neurons: 300, patterns: 30, trials: 100, dilution: { keep: 0.5 } }
}

function measure (input: SweepSpecInput): { ops: number, cpuSeconds: number } {
  const spec = normaliseSpec(input)
  const { params } = pointAt(spec, 0)
  computeChunk(spec, { index: 0, point: 0, firstTrial: 0, count: Math.min(spec.trials, 5) })
  const start = cpuUsage()
  for (const chunk of planSweep(spec).chunks) computeChunk(spec, chunk)
  const used = cpuUsage(start)
  return { ops: pointOps(estimatePointCost(params), spec.trials, params.trialsPerNetwork), cpuSeconds: (used.user + used.system) / 1e6 }
}

const rates: number[] = []
for (const [name, input] of Object.entries(WORKLOADS)) {
  const { ops, cpuSeconds } = measure(input)
  const rate = ops / cpuSeconds
  rates.push(rate)
  console.log(`${name.padEnd(36)} ${ops.toExponential(3).padStart(10)} ops  ${cpuSeconds.toFixed(3).padStart(7)} s  ${rate.toExponential(3)} ops/s  (estimate/actual ${(ops / ENGINE_OPS_PER_CPU_SECOND / cpuSeconds).toFixed(2)})`)
}
rates.sort((a, b) => a - b)
const median = rates.length % 2 === 1 ? rates[(rates.length - 1) / 2]! : (rates[rates.length / 2 - 1]! + rates[rates.length / 2]!) / 2
console.log(`median ${median.toExponential(3)} ops per CPU second (work.ts has ${ENGINE_OPS_PER_CPU_SECOND.toExponential(3)})`)
