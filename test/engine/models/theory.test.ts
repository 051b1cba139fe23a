import { describe, it, expect } from 'vitest'
import { estimatePointCost, theoryForPoint } from '../../../src/engine/index.js'
import {
  clippedCrosstalkErrorExact, clippedRetrievalOverlap, crosstalkErrorGaussian, denseCapacity, denseCrosstalkErrorGaussian,
  DILUTED_CRITICAL_LOAD, dilutedOverlapMap, dilutedRetrievalOverlap, exponentialCapacityExponent, firstParallelStep,
  oddDoubleFactorial, rsRetrievalOverlap, softmaxErrorBound
} from '../../../src/engine/theory/index.js'
import { bisect } from '../../../src/engine/theory/bisect.js'
import { pointParams } from '../../helpers/point.js'

/** Exact law of the clipped one-step sum by direct convolution of the three-point term distribution (an independent route). */
function clippedByConvolution (n: number, p: number, self: number): { below: number, tie: number } {
  // Z = sum of P − 1 fair ±1: its distribution by repeated convolution.
  let z = new Map<number, number>([[0, 1]])
  for (let k = 0; k < p - 1; k++) {
    const next = new Map<number, number>()
    for (const [v, w] of z) {
      next.set(v + 1, (next.get(v + 1) ?? 0) + w / 2)
      next.set(v - 1, (next.get(v - 1) ?? 0) + w / 2)
    }
    z = next
  }
  const term = new Map<number, number>()
  for (const [v, w] of z) term.set(Math.sign(1 + v), (term.get(Math.sign(1 + v)) ?? 0) + w)
  let s = new Map<number, number>([[self, 1]])
  for (let j = 0; j < n - 1; j++) {
    const next = new Map<number, number>()
    for (const [v, w] of s) for (const [t, q] of term) next.set(v + t, (next.get(v + t) ?? 0) + w * q)
    s = next
  }
  let below = 0
  for (const [v, w] of s) if (v < 0) below += w
  return { below, tie: s.get(0) ?? 0 }
}

