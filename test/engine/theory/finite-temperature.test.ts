import { describe, it, expect } from 'vitest'
import { curieWeissOverlap, spinGlassTemperature } from '../../../src/engine/theory/index.js'
import reference from './fixtures/reference.json' with { type: 'json' }

describe('curieWeissOverlap', () => {
  it('reproduces m = tanh(m/T) at vanishing load with T_c = 1', () => {
    // Amit, Gutfreund & Sompolinsky, PRA 32, 1007 (1985); values CHECK_VALUES §3 [C], printed
    // to 5 digits. Tolerance 1e-5 (CHECK_VALUES allows 1e-4 for embedded constants): the
    // T = 0.7 entry 0.82864 is 0.8286348 rounded up, 5.2e-6 away; the SciPy fixture below
    // checks all digits. These values catch the factor-2 temperature convention (with rate
    // 1/(1 + e^{−h/T}), T_c would be ½).
    const table: Array<[number, number]> = [
      [0.2, 0.99991], [0.3, 0.99741], [0.4, 0.98562], [0.5, 0.95750], [0.6, 0.90733],
      [0.7, 0.82864], [0.8, 0.71041], [0.9, 0.52543], [0.95, 0.37949]
    ]
    for (const [t, m] of table) expect(Math.abs(curieWeissOverlap(t) - m)).toBeLessThanOrEqual(1e-5)
  })

  it('agrees with the SciPy fixture and solves its own equation to rounding', () => {
    const { temperature, expected } = reference.curieWeissOverlap
    temperature.forEach((t, i) => {
      const m = curieWeissOverlap(t)
      expect(Math.abs(m - (expected[i] as number))).toBeLessThan(1e-12)
      if (t > 0 && t < 1) expect(Math.abs(Math.tanh(m / t) - m)).toBeLessThan(1e-15)
    })
  })

  it('vanishes like √(3(1 − T)) at T_c, is 1 at T = 0 and 0 in the paramagnet', () => {
    // Expansion tanh x ≈ x − x³/3 near T_c (elementary). Tolerance 1 % relative at 1 − T = 1e-6.
    const m = curieWeissOverlap(1 - 1e-6)
    expect(Math.abs(m / Math.sqrt(3e-6) - 1)).toBeLessThan(0.01)
    expect(curieWeissOverlap(0)).toBe(1)
    expect(curieWeissOverlap(1)).toBe(0)
    expect(curieWeissOverlap(2)).toBe(0)
    expect(() => curieWeissOverlap(-0.1)).toThrow(/temperature/)
  })
})

describe('spinGlassTemperature', () => {
  it('is where the paramagnet becomes unstable, β²α = (1 − β)²', () => {
    // T_g = 1 + √α: CHECK_VALUES §3, derived from the RS equations [C]; attribution to
    // Amit, Gutfreund & Sompolinsky 1987 recalled from memory [M]. Tolerance 1e-15.
    for (const alpha of [0, 0.01, 0.05, 0.138, 0.5]) {
      const beta = 1 / spinGlassTemperature(alpha)
      expect(Math.abs(beta * beta * alpha - (1 - beta) ** 2)).toBeLessThan(1e-15)
      expect(beta).toBeLessThanOrEqual(1)
    }
    expect(spinGlassTemperature(0.04)).toBe(1.2)
    expect(() => spinGlassTemperature(-1)).toThrow(/alpha/)
  })
})
