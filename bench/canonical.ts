/**
 * Runs the standard workloads W1–W4 (shared bench WORKLOADS.md) on one canonical
 * xoshiro256** stream seeded directly with the workload seed, drawing in the documented
 * order, so the outputs can be compared bit for bit with the C reference's integer variants.
 */
import { buildNetwork, createPointRunner, createScratch, runTrialOn, Xoshiro256StarStar, type PointParams, type TrialRecord } from '../src/engine/index.js'
import { SoftmaxMemory } from '../src/engine/models/softmax/memory.js'
import { createSoftmaxScratch, runSoftmaxTrial } from '../src/engine/models/softmax/trial.js'

export interface WorkloadRun {
  workload: string
  neurons: number
  patterns: number
  trials: TrialRecord[]
  buildSeconds: number
  simSeconds: number
  weightBytes: number
  representation: string
  /** Fast path the network ran on ('js' for the plain path). */
  fastPath: string
  /** Bytes held by the network representation (patterns in both layouts, accumulators). */
  representationBytes: number
}

export function workloadParams (neurons: number, patterns: number, flips: number, update: 'async-random' | 'sync'): PointParams {
  return {
    neurons,
    patterns,
    coding: 'pm1',
    family: { kind: 'random', activity: 0.5 },
    rule: { kind: 'hebbian', selfCoupling: false },
    dilution: null,
    cue: { kind: 'flip', fraction: flips / neurons },
    dynamics: { update, temperature: 0, maxSweeps: update === 'sync' ? 100 : 50, burnIn: 0 },
    measures: { overlapTrajectory: false, energyTrajectory: false, stability: false },
    successThreshold: 0.95,
    trialsPerNetwork: 1
  }
}

/** W1, W3, W4: one network for all trials, then per trial the cue and the sweeps' shuffles. */
export function runSharedNetworkWorkload (workload: string, p: PointParams, trials: number, seed: number): WorkloadRun {
  const rng = Xoshiro256StarStar.fromSeed(BigInt(seed))
  const t0 = performance.now()
  const net = buildNetwork(p, rng)
  const t1 = performance.now()
  const scratch = createScratch(p.neurons, p.patterns)
  const records: TrialRecord[] = []
  for (let t = 0; t < trials; t++) records.push(runTrialOn(net, p, t, t % p.patterns, rng, scratch))
  const t2 = performance.now()
  return { workload, neurons: p.neurons, patterns: p.patterns, trials: records, buildSeconds: (t1 - t0) / 1000, simSeconds: (t2 - t1) / 1000, weightBytes: 0, representation: net.representation, fastPath: net.fastPath, representationBytes: net.bytes }
}

/** The modern softmax network (D6): one pattern set for all trials, as the shared-network workloads. */
export function runSoftmaxWorkload (workload: string, p: PointParams, trials: number, seed: number): WorkloadRun {
  if (p.rule.kind !== 'modern-softmax') throw new Error('runSoftmaxWorkload needs the modern-softmax rule')
  const rng = Xoshiro256StarStar.fromSeed(BigInt(seed))
  const t0 = performance.now()
  const mem = SoftmaxMemory.draw(p, p.rule.beta, rng)
  const t1 = performance.now()
  const scratch = createSoftmaxScratch(p.neurons, p.patterns)
  const records: TrialRecord[] = []
  for (let t = 0; t < trials; t++) records.push(runSoftmaxTrial(mem, p, t, t % p.patterns, rng, scratch))
  const t2 = performance.now()
  return { workload, neurons: p.neurons, patterns: p.patterns, trials: records, buildSeconds: (t1 - t0) / 1000, simSeconds: (t2 - t1) / 1000, weightBytes: 0, representation: 'softmax-continuous', fastPath: mem.fastPath, representationBytes: mem.bytes }
}

/** W2: a fresh pattern set for every trial, α ascending, all from one stream. */
export function runCapacityWorkload (seed: number, trialsPerAlpha = 50): { alphas: number[], success: number[], meanOverlap: number[], meanSweeps: number[], totalSeconds: number, updates: number, fastPath: string } {
  const rng = Xoshiro256StarStar.fromSeed(BigInt(seed))
  const n = 500
  const alphas: number[] = []
  const success: number[] = []
  const meanOverlap: number[] = []
  const meanSweeps: number[] = []
  let updates = 0
  let fastPath = ''
  const t0 = performance.now()
  for (let k = 1; k <= 12; k++) {
    const p = workloadParams(n, 10 * k, 25, 'async-random')
    // The service's own per-point loop, on the one canonical stream: a network per trial.
    const runner = createPointRunner(p, seed, k - 1, { stream: rng })
    let ok = 0; let sumM = 0; let sumS = 0
    for (let t = 0; t < trialsPerAlpha; t++) {
      const r = runner.runTrial(t)
      fastPath = runner.fastPath ?? ''
      if (r.overlap >= 0.95) ok++
      sumM += r.overlap; sumS += r.sweeps; updates += r.sweeps * n
    }
    alphas.push(p.patterns / n); success.push(ok / trialsPerAlpha); meanOverlap.push(sumM / trialsPerAlpha); meanSweeps.push(sumS / trialsPerAlpha)
  }
  return { alphas, success, meanOverlap, meanSweeps, totalSeconds: (performance.now() - t0) / 1000, updates, fastPath }
}

export function summarize (records: readonly TrialRecord[]): { meanOverlap: number, sdOverlap: number, fracSuccess: number, meanSweeps: number, maxed: number, fixed: number, cycle2: number } {
  const n = records.length
  let s = 0; let ss = 0; let ok = 0; let sw = 0; let maxed = 0; let fixed = 0; let cycle2 = 0
  for (const r of records) {
    s += r.overlap; ss += r.overlap * r.overlap; sw += r.sweeps
    if (r.overlap >= 0.95) ok++
    if (r.ending === 'max') maxed++
    if (r.ending === 'fixed') fixed++
    if (r.ending === 'cycle2') cycle2++
  }
  const mean = s / n
  return { meanOverlap: mean, sdOverlap: Math.sqrt(Math.max(0, ss / n - mean * mean)), fracSuccess: ok / n, meanSweeps: sw / n, maxed, fixed, cycle2 }
}
