import { describe, it, expect } from 'vitest'
import { generatePatterns, summarizePatternOverlaps, Xoshiro256StarStar } from '../../src/engine/index.js'
import { pointParams } from '../helpers/point.js'

describe('random patterns', () => {
  it('independent unbiased patterns have overlap mean 0 and variance 1/N', () => {
    // Elementary binomial fact (CHECK_VALUES §12): N(1+m)/2 ~ Bin(N, ½), so E m = 0 and
    // Var m = 1/N exactly, E m⁴ = (3N − 2)/N³. With K = P(P−1)/2 pairs (weakly dependent,
    // pairwise independent), the sample mean has SE √(1/(N·K)) and the sample variance SE
    // ≈ √((E m⁴ − 1/N²)/K). Tolerance: 5 standard errors.
    const n = 200
    const count = 120
    const p = pointParams({ neurons: n, patterns: count })
    const patterns = generatePatterns(p, Xoshiro256StarStar.fromSeed(5n))
    const s = summarizePatternOverlaps(patterns, n, count)
    const k = s.pairs
    expect(k).toBe(count * (count - 1) / 2)
    expect(Math.abs(s.mean)).toBeLessThan(5 * Math.sqrt(1 / (n * k)))
    const fourth = (3 * n - 2) / n ** 3
    const varianceSe = Math.sqrt((fourth - 1 / n ** 2) / k)
    expect(Math.abs(s.sd * s.sd - 1 / n)).toBeLessThan(5 * varianceSe)
  })

  it('biased patterns have the requested activity', () => {
    // Bernoulli(a) entries: fraction of +1 within 5 binomial SE of a.
    const a = 0.1
    const p = pointParams({ neurons: 1000, patterns: 50, family: { kind: 'random', activity: a } })
    const patterns = generatePatterns(p, Xoshiro256StarStar.fromSeed(6n))
    let active = 0
    for (const v of patterns) if (v === 1) active++
    const nBits = patterns.length
    expect(Math.abs(active / nBits - a)).toBeLessThan(5 * Math.sqrt(a * (1 - a) / nBits))
  })

  it('correlated descendants overlap their parent by the requested amount', () => {
    // Each entry is redrawn with probability 1 − q, so E[child·parent]/N = q (by construction;
    // the hierarchical families of common practice). Two children of one parent: q².
    const q = 0.6
    const n = 2000
    const p = pointParams({ neurons: n, patterns: 4, family: { kind: 'correlated', parents: 2, parentOverlap: q } })
    const x = generatePatterns(p, Xoshiro256StarStar.fromSeed(7n))
    const overlap = (a: number, b: number): number => { let s = 0; for (let i = 0; i < n; i++) s += x[a * n + i]! * x[b * n + i]!; return s / n }
    // patterns 0 and 2 share parent 0; 1 and 3 share parent 1; 0 and 1 are unrelated.
    expect(overlap(0, 2)).toBeGreaterThan(q * q - 5 / Math.sqrt(n))
    expect(overlap(0, 2)).toBeLessThan(q * q + 5 / Math.sqrt(n))
    expect(Math.abs(overlap(0, 1))).toBeLessThan(5 / Math.sqrt(n))
  })

  it('supplied binary patterns map 1 → +1 and 0 → −1', () => {
    const p = pointParams({ neurons: 3, patterns: 2, coding: 'binary', family: { kind: 'supplied', data: [[1, 0, 1], [0, 0, 1]] } })
    expect(Array.from(generatePatterns(p, Xoshiro256StarStar.fromSeed(1n)))).toEqual([1, -1, 1, -1, -1, 1])
  })
})
