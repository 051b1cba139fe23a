import { describe, it, expect } from 'vitest'
import seedrandom from 'seedrandom'
import { firstParallelStep, firstParallelStepExact } from '../../../src/engine/theory/index.js'
import { meanWithError } from '../../../src/engine/stats/index.js'
import reference from './fixtures/reference.json' with { type: 'json' }

// ★ check 2 of CHECK_VALUES: the first parallel T = 0 update of a Hebbian network.
describe('firstParallelStep (N → ∞)', () => {
  it('reproduces m₁ = erf(m₀/√(2α)) with J_ii = 0', () => {
    // Gardner, Derrida & Mottishaw, J. Physique 48, 741 (1987) (attribution recalled from
    // memory [M]); values CHECK_VALUES §5a [C], 4 digits: tolerance 5e-5.
    const rows: Array<[number, number, number]> = [
      [0.1, 0.2, 0.4729], [0.1, 0.4, 0.7941], [0.1, 0.6, 0.9422], [0.1, 0.8, 0.9886],
      [0.05, 0.2, 0.6289], [0.05, 0.4, 0.9264]
    ]
    for (const [alpha, m0, m1] of rows) expect(Math.abs(firstParallelStep(m0, alpha) - m1)).toBeLessThanOrEqual(5e-5)
  })

  it('reproduces the J_ii = α formula', () => {
    // ½(1+m₀) erf((m₀+α)/√(2α)) + ½(1−m₀) erf((m₀−α)/√(2α)): CHECK_VALUES §5a [D][C].
    expect(Math.abs(firstParallelStep(0.2, 0.1, { selfCoupling: true }) - 0.4936)).toBeLessThanOrEqual(5e-5)
    expect(Math.abs(firstParallelStep(0.6, 0.1, { selfCoupling: true }) - 0.9557)).toBeLessThanOrEqual(5e-5)
  })

  it('agrees with the SciPy fixture (1e-14: same erf to rounding), is odd in m₀ and has the α → 0 limit sign(m₀)', () => {
    for (const row of reference.firstParallelStep) {
      const got = firstParallelStep(row.m0, row.alpha, { selfCoupling: row.selfCoupling })
      expect(Math.abs(got - row.expected)).toBeLessThan(1e-14)
      expect(firstParallelStep(-row.m0, row.alpha, { selfCoupling: row.selfCoupling })).toBe(-got)
    }
    expect(firstParallelStep(0.3, 0)).toBe(1)
    expect(firstParallelStep(0, 0)).toBe(0)
    expect(() => firstParallelStep(1.2, 0.1)).toThrow(/m0/)
  })
})

