import { readFileSync } from 'node:fs'
import { describe, it, expect } from 'vitest'
import { aggregatePoint, createPointRunner, END_STATES, EndStateClassifier, macroscopicLevel, mixtureOverlap, mixtureOverlapAt, type PointParams, type TrialRecord } from '../../src/engine/index.js'
import { mean, pointParams, sampleSd } from '../helpers/point.js'

const quiet = { overlapTrajectory: false, energyTrajectory: false, stability: false }

function classifier (neurons: number, patterns: number, patternLevel = 0.9, temperature = 0): EndStateClassifier {
  return new EndStateClassifier({ neurons, patterns, patternLevel, temperature })
}

function runTrials (p: PointParams, trials: number, seed: number): TrialRecord[] {
  const runner = createPointRunner(p, seed, 0)
  return Array.from({ length: trials }, (_, t) => runner.runTrial(t))
}

/** A deterministic stand-in for N(0, sd²) noise overlaps: Box–Muller on a fixed LCG. */
function noise (count: number, sd: number, seed: number): number[] {
  let state = seed
  const uniform = (): number => {
    state = (state * 1103515245 + 12345) % 2147483648
    return (state + 0.5) / 2147483648
  }
  return Array.from({ length: count }, () => sd * Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform()))
}

describe('the end-state classes', () => {
  it('are one list of camelCase names, each a row of docs/end-states.md', () => {
    expect(END_STATES).toEqual(['target', 'reversed', 'otherPattern', 'symmetricMixture', 'partialTarget', 'spurious', 'spinGlass'])
    for (const name of END_STATES) expect(name).toMatch(/^[a-z]+([A-Z][a-z]+)*$/)
    const doc = readFileSync(new URL('../../docs/end-states.md', import.meta.url), 'utf8')
    const table = doc.slice(doc.indexOf('## The classes'), doc.indexOf('### Pattern level'))
    const rows = [...table.matchAll(/^\| `([A-Za-z]+)` \| /gm)].map((m) => m[1])
    expect(rows).toEqual([...END_STATES])
  })

  it('put the target exactly where success starts: m_t ≥ q, q the pattern level', () => {
    // Our definition (docs/end-states.md): `target` and success share one threshold.
    const c = classifier(1000, 3, 0.8)
    expect(c.classify([0.8, 0, 0], 3, 0)).toBe('target')
    expect(c.classify([0.79, 0.01, 0], 3, 0)).toBe('partialTarget')
    expect(c.classify([-0.8, 0, 0], 3, 0)).toBe('reversed')
    expect(c.classify([0.1, -0.85, 0], 3, 0)).toBe('otherPattern')
    expect(c.classify([0.02, 0.01, -0.03], 3, 0)).toBe('spinGlass')
  })

  it('know the symmetric mixture values of Amit, Gutfreund & Sompolinsky (1985)', () => {
    // CHECK_VALUES §4 (AGS, PRA 32, 1007 (1985)): odd n-mixtures at T = 0 have m_n = 1/2, 3/8,
    // 5/16, 0.27344 for n = 3, 5, 7, 9; at T > 0, m_3(T) = 0.4965, 0.4804, 0.4522, 0.4319 at
    // T = 0.2, 0.3, 0.4, 0.46 (computed from the published equation [C]; tolerance 1e-4).
    expect([3, 5, 7, 9].map((n) => mixtureOverlapAt(n, 0))).toEqual([0.5, 0.375, 0.3125, mixtureOverlap(9)])
    expect(mixtureOverlap(9)).toBeCloseTo(0.27344, 5)
    const expected = [[0.2, 0.4965], [0.3, 0.4804], [0.4, 0.4522], [0.46, 0.4319]] as const
    for (const [t, m] of expected) expect(mixtureOverlapAt(3, t)).toBeCloseTo(m, 4)
    // The root bifurcates from the paramagnet at T = 1 (every mixture, α → 0).
    expect(mixtureOverlapAt(3, 1)).toBe(0)
    expect(mixtureOverlapAt(3, 0.999)).toBeGreaterThan(0)
  })

  it('tell symmetric mixtures from asymmetric ones and from even mixtures', () => {
    const n = 2000
    const c = classifier(n, 7)
    // 3- and 5-mixtures at their AGS values (above), with finite-N spread.
    expect(c.classify([0.51, -0.49, 0.5, 0.01, -0.02, 0, 0.03], 7, 0)).toBe('symmetricMixture')
    expect(c.classify([0.38, 0.37, -0.375, 0.36, 0.39, 0.01, 0], 7, 0)).toBe('symmetricMixture')
    // Unequal components: an asymmetric mixture, not the symmetric one.
    expect(c.classify([0.75, 0.25, 0.25, 0, 0, 0, 0], 7, 0)).toBe('spurious')
    // Even mixtures are no fixed points at any T (AGS 1985; CHECK_VALUES §4, general statement from memory).
    expect(c.classify([0.5, 0.5, 0, 0, 0, 0, 0], 7, 0)).toBe('spurious')
    // A lone partial overlap with another pattern.
    expect(c.classify([0.02, 0.6, 0, 0, 0, 0, 0], 7, 0)).toBe('spurious')
  })

  it('measure "macroscopic" against the state\'s own overlap noise r/N (AGS order parameter r)', () => {
    // AGS 1987: the non-condensed overlaps have mean square r/N; past capacity r ≫ 1 and a
    // few of P such overlaps reach several times 1/√N without any condensation. A state whose
    // overlaps are all N(0, r/N) noise with r = 5 (largest |m| above 1.5 times the r = 1 level) is spin-glass-like.
    const n = 1000
    const count = 300
    const overlaps = noise(count, Math.sqrt(5 / n), 7)
    const largest = Math.max(...overlaps.map(Math.abs))
    expect(largest).toBeGreaterThan(1.5 * macroscopicLevel(n))
    const c = classifier(n, count)
    expect(c.classify(overlaps, count, 0)).toBe('spinGlass')
    expect(c.stateLevel(overlaps, count)).toBeCloseTo(macroscopicLevel(n, 5), 1)
    // The same noise with a remanent overlap with the target well above it.
    const remanent = [0.5, ...overlaps.slice(1)]
    expect(c.classify(remanent, count, 0)).toBe('partialTarget')
    // With few patterns there is nothing to estimate r from: r = 1, ℓ = max(0.15, 4/√N).
    expect(classifier(100, 3).stateLevel([0.6, 0.6, 0.6], 3)).toBe(0.4)
  })
})

