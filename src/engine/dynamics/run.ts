import type { Dynamics } from '../params.js'
import type { Ending } from '../results.js'
import type { RandomSource } from '../random/source.js'
import type { Network, SyncOutcome, ThermalSampling, ThermalTotals } from '../network/network.js'
import { resetIdentity, type Scratch } from './scratch.js'
import { nativeShuffle, nativeUniforms } from '../kernels/native-random.js'

export interface DynamicsOutcome {
  sweeps: number
  ending: Ending
  /** T > 0: mean normalised target overlap over the sweeps after burn-in; else NaN. */
  timeAveragedOverlap: number
  overlapTrajectory: number[] | null
  energyTrajectory: number[] | null
}

export interface Observation {
  /** Normalised overlap of the current state with the target. */
  targetOverlap: () => number
  recordOverlap: boolean
  recordEnergy: boolean
  /** T > 0: called after each measured sweep (after burn-in), for time averages of other measures. */
  sample?: () => void
  /**
   * T > 0, offered when a fast path may take the samples itself instead of `sample`
   * (unbiased patterns): its totals go to `absorb`, and the target overlap's time average is
   * then their sum over the target divided by their count, the same operations as here.
   */
  nativeSampling?: { sampling: ThermalSampling, absorb: (totals: ThermalTotals) => void }
}

/**
 * Runs the dynamics from the state already loaded in `net`.
 *
 * Zero temperature: s_i ← sign(h_i); **tie rule: h_i = 0 leaves s_i unchanged** (decided on
 * exact integer fields for Hebbian couplings). Asynchronous dynamics stop after the first
 * sweep with no change (`fixed`); synchronous ones at a fixed point or a 2-cycle. Either
 * stops at `maxSweeps` (`max`).
 * T > 0: Glauber, P(s_i = +1) = 1/(1 + e^{−2h_i/T}); runs `maxSweeps` sweeps and averages
 * the target overlap over those after `burnIn` (`sampled`).
 */
export function runDynamics (net: Network, dynamics: Dynamics, rng: RandomSource, scratch: Scratch, observe: Observation): DynamicsOutcome {
  const thermal = dynamics.temperature > 0
  const order = scratch.order
  if (dynamics.update !== 'sync') resetIdentity(order)
  // Without trajectories a zero-temperature trial observes nothing between sweeps, so a fast
  // path may run it whole in one call.
  if (!thermal && !observe.recordOverlap && !observe.recordEnergy && net.native !== null) {
    const run = dynamics.update === 'sync'
      ? net.native.runSynchronous?.(scratch.previous, dynamics.maxSweeps)
      : net.native.runZeroTemperature?.(order, dynamics.maxSweeps, dynamics.update === 'async-random', rng)
    if (run !== undefined && run !== null) return { sweeps: run.sweeps, ending: run.ending, timeAveragedOverlap: Number.NaN, overlapTrajectory: null, energyTrajectory: null }
  }
  const overlapTrajectory = observe.recordOverlap ? [] as number[] : null
  const energyTrajectory = observe.recordEnergy ? [] as number[] : null
  const record = (): void => {
    overlapTrajectory?.push(observe.targetOverlap())
    energyTrajectory?.push(net.energyPerNeuron())
  }
  let sampledSum = 0
  let sampledCount = 0
  let ending: Ending = thermal ? 'sampled' : 'max'
  let sweeps = 0
  /** What happens between thermal sweeps: record, then sample after the burn-in. */
  const observeThermal = (sweep: number): void => {
    sweeps = sweep
    record()
    if (sweep > dynamics.burnIn) {
      sampledSum += observe.targetOverlap()
      sampledCount++
      observe.sample?.()
    }
  }
  // A fast path may run a whole asynchronous Glauber trial taking the samples itself, when
  // nothing else is observed between sweeps.
  if (thermal && dynamics.update !== 'sync' && observe.nativeSampling !== undefined && overlapTrajectory === null && energyTrajectory === null) {
    const { sampling, absorb } = observe.nativeSampling
    const totals = net.native?.runGlauberSampled?.(order, dynamics.maxSweeps, dynamics.update === 'async-random', glauberFactor(net, dynamics.temperature), rng, sampling) ?? null
    if (totals !== null) {
      absorb(totals)
      const timeAveragedOverlap = totals.count > 0 ? totals.sums[sampling.target]! / totals.count : Number.NaN
      return { sweeps: dynamics.maxSweeps, ending, timeAveragedOverlap, overlapTrajectory, energyTrajectory }
    }
  }
  // A fast path may run a whole asynchronous Glauber trial, stopping after each sweep to observe.
  const wholeGlauber = thermal && dynamics.update !== 'sync' && net.native?.runGlauber !== undefined &&
    net.native.runGlauber(order, dynamics.maxSweeps, dynamics.update === 'async-random', glauberFactor(net, dynamics.temperature), rng, observeThermal)

  const firstSweep = wholeGlauber ? dynamics.maxSweeps + 1 : 1
  for (let sweep = firstSweep; sweep <= dynamics.maxSweeps; sweep++) {
    sweeps = sweep
    let outcome: SyncOutcome
    if (dynamics.update === 'sync') {
      outcome = thermal ? syncGlauberStep(net, dynamics.temperature, rng, scratch) : syncStep(net, scratch, sweep)
    } else {
      if (dynamics.update === 'async-random') shuffle(order, rng)
      outcome = thermal ? asyncGlauberSweep(net, order, dynamics.temperature, rng, scratch.fields) : asyncSweep(net, order)
    }
    if (thermal) {
      observeThermal(sweep)
    } else {
      record()
      if (outcome !== 'changed') {
        ending = outcome
        break
      }
    }
  }
  return {
    sweeps,
    ending,
    timeAveragedOverlap: sampledCount > 0 ? sampledSum / sampledCount : Number.NaN,
    overlapTrajectory,
    energyTrajectory
  }
}

