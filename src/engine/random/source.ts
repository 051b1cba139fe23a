/**
 * The engine's only source of randomness. Every stochastic step draws from an instance
 * passed in by the caller, so tests can inject any generator and any subset of trials
 * re-runs identically.
 */
export interface RandomSource {
  /**
   * Advance by one 64-bit output and write it to `word`: word[0] the low, word[1] the high
   * unsigned 32-bit half. (A typed array, not two number fields: V8 would box uint32
   * values above 2^31 stored in object fields, one allocation per draw.)
   */
  next64 (): void
  readonly word: Uint32Array
  /** Uniform integer in [0, n), n ≤ 2^32: the high word of the 128-bit product next64()·n. */
  below (n: number): number
  /** Uniform double in [0, 1) with 53 random bits (the top 53 bits of next64()). */
  uniform (): number
  /** Name and version of the generator, recorded in result provenance. */
  readonly algorithm: string
}

const TWO_32 = 4294967296
const TWO_21 = 2097152

/** floor(x·n / 2^64) for x = hi·2^32 + lo, exact for every n < 2^32. */
export function mulHigh64 (hi: number, lo: number, n: number): number {
  if (n <= TWO_21) {
    // hi·n and lo·n stay below 2^53, so every step is exact in doubles.
    return Math.floor((hi * n + Math.floor((lo * n) / TWO_32)) / TWO_32)
  }
  const n1 = Math.floor(n / 65536)
  const n0 = n % 65536
  const a = lo * n1
  const b = lo * n0
  const aHigh = Math.floor(a / 65536)
  const carry = aHigh + Math.floor(((a - aHigh * 65536) * 65536 + b) / TWO_32)
  const c = hi * n1
  const d = hi * n0
  const cHigh = Math.floor(c / 65536)
  return cHigh + Math.floor(((c - cHigh * 65536) * 65536 + d + carry) / TWO_32)
}

/** Top 53 bits of a 64-bit word as a double in [0, 1). */
export function toUnitInterval (hi: number, lo: number): number {
  return (hi * 2097152 + (lo >>> 11)) / 9007199254740992
}
