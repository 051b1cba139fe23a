import { describe, it, expect } from 'vitest'
import { meanWithError } from '../../../src/engine/stats/index.js'

// Sample mean and n − 1 standard deviation are textbook definitions (common practice);
// expected values below are worked by hand in the comments.
describe('meanWithError', () => {
  it('gives the sample mean, the n − 1 sd and sd/√n', () => {
    // 2, 4, 4, 4, 5, 5, 7, 9: mean 40/8 = 5; squared deviations sum to 32;
    // sd = √(32/7) = 2.13809; se = sd/√8 = 0.75593. Tolerance 1e-12 (double rounding).
    const r = meanWithError([2, 4, 4, 4, 5, 5, 7, 9])
    expect(r.mean).toBe(5)
    expect(Math.abs(r.sd - Math.sqrt(32 / 7))).toBeLessThan(1e-12)
    expect(Math.abs(r.se - Math.sqrt(32 / 7) / Math.sqrt(8))).toBeLessThan(1e-12)
  })

  it('stays accurate when the spread is tiny next to the mean (overlaps near 1)', () => {
    // 1 − 1e-9, 1, 1 + 1e-9: sd is exactly 1e-9 in real arithmetic. The one-pass
    // Σx² − n·mean² formula loses every digit here; tolerance 1e-6 relative.
    const r = meanWithError([1 - 1e-9, 1, 1 + 1e-9])
    expect(Math.abs(r.sd - 1e-9) / 1e-9).toBeLessThan(1e-6)
  })

  it('accepts typed arrays and sums in index order, reproducibly', () => {
    const values = Float64Array.from({ length: 1000 }, (_, i) => Math.sin(i) * 1e3 + 1e-3 * i)
    const a = meanWithError(values)
    const b = meanWithError(Array.from(values))
    expect(a).toEqual(b)
    let sum = 0
    for (const v of values) sum += v
    expect(a.mean).toBe(sum / values.length)
  })

  it('returns NaN for no values and zero spread for one value', () => {
    expect(meanWithError([])).toEqual({ mean: NaN, sd: NaN, se: NaN })
    expect(meanWithError([0.75])).toEqual({ mean: 0.75, sd: 0, se: 0 })
  })

  it('propagates NaN instead of hiding it', () => {
    expect(Number.isNaN(meanWithError([1, NaN, 2]).mean)).toBe(true)
  })
})
