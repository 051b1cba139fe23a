import { describe, it, expect } from 'vitest'
import {
  aggregatePoint, createPointRunner, estimatePointCost, keyedParams, measurePatternOverlaps, patternOverlapExpectation, Xoshiro256StarStar,
  type PointParams, type TrialRecord
} from '../../src/engine/index.js'
import { firstParallelStepExact } from '../../src/engine/theory/index.js'
import { crosstalkErrorExact } from '../../src/engine/theory/index.js'
import { meanAbsUnbiased, medianLargestAbs, sameParentPairs } from '../../src/engine/patterns/overlap-expectation.js'
import { pointStreamKey } from '../../src/sweep/compute-chunk.js'
import { mean, pointParams, sampleSd } from '../helpers/point.js'

const quiet = { overlapTrajectory: false, energyTrajectory: false, stability: false }

function runTrials (p: PointParams, trials: number, seed: number): TrialRecord[] {
  const runner = createPointRunner(p, seed, 0)
  return Array.from({ length: trials }, (_, t) => runner.runTrial(t))
}

describe('mean trajectory per point', () => {
  it('holds a stopped trial at its last value and counts the trials still running', () => {
    const p = pointParams({ neurons: 200, patterns: 20, cue: { kind: 'flip', fraction: 0.2 }, measures: { ...quiet, overlapTrajectory: true, energyTrajectory: true } })
    const trials = runTrials(p, 25, 71)
    const summary = aggregatePoint(p, trials)
    const overlap = summary.overlapTrajectory!
    const longest = Math.max(...trials.map((t) => t.sweeps))
    expect(overlap.firstSweep).toBe(0)
    expect(overlap.mean).toHaveLength(longest + 1)
    for (let k = 0; k <= longest; k++) {
      // Padded by hand: sweep 0 is the cue, then each trial's own trajectory, then its last value.
      const padded = trials.map((t) => k === 0 ? t.initialOverlap : t.overlapTrajectory![Math.min(k, t.sweeps) - 1]!)
      expect(overlap.mean[k]).toBeCloseTo(mean(padded), 14)
      expect(overlap.sd[k]).toBeCloseTo(sampleSd(padded), 12)
      expect(overlap.se[k]).toBeCloseTo(sampleSd(padded) / 5, 12)
      expect(overlap.running[k]).toBe(trials.filter((t) => t.sweeps >= k).length)
    }
    // The last value of the padded mean is the mean final overlap.
    expect(overlap.mean[longest]).toBeCloseTo(summary.overlap.mean, 14)
    const energy = summary.energyTrajectory!
    expect(energy.firstSweep).toBe(1)
    expect(energy.mean).toHaveLength(longest)
    expect(energy.mean[longest - 1]).toBeCloseTo(summary.energy.mean, 14)
    // Without the measure there is no trajectory.
    expect(aggregatePoint({ ...p, measures: quiet }, runTrials({ ...p, measures: quiet }, 3, 71)).overlapTrajectory).toBeUndefined()
  })

  it('after one parallel step matches the exact finite-N first-step overlap', () => {
    // Gardner, Derrida & Mottishaw, J. Physique 48, 741 (1987) [recalled from memory]; the exact
    // finite-N expectation with exactly round(fN) flipped bits and ties kept (CHECK_VALUES §5a,
    // derived [D][C]; 0.943594 at (1000, 100, 0.6), docs/theory.md). Tolerance 4 SE of the band.
    const p = pointParams({
      neurons: 1000,
      patterns: 100,
      cue: { kind: 'flip', fraction: 0.2 },
      dynamics: { update: 'sync', temperature: 0, maxSweeps: 3, burnIn: 0 },
      measures: { ...quiet, overlapTrajectory: true }
    })
    const band = aggregatePoint(p, runTrials(p, 60, 72)).overlapTrajectory!
    const exact = firstParallelStepExact(1000, 100, 0.6, { ties: 'keep' })
    expect(exact).toBeCloseTo(0.943594, 5)
    expect(band.mean[0]).toBeCloseTo(0.6, 12)
    expect(Math.abs(band.mean[1]! - exact)).toBeLessThan(4 * band.se[1]!)
  })
})

