import { describe, it, expect } from 'vitest'
import fc from 'fast-check'
import { SplitMix64, Xoshiro256StarStar, SeedrandomSource, openStream, streamKey } from '../../src/engine/index.js'
import { mulHigh64 } from '../../src/engine/random/source.js'

const asBig = (w: Uint32Array): bigint => (BigInt(w[1]!) << 32n) | BigInt(w[0]!)

describe('SplitMix64', () => {
  it('matches the published reference sequence for seed 1234567', () => {
    // Reference: Vigna's splitmix64.c (public domain); the five outputs for seed 1234567 are
    // the ones listed in the Rosetta Code task "Pseudo-random numbers/Splitmix64" (recalled
    // from memory) and reproduced by test/engine/fixtures/c/xoshiro_reference.c.
    const g = new SplitMix64(1234567n)
    const got = Array.from({ length: 5 }, () => g.next())
    expect(got).toEqual([6457827717110365317n, 3203168211198807973n, 9817491932198370423n, 4593380528125082431n, 16408922859458223821n])
  })
})

describe('xoshiro256**', () => {
  it('matches the reference C algorithm (Blackman & Vigna 2021) bit for bit', () => {
    // Values printed by test/engine/fixtures/c/xoshiro_reference.c (transcribed reference code).
    const r = Xoshiro256StarStar.fromSeed(1n)
    const got = Array.from({ length: 5 }, () => { r.next64(); return asBig(r.word) })
    expect(got).toEqual([12966619160104079557n, 9600361134598540522n, 10590380919521690900n, 7218738570589545383n, 12860671823995680371n])
    expect([r.below(999983), r.below(999983), r.below(999983)]).toEqual([143569, 71044, 381177])
    expect([r.below(4000000000), r.below(4000000000), r.below(4000000000)]).toEqual([3468609939, 2206839453, 3730289768])
  })

  it('computes the high word of x·n exactly for any 64-bit x and n < 2^32', () => {
    fc.assert(fc.property(fc.bigInt({ min: 0n, max: (1n << 64n) - 1n }), fc.integer({ min: 1, max: 0xffffffff }), (x, n) => {
      const expected = Number((x * BigInt(n)) >> 64n)
      expect(mulHigh64(Number(x >> 32n), Number(x & 0xffffffffn), n)).toBe(expected)
    }), { numRuns: 2000 })
  })

  it('gives uniform doubles in [0, 1) with the right mean and variance', () => {
    // Uniform(0,1): mean 1/2, variance 1/12; n = 2e5 draws, tolerance 5 standard errors.
    const r = Xoshiro256StarStar.fromSeed(99n)
    const n = 200000
    let s = 0; let ss = 0; let min = 1; let max = 0
    for (let i = 0; i < n; i++) { const u = r.uniform(); s += u; ss += u * u; min = Math.min(min, u); max = Math.max(max, u) }
    expect(min).toBeGreaterThanOrEqual(0)
    expect(max).toBeLessThan(1)
    expect(Math.abs(s / n - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / n))
    expect(Math.abs(ss / n - s * s / n / n - 1 / 12)).toBeLessThan(0.002)
  })
})

describe('stream derivation', () => {
  it('keys streams by (seed, domain, point, index) and nothing else', () => {
    expect(streamKey(7, 'trial', 3, 11)).toBe(streamKey(7, 'trial', 3, 11))
    const keys = new Set([
      streamKey(7, 'trial', 3, 11), streamKey(7, 'trial', 3, 12), streamKey(7, 'trial', 4, 11),
      streamKey(8, 'trial', 3, 11), streamKey(7, 'network', 3, 11)
    ])
    expect(keys.size).toBe(5)
    const a = openStream(7, 'trial', 3, 11)
    const b = openStream(7, 'trial', 3, 11)
    for (let i = 0; i < 10; i++) expect(a.uniform()).toBe(b.uniform())
  })

  it('neighbouring streams are uncorrelated', () => {
    // Pearson correlation of 1e4 paired uniforms from adjacent trial streams; |r| < 4/√n.
    const n = 10000
    const a = openStream(1, 'trial', 0, 0)
    const b = openStream(1, 'trial', 0, 1)
    let sa = 0; let sb = 0; let sab = 0; let saa = 0; let sbb = 0
    for (let i = 0; i < n; i++) { const x = a.uniform(); const y = b.uniform(); sa += x; sb += y; sab += x * y; saa += x * x; sbb += y * y }
    const r = (sab - sa * sb / n) / Math.sqrt((saa - sa * sa / n) * (sbb - sb * sb / n))
    expect(Math.abs(r)).toBeLessThan(4 / Math.sqrt(n))
  })

  it('accepts an injected seedrandom generator through the same interface', () => {
    const s1 = new SeedrandomSource('room-7')
    const s2 = new SeedrandomSource('room-7')
    const draws = Array.from({ length: 5 }, () => s1.below(1000))
    expect(Array.from({ length: 5 }, () => s2.below(1000))).toEqual(draws)
    expect(s1.algorithm).toBe('seedrandom-3.0.5/alea')
  })
})