describe('firstParallelStepExact (finite N, exactly n_f flipped bits)', () => {
  it('reproduces the exact expectations with random tie-breaking', () => {
    // CHECK_VALUES §5a [D][C] (and [MC] 0.9466 ± 0.0027 at (1000, 100, 0.6)); printed to 5
    // digits: tolerance 1e-5.
    const rows: Array<[number, number, number, number]> = [
      [200, 20, 0.6, 0.94780], [1000, 100, 0.6, 0.94334], [1000, 100, 0.4, 0.79614],
      [1000, 138, 0.8, 0.96925], [2000, 276, 0.6, 0.89427]
    ]
    for (const [n, p, m0, m1] of rows) expect(Math.abs(firstParallelStepExact(n, p, m0) - m1)).toBeLessThanOrEqual(1e-5)
  })

  it('agrees with the SciPy fixture for both diagonals and both tie rules', () => {
    // scripts/fixtures/theory/generate.py, scipy.stats.binom; the two binomial
    // implementations differ by ~1e-12 here: tolerance 1e-10.
    for (const row of reference.firstParallelStepExact) {
      const ties = row.ties === 'keep' ? 'keep' : 'random'
      const got = firstParallelStepExact(row.neurons, row.patterns, row.m0, { selfCoupling: row.selfCoupling, ties })
      expect(Math.abs(got - row.expected)).toBeLessThan(1e-10)
    }
  })

  it('approaches the N → ∞ formula at fixed α and m₀', () => {
    // Finite-size gap shrinks with N (0.0056 at N = 200, 0.0011 at N = 1000 for α = 0.1).
    const limit = firstParallelStep(0.6, 0.1)
    const gaps = [200, 1000, 20000].map(n => Math.abs(firstParallelStepExact(n, n / 10, 0.6) - limit))
    expect(gaps[1]).toBeLessThan(gaps[0] as number)
    expect(gaps[2]).toBeLessThan(2e-4)
  })

  it('matches a direct simulation of one parallel step, for each tie rule and diagonal', () => {
    // Monte Carlo of the definition, independent of the binomial derivation: random ±1
    // patterns (seedrandom 'alea', fixed seed, 32 bits per draw), cue = pattern 0 with its first n_f bits
    // flipped (which bits does not matter, the patterns are exchangeable), integer fields
    // N h_i = Σ_μ ξ_i^μ (ξ^μ·s) − P s_i (+ P s_i with the diagonal kept). N = 50, P = 6
    // makes ties frequent (P[h = 0] ≈ 0.9 %), so the tie rule matters. Tolerance 4·SE of
    // the mean over runs (CHECK_VALUES §0, overlaps).
    const neurons = 50
    const patterns = 6
    const flipped = 10
    const runs = 12000
    const rng = seedrandom.alea('memsweep first parallel step')
    const xi = new Int8Array(patterns * neurons)
    const s = new Int8Array(neurons)
    const q = new Int32Array(patterns)
    const results = { random: [] as number[], keep: [] as number[], keepDiagonal: [] as number[] }
    for (let run = 0; run < runs; run++) {
      let word = 0
      for (let k = 0; k < xi.length; k++) {
        if (k % 32 === 0) word = rng.int32()
        xi[k] = ((word >>> (k % 32)) & 1) === 1 ? 1 : -1
      }
      for (let i = 0; i < neurons; i++) s[i] = (i < flipped ? -1 : 1) * (xi[i] as number)
      for (let mu = 0; mu < patterns; mu++) {
        let sum = 0
        for (let j = 0; j < neurons; j++) sum += (xi[mu * neurons + j] as number) * (s[j] as number)
        q[mu] = sum
      }
      let random = 0
      let keep = 0
      let keepDiagonal = 0
      for (let i = 0; i < neurons; i++) {
        let field = 0
        for (let mu = 0; mu < patterns; mu++) field += (xi[mu * neurons + i] as number) * (q[mu] as number)
        const target = xi[i] as number
        const before = target * (s[i] as number)
        const withoutDiagonal = field - patterns * (s[i] as number)
        // Random tie-break contributes 0 in expectation; use that conditional mean.
        random += Math.sign(withoutDiagonal) * target
        keep += withoutDiagonal === 0 ? before : Math.sign(withoutDiagonal) * target
        keepDiagonal += field === 0 ? before : Math.sign(field) * target
      }
      results.random.push(random / neurons)
      results.keep.push(keep / neurons)
      results.keepDiagonal.push(keepDiagonal / neurons)
    }
    const m0 = 1 - (2 * flipped) / neurons
    const exact = {
      random: firstParallelStepExact(neurons, patterns, m0),
      keep: firstParallelStepExact(neurons, patterns, m0, { ties: 'keep' }),
      keepDiagonal: firstParallelStepExact(neurons, patterns, m0, { ties: 'keep', selfCoupling: true })
    }
    for (const key of ['random', 'keep', 'keepDiagonal'] as const) {
      const { mean, se } = meanWithError(results[key])
      expect(Math.abs(mean - exact[key])).toBeLessThan(4 * se)
    }
    // The check can tell the tie rules apart: the exact gap is many standard errors wide.
    const { se } = meanWithError(results.keep)
    expect(Math.abs(exact.keep - exact.random)).toBeGreaterThan(8 * se)
  })

  it('rejects bad sizes and overlaps', () => {
    expect(() => firstParallelStepExact(0, 5, 0.5)).toThrow(/neurons/)
    expect(() => firstParallelStepExact(100, 5, -1.5)).toThrow(/m0/)
  })
})
