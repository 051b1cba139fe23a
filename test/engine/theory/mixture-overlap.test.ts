import { describe, it, expect } from 'vitest'
import { mixtureOverlap } from '../../../src/engine/theory/index.js'
import reference from './fixtures/reference.json' with { type: 'json' }

// Symmetric odd mixtures at T = 0, α → 0: m_n = E|ξ¹ + … + ξⁿ|/n
// (Amit, Gutfreund & Sompolinsky, PRA 32, 1007 (1985); CHECK_VALUES §4 [C]).
describe('mixtureOverlap', () => {
  it('gives 1/2, 3/8, 5/16 and 0.27344 for n = 3, 5, 7, 9', () => {
    // Exact rationals; tolerance 1e-15 (0.27344 is printed to 5 digits: 5e-6).
    expect(mixtureOverlap(1)).toBe(1)
    expect(mixtureOverlap(3)).toBe(0.5)
    expect(Math.abs(mixtureOverlap(5) - 3 / 8)).toBeLessThan(1e-15)
    expect(Math.abs(mixtureOverlap(7) - 5 / 16)).toBeLessThan(1e-15)
    expect(Math.abs(mixtureOverlap(9) - 0.27344)).toBeLessThan(5e-6)
  })

  it('matches direct summation over the binomial (SciPy fixture)', () => {
    const { n, expected } = reference.mixtureOverlap
    n.forEach((k, i) => expect(Math.abs(mixtureOverlap(k) - (expected[i] as number))).toBeLessThan(1e-14))
  })

  it('has energy per neuron −n m²/2 tending to −1/π', () => {
    // CHECK_VALUES §4: E/N = −n m_n²/2 → −1/π = −0.3183 as n → ∞; m_n ≈ √(2/(πn)) with
    // relative correction O(1/n), so at n = 10001 the gap is below 1e-4.
    const n = 10001
    const m = mixtureOverlap(n)
    expect(Math.abs(-n * m * m / 2 + 1 / Math.PI)).toBeLessThan(1e-4)
  })

  it('rejects even or non-positive component counts', () => {
    expect(() => mixtureOverlap(4)).toThrow(/components/)
    expect(() => mixtureOverlap(0)).toThrow(/components/)
    expect(() => mixtureOverlap(2.5)).toThrow(/components/)
  })
})
