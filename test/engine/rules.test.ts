import { describe, it, expect } from 'vitest'
import { buildNetwork, createPointRunner, Xoshiro256StarStar } from '../../src/engine/index.js'
import { pointParams } from '../helpers/point.js'

describe('pseudo-inverse (projection) rule', () => {
  it('makes every stored pattern an exact fixed point with ξ_i h_i = 1 when the diagonal is kept', () => {
    // Personnaz, Guyon & Dreyfus, J. Physique Lett. 46, L359 (1985) [citation recalled from
    // memory]; CHECK_VALUES §10: J = (1/N) Ξᵀ C⁻¹ Ξ projects onto the pattern span, so ξ_i h_i = 1
    // exactly for every i and μ. N = 200, P = 150 (α = 0.75, far beyond the Hebbian capacity).
    // Tolerance 1e-9 (deterministic identity up to rounding).
    const n = 200
    const count = 150
    const net = buildNetwork(pointParams({ neurons: n, patterns: count, rule: { kind: 'pseudo-inverse', selfCoupling: true } }), Xoshiro256StarStar.fromSeed(3n))
    let worst = 0
    const state = new Int8Array(n)
    for (let mu = 0; mu < count; mu++) {
      for (let i = 0; i < n; i++) state[i] = net.patterns[mu * n + i]!
      net.load(state)
      for (let i = 0; i < n; i++) worst = Math.max(worst, Math.abs(state[i]! * net.field(i) * net.fieldScale - 1))
    }
    expect(worst).toBeLessThan(1e-9)
  })

  it('keeps the patterns fixed points with the diagonal removed (ξ_i h_i = 1 − J_ii ≥ 0)', () => {
    // Kanter & Sompolinsky, Phys. Rev. A 35, 380 (1987); CHECK_VALUES §10: removing J_ii leaves
    // ξ_i h_i = 1 − J_ii ∈ [0, 1] and the mean of J_ii is exactly α. We check that no stored bit
    // is unstable at α = 0.75 while the Hebbian rule at the same load loses most patterns.
    const measures = { overlapTrajectory: false, energyTrajectory: false, stability: true }
    const pinv = createPointRunner(pointParams({ neurons: 200, patterns: 150, rule: { kind: 'pseudo-inverse', selfCoupling: false }, measures }), 4, 0).runTrial(0).stability!
    expect(pinv.unstableFraction).toBe(0)
    expect(pinv.fixedPatternFraction).toBe(1)
    const hebb = createPointRunner(pointParams({ neurons: 200, patterns: 150, measures }), 4, 0).runTrial(0).stability!
    expect(hebb.fixedPatternFraction).toBeLessThan(0.05)
  })
})

describe('Storkey rule', () => {
  it('stores far more patterns than the Hebbian rule near N/√(2 ln N)', () => {
    // Storkey, ICANN'97, LNCS 1327, 451 (1997): capacity N/√(2 ln N) = 33 at N = 100 (abstract).
    // CHECK_VALUES §6 gives a Monte-Carlo regression reference (not a published number): at
    // N = 100, P = 33 the fraction of exactly stable patterns is 0.968 for Storkey against 0.028
    // for Hebb. 12 networks → 396 patterns; thresholds leave > 4 binomial SE of room.
    const measures = { overlapTrajectory: false, energyTrajectory: false, stability: true }
    const fraction = (rule: 'storkey' | 'hebbian'): number => {
      const runner = createPointRunner(pointParams({ neurons: 100, patterns: 33, rule: { kind: rule, selfCoupling: false }, measures }), 8, 0)
      let s = 0
      for (let t = 0; t < 12; t++) s += runner.runTrial(t).stability!.fixedPatternFraction
      return s / 12
    }
    const storkey = fraction('storkey')
    const hebb = fraction('hebbian')
    expect(storkey).toBeGreaterThan(0.968 - 4 * Math.sqrt(0.968 * 0.032 / 396))
    expect(hebb).toBeLessThan(0.028 + 4 * Math.sqrt(0.028 * 0.972 / 396) + 0.02)
  })
})

describe('covariance rule for sparse patterns', () => {
  it('recalls biased patterns that the plain Hebbian rule cannot hold', () => {
    // Tsodyks & Feigel'man, Europhys. Lett. 6, 101 (1988): subtracting the mean activity lets
    // sparse patterns be stored, while plain Hebbian crosstalk carries the mean activity and
    // drowns the signal. At a = 0.1, α = 0.1 with 0/1 neurons and the midway threshold the
    // covariance rule retrieves from every pattern; the Hebbian rule on the same patterns does
    // not (qualitative check, common practice; no published number used).
    const family = { kind: 'random' as const, activity: 0.1 }
    const base = { neurons: 600, patterns: 60, family, coding: 'binary' as const, successThreshold: 0.9 }
    const cov = createPointRunner(pointParams({ ...base, rule: { kind: 'covariance', selfCoupling: false, threshold: null } }), 9, 0)
    const hebb = createPointRunner(pointParams({ ...base }), 9, 0)
    const covOverlap = [0, 1, 2, 3].map((t) => cov.runTrial(t).overlap)
    const hebbOverlap = [0, 1, 2, 3].map((t) => hebb.runTrial(t).overlap)
    expect(Math.min(...covOverlap)).toBeGreaterThan(0.9)
    expect(Math.max(...hebbOverlap)).toBeLessThan(0.9)
  })
})

describe('dilution', () => {
  it('keeps the requested fraction of couplings, symmetric when asked', () => {
    // Random dilution (common practice): each off-diagonal pair kept with probability c.
    const n = 300
    const p = pointParams({ neurons: n, patterns: 5, dilution: { keep: 0.3, symmetric: true } })
    const net = buildNetwork(p, Xoshiro256StarStar.fromSeed(10n))
    // Read couplings through fields: load unit vectors e_j and read h_i = J_ij.
    const state = new Int8Array(n)
    let kept = 0
    let asymmetric = 0
    const col = (j: number): Float64Array => { state.fill(0); state[j] = 1; net.load(state); return Float64Array.from({ length: n }, (_, i) => net.field(i)) }
    const cols = Array.from({ length: 40 }, (_, j) => col(j))
    for (let i = 0; i < 40; i++) for (let j = 0; j < 40; j++) if (i !== j) { if (cols[j]![i] !== 0) kept++; if ((cols[j]![i] !== 0) !== (cols[i]![j] !== 0)) asymmetric++ }
    const pairs = 40 * 39
    expect(asymmetric).toBe(0)
    // With P = 5 a kept Hebbian coupling can be exactly 0 (sum of 5 odd terms is odd: never), so kept = nonzero.
    expect(Math.abs(kept / pairs - 0.3)).toBeLessThan(5 * Math.sqrt(0.3 * 0.7 / (pairs / 2)))
  })
})