describe('one-step stability with its spread over networks', () => {
  it('gives the standard error of the mean over networks, which covers the exact instability', () => {
    // CHECK_VALUES §1 and §0: exact binomial instability 6.93e-4 at (N, P) = (500, 50), and
    // "better, 4 × the standard error of the mean of the per-network rates" as the tolerance.
    const p = pointParams({ neurons: 500, patterns: 50, measures: { ...quiet, stability: true }, dynamics: { update: 'async-random', temperature: 0, maxSweeps: 1, burnIn: 0 } })
    const trials = runTrials(p, 40, 73)
    const stability = aggregatePoint(p, trials).stability!
    const perNetwork = trials.map((t) => t.stability!.unstableFraction)
    expect(stability.networks).toBe(40)
    expect(stability.unstableFraction).toBeCloseTo(mean(perNetwork), 15)
    expect(stability.sd.unstableFraction).toBeCloseTo(sampleSd(perNetwork), 15)
    expect(stability.se.unstableFraction).toBeCloseTo(sampleSd(perNetwork) / Math.sqrt(40), 15)
    const exact = crosstalkErrorExact(500, 50, { selfCoupling: false }).below
    expect(exact).toBeCloseTo(6.93e-4, 5)
    expect(Math.abs(stability.unstableFraction - exact)).toBeLessThan(4 * stability.se.unstableFraction)
  })
})

describe('overlaps with the components of a mixture cue', () => {
  it('are reported per component, target first, and summarised per point', () => {
    // AGS 1985 (CHECK_VALUES §4): the 3-mixture is a T = 0 fixed point with m = ½ on each
    // component; N = 2000, P = 20 (α = 0.01). Tolerance 4·√(0.75/N) per overlap plus 0.01 for the load.
    const p = pointParams({ neurons: 2000, patterns: 20, cue: { kind: 'mixture', components: 3 }, measures: quiet })
    const trials = runTrials(p, 6, 74)
    for (const t of trials) {
      expect(t.componentOverlaps).toHaveLength(3)
      expect(t.componentOverlaps![0]).toBe(t.overlap)
    }
    const components = aggregatePoint(p, trials).componentOverlaps!
    expect(components).toHaveLength(3)
    for (const c of components) expect(Math.abs(c.mean - 0.5)).toBeLessThan(4 * Math.sqrt(0.75 / 2000) + 0.01)
    expect(aggregatePoint(p, runTrials({ ...p, cue: { kind: 'flip', fraction: 0.1 } }, 2, 74)).componentOverlaps).toBeUndefined()
  })
})

describe('overlaps between the stored patterns', () => {
  it('of independent unbiased patterns have mean square exactly 1/N', () => {
    // CHECK_VALUES §12 (elementary [C]): C = (1/N) ξ·η has E C = 0 and Var C = 1/N exactly.
    // 60 networks of P = 20 at N = 400 (190 pairs each); tolerance 4 SE over networks.
    const n = 400
    const p = pointParams({ neurons: n, patterns: 20, measures: { ...quiet, patternOverlaps: true }, dynamics: { update: 'async-random', temperature: 0, maxSweeps: 1, burnIn: 0 } })
    const trials = runTrials(p, 60, 75)
    const summary = aggregatePoint(p, trials).patternOverlaps!
    expect(summary.networks).toBe(60)
    expect(summary.pairs).toBe(190)
    const meanSquares = trials.map((t) => t.patternOverlaps!.rms ** 2)
    expect(Math.abs(mean(meanSquares) - 1 / n)).toBeLessThan(4 * sampleSd(meanSquares) / Math.sqrt(60))
    expect(summary.expected.rms).toBeCloseTo(1 / Math.sqrt(n), 15)
    expect(summary.expected.mean).toBe(0)
    expect(Math.abs(summary.meanAbs.mean - summary.expected.meanAbs!)).toBeLessThan(4 * summary.meanAbs.se)
    expect(Math.abs(summary.mean.mean)).toBeLessThan(4 * summary.mean.se)
  })

  it('give the exact mean |C| of two independent patterns (binomial mean absolute deviation)', () => {
    // E|C| = C(N−1, ⌊(N−1)/2⌋)/2^{N−1} (de Moivre's mean absolute deviation of the binomial,
    // closed form recalled from memory): checked against full enumeration of Bin(N, ½), and
    // ≈ √(2/(πN)) for large N.
    for (const n of [1, 2, 3, 4, 7, 10, 25]) {
      let expected = 0
      let binomial = 1
      for (let d = 0; d <= n; d++) {
        expected += binomial / 2 ** n * Math.abs(2 * d - n) / n
        binomial = binomial * (n - d) / (d + 1)
      }
      expect(meanAbsUnbiased(n)).toBeCloseTo(expected, 14)
    }
    expect(meanAbsUnbiased(100000)).toBeCloseTo(Math.sqrt(2 / (Math.PI * 100000)), 6)
  })

  it('give the median largest |C| of a pattern set, independent-pairs approximation', () => {
    // Our expectation: the median of the largest of M pairwise-independent |C| (common
    // practice for extreme values). Checked against 200 simulated networks of P = 20 at N = 200;
    // tolerance one lattice step 2/N plus 4 SE of a sample median (≈ 1.25·sd/√200).
    const n = 200
    const p = pointParams({ neurons: n, patterns: 20, measures: { ...quiet, patternOverlaps: true }, dynamics: { update: 'async-random', temperature: 0, maxSweeps: 1, burnIn: 0 } })
    const largest = runTrials(p, 200, 76).map((t) => t.patternOverlaps!.maxAbs).sort((a, b) => a - b)
    const median = (largest[99]! + largest[100]!) / 2
    const expected = medianLargestAbs(n, 190)
    expect(patternOverlapExpectation(p).maxAbs).toBe(expected)
    expect(Math.abs(median - expected)).toBeLessThan(2 / n + 4 * 1.25 * sampleSd(largest) / Math.sqrt(200))
  })

  it('of a correlated family follow the parent overlap, and biased patterns their activity', () => {
    // Derived from the family's definition [D]: children of one parent with parent overlap q
    // have E C = q²; others 0. Random entries with activity a have E C = (2a − 1)².
    const n = 500
    const correlated = pointParams({ neurons: n, patterns: 12, family: { kind: 'correlated', parents: 3, parentOverlap: 0.6 }, measures: { ...quiet, patternOverlaps: true } })
    expect(sameParentPairs(12, 3)).toBe(18)
    const c = aggregatePoint(correlated, runTrials(correlated, 30, 77)).patternOverlaps!
    expect(c.expected.mean).toBeCloseTo(18 * 0.36 / 66, 15)
    expect(Math.abs(c.mean.mean - c.expected.mean!)).toBeLessThan(4 * c.mean.se)
    expect(Math.abs(c.rms.mean - c.expected.rms!)).toBeLessThan(4 * c.rms.se + 0.005)
    const biased = pointParams({ neurons: n, patterns: 10, family: { kind: 'random', activity: 0.2 }, measures: { ...quiet, patternOverlaps: true } })
    const b = aggregatePoint(biased, runTrials(biased, 30, 78)).patternOverlaps!
    expect(b.expected.mean).toBeCloseTo(0.36, 15)
    expect(Math.abs(b.mean.mean - 0.36)).toBeLessThan(4 * b.mean.se)
    expect(b.expected.meanAbs).toBeNull()
  })

  it('are measured on the first trial of each network only, and change no trial', () => {
    const p = pointParams({ neurons: 100, patterns: 8, trialsPerNetwork: 3 })
    const plain = runTrials(p, 6, 79)
    const measured = runTrials({ ...p, measures: { ...quiet, patternOverlaps: true } }, 6, 79)
    expect(measured.map((t) => t.patternOverlaps !== undefined)).toEqual([true, false, false, true, false, false])
    expect(measured.map(({ patternOverlaps: _po, ...t }) => t)).toEqual(plain)
    const direct = measurePatternOverlaps(new Int8Array([1, 1, 1, 1, 1, -1, 1, -1]), 4, 2)
    expect(direct).toEqual({ pairs: 1, mean: 0, meanAbs: 0, rms: 0, maxAbs: 0 })
  })
})

