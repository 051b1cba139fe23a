/**
 * Every theory function is total over its declared domain: no valid input makes it throw,
 * and every grid point gets each value of its model either as a finite number or with a
 * reason code. Property tests (fast-check, fixed seed) over the whole parameter range the
 * spec allows (N and P up to 10⁶), plus the loads that once broke the root bracketing.
 */
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import type { PointParams } from '../../../src/engine/params.js'
import {
  clippedCrosstalkErrorExact, clippedRetrievalOverlap, crosstalkErrorExact, curieWeissOverlap, DILUTED_CRITICAL_LOAD,
  dilutedRetrievalOverlap, firstParallelStep, firstParallelStepExact, isUnavailableReason, rsCriticalLoad,
  rsRetrievalOverlap, theoryForPoint
} from '../../../src/engine/theory/index.js'
import { rsLoadEquation } from '../../../src/engine/theory/rs-load-equation.js'
import { STDLIB_WALK_STEPS, symmetricBinomialCdf, symmetricBinomialPmf } from '../../../src/engine/theory/binomial-walk.js'
import binomialCdf from '@stdlib/stats-base-dists-binomial-cdf'
import binomialPmf from '@stdlib/stats-base-dists-binomial-pmf'

const SEED = { seed: 20261204 }
const MAX = 1_000_000

/** Sizes across the whole range, weighted towards the small and the large. */
const size = fc.oneof(fc.integer({ min: 1, max: 100 }), fc.integer({ min: 100, max: 20_000 }), fc.integer({ min: 20_000, max: MAX }))
/** Loads from vanishing to far above every capacity, as P/N of an admissible (N, P). */
const sizeAndPatterns = fc.tuple(size, fc.oneof(fc.double({ min: 1e-6, max: 0.02, noNaN: true }), fc.double({ min: 0.02, max: 3, noNaN: true })))
  .map(([n, alpha]) => [n, Math.min(MAX, Math.max(1, Math.round(alpha * n)))] as const)
const temperature = fc.oneof(fc.constant(0), fc.double({ min: 1e-6, max: 3, noNaN: true }), fc.double({ min: 0.999, max: 1.001, noNaN: true }))
const overlap = fc.double({ min: -1, max: 1, noNaN: true })

describe('root bracketing at small loads', () => {
  it('solves the replica-symmetric equations at the loads that used to throw (N = 5000 and 10000)', () => {
    // The bracket's upper end y = 1/√(2α) met the equation's right-hand side to the last bit.
    const cases: Array<[number, number]> = [[5000, 7], [5000, 23], [5000, 27], [5000, 28], [5000, 31], [10000, 14], [10000, 17], [10000, 19], [10000, 46]]
    for (const [n, p] of cases) {
      const m = rsRetrievalOverlap(p / n)
      // At α ≤ 0.005 the retrieval state is perfect to double precision: y ≥ 10, erf(y) = 1.
      expect(m).toBe(1)
      expect(clippedRetrievalOverlap(p / n, 0)).toBe(1)
    }
  })

  it('solves them for every P ≤ 300 at N = 5000, 10⁴, 10⁵ and 10⁶, on the retrieval branch', () => {
    const { yC } = rsCriticalLoad()
    for (const n of [5000, 10_000, 100_000, MAX]) {
      for (let p = 1; p <= 300; p++) {
        const alpha = p / n
        const m = rsRetrievalOverlap(alpha)
        expect(m).toBeGreaterThan(0.999)
        expect(m).toBeLessThanOrEqual(1)
      }
    }
    // The root itself: √(2α) = rsLoadEquation(y) with y past y_c (checked where erf(y) < 1 still resolves y).
    expect(rsLoadEquation(yC)).toBeGreaterThan(Math.sqrt(2 * 0.1))
  })
})