/** In-place Fisher–Yates, i = N−1 down to 1, j = below(i + 1). */
function shuffle (order: Int32Array, rng: RandomSource): void {
  if (nativeShuffle(order, rng)) return
  for (let i = order.length - 1; i > 0; i--) {
    const j = rng.below(i + 1)
    const t = order[i]!
    order[i] = order[j]!
    order[j] = t
  }
}

function asyncSweep (net: Network, order: Int32Array): 'changed' | 'fixed' {
  if (net.native !== null) return net.native.sweepZeroTemperature(order) ? 'changed' : 'fixed'
  const s = net.state
  let changed = false
  for (let k = 0; k < order.length; k++) {
    const i = order[k]!
    const h = net.field(i)
    const si = s[i]!
    if (h > 0 ? si !== 1 : (h < 0 && si !== -1)) {
      net.set(i, h > 0 ? 1 : -1)
      changed = true
    }
  }
  return changed ? 'changed' : 'fixed'
}

/** Glauber's factor: s_i ← +1 with probability 1/(1 + exp(factor·field(i))). */
function glauberFactor (net: Network, temperature: number): number {
  return -2 * net.fieldScale / temperature
}

function asyncGlauberSweep (net: Network, order: Int32Array, temperature: number, rng: RandomSource, noise: Float64Array): 'changed' {
  const s = net.state
  const factor = glauberFactor(net, temperature)
  if (net.native !== null) {
    // Visit k draws the k-th uniform, and nothing else draws during a sweep, so drawing
    // them all first consumes the stream exactly as the loop below does.
    if (!nativeUniforms(noise, order.length, rng)) for (let k = 0; k < order.length; k++) noise[k] = rng.uniform()
    net.native.sweepGlauber(order, noise, factor)
    return 'changed'
  }
  for (let k = 0; k < order.length; k++) {
    const i = order[k]!
    const up = rng.uniform() * (1 + Math.exp(factor * net.field(i))) < 1
    const v = up ? 1 : -1
    if (s[i] !== v) net.set(i, v)
  }
  return 'changed'
}

/** One parallel step s(t) = sign(h(s(t−1))); detects s(t) = s(t−1) and s(t) = s(t−2). */
function syncStep (net: Network, scratch: Scratch, step: number): SyncOutcome {
  if (net.native !== null) return net.native.stepZeroTemperature(scratch.previous, step >= 2)
  const n = net.neurons
  const s = net.state
  const next = scratch.next
  let sameAsNow = true
  for (let i = 0; i < n; i++) {
    const h = net.field(i)
    const v = h > 0 ? 1 : h < 0 ? -1 : s[i]!
    next[i] = v
    if (v !== s[i]) sameAsNow = false
  }
  if (sameAsNow) return 'fixed'
  let sameAsBefore = step >= 2
  if (sameAsBefore) {
    for (let i = 0; i < n; i++) {
      if (next[i] !== scratch.previous[i]) { sameAsBefore = false; break }
    }
  }
  scratch.previous.set(s)
  net.load(next)
  return sameAsBefore ? 'cycle2' : 'changed'
}

function syncGlauberStep (net: Network, temperature: number, rng: RandomSource, scratch: Scratch): 'changed' {
  const n = net.neurons
  const next = scratch.next
  const factor = glauberFactor(net, temperature)
  if (net.native !== null) {
    const noise = scratch.fields
    if (!nativeUniforms(noise, n, rng)) for (let i = 0; i < n; i++) noise[i] = rng.uniform()
    net.native.stepGlauber(noise, factor)
    return 'changed'
  }
  for (let i = 0; i < n; i++) {
    next[i] = rng.uniform() * (1 + Math.exp(factor * net.field(i))) < 1 ? 1 : -1
  }
  net.load(next)
  return 'changed'
}
