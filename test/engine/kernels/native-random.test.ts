import { afterEach, describe, expect, it } from 'vitest'
import { Xoshiro256StarStar } from '../../../src/engine/index.js'
import { nativeMarkChosen, nativePartialShuffle, nativeShuffle, nativeUnbiasedRows, nativeUniforms } from '../../../src/engine/kernels/native-random.js'
import { fillUnbiased } from '../../../src/engine/patterns/generate.js'
import { setFastPathsEnabled } from '../../../src/engine/kernels/wasm.js'

afterEach(() => setFastPathsEnabled(true))

function jsShuffle (order: Int32Array, rng: Xoshiro256StarStar): void {
  for (let i = order.length - 1; i > 0; i--) {
    const j = rng.below(i + 1)
    const t = order[i]!
    order[i] = order[j]!
    order[j] = t
  }
}

/** The next few outputs, to show both generators were left in the same state. */
function nextWords (rng: Xoshiro256StarStar): number[] {
  const out: number[] = []
  for (let k = 0; k < 4; k++) {
    rng.next64()
    out.push(rng.word[0]!, rng.word[1]!)
  }
  return out
}

describe('native xoshiro256** draws continue the JavaScript stream exactly', () => {
  it('shuffles like the Fisher–Yates loop, leaving the same state and last output', () => {
    for (const n of [2, 3, 1000, 4097]) {
      const a = Xoshiro256StarStar.fromSeed(BigInt(n))
      const b = Xoshiro256StarStar.fromSeed(BigInt(n))
      const x = Int32Array.from({ length: n }, (_, i) => i)
      const y = x.slice()
      for (let sweep = 0; sweep < 3; sweep++) {
        expect(nativeShuffle(x, a)).toBe(true)
        jsShuffle(y, b)
      }
      expect(x).toStrictEqual(y)
      expect(Array.from(a.word)).toStrictEqual(Array.from(b.word))
      expect(nextWords(a)).toStrictEqual(nextWords(b))
    }
  })

  it('chooses cue bits like the partial Fisher–Yates loop, from any previous contents, leaving the same state', () => {
    for (const [n, count] of [[1, 0], [1, 1], [10, 10], [1000, 100], [4097, 409], [5, 0]] as const) {
      const a = Xoshiro256StarStar.fromSeed(BigInt(7 * n + count))
      const b = Xoshiro256StarStar.fromSeed(BigInt(7 * n + count))
      // Stale contents from an earlier trial: the kernel starts from the identity, as the loop does.
      const x = Int32Array.from({ length: n }, (_, i) => n - 1 - i)
      const y = new Int32Array(n)
      for (let trial = 0; trial < 3; trial++) {
        expect(nativePartialShuffle(x, count, a)).toBe(true)
        for (let i = 0; i < n; i++) y[i] = i
        for (let k = 0; k < count; k++) {
          const j = k + b.below(n - k)
          const t = y[j]!
          y[j] = y[k]!
          y[k] = t
        }
        expect(x).toStrictEqual(y)
      }
      expect(Array.from(a.word)).toStrictEqual(Array.from(b.word))
      expect(nextWords(a)).toStrictEqual(nextWords(b))
    }
  })

  it('flips or erases the chosen cue bits in place like the plain interleaved loop, leaving the same state', () => {
    for (const [n, count] of [[1, 0], [1, 1], [10, 10], [1000, 100], [4097, 409], [7, 3]] as const) {
      for (const erase of [false, true]) {
        const a = Xoshiro256StarStar.fromSeed(BigInt(5 * n + count))
        const b = Xoshiro256StarStar.fromSeed(BigInt(5 * n + count))
        for (let trial = 0; trial < 3; trial++) {
          const start = Int8Array.from({ length: n }, (_, i) => ((i * 7 + trial) % 3 === 0 ? -1 : 1))
          const x = start.slice()
          expect(nativeMarkChosen(x, count, erase, a)).toBe(true)
          // The plain loop of dynamics/cue.ts.
          const y = start.slice()
          const idx = Int32Array.from({ length: n }, (_, i) => i)
          for (let k = 0; k < count; k++) {
            const j = k + b.below(n - k)
            const chosen = idx[j]!
            idx[j] = idx[k]!
            idx[k] = chosen
            y[chosen] = erase ? 0 : -y[chosen]!
          }
          expect(x).toStrictEqual(y)
        }
        expect(Array.from(a.word)).toStrictEqual(Array.from(b.word))
        expect(nextWords(a)).toStrictEqual(nextWords(b))
      }
    }
  })

  it('draws unbiased rows like the bit-by-bit fill, for sizes that are not multiples of 64', () => {
    for (const [n, count] of [[100, 7], [37, 3], [64, 2], [1, 5]] as const) {
      const a = Xoshiro256StarStar.fromSeed(11n)
      const b = Xoshiro256StarStar.fromSeed(11n)
      const x = new Int8Array(n * count + 5)
      const y = new Int8Array(n * count + 5)
      expect(nativeUnbiasedRows(x, 5, n, count, a)).toBe(true)
      for (let mu = 0; mu < count; mu++) fillUnbiased(y, 5 + mu * n, n, b)
      expect(x).toStrictEqual(y)
      expect(nextWords(a)).toStrictEqual(nextWords(b))
    }
  })

  it('draws uniforms like uniform(), leaving the same state and last output', () => {
    for (const count of [1, 7, 3000]) {
      const a = Xoshiro256StarStar.fromSeed(21n)
      const b = Xoshiro256StarStar.fromSeed(21n)
      const x = new Float64Array(count + 2).fill(-1)
      expect(nativeUniforms(x, count, a)).toBe(true)
      const y = new Float64Array(count + 2).fill(-1)
      for (let k = 0; k < count; k++) y[k] = b.uniform()
      expect(x).toStrictEqual(y)
      expect(nextWords(a)).toStrictEqual(nextWords(b))
    }
  })

  it('declines when the fast paths are switched off', () => {
    setFastPathsEnabled(false)
    expect(nativeShuffle(new Int32Array(4), Xoshiro256StarStar.fromSeed(1n))).toBe(false)
  })
})
