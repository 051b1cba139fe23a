import { SplitMix64 } from './splitmix64.js'
import { mulHigh64, toUnitInterval, type RandomSource } from './source.js'

/**
 * xoshiro256** 1.0 (Blackman & Vigna, "Scrambled linear pseudorandom number generators",
 * ACM TOMS 47(4), 2021), seeded by filling its four state words with four successive
 * SplitMix64 outputs, as the authors recommend.
 *
 * ## Method
 * The 64-bit state words live as 32-bit halves in an Int32Array, so every step is int32
 * arithmetic with no BigInt and no boxed numbers: result = rotl(s1·5, 7)·9, then the
 * xor/shift/rotate state transition of the reference code.
 *
 * @example
 * const r = Xoshiro256StarStar.fromSeed(1n); r.next64(); // r.word = [low, high] of the first output
 */
export class Xoshiro256StarStar implements RandomSource {
  readonly algorithm = 'xoshiro256**-1.0/splitmix64-seeded'
  readonly word = new Uint32Array(2)
  // [s0h, s0l, s1h, s1l, s2h, s2l, s3h, s3l]
  private readonly s = new Int32Array(8)

  /**
   * The live state words [s0 high, s0 low, s1 high, …, s3 low], shared, not copied: native
   * kernels advance the same stream in place, so the JS and kernel draws stay one sequence.
   */
  get stateWords (): Int32Array {
    return this.s
  }

  static fromSeed (seed: bigint): Xoshiro256StarStar {
    const sm = new SplitMix64(seed)
    const r = new Xoshiro256StarStar()
    r.setState([sm.next(), sm.next(), sm.next(), sm.next()])
    return r
  }

  setState (words: readonly bigint[]): void {
    if (words.length !== 4 || words.every((w) => w === 0n)) throw new RangeError(`invalid argument. xoshiro256** needs four words, not all zero. Value: [${words.join(', ')}].`)
    for (let k = 0; k < 4; k++) {
      const w = words[k]!
      this.s[2 * k] = Number((w >> 32n) & 0xffffffffn) | 0
      this.s[2 * k + 1] = Number(w & 0xffffffffn) | 0
    }
  }

  next64 (): void {
    const s = this.s
    const s1h = s[2]!
    const s1l = s[3]!
    // x = s1·5 = (s1 << 2) + s1 (mod 2^64); carry out of the low half by unsigned compare
    let xl = ((s1l << 2) + s1l) | 0
    let xh = ((s1h << 2) | (s1l >>> 30)) + s1h + ((xl >>> 0) < (s1l >>> 0) ? 1 : 0) | 0
    // y = rotl(x, 7)
    const yh = (xh << 7) | (xl >>> 25)
    const yl = (xl << 7) | (xh >>> 25)
    // result = y·9 = (y << 3) + y
    xl = ((yl << 3) + yl) | 0
    xh = ((yh << 3) | (yl >>> 29)) + yh + ((xl >>> 0) < (yl >>> 0) ? 1 : 0) | 0
    this.word[0] = xl
    this.word[1] = xh
    // t = s1 << 17
    const th = (s1h << 17) | (s1l >>> 15)
    const tl = s1l << 17
    const s2h = s[4]! ^ s[0]!
    const s2l = s[5]! ^ s[1]!
    const s3h = s[6]! ^ s1h
    const s3l = s[7]! ^ s1l
    s[2] = s1h ^ s2h
    s[3] = s1l ^ s2l
    s[0] = s[0]! ^ s3h
    s[1] = s[1]! ^ s3l
    s[4] = s2h ^ th
    s[5] = s2l ^ tl
    // s3 = rotl(s3, 45) = rotl(halves swapped, 13)
    s[6] = (s3l << 13) | (s3h >>> 19)
    s[7] = (s3h << 13) | (s3l >>> 19)
  }

  below (n: number): number {
    this.next64()
    return mulHigh64(this.word[1]!, this.word[0]!, n)
  }

  uniform (): number {
    this.next64()
    return toUnitInterval(this.word[1]!, this.word[0]!)
  }
}
