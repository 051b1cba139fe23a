import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { expandAxis, MAX_AXIS_VALUES, type NumericDomain } from '../../src/spec/axis.js'

const real: NumericDomain = { integer: false, min: 0 }
const count: NumericDomain = { integer: true, min: 1 }

function values (axis: Parameters<typeof expandAxis>[0], domain = real): number[] {
  const result = expandAxis(axis, domain)
  if ('problem' in result) throw new Error(result.problem)
  return result.values
}

function problem (axis: Parameters<typeof expandAxis>[0], domain = real): string {
  const result = expandAxis(axis, domain)
  if (!('problem' in result)) throw new Error(`expected a problem, got ${JSON.stringify(result.values)}`)
  return result.problem
}

describe('step axes', () => {
  it('gives the twelve decimals of 0.02 … 0.24 step 0.02 exactly as written', () => {
    expect(values({ from: 0.02, to: 0.24, step: 0.02 })).toEqual(
      [0.02, 0.04, 0.06, 0.08, 0.1, 0.12, 0.14, 0.16, 0.18, 0.2, 0.22, 0.24])
  })

  it('runs downwards when to < from and stops before overshooting', () => {
    expect(values({ from: 0.5, to: 0.1, step: 0.1 })).toEqual([0.5, 0.4, 0.3, 0.2, 0.1])
    expect(values({ from: 0, to: 1, step: 0.3 })).toEqual([0, 0.3, 0.6, 0.9])
  })

  it('gives a single value when from = to', () => {
    expect(values({ from: 0.3, to: 0.3, step: 0.1 })).toEqual([0.3])
  })

  it('needs whole steps for integer parameters', () => {
    expect(values({ from: 100, to: 400, step: 100 }, count)).toEqual([100, 200, 300, 400])
    expect(problem({ from: 100, to: 400, step: 2.5 }, count)).toMatch(/whole number/)
  })

  it('refuses an axis longer than the ceiling before generating it', () => {
    // 1e18 values would not fit in memory: the refusal proves the length is checked first.
    expect(problem({ from: 0, to: 1e12, step: 1e-6 })).toMatch(/at most 10000/)
    expect(values({ from: 1, to: MAX_AXIS_VALUES, step: 1 }, count)).toHaveLength(MAX_AXIS_VALUES)
  })

  it('lands exactly on zero where a range crosses it (kept from a property-test failure)', () => {
    expect(values({ from: -0.3, to: 0.3, step: 0.1 }, { integer: false })).toEqual([-0.3, -0.2, -0.1, 0, 0.1, 0.2, 0.3])
    expect(values({ from: 0.3, to: -0.3, step: 0.1 }, { integer: false })).toEqual([0.3, 0.2, 0.1, 0, -0.1, -0.2, -0.3])
    expect(values({ from: -0.7, to: 0.7, count: 15 }, { integer: false })).toContain(0)
    expect(values({ from: -1e-7, to: 1e-7, step: 5e-8 }, { integer: false })).toEqual([-1e-7, -5e-8, 0, 5e-8, 1e-7])
  })

  // Property: k steps of a decimal step from a decimal start give the decimals themselves.
  it('generates the decimal values whatever the (from, step, k)', () => {
    fc.assert(fc.property(
      fc.integer({ min: -5000, max: 5000 }), fc.integer({ min: 1, max: 999 }), fc.integer({ min: 0, max: 60 }), fc.integer({ min: 1, max: 4 }),
      (fromUnits, stepUnits, k, decimals) => {
        const scale = 10 ** decimals
        const from = fromUnits / scale
        const step = stepUnits / scale
        const to = (fromUnits + k * stepUnits) / scale
        const expected = Array.from({ length: k + 1 }, (_, i) => (fromUnits + i * stepUnits) / scale)
        expect(values({ from, to, step }, { integer: false })).toEqual(expected.map((v) => (v === 0 ? 0 : v)))
      }))
  })
})

describe('count axes', () => {
  it('spaces values linearly by default, ends included', () => {
    expect(values({ from: 0, to: 1, count: 5 })).toEqual([0, 0.25, 0.5, 0.75, 1])
    expect(values({ from: 0, to: 0.3, count: 4 })).toEqual([0, 0.1, 0.2, 0.3])
  })

  it('spaces values evenly in log scale and rounds to 12 significant digits', () => {
    expect(values({ from: 100, to: 1600, count: 5, scale: 'log' }, count)).toEqual([100, 200, 400, 800, 1600])
    expect(values({ from: 0.001, to: 1, count: 4, scale: 'log' })).toEqual([0.001, 0.01, 0.1, 1])
  })

  it('rounds integer parameters and refuses the duplicates rounding makes', () => {
    expect(values({ from: 10, to: 20, count: 4 }, count)).toEqual([10, 13, 17, 20])
    expect(problem({ from: 1, to: 3, count: 5 }, count)).toMatch(/more than once after rounding/)
  })

  it('checks the form of the axis', () => {
    expect(problem({ from: 1, to: 2, count: 1 })).toMatch(/count' of 1 needs/)
    expect(problem({ from: 0, to: 2, count: 3, scale: 'log' })).toMatch(/positive/)
    expect(problem({ from: 0, to: 1, step: 0.5, scale: 'log' })).toMatch(/'scale' applies to 'count' axes only/)
    expect(problem({ from: 0, to: 1 })).toMatch(/exactly one of 'step' or 'count'/)
    expect(problem({ from: 0, to: 1, step: 0.5, count: 3 })).toMatch(/exactly one of 'step' or 'count'/)
    expect(problem({ to: 1, step: 0.5 })).toMatch(/'from' and 'to'/)
    expect(problem({ values: [1, 2], from: 0 })).toMatch(/takes no 'from'/)
  })
})

describe('listed values', () => {
  it('keeps the given order and refuses repeats', () => {
    expect(values({ values: [0.3, 0.1, 0.2] })).toEqual([0.3, 0.1, 0.2])
    expect(problem({ values: [0.1, 0.2, 0.1] })).toMatch(/distinct; 0.1 appears more than once/)
  })

  it('checks every value against the parameter domain', () => {
    expect(problem({ values: [0.5, 1] }, { integer: false, min: 0, max: 1, maxExclusive: true })).toMatch(/1 is above the allowed range \(0 ≤ number < 1\)/)
  })
})
