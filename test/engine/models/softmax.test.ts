import { describe, it, expect } from 'vitest'
import fc from 'fast-check'
import { createPointRunner, generatePatterns, Xoshiro256StarStar } from '../../../src/engine/index.js'
import { SoftmaxMemory } from '../../../src/engine/models/softmax/memory.js'
import { softmaxErrorBound, softmaxSeparationThreshold } from '../../../src/engine/theory/index.js'
import { pointParams } from '../../helpers/point.js'

const quiet = { overlapTrajectory: false, energyTrajectory: false, stability: false }

function randomMemory (d: number, count: number, beta: number, seed: number): SoftmaxMemory {
  const p = pointParams({ neurons: d, patterns: count, rule: { kind: 'modern-softmax', beta } })
  return new SoftmaxMemory(generatePatterns(p, Xoshiro256StarStar.fromSeed(BigInt(seed))), d, count, beta)
}

function distance (a: Float64Array, b: Float64Array): number {
  let s = 0
  for (let i = 0; i < a.length; i++) s += (a[i]! - b[i]!) ** 2
  return Math.sqrt(s)
}

/** x_iᵀξ − max_{j≠i} x_jᵀξ. */
function gapOf (mem: SoftmaxMemory, state: Float64Array, i: number): number {
  const overlaps = new Float64Array(mem.patternCount)
  mem.overlaps(state, overlaps)
  let other = -Infinity
  for (let j = 0; j < mem.patternCount; j++) if (j !== i && overlaps[j]! > other) other = overlaps[j]!
  return overlaps[i]! - other
}

function unitPattern (mem: SoftmaxMemory, i: number): Float64Array {
  const d = mem.dimension
  return Float64Array.from({ length: d }, (_, k) => mem.patterns[i * d + k]! / Math.sqrt(d))
}

