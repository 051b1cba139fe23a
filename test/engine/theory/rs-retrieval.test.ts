import { describe, it, expect } from 'vitest'
import { rsCriticalLoad, rsRetrievalOverlap } from '../../../src/engine/theory/index.js'
import reference from './fixtures/reference.json' with { type: 'json' }

// Amit, Gutfreund & Sompolinsky, PRL 55, 1530 (1985) and Ann. Phys. 173, 30 (1987):
// replica-symmetric T = 0 retrieval, √(2α) = erf(y)/y − (2/√π) e^{−y²}, m = erf(y).
describe('rsCriticalLoad', () => {
  it('gives α_c = 0.137906, y_c = 1.51122 and m(α_c) = 0.96742', () => {
    // CHECK_VALUES §2 [C]; Steffan & Kühn, Z. Phys. B 95, 249 (1994) give 0.137905 and
    // Stojnic 2024 0.137906 [S]. Tolerance: half a unit of the printed digits (5e-7, 5e-6,
    // 5e-6), tighter than the 1e-5 / 1e-4 allowed there. AGS 1987 quote m = 0.967
    // (recalled from memory, [M]).
    const { alphaC, yC, overlapAtCritical } = rsCriticalLoad()
    expect(Math.abs(alphaC - 0.137906)).toBeLessThanOrEqual(5e-7)
    expect(Math.abs(yC - 1.51122)).toBeLessThanOrEqual(5e-6)
    expect(Math.abs(overlapAtCritical - 0.96742)).toBeLessThanOrEqual(5e-6)
    // Wrong-bit fraction at α_c, (1 − m)/2 = 0.01629 (CHECK_VALUES §2 [C]).
    expect(Math.abs((1 - overlapAtCritical) / 2 - 0.01629)).toBeLessThanOrEqual(5e-6)
  })

  it('agrees with the SciPy fixture (maximum found by a different method)', () => {
    // scripts/fixtures/theory/generate.py locates y_c with a numerical derivative and
    // Brent's method; α_c is quadratic in the y_c error. Tolerances 1e-12 / 1e-8.
    const got = rsCriticalLoad()
    expect(Math.abs(got.alphaC - reference.rsCriticalLoad.alphaC)).toBeLessThan(1e-12)
    expect(Math.abs(got.yC - reference.rsCriticalLoad.yC)).toBeLessThan(1e-8)
  })
})

describe('rsRetrievalOverlap', () => {
  it('reproduces the m(α) table', () => {
    // CHECK_VALUES §2 [C]: reproducible to 1e-6; tolerance 1e-6.
    const table: Array<[number, number]> = [
      [0.04, 0.9999994], [0.05, 0.9999922], [0.06, 0.9999548], [0.07, 0.9998366], [0.08, 0.9995574],
      [0.09, 0.9990020], [0.10, 0.9979993], [0.11, 0.9962644], [0.12, 0.9932227], [0.13, 0.9872119],
      [0.135, 0.9807913], [0.137, 0.9754441], [0.1379, 0.968101]
    ]
    for (const [alpha, m] of table) expect(Math.abs(rsRetrievalOverlap(alpha) - m)).toBeLessThanOrEqual(1e-6)
  })

  it('agrees with the SciPy fixture on a wider grid, including the region past α_c', () => {
    // Brent's method in SciPy against our bisection; tolerance 1e-9.
    const { alpha, expected } = reference.rsRetrievalOverlap
    alpha.forEach((a, i) => expect(Math.abs(rsRetrievalOverlap(a) - (expected[i] as number))).toBeLessThan(1e-9))
  })

  it('falls from 1 to m(α_c) and then to 0: no retrieval branch above α_c', () => {
    const { alphaC, overlapAtCritical } = rsCriticalLoad()
    expect(rsRetrievalOverlap(0)).toBe(1)
    expect(rsRetrievalOverlap(1e-9)).toBe(1)
    expect(rsRetrievalOverlap(alphaC)).toBe(overlapAtCritical)
    expect(rsRetrievalOverlap(alphaC * (1 + 1e-12))).toBe(0)
    expect(rsRetrievalOverlap(1)).toBe(0)
    let previous = 1
    for (let a = 0.005; a < alphaC; a += 0.005) {
      const m = rsRetrievalOverlap(a)
      expect(m).toBeLessThanOrEqual(previous)
      previous = m
    }
  })

  it('rejects negative loads', () => {
    expect(() => rsRetrievalOverlap(-0.01)).toThrow(/alpha/)
  })
})
