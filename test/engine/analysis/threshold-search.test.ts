/**
 * The threshold search on synthetic responses whose crossing is known, so the design and
 * its confidence interval can be checked against the truth: the nominal-coverage checks are
 * the standard way to validate an interval procedure (common practice: simulate, count how
 * often the interval holds the truth, compare with the confidence level).
 */
import { describe, expect, it } from 'vitest'
import { runThresholdSearch, type StepObservation, type ThresholdSearchSettings } from '../../../src/engine/analysis/index.js'
import { Xoshiro256StarStar, type RandomSource } from '../../../src/engine/index.js'

const BASE: ThresholdSearchSettings = { from: 0, to: 1, direction: 'decreasing', measure: 'success', level: 0.5, maxSteps: 12, tolerance: 0.005, confidence: 0.95 }

/** Binomial counts of `trials` Bernoulli(p(x)) draws. */
function binomialResponse (p: (x: number) => number, rng: RandomSource, trials = 200) {
  return (x: number): StepObservation => {
    const rate = p(x)
    let k = 0
    for (let t = 0; t < trials; t++) if (rng.uniform() < rate) k++
    return { trials, successes: k, overlapMean: Number.NaN, overlapSe: Number.NaN }
  }
}

/** Means of `trials` draws of p(x) + uniform noise of standard deviation sd. */
function meanResponse (m: (x: number) => number, rng: RandomSource, sd: number, trials = 200) {
  return (x: number): StepObservation => {
    const values = Array.from({ length: trials }, () => m(x) + sd * Math.sqrt(12) * (rng.uniform() - 0.5))
    const mean = values.reduce((s, v) => s + v, 0) / trials
    const variance = values.reduce((s, v) => s + (v - mean) ** 2, 0) / (trials - 1)
    return { trials, successes: 0, overlapMean: mean, overlapSe: Math.sqrt(variance / trials) }
  }
}

function crossingOf (curve: (x: number) => number, level: number): number {
  let lo = 0
  let hi = 1
  for (let i = 0; i < 100; i++) {
    const mid = (lo + hi) / 2
    if (curve(mid) > level) lo = mid
    else hi = mid
  }
  return (lo + hi) / 2
}

/** Fraction of `runs` searches whose interval holds the true crossing, with crossings drawn in [0.3, 0.7]. */
function coverage (runs: number, seedBase: bigint, make: (x0: number) => (x: number) => number, measure: 'success' | 'overlap') {
  let covered = 0
  let open = 0
  for (let run = 0; run < runs; run++) {
    const rng = Xoshiro256StarStar.fromSeed(seedBase + BigInt(run))
    const curve = make(0.3 + 0.4 * rng.uniform())
    const truth = crossingOf(curve, 0.5)
    const respond = measure === 'success' ? binomialResponse(curve, rng) : meanResponse(curve, rng, 0.3)
    const result = runThresholdSearch({ ...BASE, measure }, respond)
    if (result.low === null || result.high === null) open++
    else if (result.low <= truth && truth <= result.high) covered++
  }
  return { covered: covered / runs, open }
}

const logistic = (scale: number) => (x0: number) => (x: number) => 1 / (1 + Math.exp((x - x0) / scale))
/** Gompertz curve: skewed, so a logistic fits it only locally, like finite-size success curves. */
const gompertz = (scale: number) => (x0: number) => (x: number) => Math.exp(-Math.exp((x - x0) / scale))

describe('threshold search: coverage of the 95 % interval on known crossings', () => {
  // 200 runs: the binomial standard error of a 0.95 coverage is 0.015, so [0.91, 0.99] is ±2.7 SE.
  it('success rate with a logistic response (the fitted model is right)', () => {
    const { covered, open } = coverage(200, 1000n, logistic(0.03), 'success')
    expect(open).toBe(0)
    expect(covered).toBeGreaterThanOrEqual(0.91)
    expect(covered).toBeLessThanOrEqual(0.99)
  })

  it('success rate with a skewed response (the local fit and dispersion keep coverage near nominal)', () => {
    const { covered } = coverage(200, 2000n, gompertz(0.03), 'success')
    expect(covered).toBeGreaterThanOrEqual(0.88)
  })

  it('mean overlap with a smooth response and Gaussian-like noise', () => {
    const { covered } = coverage(200, 3000n, logistic(0.03), 'overlap')
    expect(covered).toBeGreaterThanOrEqual(0.91)
    expect(covered).toBeLessThanOrEqual(0.995)
  })
})