describe('the random walk beyond stdlib\'s range', () => {
  it('meets stdlib at the crossover (both accurate there) and stays a probability up to 10¹² steps', () => {
    // Just past 2²⁴ steps stdlib is still accurate to ~1e-10; the Edgeworth expansion's error
    // is O(n⁻²) ≈ 1e-15 there. Tolerance 1e-9 absolute, 1e-7 relative for the PMF.
    const n = STDLIB_WALK_STEPS + 2
    const sd = Math.sqrt(n) / 2
    for (const z of [-8, -3, -1, -0.2, 0, 0.4, 2, 5]) {
      const k = Math.floor(n / 2 + z * sd)
      expect(Math.abs(symmetricBinomialCdf(k, n) - binomialCdf(k, n, 0.5))).toBeLessThan(1e-9)
      expect(Math.abs(symmetricBinomialPmf(k, n) / binomialPmf(k, n, 0.5) - 1)).toBeLessThan(1e-7)
    }
    // Symmetry P[K ≤ k] + P[K ≤ n − k − 1] = 1, and the median of an even walk: ½ + ½ P[K = n/2].
    // (stdlib's CDF gives −0.43 at k = n/2 for n = 3·10¹⁰: the failure that broke the first parallel step.)
    for (const big of [3e10, 1e12]) {
      expect(Math.abs(symmetricBinomialCdf(big / 2, big) - (0.5 + 0.5 * symmetricBinomialPmf(big / 2, big)))).toBeLessThan(1e-13)
      expect(Math.abs(symmetricBinomialCdf(big / 2 - 1000, big) + symmetricBinomialCdf(big / 2 + 999, big) - 1)).toBeLessThan(1e-13)
    }
    // The case fast-check found (kept as an explicit example): N = 786525, P = 42576, m₀ = 0
    // is a walk of 3.3·10¹⁰ steps; the overlap after one step must be a number in [−1, 1].
    for (const ties of ['keep', 'random'] as const) expect(Math.abs(firstParallelStepExact(786525, 42576, 0, { ties }))).toBeLessThan(1e-5)
  })
})

describe('every theory function is total over its domain', () => {
  it('replica-symmetric and clipped retrieval: an overlap in [0, 1] for every admissible load', () => {
    fc.assert(fc.property(sizeAndPatterns, ([n, p]) => {
      for (const m of [rsRetrievalOverlap(p / n), clippedRetrievalOverlap(p / n), clippedRetrievalOverlap(p / n, 0)]) {
        expect(m >= 0 && m <= 1).toBe(true)
      }
    }), { ...SEED, numRuns: 400 })
  })

  it('Curie–Weiss and the diluted fixed point: every temperature and load, including within rounding of T_c and α_c', () => {
    fc.assert(fc.property(temperature, fc.oneof(fc.double({ min: 0, max: 5, noNaN: true }), fc.double({ min: DILUTED_CRITICAL_LOAD * (1 - 1e-9), max: DILUTED_CRITICAL_LOAD * (1 + 1e-9), noNaN: true })), (t, alpha) => {
      const cw = curieWeissOverlap(t)
      expect(cw >= 0 && cw <= 1).toBe(true)
      const diluted = dilutedRetrievalOverlap(alpha)
      expect(diluted >= 0 && diluted <= 1).toBe(true)
    }), { ...SEED, numRuns: 400 })
  })

  it('one-step instabilities and first parallel steps: probabilities and overlaps for N, P up to 10⁶', () => {
    fc.assert(fc.property(sizeAndPatterns, overlap, fc.boolean(), ([n, p], m0, selfCoupling) => {
      const { below, tie } = crosstalkErrorExact(n, p, { selfCoupling })
      expect(below >= 0 && tie >= 0 && below + tie <= 1 + 1e-12).toBe(true)
      for (const ties of ['keep', 'random'] as const) {
        const m1 = firstParallelStepExact(n, p, m0, { selfCoupling, ties })
        expect(Math.abs(m1) <= 1 + 1e-12).toBe(true)
      }
      expect(Math.abs(firstParallelStep(m0, p / n, { selfCoupling })) <= 1).toBe(true)
    }), { ...SEED, numRuns: 300 })
  })

  it('clipped exact instability for N, P up to 10⁶', () => {
    fc.assert(fc.property(sizeAndPatterns, fc.boolean(), ([n, p], selfCoupling) => {
      const { below, tie } = clippedCrosstalkErrorExact(n, p, { selfCoupling })
      expect(below >= 0 && tie >= 0 && below + tie <= 1 + 1e-9).toBe(true)
    }), { ...SEED, numRuns: 60 })
  })
})

