/**
 * Threshold searches on real simulations of the Hebbian network (J_ii = 0, unbiased ±1
 * patterns, asynchronous T = 0 dynamics), checked against published capacity values.
 * Lean: N ≤ 1000 and 100–200 trials per step; the full scaling over N = 250 … 2000 (and
 * 4000) is `npm run analysis:scaling`.
 */
import { describe, expect, it } from 'vitest'
import { curieWeissOverlap, rsCriticalLoad } from '../../src/engine/index.js'
import { normaliseSpec } from '../../src/spec/index.js'
import { assembleResult, makeProvenance, planSweep, computeChunk, SIMULATED_CAPACITY } from '../../src/sweep/index.js'
import { type SweepResult } from '../../src/results/index.js'
import { runtimeFacts } from '../../src/runtime/facts.js'

function run (input: unknown): SweepResult {
  const spec = normaliseSpec(input)
  const chunks = planSweep(spec).chunks.map((chunk) => computeChunk(spec, chunk))
  return assembleResult(spec, chunks, makeProvenance(spec, runtimeFacts(), { wallSeconds: 0, cpuSeconds: 0 }))
}

/** A load search on the standard Hebbian network, started from the stored pattern itself. */
const loadSearch = (extra: Record<string, unknown>, analysis: Record<string, unknown>) => ({
  rule: { kind: 'hebbian' },
  cue: { kind: 'flip', fraction: 0 },
  dynamics: { update: 'async-random', maxSweeps: 100 },
  successThreshold: 0.9,
  trials: 200,
  ...extra,
  analysis: { kind: 'threshold', parameter: 'load', from: 0.08, to: 0.28, tolerance: 0.002, maxSteps: 14, ...analysis }
})

describe('capacity of the Hebbian network at N = 1000', () => {
  it('lies where finite-size simulations put the apparent α_c: 0.145 ± 0.009 (as quoted by Steffan & Kühn, Z. Phys. B 95, 249 (1994))', () => {
    // Definition: the load at which the mean final overlap, starting from the stored pattern
    // itself, falls to 0.9 (on average 5 % wrong bits, three times the RS error fraction at
    // α_c, 1.6 %; AGS 1987, CHECK_VALUES §2). Why this comparison is apt: α_c is where the
    // retrieval state near each pattern disappears, which is probed by starting on the
    // pattern (no cue noise, so basin size plays no part), and a simulation of it reports the
    // trial-averaged retrieval quality. For N → ∞ any level between the failed-trial overlap
    // (~0.3–0.4) and m(α_c) = 0.967 gives α_c itself; at finite N the crossing depends on the
    // criterion. With the median criterion instead (half the trials reach m ≥ 0.9) the same
    // network gives ≈ 0.164 at N = 1000 (npm run analysis:scaling), above the quoted band:
    // the median sits where the failures of the mean criterion (~10 % of trials) have grown
    // to one half, further along the smeared finite-N transition.
    const result = run(loadSearch({ seed: 1, neurons: 1000 }, { measure: 'overlap', level: 0.9 }))
    const search = result.searches![0]!
    expect(search.estimate).not.toBeNull()
    const se = (search.high! - search.low!) / (2 * 1.96)
    expect(search.high! - search.low!).toBeLessThan(0.01)
    // Consistent: within two combined standard errors of the quoted value.
    expect(Math.abs(search.estimate! - SIMULATED_CAPACITY.value)).toBeLessThan(2 * Math.hypot(se, SIMULATED_CAPACITY.uncertainty))
    // And above the N → ∞ RS value 0.1379 (AGS 1985/1987), as every finite-N estimate is.
    expect(search.low!).toBeGreaterThan(rsCriticalLoad().alphaC)
  })
})