describe('threshold search: the design', () => {
  it('evaluates both ends first, then bisects inside the bracket, and keeps the crossing in the final bracket', () => {
    const rng = Xoshiro256StarStar.fromSeed(7n)
    const result = runThresholdSearch(BASE, binomialResponse(logistic(0.02)(0.37), rng, 2000))
    expect(result.steps.slice(0, 3).map((s) => s.value)).toEqual([0, 1, 0.5])
    expect(result.steps[3]!.value).toBe(0.25)
    expect(result.bracket!.low).toBeLessThan(0.37)
    expect(result.bracket!.high).toBeGreaterThan(0.37)
    expect(result.estimate!).toBeCloseTo(0.37, 2)
    expect(result.steps.length).toBeLessThanOrEqual(BASE.maxSteps)
  })

  it('stops at the tolerance when the data are precise', () => {
    const exact = (x: number): StepObservation => ({ trials: 1e6, successes: Math.round(1e6 / (1 + Math.exp((x - 0.3) / 0.05))), overlapMean: 0, overlapSe: 0 })
    const result = runThresholdSearch({ ...BASE, tolerance: 0.01 }, exact)
    expect(result.stoppedBy).toBe('tolerance')
    expect(result.bracket!.high - result.bracket!.low).toBeLessThanOrEqual(0.01)
    expect(result.estimate!).toBeCloseTo(0.3, 4)
  })

  it('stops at max-steps when the budget runs out first', () => {
    const exact = (x: number): StepObservation => ({ trials: 1e6, successes: Math.round(1e6 / (1 + Math.exp((x - 0.3) / 0.05))), overlapMean: 0, overlapSe: 0 })
    const result = runThresholdSearch({ ...BASE, tolerance: 1e-9, maxSteps: 5 }, exact)
    expect(result.stoppedBy).toBe('max-steps')
    expect(result.steps).toHaveLength(5)
  })

  it('stops at the resolution of a realised parameter (whole pattern counts) and runs realised values only', () => {
    const n = 50
    const realise = (x: number) => Math.round(x * n) / n
    const exact = (x: number): StepObservation => ({ trials: 1e6, successes: Math.round(1e6 / (1 + Math.exp((x - 0.31) / 0.05))), overlapMean: 0, overlapSe: 0 })
    const result = runThresholdSearch({ ...BASE, tolerance: 1e-6, realise }, exact)
    expect(result.stoppedBy).toBe('resolution')
    for (const step of result.steps) expect(Math.round(step.value * n)).toBeCloseTo(step.value * n, 9)
    expect(result.bracket!.high - result.bracket!.low).toBeCloseTo(1 / n, 12)
  })

  it('says where the crossing lies when the range misses it, and spends only the two end steps', () => {
    const high = (x: number): StepObservation => ({ trials: 100, successes: x < 2 ? 100 : 0, overlapMean: 0, overlapSe: 0 })
    const above = runThresholdSearch(BASE, high)
    expect(above.stoppedBy).toBe('no-crossing')
    expect(above.estimate).toBeNull()
    expect(above.steps).toHaveLength(2)
    expect(above.note).toMatch(/above `to`/)
    const below = runThresholdSearch(BASE, () => ({ trials: 100, successes: 0, overlapMean: 0, overlapSe: 0 }))
    expect(below.note).toMatch(/below `from`/)
    const rising = runThresholdSearch(BASE, (x) => ({ trials: 100, successes: x > 0.5 ? 100 : 0, overlapMean: 0, overlapSe: 0 }))
    expect(rising.note).toMatch(/other way/)
  })

  it('follows an increasing measure when told so', () => {
    const rng = Xoshiro256StarStar.fromSeed(11n)
    const rising = (x: number) => 1 / (1 + Math.exp(-(x - 0.62) / 0.03))
    const result = runThresholdSearch({ ...BASE, direction: 'increasing' }, binomialResponse(rising, rng, 1000))
    expect(result.low!).toBeLessThan(0.62)
    expect(result.high!).toBeGreaterThan(0.62)
  })

  it('is deterministic, and an error thrown by evaluate (a cancel) propagates', () => {
    const once = () => runThresholdSearch(BASE, binomialResponse(logistic(0.03)(0.4), Xoshiro256StarStar.fromSeed(5n)))
    expect(once()).toEqual(once())
    expect(() => runThresholdSearch(BASE, (_x, step) => { if (step === 3) throw new Error('stop'); return { trials: 10, successes: 5, overlapMean: 0, overlapSe: 0 } })).toThrow('stop')
  })
})