describe('theory of the model families', () => {
  it('clipped one-step law: the conditioning formula agrees with a direct convolution', () => {
    // Derivation in theory/clipped-crosstalk.ts; both routes must agree to rounding (1e-12).
    for (const [n, p, selfCoupling] of [[12, 3, false], [15, 4, false], [30, 6, false], [31, 7, true], [40, 8, true], [25, 1, false]] as const) {
      const direct = clippedByConvolution(n, p, selfCoupling ? 1 : 0)
      const formula = clippedCrosstalkErrorExact(n, p, { selfCoupling })
      expect(formula.below).toBeCloseTo(direct.below, 12)
      expect(formula.tie).toBeCloseTo(direct.tie, 12)
    }
  })

  it('clipped retrieval equations without static noise are the AGS equations', () => {
    // Amit, Gutfreund & Sompolinsky 1987 (CHECK_VALUES §2): the s = 0 case must give m(α) of the
    // Hebbian network; the clipped overlap lies below it at every load.
    for (const alpha of [0.02, 0.05, 0.1, 0.12, 0.135]) {
      expect(clippedRetrievalOverlap(alpha, 0)).toBeCloseTo(rsRetrievalOverlap(alpha), 9)
      if (alpha < 0.1) expect(clippedRetrievalOverlap(alpha)).toBeLessThan(rsRetrievalOverlap(alpha))
    }
    expect(clippedRetrievalOverlap(0.11)).toBe(0)
  })

  it('dense memory: n = 2 is the Hebbian formula; the generalised capacity table', () => {
    // CHECK_VALUES §6 [D][C]: K_max/N^{n−1} at P_err = 0.001 is 0.1047 / 0.0349 / 0.00698 for
    // n = 2 / 3 / 4, i.e. the Hebbian 0.1047 divided by (2n − 3)!!.
    expect(denseCrosstalkErrorGaussian(500, 50, 2)).toBeCloseTo(crosstalkErrorGaussian(0.1), 15)
    expect([2, 3, 4, 5].map(oddDoubleFactorial)).toEqual([1, 3, 15, 105])
    const n = 1000
    for (const [degree, ratio] of [[2, 0.1047], [3, 0.0349], [4, 0.00698]] as const) {
      const k = Math.exp(bisect((logK) => denseCrosstalkErrorGaussian(n, Math.max(1, Math.round(Math.exp(logK))), degree) - 0.001, 0, 40))
      expect(Math.abs(k / n ** (degree - 1) / ratio - 1)).toBeLessThan(0.01)
    }
    // K_max = N^{n−1}/(2(2n−3)!! ln N): n = 2 gives McEliece et al.'s N/(2 ln N).
    expect(denseCapacity(1000, 2)).toBeCloseTo(1000 / (2 * Math.log(1000)), 12)
  })

  it('exponential capacity bound I(1 − 2ρ)/2 at the CHECK_VALUES points', () => {
    // Demircigil et al. 2017 (bound recalled from memory, CHECK_VALUES §6): 0.3466 / 0.184 / 0.0964.
    expect(exponentialCapacityExponent(0)).toBeCloseTo(0.3466, 4)
    expect(exponentialCapacityExponent(0.1)).toBeCloseTo(0.184, 3)
    expect(exponentialCapacityExponent(0.2)).toBeCloseTo(0.0964, 4)
    expect(exponentialCapacityExponent(0.5)).toBe(0)
    expect(() => exponentialCapacityExponent(0.6)).toThrow(/rho/)
  })

  it('diluted overlap map: same form as the first parallel step, fixed point vanishing at 2/π', () => {
    // DGZ 1987 (recalled from memory): m ↦ erf(m/√(2α)), the Gardner–Derrida–Mottishaw first
    // step (CHECK_VALUES §5a) holding at every step; m* → 0 continuously as α → 2/π.
    expect(dilutedOverlapMap(0.6, 0.1)).toBeCloseTo(firstParallelStep(0.6, 0.1), 15)
    expect(dilutedOverlapMap(0.6, 0.1)).toBeCloseTo(0.9422, 4)
    for (const alpha of [0.1, 0.3, 0.5, 0.6]) {
      const m = dilutedRetrievalOverlap(alpha)
      expect(dilutedOverlapMap(m, alpha)).toBeCloseTo(m, 12)
    }
    expect(dilutedRetrievalOverlap(DILUTED_CRITICAL_LOAD * 0.999)).toBeLessThan(0.1)
    expect(dilutedRetrievalOverlap(DILUTED_CRITICAL_LOAD)).toBe(0)
  })

  it('softmax bound is capped at 2M', () => {
    expect(softmaxErrorBound(-1, 10, 5)).toBe(2)
    expect(softmaxErrorBound(1, 10, 5, 3)).toBeCloseTo(6 * 9 * Math.exp(-5), 15)
  })

  it('per-point theory values name the family they belong to', () => {
    const keys = (over: Parameters<typeof pointParams>[0]) => Object.keys(theoryForPoint(pointParams(over)).values).sort()
    expect(keys({ rule: { kind: 'clipped', selfCoupling: false } })).toEqual(['clippedCriticalLoad', 'clippedCrosstalkErrorExact', 'clippedCrosstalkErrorGaussian', 'clippedCrosstalkTieExact', 'clippedRetrievalOverlap', 'loadAlpha'])
    expect(keys({ rule: { kind: 'dense-polynomial', degree: 3 } })).toEqual(['denseCapacity', 'denseCrosstalkErrorGaussian'])
    expect(keys({ rule: { kind: 'dense-exponential' } })).toEqual(['exponentialCapacityExponent', 'exponentialLoad'])
    expect(keys({ rule: { kind: 'modern-softmax', beta: 4 } })).toEqual(['softmaxSeparationThreshold'])
    expect(keys({ dilution: { kind: 'fixed-in-degree', inDegree: 20 }, dynamics: { update: 'sync', temperature: 0, maxSweeps: 5, burnIn: 0 }, cue: { kind: 'flip', fraction: 0.2 } }))
      .toEqual(['dilutedCriticalLoad', 'dilutedFirstStepOverlap', 'dilutedFirstStepOverlapExactTiesKeep', 'dilutedFirstStepOverlapExactTiesRandom', 'dilutedLoad', 'dilutedRetrievalOverlap'])
    expect(theoryForPoint(pointParams({ dilution: { kind: 'fixed-in-degree', inDegree: 20 } })).values.dilutedLoad).toBe(10 / 20)
    expect(keys({ rule: { kind: 'dense-polynomial', degree: 3 }, family: { kind: 'random', activity: 0.3 } })).toEqual([])
    // Biased patterns are outside every value's domain: each is listed with its reason.
    expect(theoryForPoint(pointParams({ rule: { kind: 'dense-polynomial', degree: 3 }, family: { kind: 'random', activity: 0.3 } })).unavailable)
      .toEqual({ denseCapacity: 'model-outside-domain', denseCrosstalkErrorGaussian: 'model-outside-domain' })
  })

  it('cost model: the new representations hold O(N·P) or O(N·K), not N² words', () => {
    const dense = estimatePointCost(pointParams({ neurons: 20000, patterns: 50, rule: { kind: 'clipped', selfCoupling: false } }))
    const sparse = estimatePointCost(pointParams({ neurons: 20000, patterns: 50, dilution: { kind: 'fixed-in-degree', inDegree: 50 } }))
    const memory = estimatePointCost(pointParams({ neurons: 20000, patterns: 50, rule: { kind: 'dense-polynomial', degree: 3 } }))
    const softmax = estimatePointCost(pointParams({ neurons: 20000, patterns: 50, rule: { kind: 'modern-softmax', beta: 2 } }))
    expect(dense.bytes).toBeGreaterThan(8 * 20000 * 20000)
    for (const cost of [sparse, memory, softmax]) {
      expect(cost.bytes).toBeLessThan(100 * 20000 * 50)
      expect(cost.opsPerVisit).toBeGreaterThan(0)
      expect(Number.isFinite(cost.buildOpsPerNetwork)).toBe(true)
    }
  })
})