/** Any point the spec layer can produce (the patterns of a supplied family are not read by theory). */
export const anyPoint: fc.Arbitrary<PointParams> = fc.record({
  sizes: sizeAndPatterns,
  coding: fc.constantFrom('pm1' as const, 'pm1' as const, 'binary' as const),
  family: fc.oneof(
    fc.constant({ kind: 'random' as const, activity: 0.5 }),
    fc.record({ kind: fc.constant('random' as const), activity: fc.double({ min: 0.01, max: 0.99, noNaN: true }) }),
    fc.record({ kind: fc.constant('correlated' as const), parents: fc.integer({ min: 1, max: 10 }), parentOverlap: fc.double({ min: 0, max: 1, noNaN: true }) })
  ),
  rule: fc.oneof(
    fc.record({ kind: fc.constantFrom('hebbian' as const, 'pseudo-inverse' as const, 'storkey' as const, 'clipped' as const), selfCoupling: fc.boolean() }),
    fc.record({ kind: fc.constant('hebbian' as const), selfCoupling: fc.constant(false) }),
    fc.record({ kind: fc.constant('covariance' as const), selfCoupling: fc.boolean(), threshold: fc.constant(null) }),
    fc.record({ kind: fc.constant('dense-polynomial' as const), degree: fc.integer({ min: 2, max: 30 }) }),
    fc.constant({ kind: 'dense-exponential' as const }),
    fc.record({ kind: fc.constant('modern-softmax' as const), beta: fc.double({ min: 1e-3, max: 1e3, noNaN: true }) })
  ),
  dilution: fc.oneof(
    fc.constant(null),
    fc.record({ keep: fc.oneof(fc.constant(1), fc.double({ min: 0.01, max: 1, noNaN: true })), symmetric: fc.boolean() }),
    fc.record({ kind: fc.constant('fixed-in-degree' as const), inDegree: fc.integer({ min: 1, max: 2000 }) })
  ),
  cue: fc.oneof(
    fc.record({ kind: fc.constant('flip' as const), fraction: fc.double({ min: 0, max: 1, noNaN: true }) }),
    fc.record({ kind: fc.constant('erase' as const), fraction: fc.double({ min: 0, max: 1, noNaN: true }), fill: fc.constantFrom('zero' as const, 'random' as const) }),
    fc.constant({ kind: 'random' as const }),
    fc.record({ kind: fc.constant('mixture' as const), components: fc.integer({ min: 1, max: 15 }) })
  ),
  update: fc.constantFrom('async-random' as const, 'async-sequential' as const, 'sync' as const),
  temperature,
  maxSweeps: fc.integer({ min: 1, max: 100 })
}).map(({ sizes: [neurons, patterns], coding, family, rule, dilution, cue, update, temperature, maxSweeps }) => ({
  neurons,
  patterns,
  coding,
  family,
  rule,
  dilution: dilution !== null && 'inDegree' in dilution ? { ...dilution, inDegree: Math.max(1, Math.min(dilution.inDegree, neurons - 1)) } : dilution,
  cue,
  dynamics: { update, temperature, maxSweeps, burnIn: 0 },
  measures: { overlapTrajectory: false, energyTrajectory: false, stability: false },
  successThreshold: 0.9,
  trialsPerNetwork: 1
}))

describe('theoryForPoint', () => {
  it('gives every value of the model as a finite number or with a reason, and never fails', () => {
    fc.assert(fc.property(anyPoint, (p) => {
      const { values, unavailable } = theoryForPoint(p)
      for (const [name, value] of Object.entries(values)) {
        expect(Number.isFinite(value), name).toBe(true)
        expect(unavailable, name).not.toHaveProperty(name)
      }
      for (const [name, reason] of Object.entries(unavailable)) {
        expect(isUnavailableReason(reason), name).toBe(true)
        // A reason that signals a defect must never occur anywhere in the admissible range.
        expect(['evaluation-failed', 'not-converged'], `${name} at ${JSON.stringify(p)}`).not.toContain(reason)
      }
    }), { ...SEED, numRuns: 400 })
  })
})