describe('end states in simulations', () => {
  it('the symmetric 3-mixture persists below T_3 with the AGS overlap m_3(T), time-averaged', () => {
    // AGS 1985 (CHECK_VALUES §4): the 3-mixture is stable below T_3 ≈ 0.46 with m_3(0.2) =
    // 0.4965 [C]. N = 3000, P = 3 (α → 0), Glauber from the mixture cue, 20 measured sweeps
    // after 10 of burn-in. Tolerance: 4 SE over trials plus 0.005 for finite N.
    const p = pointParams({
      neurons: 3000,
      patterns: 3,
      cue: { kind: 'mixture', components: 3 },
      successThreshold: 0.9,
      dynamics: { update: 'async-random', temperature: 0.2, maxSweeps: 30, burnIn: 10 },
      measures: quiet
    })
    const trials = runTrials(p, 8, 61)
    const components = trials.flatMap((t) => t.componentOverlaps!)
    expect(components).toHaveLength(24)
    const target = mixtureOverlapAt(3, 0.2)
    expect(Math.abs(mean(components) - target)).toBeLessThan(4 * sampleSd(components) / Math.sqrt(components.length) + 0.005)
    for (const t of trials) {
      expect(t.endState).toBe('symmetricMixture')
      expect(t.endStateShares!.symmetricMixture).toBeGreaterThan(0.9)
      expect(t.finalEndState).toBe('symmetricMixture')
    }
  })

  it('past capacity the states reached from random starts are spin-glass-like, not mixtures', () => {
    // AGS 1987 (α_c = 0.138, CHECK_VALUES §2): above α_c no retrieval or mixture state is
    // left; at α = 0.3 the states reached are spin-glass states. N = 1000, random cues.
    const p = pointParams({ neurons: 1000, patterns: 300, cue: { kind: 'random' }, measures: quiet })
    const trials = runTrials(p, 20, 62)
    const counts = aggregatePoint(p, trials).endStates
    expect(counts.symmetricMixture).toBe(0)
    expect(counts.target + counts.reversed + counts.otherPattern).toBe(0)
    expect(counts.spinGlass).toBeGreaterThanOrEqual(16)
  })

  it('at T > 0 count the target exactly as success, and keep the last sweep apart', () => {
    // Curie–Weiss retrieval (AGS 1985; CHECK_VALUES §3): m(0.6) = 0.90733 at α → 0, so with a
    // success threshold of 0.85 every trial both succeeds and ends at the target. The
    // time-averaged energy per neuron is −⟨m²⟩/2 + α/2 (CHECK_VALUES conventions; P = 1 here,
    // so α/2 = 1/(2N)); ⟨m²⟩ ≥ ⟨m⟩², and the thermal spread adds at most 0.01 at N = 1000.
    const p = pointParams({
      neurons: 1000,
      patterns: 1,
      successThreshold: 0.85,
      cue: { kind: 'flip', fraction: 0.05 },
      dynamics: { update: 'async-random', temperature: 0.6, maxSweeps: 60, burnIn: 20 },
      measures: quiet
    })
    const trials = runTrials(p, 10, 63)
    const summary = aggregatePoint(p, trials)
    expect(summary.endStates.target).toBe(summary.success.count)
    expect(summary.success.count).toBe(10)
    expect(summary.endStateShares!.target).toBeGreaterThan(0.8)
    expect(summary.finalEndStates!.target + summary.finalEndStates!.partialTarget).toBe(10)
    for (const t of trials) {
      const energyOfMean = -t.overlap * t.overlap / 2 + 1 / 2000
      expect(t.energy).toBeLessThanOrEqual(energyOfMean + 1e-12)
      expect(t.energy).toBeGreaterThan(energyOfMean - 0.01)
      expect(t.finalEnergy).toBeDefined()
    }
  })

  it('count target and success alike whatever the threshold, at T = 0 and T > 0', () => {
    // Our definition: the pattern level is the success threshold (spec format 2).
    for (const [temperature, threshold] of [[0, 0.95], [0, 0.6], [0.4, 0.9], [0.4, 0.7]] as const) {
      const p = pointParams({
        neurons: 300,
        patterns: 36,
        successThreshold: threshold,
        cue: { kind: 'flip', fraction: 0.25 },
        dynamics: { update: 'async-random', temperature, maxSweeps: 20, burnIn: 5 },
        measures: quiet
      })
      const summary = aggregatePoint(p, runTrials(p, 30, 64))
      expect(summary.endStates.target).toBe(summary.success.count)
    }
  })

  it('keep the format-1 pattern level when a point sets it', () => {
    const base = pointParams({ neurons: 300, patterns: 30, successThreshold: 0.5, cue: { kind: 'flip', fraction: 0.3 }, measures: quiet })
    const format2 = runTrials(base, 20, 65)
    const format1 = runTrials({ ...base, patternLevel: 0.9 }, 20, 65)
    // Same trials (the level is output only), classified at 0.9 instead of 0.5.
    expect(format1.map((t) => t.overlap)).toEqual(format2.map((t) => t.overlap))
    format1.forEach((t, k) => {
      expect(t.endState === 'target').toBe(t.overlap >= 0.9)
      expect(format2[k]!.endState === 'target').toBe(t.overlap >= 0.5)
    })
  })
})

describe('the pattern level of a point', () => {
  it('is checked like the success threshold', () => {
    expect(() => createPointRunner(pointParams({ patternLevel: 1.5 }), 1, 0)).toThrow(/patternLevel/)
  })
})
