/**
 * SplitMix64 (Steele, Lea & Flood, OOPSLA 2014; constants as in Vigna's public-domain
 * reference splitmix64.c). Used only to expand seeds, so BigInt's cost is paid once per
 * stream, never per draw.
 */
const MASK64 = (1n << 64n) - 1n
const GOLDEN_GAMMA = 0x9e3779b97f4a7c15n

/** The finaliser (mix) of SplitMix64: a bijection on 64-bit words with full avalanche. */
export function mix64 (z: bigint): bigint {
  z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK64
  z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK64
  return z ^ (z >> 31n)
}

/** A SplitMix64 generator: `next()` returns the same sequence as the reference C code. */
export class SplitMix64 {
  private x: bigint
  constructor (seed: bigint) {
    this.x = seed & MASK64
  }

  next (): bigint {
    this.x = (this.x + GOLDEN_GAMMA) & MASK64
    return mix64(this.x)
  }
}

export { MASK64 }