describe('stream keys', () => {
  it('leave out members that only add output, so such points draw the same trials', () => {
    const p = pointParams({ neurons: 100, patterns: 8 })
    const withOutput = { ...p, patternLevel: 0.9, measures: { ...p.measures, patternOverlaps: true } }
    expect(keyedParams(withOutput)).toEqual(p)
    expect(pointStreamKey(withOutput)).toBe(pointStreamKey(p))
    expect(pointStreamKey({ ...p, patterns: 9 })).not.toBe(pointStreamKey(p))
  })
})

describe('one shared stream (canonical)', () => {
  it('draws every network and trial from the one stream, in trial order only', () => {
    const p = pointParams({ neurons: 64, patterns: 4, trialsPerNetwork: 2 })
    const runner = createPointRunner(p, 1, 0, { stream: Xoshiro256StarStar.fromSeed(9n) })
    runner.runTrial(0)
    expect(() => runner.runTrial(2)).toThrow(/next trial is 1/)
    // The same stream state gives the same trials; a runner on a fresh stream repeats them.
    const again = createPointRunner(p, 1, 0, { stream: Xoshiro256StarStar.fromSeed(9n) })
    const first = createPointRunner(p, 1, 0, { stream: Xoshiro256StarStar.fromSeed(9n) })
    expect([0, 1, 2].map((t) => again.runTrial(t))).toEqual([0, 1, 2].map((t) => first.runTrial(t)))
  })
})

describe('the cost model', () => {
  it('counts the stored-pattern overlaps once per network: N·P(P − 1)/2 operations', () => {
    const p = pointParams({ neurons: 1000, patterns: 100 })
    const plain = estimatePointCost(p)
    const measured = estimatePointCost({ ...p, measures: { ...p.measures, patternOverlaps: true } })
    expect(measured.buildOpsPerNetwork - plain.buildOpsPerNetwork).toBe(1000 * 100 * 99 / 2)
    expect(measured.bytes).toBe(plain.bytes)
  })
})
