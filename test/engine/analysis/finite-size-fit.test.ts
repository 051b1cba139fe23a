/** Weighted fits of critical values against N: exact recovery, honest standard errors, the refusals. */
import { describe, expect, it } from 'vitest'
import { fitFiniteSize, type SizedEstimate } from '../../../src/engine/analysis/index.js'
import { Xoshiro256StarStar } from '../../../src/engine/index.js'

const SIZES = [250, 500, 1000, 2000]

function exact (limit: number, amplitude: number, exponent: number, se = 0.001): SizedEstimate[] {
  return SIZES.map((neurons) => ({ neurons, value: limit + amplitude * neurons ** -exponent, se }))
}

/** A standard normal draw (Box–Muller) from the engine's generator. */
function gaussian (rng: Xoshiro256StarStar): number {
  return Math.sqrt(-2 * Math.log(1 - rng.uniform())) * Math.cos(2 * Math.PI * rng.uniform())
}

describe('fitFiniteSize', () => {
  it('recovers the parameters of exact data, with the exponent fixed or fitted', () => {
    const data = exact(0.138, 0.6, 0.5)
    const fixed = fitFiniteSize(data, { form: 'power', exponent: 0.5 })
    expect(fixed.limit.value).toBeCloseTo(0.138, 10)
    expect(fixed.amplitude.value).toBeCloseTo(0.6, 8)
    expect(fixed.exponent).toEqual({ value: 0.5, se: null })
    expect(fixed.chiSquare).toBeCloseTo(0, 10)
    expect(fixed.degreesOfFreedom).toBe(2)
    const fitted = fitFiniteSize(data, { form: 'power', exponent: null })
    expect(fitted.exponent.value).toBeCloseTo(0.5, 5)
    expect(fitted.limit.value).toBeCloseTo(0.138, 6)
    expect(fitted.exponent.se!).toBeGreaterThan(0)
    expect(fitted.degreesOfFreedom).toBe(1)
    const inverse = fitFiniteSize(exact(0.14, 3, 1), { form: 'linear-inverse' })
    expect(inverse.limit.value).toBeCloseTo(0.14, 10)
    expect(inverse.exponent.value).toBe(1)
  })

  it('reports standard errors that match the scatter of repeated noisy fits (and intervals that cover at ~95 %)', () => {
    // Common practice: with correct weights, the SD of the estimates over replicates equals
    // the reported standard error. 400 replicates: the SD is known to about ±3.5 %.
    const rng = Xoshiro256StarStar.fromSeed(99n)
    const limits: number[] = []
    let seSum = 0
    let covered = 0
    for (let r = 0; r < 400; r++) {
      const noisy = exact(0.138, 0.6, 0.5, 0.002).map((p) => ({ ...p, value: p.value + 0.002 * gaussian(rng) }))
      // errorScale is left at 1 by comparing the raw covariance: refit with dof-scaling undone.
      const fit = fitFiniteSize(noisy, { form: 'power', exponent: 0.5 })
      const rawSe = fit.limit.se! / fit.errorScale
      limits.push(fit.limit.value)
      seSum += rawSe
      if (Math.abs(fit.limit.value - 0.138) <= 1.96 * fit.limit.se!) covered++
    }
    const mean = limits.reduce((s, v) => s + v, 0) / limits.length
    const sd = Math.sqrt(limits.reduce((s, v) => s + (v - mean) ** 2, 0) / (limits.length - 1))
    expect(mean).toBeCloseTo(0.138, 3)
    expect(sd / (seSum / limits.length)).toBeGreaterThan(0.9)
    expect(sd / (seSum / limits.length)).toBeLessThan(1.1)
    // The scale factor only ever widens, so coverage is at least nominal (binomial SE 1.1 %).
    expect(covered / limits.length).toBeGreaterThan(0.93)
  })

  it('widens the errors by √(χ²/dof) when the points scatter more than their errors allow', () => {
    const scattered = exact(0.138, 0.6, 0.5, 0.0005).map((p, i) => ({ ...p, value: p.value + (i % 2 === 0 ? 0.003 : -0.003) }))
    const fit = fitFiniteSize(scattered, { form: 'power', exponent: 0.5 })
    expect(fit.chiSquare / fit.degreesOfFreedom).toBeGreaterThan(1)
    expect(fit.errorScale).toBeCloseTo(Math.sqrt(fit.chiSquare / fit.degreesOfFreedom), 12)
  })

  it('refuses too few sizes, repeated sizes and unusable errors', () => {
    const three = exact(0.138, 0.6, 0.5).slice(0, 3)
    expect(() => fitFiniteSize(three, { form: 'power', exponent: null })).toThrow(RangeError)
    expect(() => fitFiniteSize(three.slice(0, 2), { form: 'linear-inverse' })).toThrow(RangeError)
    expect(() => fitFiniteSize([...three, three[0]!], { form: 'power', exponent: 0.5 })).toThrow(/once/)
    expect(() => fitFiniteSize(three.map((p) => ({ ...p, se: 0 })), { form: 'power', exponent: 0.5 })).toThrow(RangeError)
  })
})
