/**
 * Exact finite-K theory of the fixed in-degree network against the engine's own simulation:
 * the first parallel step under both tie rules at K = 20…50, and the finite-K overlap map
 * over several steps where it is exact (ties impossible, K·P odd).
 */
import { describe, expect, it } from 'vitest'
import { createPointRunner, type PointParams } from '../../../src/engine/index.js'
import { dilutedFirstStepExact, dilutedFixedPointExact, dilutedMapExact, dilutedOverlapMap } from '../../../src/engine/theory/index.js'
import { mean, pointParams, sampleSd } from '../../helpers/point.js'

function diluted (neurons: number, inDegree: number, patterns: number, fraction: number, maxSweeps: number): PointParams {
  return pointParams({
    neurons,
    patterns,
    dilution: { kind: 'fixed-in-degree', inDegree },
    cue: { kind: 'flip', fraction },
    dynamics: { update: 'sync', temperature: 0, maxSweeps, burnIn: 0 },
    measures: { overlapTrajectory: true, energyTrajectory: false, stability: false }
  })
}

describe('dilutedFirstStepExact', () => {
  it('gives the issue-16 values at K = 20: limit 0.6387, exact 0.6710 with ties kept', () => {
    // Issue 16 (N = 2000 simulation 0.6716): P = 6, K = 20, m₀ = 0.5. The limit is
    // erf(m₀/√(2P/K)) (Derrida, Gardner & Zippelius, Europhys. Lett. 4, 167 (1987), recalled
    // from memory). Printed to 4 digits: tolerance 5e-5.
    expect(Math.abs(dilutedOverlapMap(0.5, 6 / 20) - 0.6387)).toBeLessThan(5e-5)
    expect(Math.abs(dilutedFirstStepExact(20000, 20, 6, 0.5, 'keep') - 0.6710)).toBeLessThan(5e-5)
    // K·P odd: S + B is never 0, so the tie rules agree exactly.
    expect(dilutedFirstStepExact(2000, 21, 5, 0.5, 'keep')).toBe(dilutedFirstStepExact(2000, 21, 5, 0.5, 'random'))
  })

  it('matches simulations of the first parallel step at K = 20 and 50 with the engine\'s tie rule', () => {
    // N = 1000, m₀ = 0.5 (250 flipped bits), K·P even so ties occur. 100 networks each; the
    // tolerance is 4 standard errors of the mean over trials (CHECK_VALUES §0, overlaps): the
    // first step is exact at any N, so no finite-size allowance. The check tells the exact
    // value from the K → ∞ limit, and at K = 20 (where ties are most frequent) from random
    // tie-breaking: both lie many SE away.
    for (const [k, p] of [[20, 6], [50, 12]] as const) {
      const runner = createPointRunner(diluted(1000, k, p, 0.25, 1), 40 + k, 0)
      const overlaps = Array.from({ length: 100 }, (_, t) => runner.runTrial(t).overlap)
      const se = sampleSd(overlaps) / Math.sqrt(overlaps.length)
      const keep = dilutedFirstStepExact(1000, k, p, 0.5, 'keep')
      expect(Math.abs(mean(overlaps) - keep), `K = ${k}`).toBeLessThan(4 * se)
      if (k !== 20) continue
      expect(Math.abs(dilutedFirstStepExact(1000, k, p, 0.5, 'random') - keep)).toBeGreaterThan(8 * se)
      expect(Math.abs(dilutedOverlapMap(0.5, p / k) - keep)).toBeGreaterThan(8 * se)
    }
  })
})

describe('dilutedMapExact', () => {
  it('follows simulations over three parallel steps when ties are impossible (K = 21, P = 5)', () => {
    // Exact as N → ∞ at fixed K (derived in diluted-exact.ts). At N = 20000 the inputs of a
    // neuron are not quite a tree: two of them share an input with probability ~K²/N per pair,
    // and the flipped bits are drawn without replacement, which correlates them weakly (an
    // O(K^t/N) effect): allowance 0.004 beside 4 SE.
    const runner = createPointRunner(diluted(20000, 21, 5, 0.35, 3), 9, 0)
    const paths = Array.from({ length: 8 }, (_, t) => runner.runTrial(t).overlapTrajectory!)
    const map = dilutedMapExact(21, 5)
    let m = 1 - 2 * Math.round(0.35 * 20000) / 20000
    for (let step = 0; step < 3; step++) {
      m = map(m)
      const values = paths.map((path) => path[step]!)
      expect(Math.abs(mean(values) - m), `step ${step + 1}`).toBeLessThan(4 * sampleSd(values) / Math.sqrt(values.length) + 0.004)
    }
    // The finite-K fixed point the dynamics head for, and the K → ∞ map's (which lies lower).
    const star = dilutedFixedPointExact(21, 5, 0.3)!
    expect(Math.abs(map(star) - star)).toBeLessThan(1e-13)
    expect(star).toBeGreaterThan(m)
  })

  it('tends to erf(m/√(2α)) as K grows at fixed α = P/K', () => {
    // DGZ 1987 (recalled from memory): the K → ∞ limit; the finite-K gap shrinks like 1/K.
    const gaps = [21, 201, 2001].map((k) => Math.abs(dilutedMapExact(k, Math.round(0.3 * k))(0.4) - dilutedOverlapMap(0.4, Math.round(0.3 * k) / k)))
    expect(gaps[1]).toBeLessThan(gaps[0]! / 5)
    expect(gaps[2]).toBeLessThan(2e-3)
  })
})
