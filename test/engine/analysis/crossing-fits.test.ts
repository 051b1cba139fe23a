/** The two crossing fits on hand-made data: exact recovery, the shape of the intervals, and the cases that give none. */
import { describe, expect, it } from 'vitest'
import { localLinearCrossing, logisticCrossing, type BinomialPoint } from '../../../src/engine/analysis/index.js'

const LIMITS = { low: -1, high: 2 }

/** Counts that follow σ(−(x − x0)/s) as closely as whole numbers allow. */
function logisticCounts (xs: number[], x0: number, s: number, trials: number): BinomialPoint[] {
  return xs.map((x) => ({ x, trials, successes: Math.round(trials / (1 + Math.exp((x - x0) / s))) }))
}

describe('logisticCrossing', () => {
  it('recovers the crossing of an exact logistic curve, inside a narrow interval', () => {
    const fit = logisticCrossing(logisticCounts([0.2, 0.3, 0.35, 0.4, 0.45, 0.5, 0.6], 0.41, 0.05, 1e6), 0.5, 'decreasing', 0.95, LIMITS)!
    expect(fit.method).toBe('logistic-profile')
    expect(fit.estimate).toBeCloseTo(0.41, 4)
    expect(fit.low!).toBeLessThan(0.41)
    expect(fit.high!).toBeGreaterThan(0.41)
    expect(fit.high! - fit.low!).toBeLessThan(0.002)
    // σ'(x) at the crossing, in logit units: −1/s.
    expect(fit.slope).toBeCloseTo(-1 / 0.05, 0)
  })

  it('finds other levels than one half: the 80 % point of the same curve', () => {
    const fit = logisticCrossing(logisticCounts([0.2, 0.3, 0.35, 0.4, 0.5], 0.41, 0.05, 1e6), 0.8, 'decreasing', 0.95, LIMITS)!
    expect(fit.estimate).toBeCloseTo(0.41 - 0.05 * Math.log(4), 3)
  })

  it('widens the interval with fewer trials, roughly as 1/√trials', () => {
    const xs = [0.3, 0.35, 0.4, 0.45, 0.5]
    const wide = logisticCrossing(logisticCounts(xs, 0.41, 0.05, 100), 0.5, 'decreasing', 0.95, LIMITS)!
    const narrow = logisticCrossing(logisticCounts(xs, 0.41, 0.05, 10_000), 0.5, 'decreasing', 0.95, LIMITS)!
    const ratio = (wide.high! - wide.low!) / (narrow.high! - narrow.low!)
    expect(ratio).toBeGreaterThan(7)
    expect(ratio).toBeLessThan(13)
  })

  it('handles perfectly separated counts: estimate mid-gap, interval around the gap', () => {
    const points = [{ x: 0.1, trials: 200, successes: 200 }, { x: 0.3, trials: 200, successes: 200 }, { x: 0.4, trials: 200, successes: 0 }, { x: 0.8, trials: 200, successes: 0 }]
    const fit = logisticCrossing(points, 0.5, 'decreasing', 0.95, LIMITS)!
    expect(fit.separated).toBe(true)
    expect(fit.estimate).toBeCloseTo(0.35, 6)
    expect(fit.low!).toBeGreaterThan(0.29)
    expect(fit.low!).toBeLessThan(0.31)
    expect(fit.high!).toBeGreaterThan(0.39)
    expect(fit.high!).toBeLessThan(0.41)
  })

  it('returns null when the counts show no fall (a rising or flat curve in a search for a falling one)', () => {
    expect(logisticCrossing(logisticCounts([0.2, 0.4, 0.6], 0.4, -0.05, 1000), 0.5, 'decreasing', 0.95, LIMITS)).toBeNull()
    expect(logisticCrossing([{ x: 0.2, trials: 100, successes: 50 }, { x: 0.4, trials: 100, successes: 50 }], 0.5, 'decreasing', 0.95, LIMITS)).toBeNull()
  })

  it('leaves an interval end open (null) when the data do not bound it', () => {
    // Two barely different rates: the slope may be nearly zero, so the crossing could be far away.
    const fit = logisticCrossing([{ x: 0.4, trials: 30, successes: 17 }, { x: 0.5, trials: 30, successes: 14 }], 0.5, 'decreasing', 0.95, LIMITS)!
    expect(fit.low === null || fit.high === null).toBe(true)
  })
})

describe('localLinearCrossing', () => {
  it('recovers the crossing of a straight line exactly, with Fieller limits around it', () => {
    const points = [0.1, 0.2, 0.3, 0.4].map((x) => ({ x, mean: 1 - 2 * x, se: 0.01, trials: 100 }))
    const fit = localLinearCrossing(points, 0.5, 'decreasing', 0.95)!
    expect(fit.estimate).toBeCloseTo(0.25, 12)
    expect(fit.slope).toBeCloseTo(-2, 12)
    expect(fit.low!).toBeLessThan(0.25)
    expect(fit.high!).toBeGreaterThan(0.25)
    // The window is the three points nearest 0.25 (0.1, 0.2, 0.3; ties go to the smaller x), x̄ = 0.2.
    // Delta method: Var θ̂ ≈ (Var a + (θ − x̄)² Var b)/b², Var a = σ²/3, Var b = σ²/Σ(x − x̄)²;
    // Fieller's interval is a little wider than ±1.96·√Var θ̂ but agrees to a few per cent here.
    const varTheta = (1e-4 / 3 + 0.05 ** 2 * 1e-4 / 0.02) / 4
    expect((fit.high! - fit.low!) / (2 * 1.96 * Math.sqrt(varTheta))).toBeCloseTo(1, 1)
  })

  it('uses the points nearest the crossing, so far curvature does not bias it', () => {
    const curve = (x: number) => 1 / (1 + Math.exp((x - 0.5) / 0.05))
    const points = [0, 0.2, 0.4, 0.45, 0.5, 0.55, 0.6, 0.8, 1].map((x) => ({ x, mean: curve(x), se: 0.002, trials: 400 }))
    const fit = localLinearCrossing(points, 0.5, 'decreasing', 0.95)!
    expect(fit.estimate).toBeCloseTo(0.5, 6)
  })

  it('gives an open interval when the slope is not significant, and null for the wrong sign', () => {
    const flat = [{ x: 0.4, mean: 0.51, se: 0.05, trials: 50 }, { x: 0.5, mean: 0.49, se: 0.05, trials: 50 }]
    const open = localLinearCrossing(flat, 0.5, 'decreasing', 0.95)!
    expect(open.low).toBeNull()
    expect(open.high).toBeNull()
    expect(localLinearCrossing(flat, 0.5, 'increasing', 0.95)).toBeNull()
  })
})
