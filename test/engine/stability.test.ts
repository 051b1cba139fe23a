import { describe, it, expect } from 'vitest'
import { createPointRunner } from '../../src/engine/index.js'
import { crosstalkErrorExact } from '../../src/engine/theory/index.js'
import { pointParams } from '../helpers/point.js'

/** Pools the one-step stability of R independent networks (one trial each). */
function pooledInstability (neurons: number, patterns: number, networks: number, selfCoupling: boolean, seed: number): { below: number, tie: number, perNetwork: number[] } {
  const p = pointParams({ neurons, patterns, rule: { kind: 'hebbian', selfCoupling }, measures: { overlapTrajectory: false, energyTrajectory: false, stability: true }, dynamics: { update: 'async-random', temperature: 0, maxSweeps: 1, burnIn: 0 } })
  const runner = createPointRunner(p, seed, 0)
  let below = 0
  let tie = 0
  const perNetwork: number[] = []
  for (let t = 0; t < networks; t++) {
    const s = runner.runTrial(t).stability!
    below += s.unstableFraction
    tie += s.tieFraction
    perNetwork.push(s.unstableFraction)
  }
  return { below: below / networks, tie: tie / networks, perNetwork }
}

describe('one-step stability of stored patterns (Hebbian)', () => {
  it('matches the exact finite-N binomial instability with J_ii = 0', () => {
    // CHECK_VALUES §1 (derived, checked by Monte Carlo): N h_i ξ_i = (N−1) + B with B a sum
    // of (P−1)(N−1) iid ±1 terms, so P[ξh < 0] is exactly binomial: 6.93e-4 at (500, 50).
    // Signal-to-noise picture: Hertz, Krogh & Palmer 1991, ch. 2. Tolerance 4·√(3p(1−p)/n),
    // the factor 3 covering the bit correlations within one network (design effect ≤ 2.6).
    const n = 500
    const count = 50
    const networks = 40
    const exact = crosstalkErrorExact(n, count, { selfCoupling: false })
    expect(exact.below).toBeCloseTo(6.93e-4, 5)
    const sim = pooledInstability(n, count, networks, false, 11)
    const bits = n * count * networks
    const tol = 4 * Math.sqrt(3 * exact.below * (1 - exact.below) / bits)
    expect(Math.abs(sim.below - exact.below)).toBeLessThan(tol)
    // A tie h = 0 needs P(N−1) even: 50·499 is even, so ties occur at the exact rate too.
    const tieTol = 4 * Math.sqrt(3 * exact.tie * (1 - exact.tie) / bits)
    expect(Math.abs(sim.tie - exact.tie)).toBeLessThan(tieTol)
  })

  it('tells J_ii = P/N apart from J_ii = 0', () => {
    // CHECK_VALUES §1: keeping the self-coupling raises the signal to N − 1 + P and lowers the
    // instability (100, 10): 1.12e-4 against 3.99e-4. At (500, 50) we use the exact values
    // from the same binomial formula; same tolerance as above.
    const n = 500
    const count = 50
    const networks = 40
    const kept = crosstalkErrorExact(n, count, { selfCoupling: true })
    const removed = crosstalkErrorExact(n, count, { selfCoupling: false })
    expect(kept.below).toBeLessThan(removed.below / 2)
    const sim = pooledInstability(n, count, networks, true, 12)
    const bits = n * count * networks
    expect(Math.abs(sim.below - kept.below)).toBeLessThan(4 * Math.sqrt(3 * kept.below * (1 - kept.below) / bits))
  })
})
