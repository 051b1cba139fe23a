import { describe, it, expect } from 'vitest'
import { crosstalkErrorExact, crosstalkErrorGaussian } from '../../../src/engine/theory/index.js'
import { bisect } from '../../../src/engine/theory/bisect.js'
import { EngineInputError } from '../../../src/engine/errors.js'
import reference from './fixtures/reference.json' with { type: 'json' }

describe('crosstalkErrorGaussian', () => {
  it('inverts to the capacity table of the Gaussian signal-to-noise estimate', () => {
    // Hertz, Krogh & Palmer 1991, Introduction to the Theory of Neural Computation, ch. 2,
    // P_error = ½ erfc(1/√(2α)); table of p_max/N against P_error (Table 2.1: its location
    // is recalled from memory). Values recomputed with SciPy in CHECK_VALUES §1:
    // 0.1047 / 0.1385 / 0.1848 / 0.3696 / 0.6089 (HKP print 0.105 / 0.138 / 0.185 / 0.37 /
    // 0.61). Tolerance 1e-4 as stated there.
    const table: Array<[number, number]> = [[0.001, 0.1047], [0.0036, 0.1385], [0.01, 0.1848], [0.05, 0.3696], [0.1, 0.6089]]
    for (const [pError, load] of table) {
      const alpha = bisect(a => crosstalkErrorGaussian(a) - pError, 1e-3, 5)
      expect(Math.abs(alpha - load)).toBeLessThan(1e-4)
    }
  })

  it('overestimates the exact value at small N', () => {
    // CHECK_VALUES §1 caution: N = 100, P = 10 gives 7.8e-4 (Gaussian) against exact 4.0e-4.
    expect(crosstalkErrorGaussian(0.1)).toBeCloseTo(7.8e-4, 5)
    expect(crosstalkErrorGaussian(0)).toBe(0)
  })

  it('adds α to the signal when the diagonal is kept', () => {
    // ½ erfc((1 + α)/√(2α)): signal-to-noise with J_ii = α (derived, CHECK_VALUES §1 [D]).
    // Large-N limit of the exact (1000, 100) value 2.35e-4; within 0.3e-4 at N = 1000.
    expect(Math.abs(crosstalkErrorGaussian(0.1, { selfCoupling: true }) - 2.35e-4)).toBeLessThan(0.3e-4)
  })

  it('rejects a negative or non-finite load', () => {
    expect(() => crosstalkErrorGaussian(-0.1)).toThrow(EngineInputError)
    expect(() => crosstalkErrorGaussian(NaN)).toThrow(/alpha/)
  })
})

describe('crosstalkErrorExact', () => {
  // CHECK_VALUES §1 (★ check 1): N h_i ξ_i = (N − 1) + B, B a sum of (P − 1)(N − 1) fair
  // ±1 terms [D, checked there by Monte Carlo]. Values printed to 3–4 significant digits;
  // tolerance = half a unit of the last printed digit.
  it('reproduces the exact finite-N instabilities with J_ii = 0', () => {
    const rows: Array<[number, number, number, number]> = [
      // [N, P, value, half unit of last printed digit]
      [100, 10, 3.99e-4, 0.005e-4], [200, 20, 5.70e-4, 0.005e-4], [500, 50, 6.93e-4, 0.005e-4],
      [1000, 100, 7.37e-4, 0.005e-4], [1000, 138, 3.435e-3, 0.0005e-3], [2000, 200, 7.60e-4, 0.005e-4]
    ]
    for (const [n, p, value, tol] of rows) {
      expect(Math.abs(crosstalkErrorExact(n, p).below - value)).toBeLessThanOrEqual(tol)
    }
    // The tie h = 0: 1.09e-4 at (100, 10); impossible when P(N − 1) is odd.
    expect(Math.abs(crosstalkErrorExact(100, 10).tie - 1.09e-4)).toBeLessThanOrEqual(0.005e-4)
    expect(crosstalkErrorExact(100, 9).tie).toBe(0)
    expect(crosstalkErrorExact(200, 21).tie).toBe(0)
    expect(crosstalkErrorExact(101, 9).tie).toBeGreaterThan(0)
  })

  it('reproduces the instabilities with the diagonal J_ii = P/N kept (signal N − 1 + P)', () => {
    const rows: Array<[number, number, number, number]> = [
      [1000, 100, 2.35e-4, 0.005e-4], [1000, 138, 1.049e-3, 0.0005e-3], [100, 10, 1.12e-4, 0.005e-4]
    ]
    for (const [n, p, value, tol] of rows) {
      expect(Math.abs(crosstalkErrorExact(n, p, { selfCoupling: true }).below - value)).toBeLessThanOrEqual(tol)
    }
  })

  it('agrees with the SciPy fixture, including a walk of 1.4e7 steps and far tails', () => {
    // test/engine/theory/fixtures/reference.json from scripts/fixtures/theory/generate.py
    // (scipy.stats.binom). CDFs: two incomplete-beta implementations, relative tolerance
    // 1e-9. Tie (PMF): stdlib's saddle-point PMF is 2e-9 low at 1.4e7 steps (SciPy agrees
    // with a 40-digit mpmath evaluation to 1e-14), so relative tolerance 1e-8.
    for (const row of reference.crosstalkErrorExact) {
      const got = crosstalkErrorExact(row.neurons, row.patterns, { selfCoupling: row.selfCoupling })
      expect(Math.abs(got.below - row.below)).toBeLessThanOrEqual(1e-9 * row.below + 1e-300)
      expect(Math.abs(got.tie - row.tie)).toBeLessThanOrEqual(1e-8 * row.tie + 1e-300)
    }
  })

  it('handles the degenerate sizes by direct counting', () => {
    // One pattern: no crosstalk, the signal N − 1 > 0 always wins.
    expect(crosstalkErrorExact(50, 1)).toEqual({ below: 0, tie: 0 })
    // N = 2, P = 2: N ξh = 1 ± 1, so h = 0 with probability ½ and never negative.
    expect(crosstalkErrorExact(2, 2)).toEqual({ below: 0, tie: 0.5 })
    // N = 1: no other neuron, h = 0 always.
    expect(crosstalkErrorExact(1, 3)).toEqual({ below: 0, tie: 1 })
  })

  it('rejects non-integer or empty sizes, naming the field', () => {
    expect(() => crosstalkErrorExact(0, 3)).toThrow(/neurons/)
    expect(() => crosstalkErrorExact(100, 2.5)).toThrow(/patterns/)
  })
})
