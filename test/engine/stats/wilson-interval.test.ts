import { describe, it, expect } from 'vitest'
import { wilsonInterval } from '../../../src/engine/stats/index.js'
import { EngineInputError } from '../../../src/engine/errors.js'

// Wilson, "Probable inference, the law of succession, and statistical inference",
// JASA 22, 209–212 (1927): the score interval
//   (p̂ + z²/2n ± z √(p̂(1−p̂)/n + z²/4n²)) / (1 + z²/n).
describe('wilsonInterval', () => {
  it('matches Wilson\'s formula worked by hand for 8 successes in 10 (95 %)', () => {
    // z = 1.959964, z²/n = 0.3841459, 1 + z²/n = 1.3841459
    // centre = (0.8 + 0.1920729) / 1.3841459 = 0.7167402
    // half   = (1.959964 / 1.3841459) · √(0.016 + 0.0096036) = 1.4160097 · 0.1600114 = 0.2265777
    // interval = [0.4901625, 0.9433178]. Tolerance 1e-6 (the hand working carries 7 digits).
    const { low, high } = wilsonInterval(8, 10)
    expect(Math.abs(low - 0.4901625)).toBeLessThan(1e-6)
    expect(Math.abs(high - 0.9433178)).toBeLessThan(1e-6)
  })

  it('uses the requested confidence', () => {
    // 90 %: z = 1.6448536; same working gives [0.5407928, 0.9314420]. Tolerance 1e-6.
    const { low, high } = wilsonInterval(8, 10, 0.9)
    expect(Math.abs(low - 0.5407928)).toBeLessThan(1e-6)
    expect(Math.abs(high - 0.9314420)).toBeLessThan(1e-6)
  })

  it('keeps a non-zero width at 0/n and n/n, with the bound at exactly 0 or 1', () => {
    // At k = 0 the upper end is (z²/n)/(1 + z²/n): n = 20 gives 0.1921 / 1.1921 = 0.1611252.
    const none = wilsonInterval(0, 20)
    expect(none.low).toBe(0)
    expect(Math.abs(none.high - 0.1611252)).toBeLessThan(1e-6)
    // k = n mirrors k = 0.
    const all = wilsonInterval(20, 20)
    expect(all.high).toBe(1)
    expect(Math.abs(all.low - (1 - 0.1611252))).toBeLessThan(1e-6)
  })

  it('is symmetric under k → n − k, and at p̂ = ½ has width z/√(n + z²)', () => {
    const a = wilsonInterval(3, 17)
    const b = wilsonInterval(14, 17)
    expect(Math.abs(a.low - (1 - b.high))).toBeLessThan(1e-15)
    // At p̂ = ½ the half-width z/(1 + z²/n)·√(1/4n + z²/4n²) simplifies by hand to
    // ½·z/√(n + z²). Tolerance 1e-12 (rounding only).
    const z = 1.959963984540054
    for (const n of [2, 100, 10000]) {
      const { low, high } = wilsonInterval(n / 2, n)
      expect(Math.abs((high - low) - z / Math.sqrt(n + z * z))).toBeLessThan(1e-12)
      expect(Math.abs((high + low) / 2 - 0.5)).toBeLessThan(1e-15)
    }
  })

  it('returns [0, 1] for no trials', () => {
    expect(wilsonInterval(0, 0)).toEqual({ low: 0, high: 1 })
  })

  it('rejects impossible counts and confidences, naming the argument', () => {
    expect(() => wilsonInterval(11, 10)).toThrow(EngineInputError)
    expect(() => wilsonInterval(1.5, 10)).toThrow(/successes/)
    expect(() => wilsonInterval(1, -1)).toThrow(/\bn\b/)
    expect(() => wilsonInterval(1, 10, 1)).toThrow(/confidence/)
  })
})
