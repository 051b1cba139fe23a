import { describe, it, expect } from 'vitest'
import type { PointParams } from '../../../src/engine/params.js'
import {
  crosstalkErrorExact, curieWeissOverlap, firstParallelStepExact, rsCriticalLoad, rsRetrievalOverlap, theoryForPoint
} from '../../../src/engine/theory/index.js'

/** A Hebbian point: N = 1000, P = 100, unbiased random patterns, async T = 0, 10 % flip cue. */
function point (changes: Partial<PointParams> = {}): PointParams {
  return {
    neurons: 1000,
    patterns: 100,
    coding: 'pm1',
    family: { kind: 'random', activity: 0.5 },
    rule: { kind: 'hebbian', selfCoupling: false },
    dilution: null,
    cue: { kind: 'flip', fraction: 0.1 },
    dynamics: { update: 'async-random', temperature: 0, maxSweeps: 50, burnIn: 0 },
    measures: { overlapTrajectory: false, energyTrajectory: false, stability: false },
    successThreshold: 0.9,
    trialsPerNetwork: 1,
    ...changes
  }
}

const values = (p: PointParams): Record<string, number> => theoryForPoint(p).values

describe('theoryForPoint', () => {
  it('gives crosstalk, critical load and RS retrieval for Hebbian asynchronous T = 0', () => {
    const theory = values(point())
    expect(Object.keys(theory).sort()).toEqual([
      'criticalLoad', 'crosstalkErrorExact', 'crosstalkErrorExactTiesRandom', 'crosstalkErrorGaussian', 'crosstalkTieExact', 'loadAlpha', 'retrievalOverlapRS'
    ])
    // Ties broken at random flip half the tied bits: P[ξh < 0] + ½ P[h = 0].
    expect(theory.crosstalkErrorExactTiesRandom).toBe(crosstalkErrorExact(1000, 100).below + crosstalkErrorExact(1000, 100).tie / 2)
    expect(theory.loadAlpha).toBe(0.1)
    // CHECK_VALUES §1 [D]: (1000, 100) → 7.37e-4, half a unit of the last digit.
    expect(Math.abs((theory.crosstalkErrorExact as number) - 7.37e-4)).toBeLessThanOrEqual(5e-7)
    expect(theory.crosstalkTieExact).toBe(crosstalkErrorExact(1000, 100).tie)
    // CHECK_VALUES §2 (AGS 1987): m(0.10) = 0.9979993, tolerance 1e-6; α_c = 0.137906.
    expect(Math.abs((theory.retrievalOverlapRS as number) - 0.9979993)).toBeLessThanOrEqual(1e-6)
    expect(theory.criticalLoad).toBe(rsCriticalLoad().alphaC)
  })

  it('uses the kept diagonal in the crosstalk and drops the J_ii = 0 theories', () => {
    const theory = values(point({ rule: { kind: 'hebbian', selfCoupling: true } }))
    // CHECK_VALUES §1 [D]: 2.35e-4 with J_ii = P/N.
    expect(Math.abs((theory.crosstalkErrorExact as number) - 2.35e-4)).toBeLessThanOrEqual(5e-7)
    expect(theory.retrievalOverlapRS).toBeUndefined()
    expect(theory.criticalLoad).toBeUndefined()
  })

  it('reports 0 for RS retrieval above α_c', () => {
    expect(values(point({ patterns: 150 })).retrievalOverlapRS).toBe(0)
  })

  it('gives the first parallel step for synchronous T = 0 with a flip cue, ties kept as the engine does', () => {
    const theory = values(point({
      cue: { kind: 'flip', fraction: 0.2 },
      dynamics: { update: 'sync', temperature: 0, maxSweeps: 50, burnIn: 0 }
    }))
    expect(theory.retrievalOverlapRS).toBeUndefined()
    // m₀ = 0.6: CHECK_VALUES §5a, erf(0.6/√0.2) = 0.9422 (4 digits).
    expect(Math.abs((theory.firstStepOverlap as number) - 0.9422)).toBeLessThanOrEqual(5e-5)
    expect(theory.firstStepOverlapExactTiesKeep).toBe(firstParallelStepExact(1000, 100, 0.6, { ties: 'keep' }))
    // Both tie rules, each labelled: random tie-breaking is the published exact value 0.94334
    // (CHECK_VALUES §5a [D][C], 5 digits: 5e-6); keeping the state gives 0.943594 (issue 16).
    expect(Math.abs((theory.firstStepOverlapExactTiesRandom as number) - 0.94334)).toBeLessThan(5e-6)
    expect(Math.abs((theory.firstStepOverlapExactTiesKeep as number) - 0.943594)).toBeLessThan(5e-7)
  })

  it('uses the realised number of flipped bits for m₀', () => {
    // fraction 0.1234 of N = 1000 flips round(123.4) = 123 bits: m₀ = 0.754.
    const theory = values(point({
      cue: { kind: 'flip', fraction: 0.1234 },
      dynamics: { update: 'sync', temperature: 0, maxSweeps: 50, burnIn: 0 }
    }))
    expect(theory.firstStepOverlapExactTiesKeep).toBe(firstParallelStepExact(1000, 100, 0.754, { ties: 'keep' }))
  })

  it('gives Curie–Weiss only where the load is negligible, and the finite-temperature RS theory elsewhere', () => {
    const at = (neurons: number, patterns: number, temperature: number, update: PointParams['dynamics']['update'] = 'async-random') =>
      theoryForPoint(point({ neurons, patterns, dynamics: { update, temperature, maxSweeps: 50, burnIn: 10 } }))
    // Issue 16: α = 0.01, T = 0.85 once gave Curie–Weiss 0.63, but T_M(0.01) = 0.801
    // (CHECK_VALUES §3, AGS 1987 [C]): no retrieval state there (simulation 0.12 ± 0.02).
    const hot = at(1000, 10, 0.85)
    expect(hot.unavailable.curieWeissOverlap).toBe('load-outside-domain')
    expect(hot.values.retrievalOverlapRS).toBe(0)
    expect(hot.values.criticalLoad).toBeLessThan(0.01)
    expect(Math.abs(hot.values.retrievalTemperature! - 0.801)).toBeLessThan(1e-3)
    expect(hot.values.spinGlassTemperature).toBe(1 + Math.sqrt(0.01))
    // Issue 16: N = 2000, P = 4, T = 0.9: the finite-α value 0.474, not Curie–Weiss 0.525.
    const small = at(2000, 4, 0.9)
    expect(small.unavailable.curieWeissOverlap).toBe('load-outside-domain')
    expect(Math.abs(small.values.retrievalOverlapRS! - 0.474)).toBeLessThan(5e-4)
    // One pattern has no crosstalk at all: Curie–Weiss holds (CHECK_VALUES §3: m(0.6) = 0.90733).
    const single = at(200, 1, 0.6)
    expect(single.values.curieWeissOverlap).toBe(curieWeissOverlap(0.6))
    // Glauber equilibrium theory does not describe parallel updates at T > 0; Curie–Weiss does
    // (AGS, PRA 32, 1007 (1985): Hopfield and Little models agree below T_c).
    const parallel = at(200, 1, 0.6, 'sync')
    expect(parallel.unavailable).toMatchObject({ retrievalOverlapRS: 'dynamics-outside-domain', criticalLoad: 'dynamics-outside-domain', retrievalTemperature: 'dynamics-outside-domain' })
    expect(parallel.values.curieWeissOverlap).toBe(curieWeissOverlap(0.6))
    // Above T = 1 no load allows retrieval.
    expect(at(1000, 10, 1.2).unavailable.criticalLoad).toBe('no-retrieval-solution')
    // Above α_c(0) no temperature does.
    expect(at(1000, 150, 0.2).unavailable.retrievalTemperature).toBe('no-retrieval-solution')
    expect(at(1000, 100, 0).unavailable.retrievalTemperature).toBe('temperature-outside-domain')
  })

  it('gives the symmetric mixture overlap for an odd mixture cue at vanishing load', () => {
    // AGS 1985, CHECK_VALUES §4: m₃ = ½.
    expect(values(point({ patterns: 10, cue: { kind: 'mixture', components: 3 } })).mixtureOverlap).toBe(0.5)
    expect(values(point({ patterns: 10, cue: { kind: 'mixture', components: 4 } })).mixtureOverlap).toBeUndefined()
    expect(values(point({ cue: { kind: 'mixture', components: 3 } })).mixtureOverlap).toBeUndefined()
  })

  it('gives critical load 1 for the pseudo-inverse rule', () => {
    // Kanter & Sompolinsky, PRA 35, 380 (1987) [S]: maximum capacity α = 1.
    const theory = theoryForPoint(point({ rule: { kind: 'pseudo-inverse', selfCoupling: false }, patterns: 500 }))
    expect(theory).toEqual({ values: { loadAlpha: 0.5, criticalLoad: 1 }, unavailable: {} })
  })

  it('gives nothing for rules without a theory, and lists every Hebbian value as outside the model elsewhere', () => {
    expect(theoryForPoint(point({ rule: { kind: 'storkey', selfCoupling: false } }))).toEqual({ values: {}, unavailable: {} })
    const hebbianNames = Object.keys({ ...theoryForPoint(point()).values, ...theoryForPoint(point()).unavailable }).sort()
    for (const changes of [
      { family: { kind: 'random' as const, activity: 0.1 } },
      { family: { kind: 'correlated' as const, parents: 3, parentOverlap: 0.5 } },
      { dilution: { keep: 0.5, symmetric: true } },
      { coding: 'binary' as const }
    ]) {
      const theory = theoryForPoint(point(changes))
      expect(theory.values).toEqual({})
      expect(Object.keys(theory.unavailable).sort()).toEqual(hebbianNames)
      expect(new Set(Object.values(theory.unavailable))).toEqual(new Set(['model-outside-domain']))
    }
  })

  it('says why each value of the model is missing', () => {
    const theory = theoryForPoint(point())
    expect(theory.unavailable).toMatchObject({
      firstStepOverlap: 'dynamics-outside-domain',
      mixtureOverlap: 'cue-outside-domain',
      curieWeissOverlap: 'temperature-outside-domain'
    })
    for (const name of Object.keys(theory.values)) expect(theory.unavailable).not.toHaveProperty(name)
    const kept = theoryForPoint(point({ rule: { kind: 'hebbian', selfCoupling: true } }))
    expect(kept.unavailable.retrievalOverlapRS).toBe('model-outside-domain')
  })

  it('treats dilution that keeps every coupling as none', () => {
    expect(theoryForPoint(point({ dilution: { keep: 1, symmetric: false } }))).toEqual(theoryForPoint(point()))
  })

  it('stays consistent with the standalone functions over a load sweep', () => {
    for (let p = 10; p <= 200; p += 10) {
      const theory = values(point({ patterns: p }))
      expect(theory.retrievalOverlapRS).toBe(rsRetrievalOverlap(p / 1000))
    }
  })
})