describe('basin of attraction', () => {
  it('has a radius (cue noise at which half the recalls succeed) that shrinks as the load grows', () => {
    // Qualitative law of the Hopfield model: the basins shrink with load and vanish at α_c
    // (Amit, Gutfreund & Sompolinsky, Ann. Phys. 173, 30 (1987); attribution recalled from
    // memory [M]; the pseudo-inverse analogue, R → 0 as α → 1, is Kanter & Sompolinsky,
    // PRA 35, 380 (1987), CHECK_VALUES §10). Success: final overlap ≥ 0.9.
    const result = run({
      seed: 2,
      neurons: 500,
      load: { values: [0.05, 0.1, 0.13] },
      cue: { kind: 'flip' },
      dynamics: { update: 'async-random', maxSweeps: 100 },
      successThreshold: 0.9,
      trials: 100,
      analysis: { kind: 'threshold', parameter: 'cue.fraction', from: 0, to: 0.5, tolerance: 0.01, maxSteps: 12 }
    })
    const searches = result.searches!
    expect(searches.map((s) => s.values.load)).toEqual([0.05, 0.1, 0.13])
    for (const s of searches) {
      expect(s.low).not.toBeNull()
      expect(s.high).not.toBeNull()
      // Flips are whole neurons: every step ran round(fraction·N) flipped bits.
      for (const step of s.steps) expect(step.value * 500).toBeCloseTo(Math.round(step.value * 500), 9)
    }
    // Strictly shrinking, and significantly so: each interval lies wholly below the previous one.
    for (let i = 1; i < searches.length; i++) expect(searches[i]!.high!).toBeLessThan(searches[i - 1]!.low!)
  })
})

describe('temperature at which retrieval degrades', () => {
  it('puts the time-averaged overlap 0.9 where the Curie–Weiss curve m = tanh(m/T) does: T = 0.9/artanh 0.9 = 0.6113', () => {
    // One stored pattern (α → 0), Glauber dynamics with P(s = +1) = 1/(1 + e^{−2h/T}), so
    // T_c = 1: m = tanh(m/T) (Amit, Gutfreund & Sompolinsky, PRA 32, 1007 (1985); CHECK_VALUES
    // §3, m(0.6) = 0.90733). Tolerance: CHECK_VALUES allows ±0.02 in m at N ≥ 1000, T ≤ 0.8;
    // with dm/dT ≈ −0.65 near the crossing that is ±0.03 in T.
    const crossing = 0.9 / Math.atanh(0.9)
    expect(curieWeissOverlap(crossing)).toBeCloseTo(0.9, 6)
    const result = run({
      seed: 4,
      neurons: 1000,
      patterns: 1,
      cue: { kind: 'flip', fraction: 0 },
      dynamics: { update: 'async-random', maxSweeps: 40, burnIn: 10 },
      trials: 40,
      analysis: { kind: 'threshold', parameter: 'dynamics.temperature', measure: 'overlap', level: 0.9, from: 0.2, to: 1, tolerance: 0.01 }
    })
    const search = result.searches![0]!
    expect(search.fit!.method).toBe('local-linear-fieller')
    expect(Math.abs(search.estimate! - crossing)).toBeLessThan(0.03)
    expect(search.high! - search.low!).toBeLessThan(0.03)
    // Midpoints are rounded like axis values: no 0.6000000000000001.
    for (const step of search.steps) expect(String(step.value).length).toBeLessThan(15)
  })
})

describe('finite-size scaling of the capacity (cheap version of npm run analysis:scaling)', () => {
  it('extrapolates the median capacity at N = 250, 500, 1000 to the RS value 0.1379 within its stated uncertainty', () => {
    // Median criterion from the stored pattern (half the trials keep m ≥ 0.9). The exponent
    // is fixed at b = 1/2 so that three sizes leave a degree of freedom: fitted over N = 250 …
    // 4000 (npm run analysis:scaling -- --sizes 250,500,1000,2000,4000) it came out
    // 0.47 ± 0.06, with x_∞ = 0.1379 ± 0.0032 [MC, our own runs, not a published number].
    const result = run(loadSearch({ seed: 2, neurons: { values: [250, 500, 1000] } }, { scaling: { form: 'power', exponent: 0.5 } }))
    const [row] = result.scaling!
    const fit = row!.fit!
    expect(row!.sizes).toHaveLength(3)
    // Finite networks hold more than the N → ∞ limit: the amplitude of the correction is positive.
    expect(fit.amplitude.value).toBeGreaterThan(0)
    const rs = row!.references.find((r) => r.name === 'rs-theory')!
    expect(rs.value).toBeCloseTo(0.137906, 5)
    expect(Math.abs(fit.limit.value - rs.value)).toBeLessThan(2 * fit.limit.se!)
    expect(fit.limitInterval.low).toBeLessThan(rs.value)
    expect(fit.limitInterval.high).toBeGreaterThan(rs.value)
  })
})
