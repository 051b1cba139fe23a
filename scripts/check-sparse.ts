/**
 * `npm run check:sparse [-- --neurons 1000 --targets 24 --networks 3 --seed 1]`: the storage
 * capacity of the covariance rule for sparse 0/1 patterns at activities a = 0.1 and 0.05,
 * each with its threshold optimised, and the ratio α_c(0.05)/α_c(0.1) beside the asymptotic
 * ratio of α_c ≈ 1/(2a|ln a|) (Tsodyks & Feigel'man, Europhys. Lett. 6, 101 (1988); recalled
 * from memory, CHECK_VALUES §8: corrections are logarithmic, so only the ratio is compared,
 * with aN ≥ 50). Too slow for the test suite (one to a few minutes on 2 cores);
 * test/engine/models/sparse-covariance.test.ts runs a cheap qualitative check.
 *
 * Method: for each a and load α of a grid, `networks` networks are drawn through the engine
 * (patterns, covariance couplings); each threshold θ of a grid is applied to the same
 * couplings (denseNetworkFrom), and recall starts exactly on each of the first `targets`
 * stored patterns (zero temperature, asynchronous random order, at most 50 sweeps). A trial
 * succeeds when its final centred overlap is ≥ 0.9 (the engine's overlap for biased
 * patterns). For each network the success at α is the best over θ, and its α_c is where
 * that falls through ½ (linear interpolation between grid loads, first fall). α_c(a) is the
 * mean over networks with its standard error; the ratio's error is propagated from both.
 */
import { Command } from 'commander'
import { createScratch, generatePatterns, openStream, runTrialOn, type PointParams } from '../src/engine/index.js'
import { denseNetworkFrom } from '../src/engine/network/build.js'
import { covarianceCouplings } from '../src/engine/rules/covariance.js'
import { sparseCapacityAsymptote } from '../src/engine/theory/index.js'

const options = new Command()
  .option('--neurons <n>', 'network size N', '1000')
  .option('--targets <n>', 'recall trials per network (one per stored pattern)', '24')
  .option('--networks <n>', 'networks per load', '3')
  .option('--seed <n>', 'master seed', '1')
  .parse()
  .opts<{ neurons: string, targets: string, networks: string, seed: string }>()

const neurons = Number(options.neurons)
const targets = Number(options.targets)
const networks = Number(options.networks)
const seed = Number(options.seed)
/** Thresholds in the rule's units, θ/(1 − b²): silent units sit near −a, active ones near 1 − a. */
const THRESHOLDS = [0.4, 0.45, 0.5, 0.55, 0.6, 0.65]
const LOADS: Record<string, number[]> = {
  0.1: [0.3, 0.35, 0.4, 0.45, 0.5, 0.55, 0.6, 0.7],
  0.05: [0.5, 0.6, 0.7, 0.8, 0.9, 1, 1.1, 1.3]
}

function params (activity: number, load: number, threshold: number): PointParams {
  return {
    neurons,
    patterns: Math.round(load * neurons),
    coding: 'binary',
    family: { kind: 'random', activity },
    rule: { kind: 'covariance', selfCoupling: false, threshold },
    dilution: null,
    cue: { kind: 'flip', fraction: 0 },
    dynamics: { update: 'async-random', temperature: 0, maxSweeps: 50, burnIn: 0 },
    measures: { overlapTrajectory: false, energyTrajectory: false, stability: false },
    successThreshold: 0.9,
    trialsPerNetwork: targets
  }
}

/** Best success rate over the thresholds at one load for network k, and the threshold that gave it. */
function bestSuccess (activity: number, load: number, point: number, k: number): { rate: number, threshold: number } {
  const base = params(activity, load, THRESHOLDS[0]!)
  const patterns = generatePatterns(base, openStream(seed, 'network', point, k))
  const b = 2 * activity - 1
  const { couplings } = covarianceCouplings(patterns, neurons, base.patterns, activity, false, 0, true)
  const rates = THRESHOLDS.map((threshold) => {
    const p = params(activity, load, threshold)
    const net = denseNetworkFrom(p, patterns, couplings, 1, threshold * (1 - b * b), true)
    const scratch = createScratch(neurons, p.patterns)
    let successes = 0
    for (let target = 0; target < targets; target++) {
      const record = runTrialOn(net, p, k * targets + target, target, openStream(seed, 'trial', point, k * targets + target), scratch)
      if (record.overlap >= p.successThreshold) successes++
    }
    return successes / targets
  })
  let best = 0
  for (let t = 1; t < rates.length; t++) if (rates[t]! > rates[best]!) best = t
  return { rate: rates[best]!, threshold: THRESHOLDS[best]! }
}

/** Where a success curve first falls through ½ (linear interpolation); NaN when it never does on the grid. */
function crossing (loads: number[], rates: number[]): number {
  for (let i = 1; i < loads.length; i++) {
    if (rates[i - 1]! >= 0.5 && rates[i]! < 0.5) return loads[i - 1]! + (rates[i - 1]! - 0.5) / (rates[i - 1]! - rates[i]!) * (loads[i]! - loads[i - 1]!)
  }
  return Number.NaN
}

function meanAndError (values: number[]): { mean: number, se: number } {
  const mean = values.reduce((s, v) => s + v, 0) / values.length
  const variance = values.reduce((s, v) => s + (v - mean) ** 2, 0) / Math.max(1, values.length - 1)
  return { mean, se: Math.sqrt(variance / values.length) }
}

const started = Date.now()
const capacities: Record<string, { mean: number, se: number }> = {}
for (const [index, activity] of [0.1, 0.05].entries()) {
  const loads = LOADS[String(activity)]!
  console.log(`a = ${activity}, N = ${neurons} (aN = ${activity * neurons}), ${networks} network(s) × ${targets} patterns per load; best success over θ ∈ {${THRESHOLDS.join(', ')}}`)
  const perNetwork: number[] = []
  for (let k = 0; k < networks; k++) {
    const results = loads.map((load, l) => bestSuccess(activity, load, index * 100 + l, k))
    const alphaC = crossing(loads, results.map((r) => r.rate))
    perNetwork.push(alphaC)
    console.log(`  network ${k}: ${results.map((r, l) => `α ${loads[l]} → ${r.rate.toFixed(2)} (θ ${r.threshold})`).join(', ')}; α_c ≈ ${alphaC.toFixed(3)}`)
  }
  capacities[activity] = meanAndError(perNetwork)
  console.log(`  α_c(${activity}) = ${capacities[activity].mean.toFixed(3)} ± ${capacities[activity].se.toFixed(3)}; asymptote 1/(2a|ln a|) = ${sparseCapacityAsymptote(activity).toFixed(3)}`)
}
const sparse = capacities[0.05]!
const dense = capacities[0.1]!
const measured = sparse.mean / dense.mean
const error = measured * Math.hypot(sparse.se / sparse.mean, dense.se / dense.mean)
const asymptotic = sparseCapacityAsymptote(0.05) / sparseCapacityAsymptote(0.1)
console.log(`ratio α_c(0.05)/α_c(0.1): measured ${measured.toFixed(3)} ± ${error.toFixed(3)}, asymptotic ${asymptotic.toFixed(3)} (measured/asymptotic − 1 = ${((measured / asymptotic - 1) * 100).toFixed(1)} %)`)
console.log(`${((Date.now() - started) / 1000).toFixed(1)} s`)