describe('modern continuous Hopfield network (Ramsauer et al., ICLR 2021)', () => {
  it('computes ξ ← X softmax(β Xᵀξ) and the energy as defined, at any β without overflow', () => {
    // Definitions of Ramsauer et al. (arXiv:2008.02217; energy recalled from memory, CHECK_VALUES
    // §6) evaluated naively in a small case and compared; then β = 1e6 stays finite.
    const mem = randomMemory(6, 4, 1.7, 1)
    const xi = Float64Array.from([0.3, -0.2, 0.5, 0.1, -0.4, 0.2])
    const x = [0, 1, 2, 3].map((mu) => unitPattern(mem, mu))
    const scores = x.map((v) => 1.7 * v.reduce((s, xv, k) => s + xv * xi[k]!, 0))
    const z = scores.reduce((s, a) => s + Math.exp(a), 0)
    const expected = Array.from({ length: 6 }, (_, k) => x.reduce((s, v, mu) => s + v[k]! * Math.exp(scores[mu]!) / z, 0))
    const out = new Float64Array(6)
    mem.update(xi, out)
    for (let k = 0; k < 6; k++) expect(out[k]!).toBeCloseTo(expected[k]!, 14)
    const energy = -Math.log(z) / 1.7 + 0.5 * xi.reduce((s, v) => s + v * v, 0) + Math.log(4) / 1.7 + 0.5
    expect(mem.energy(xi)).toBeCloseTo(energy, 13)
    const sharp = randomMemory(6, 4, 1e6, 1)
    sharp.update(xi, out)
    expect(out.every(Number.isFinite)).toBe(true)
    expect(Number.isFinite(sharp.energy(xi))).toBe(true)
  })

  it('energy never increases along the iteration (property)', () => {
    // Ramsauer et al. 2021: the update is a concave–convex procedure on E, so E(ξ_{t+1}) ≤ E(ξ_t)
    // from any start (CHECK_VALUES §6 [C], §11). Tolerance 1e-12 (floating point).
    const cases = fc.record({
      d: fc.integer({ min: 2, max: 40 }),
      count: fc.integer({ min: 1, max: 50 }),
      beta: fc.double({ min: 0.05, max: 60, noNaN: true }),
      seed: fc.integer({ min: 0, max: 2 ** 31 }),
      start: fc.array(fc.double({ min: -2, max: 2, noNaN: true }), { minLength: 40, maxLength: 40 })
    })
    fc.assert(fc.property(cases, ({ d, count, beta, seed, start }) => {
      const mem = randomMemory(d, count, beta, seed)
      let xi = Float64Array.from(start.slice(0, d))
      let next = new Float64Array(d)
      let energy = mem.energy(xi)
      for (let t = 0; t < 25; t++) {
        mem.update(xi, next)
        const after = mem.energy(next)
        expect(after).toBeLessThanOrEqual(energy + 1e-12 * Math.max(1, Math.abs(energy)))
        energy = after
        const swap = xi
        xi = next
        next = swap
      }
    }), { numRuns: 150 })
  })

  it('one update obeys ‖f(ξ) − x_i‖ ≤ 2M·min(1, (P − 1)e^{−βΔ̃}) for any cue (property)', () => {
    // Elementary bound, derived in CHECK_VALUES §6 [D]; M = 1 for unit patterns.
    const cases = fc.record({
      d: fc.integer({ min: 4, max: 64 }),
      count: fc.integer({ min: 2, max: 60 }),
      beta: fc.double({ min: 0.5, max: 80, noNaN: true }),
      seed: fc.integer({ min: 0, max: 2 ** 31 }),
      flips: fc.integer({ min: 0, max: 20 })
    })
    fc.assert(fc.property(cases, ({ d, count, beta, seed, flips }) => {
      const mem = randomMemory(d, count, beta, seed)
      const target = seed % count
      const xi = unitPattern(mem, target)
      for (let k = 0; k < Math.min(flips, d); k++) xi[(k * 7) % d] = -xi[(k * 7) % d]!
      const out = new Float64Array(d)
      mem.update(xi, out)
      const bound = softmaxErrorBound(gapOf(mem, xi, target), count, beta)
      expect(distance(out, unitPattern(mem, target))).toBeLessThanOrEqual(bound * (1 + 1e-9) + 1e-15)
    }), { numRuns: 200 })
  })

  it('retrieves in one update when the separation condition holds (d = 64, P = 200, β = 32), not at β = 8', () => {
    // Ramsauer et al. 2021 (condition recalled from memory, CHECK_VALUES §6): Δ_i ≥ 2/(βP) +
    // β⁻¹ ln(2(P−1)PβM²) = 0.461 at β = 32 and 1.67 at β = 8. CHECK_VALUES gives a Monte-Carlo
    // reference (not a published number) of error 1.4e-7 ≤ bound 4.7e-5 at β = 32 (Δ = 0.594) and
    // an error of 0.07 at β = 8. We start on each stored pattern (Δ̃ = Δ_i).
    expect(softmaxSeparationThreshold(200, 32)).toBeCloseTo(0.461, 3)
    expect(softmaxSeparationThreshold(200, 8)).toBeCloseTo(1.67, 2)
    const errors = (beta: number): { worst: number, worstAny: number, separated: number, worstBoundRatio: number } => {
      const mem = randomMemory(64, 200, beta, 11)
      const out = new Float64Array(64)
      let worst = 0
      let worstAny = 0
      let separated = 0
      let worstBoundRatio = 0
      for (let i = 0; i < 200; i++) {
        const x = unitPattern(mem, i)
        mem.update(x, out)
        const error = distance(out, x)
        const gap = gapOf(mem, x, i)
        worstAny = Math.max(worstAny, error)
        worstBoundRatio = Math.max(worstBoundRatio, error / softmaxErrorBound(gap, 200, beta))
        if (gap < softmaxSeparationThreshold(200, beta)) continue
        separated++
        worst = Math.max(worst, error)
      }
      return { worst, worstAny, separated, worstBoundRatio }
    }
    // Random patterns at d = 64 overlap by at most ≈ 0.5, so nearly all are separated at β = 32;
    // every separated one is retrieved with an error far below the Monte-Carlo bound value.
    const sharp = errors(32)
    expect(sharp.separated).toBeGreaterThanOrEqual(190)
    expect(sharp.worst).toBeLessThan(4.7e-5)
    expect(sharp.worst).toBeGreaterThan(1e-9)
    expect(sharp.worstBoundRatio).toBeLessThanOrEqual(1)
    const soft = errors(8)
    expect(soft.separated).toBe(0)
    expect(soft.worstAny).toBeGreaterThan(0.01)
    expect(soft.worstBoundRatio).toBeLessThanOrEqual(1)
  })

  it('runs trials through the point runner: cue, convergence, overlaps, trajectories', () => {
    // A flip cue with 6 of 64 bits wrong starts at m₀ = 1 − 12/64; at β = 32 the network lands
    // on the pattern (random patterns at d = 64 are nearly all separated, Δ ≈ 0.5 ≥ 0.461)
    // within a few updates;
    // at β = 8 it falls to the global average of the patterns (overlap ≈ 0), which Ramsauer et
    // al. describe as the metastable state of small β.
    const p = pointParams({ neurons: 64, patterns: 200, rule: { kind: 'modern-softmax', beta: 32 }, cue: { kind: 'flip', fraction: 0.1 }, measures: { overlapTrajectory: true, energyTrajectory: true, stability: true }, trialsPerNetwork: 10 })
    const runner = createPointRunner(p, 4, 0)
    expect(runner.representation).toBe('softmax-continuous')
    for (let t = 0; t < 10; t++) {
      const r = runner.runTrial(t)
      expect(r.initialOverlap).toBeCloseTo(1 - 12 / 64, 14)
      expect(r.ending).toBe('fixed')
      expect(r.sweeps).toBeLessThanOrEqual(4)
      expect(r.overlap).toBeGreaterThan(1 - 1e-6)
      expect(r.endState).toBe('target')
      expect(r.overlapTrajectory).toHaveLength(r.sweeps)
      for (let k = 1; k < r.energyTrajectory!.length; k++) expect(r.energyTrajectory![k]!).toBeLessThanOrEqual(r.energyTrajectory![k - 1]! + 1e-12)
      if (t === 0) expect(r.stability).toEqual({ unstableFraction: 0, tieFraction: 0, fixedPatternFraction: 1 })
      else expect(r.stability).toBeUndefined()
    }
    expect(runner.fastPath).toBe('wasm-simd128-softmax')
    const soft = createPointRunner({ ...p, rule: { kind: 'modern-softmax', beta: 8 }, measures: quiet }, 4, 0).runTrial(0)
    expect(Math.abs(soft.overlap)).toBeLessThan(0.1)
    expect(soft.endState).toBe('spinGlass')
  })

  it('gives the same record for the same (seed, point, trial), whatever ran before', () => {
    const p = pointParams({ neurons: 32, patterns: 20, rule: { kind: 'modern-softmax', beta: 4 }, cue: { kind: 'erase', fraction: 0.3, fill: 'random' }, trialsPerNetwork: 3 })
    const a = createPointRunner(p, 9, 2)
    const first = [0, 1, 2, 3, 4].map((t) => a.runTrial(t))
    const b = createPointRunner(p, 9, 2)
    expect(b.runTrial(4)).toStrictEqual(first[4])
    expect(b.runTrial(1)).toStrictEqual(first[1])
  })
})
