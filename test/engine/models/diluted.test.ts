import { describe, it, expect } from 'vitest'
import { buildNetwork, createPointRunner, Xoshiro256StarStar, type PointParams } from '../../../src/engine/index.js'
import { DILUTED_CRITICAL_LOAD, dilutedOverlapMap, dilutedRetrievalOverlap } from '../../../src/engine/theory/index.js'
import { mean, pointParams, sampleSd } from '../../helpers/point.js'

const trajectory = { overlapTrajectory: true, energyTrajectory: false, stability: false }

function diluted (neurons: number, inDegree: number, patterns: number, fraction: number, maxSweeps: number): PointParams {
  return pointParams({
    neurons,
    patterns,
    dilution: { kind: 'fixed-in-degree', inDegree },
    cue: { kind: 'flip', fraction },
    dynamics: { update: 'sync', temperature: 0, maxSweeps, burnIn: 0 },
    measures: trajectory
  })
}

describe('extremely diluted asymmetric network (Derrida, Gardner & Zippelius 1987)', () => {
  it('gives every neuron exactly K distinct inputs from other neurons, with Hebbian couplings', () => {
    // The model's definition: c_ij ∈ {0, 1} with Σ_j c_ij = K, c_ii = 0, J_ij = c_ij Σ_μ ξ_i^μ ξ_j^μ / K,
    // drawn independently per neuron (asymmetric). Read J back through fields of unit states.
    const n = 60
    const k = 7
    const net = buildNetwork(pointParams({ neurons: n, patterns: 5, dilution: { kind: 'fixed-in-degree', inDegree: k } }), Xoshiro256StarStar.fromSeed(3n))
    expect(net.representation).toBe('sparse-in-degree')
    expect(net.fieldScale).toBeCloseTo(1 / k, 15)
    const e = new Int8Array(n)
    const inputs = new Array<number>(n).fill(0)
    let reciprocal = 0
    const column: number[][] = []
    for (let j = 0; j < n; j++) {
      e.fill(0)
      e[j] = 1
      net.load(e)
      column.push(Array.from({ length: n }, (_, i) => net.field(i)))
    }
    for (let i = 0; i < n; i++) {
      expect(column[i]![i]).toBe(0)
      for (let j = 0; j < n; j++) {
        if (column[j]![i] === 0) continue
        inputs[i]!++
        let t = 0
        for (let mu = 0; mu < 5; mu++) t += net.patterns[mu * n + i]! * net.patterns[mu * n + j]!
        expect(column[j]![i]).toBe(t)
        if (column[i]![j] !== 0) reciprocal++
      }
    }
    // P = 5 is odd, so no kept coupling is 0 and the count of nonzero entries is the in-degree.
    expect(inputs.every((count) => count === k)).toBe(true)
    // Independent rows: a connection is reciprocated with probability ≈ K/(N − 1) = 0.12, not 1.
    expect(reciprocal / (n * k)).toBeLessThan(0.3)
  })

  it('first parallel steps follow m_{t+1} = erf(m_t/√(2α)) at N = 4000, K = 41', () => {
    // Derrida, Gardner & Zippelius, Europhys. Lett. 4, 167 (1987) (recalled from memory): in the
    // K ≪ ln N limit the overlap obeys this map at every step (theory/diluted-overlap-map.ts).
    // Here α = P/K = 13/41 and m₀ = 0.3; K and P odd so no field is ever exactly 0. Tolerance:
    // 4 standard errors over trials plus 0.01 for finite K (the crosstalk variance is
    // (P − m²)/K rather than P/K, and N = 4000 is not ≫ K^t: an O(1/K) effect).
    const p = diluted(4000, 41, 13, 0.35, 4)
    const runner = createPointRunner(p, 7, 0)
    const paths = Array.from({ length: 12 }, (_, t) => runner.runTrial(t).overlapTrajectory!)
    let m = 1 - 2 * Math.round(0.35 * 4000) / 4000
    for (let step = 0; step < 4; step++) {
      m = dilutedOverlapMap(m, 13 / 41)
      const values = paths.map((path) => path[step]!)
      const tol = 4 * sampleSd(values) / Math.sqrt(values.length) + 0.01
      expect(Math.abs(mean(values) - m)).toBeLessThan(tol)
    }
    // The map rises from 0.3 towards m* ≈ 0.883: the test covers real dynamics, not a fixed point.
    expect(m).toBeGreaterThan(0.7)
  })

  it('retrieves below α_c = 2/π and loses the pattern above it', () => {
    // DGZ 1987: the retrieval fixed point m* > 0 exists only for α < 2/π ≈ 0.637 at T = 0, where
    // the slope √(2/(πα)) of the map at 0 drops below 1. Below: P = 17, K = 41 (α = 0.415,
    // m* = 0.765); above: P = 37 (α = 0.902). From m₀ = 0.6, 30 parallel steps.
    expect(DILUTED_CRITICAL_LOAD).toBeCloseTo(0.63662, 5)
    expect(dilutedRetrievalOverlap(0.7)).toBe(0)
    const final = (patterns: number): number[] => {
      const runner = createPointRunner(diluted(4000, 41, patterns, 0.2, 30), 8, 0)
      return Array.from({ length: 4 }, (_, t) => runner.runTrial(t).overlap)
    }
    const below = final(17)
    const star = dilutedRetrievalOverlap(17 / 41)
    for (const m of below) expect(Math.abs(m - star)).toBeLessThan(0.05)
    for (const m of final(37)) expect(Math.abs(m)).toBeLessThan(0.1)
  })

  it('asynchronous updates and clipped couplings run on the same lists', () => {
    // Asymmetric couplings have no energy function, so asynchronous dynamics may not settle;
    // the run must still be deterministic and stay within the sweep limit.
    const p: PointParams = { ...diluted(500, 20, 5, 0.1, 20), rule: { kind: 'clipped', selfCoupling: false }, dynamics: { update: 'async-random', temperature: 0, maxSweeps: 20, burnIn: 0 } }
    const a = createPointRunner(p, 2, 0).runTrial(3)
    expect(createPointRunner(p, 2, 0).runTrial(3)).toStrictEqual(a)
    expect(a.overlap).toBeGreaterThan(0.9)
    expect(buildNetwork(p, Xoshiro256StarStar.fromSeed(1n)).fieldScale).toBeCloseTo(Math.sqrt(5) / 20, 15)
  })
})
