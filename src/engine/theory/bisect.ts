/**
 * Root of a continuous f on [lo, hi] by bisection, given that f(lo) and f(hi) have opposite
 * signs (or one of them is zero).
 *
 * ## Method
 * Halve the bracket until its midpoint is no longer strictly inside it in floating point,
 * i.e. to the last representable double. Slower than Brent's method but every theory curve
 * here needs at most a few hundred evaluations of erf or tanh, and bisection cannot
 * wander out of the bracket near the fold of the retrieval branch, where f is flat.
 * The step sequence depends on nothing but f, so results are bit-reproducible.
 *
 * @example
 * bisect(x => x * x - 2, 0, 2)
 * // returns ~1.4142135623730951
 */
export function bisect (f: (x: number) => number, lo: number, hi: number): number {
  const atLo = f(lo)
  if (atLo === 0) return lo
  const atHi = f(hi)
  if (atHi === 0) return hi
  if (Math.sign(atLo) === Math.sign(atHi) || Number.isNaN(atLo) || Number.isNaN(atHi)) {
    throw new RangeError(`invalid argument. bisect needs a sign change on [${lo}, ${hi}]; f = ${atLo}, ${atHi}.`)
  }
  const loSign = Math.sign(atLo)
  // 2100 halvings exhaust any bracket of doubles; the loop normally ends after ~55.
  for (let step = 0; step < 2100; step++) {
    const mid = lo + (hi - lo) / 2
    if (mid <= lo || mid >= hi) break
    const value = f(mid)
    if (value === 0) return mid
    if (Math.sign(value) === loSign) lo = mid
    else hi = mid
  }
  return lo + (hi - lo) / 2
}
