import { describe, it, expect } from 'vitest'
import { createPointRunner } from '../../src/engine/index.js'
import { curieWeissOverlap, firstParallelStepExact, rsRetrievalOverlap, mixtureOverlap } from '../../src/engine/theory/index.js'
import { mean, pointParams, sampleSd } from '../helpers/point.js'

function overlaps (runner: ReturnType<typeof createPointRunner>, trials: number): number[] {
  return Array.from({ length: trials }, (_, t) => runner.runTrial(t).overlap)
}

describe('zero-temperature retrieval (Hebbian, asynchronous)', () => {
  it('settles at the replica-symmetric retrieval overlap m(α = 0.10)', () => {
    // Amit, Gutfreund & Sompolinsky, Ann. Phys. 173, 30 (1987): m(0.10) = 0.99800 (CHECK_VALUES §2,
    // computed from the RS equations). Start on the pattern, N = 1000, 24 independent networks.
    // Tolerance 4·sd/√R plus the finite-size allowance 0.005 given for α ≤ 0.12, N ≥ 1000.
    expect(rsRetrievalOverlap(0.1)).toBeCloseTo(0.9979993, 6)
    const runner = createPointRunner(pointParams({ neurons: 1000, patterns: 100 }), 21, 0)
    const m = overlaps(runner, 24)
    const tol = 4 * sampleSd(m) / Math.sqrt(m.length) + 0.005
    expect(Math.abs(mean(m) - rsRetrievalOverlap(0.1))).toBeLessThan(tol)
  })
})

describe('Glauber dynamics at vanishing load', () => {
  it.each([0.4, 0.6, 0.8])('time-averaged overlap follows m = tanh(m/T) at T = %s', (temperature) => {
    // Amit, Gutfreund & Sompolinsky, Phys. Rev. A 32, 1007 (1985): at α → 0 the retrieval overlap
    // solves m = tanh(m/T) with T_c = 1 for P(s=+1) = 1/(1+e^{−2h/T}) (CHECK_VALUES §3:
    // 0.98562 / 0.90733 / 0.71041). N = 1000, P = 1, 30 burn-in + 120 sampled sweeps, 4 runs.
    // Tolerance ±0.02, as CHECK_VALUES gives for N ≥ 1000 and T ≤ 0.8. A factor-2 error in the
    // temperature convention would move T = 0.6 to m(0.3) = 0.997 or m(1.2) = 0: both fail.
    const p = pointParams({ neurons: 1000, patterns: 1, dynamics: { update: 'async-random', temperature, maxSweeps: 150, burnIn: 30 } })
    const runner = createPointRunner(p, 31, 0)
    const m = mean(overlaps(runner, 4))
    expect(Math.abs(m - curieWeissOverlap(temperature))).toBeLessThan(0.02)
  })
})

describe('first parallel step', () => {
  it('matches the exact finite-N expectation of m₁ from m₀ = 0.6 at α = 0.1', () => {
    // Signal-to-noise argument behind m₁ = erf(m₀/√(2α)) (Gardner, Derrida & Mottishaw,
    // J. Physique 48, 741 (1987) [recalled from memory]); CHECK_VALUES §5a gives the exact
    // finite-N expectation 0.94334 at (N, P, m₀) = (1000, 100, 0.6). Tolerance 4 SE over runs.
    const p = pointParams({ neurons: 1000, patterns: 100, cue: { kind: 'flip', fraction: 0.2 }, dynamics: { update: 'sync', temperature: 0, maxSweeps: 1, burnIn: 0 } })
    const runner = createPointRunner(p, 41, 0)
    const m = overlaps(runner, 60)
    const expected = firstParallelStepExact(1000, 100, 0.6)
    expect(expected).toBeCloseTo(0.94334, 4)
    expect(Math.abs(mean(m) - expected)).toBeLessThan(4 * sampleSd(m) / Math.sqrt(m.length))
  })
})

describe('spurious mixture states', () => {
  it('the symmetric 3-mixture is a fixed point with overlap ½ on each component', () => {
    // Amit, Gutfreund & Sompolinsky, Phys. Rev. A 32, 1007 (1985); CHECK_VALUES §4: at low load
    // sign(ξ¹+ξ²+ξ³) is a fixed point with m = ½ on each pattern. N = 3000, P = 3.
    // Tolerance 4·√(0.75/N) per overlap (binomial spread of a finite sample).
    const n = 3000
    const p = pointParams({ neurons: n, patterns: 3, cue: { kind: 'mixture', components: 3 } })
    const runner = createPointRunner(p, 51, 0)
    const r = runner.runTrial(0)
    expect(r.ending).toBe('fixed')
    expect(r.sweeps).toBe(1)
    expect(r.endState).toBe('symmetricMixture')
    expect(mixtureOverlap(3)).toBe(0.5)
    const tol = 4 * Math.sqrt(0.75 / n)
    expect(Math.abs(r.overlap - 0.5)).toBeLessThan(tol)
    expect(Math.abs(r.maxOtherOverlap - 0.5)).toBeLessThan(tol)
    expect(r.componentOverlaps).toHaveLength(3)
    for (const m of r.componentOverlaps!) expect(Math.abs(m - 0.5)).toBeLessThan(tol)
  })
})
