import type { MeanWithError } from '../results.js'

/**
 * Sample mean, sample standard deviation (n − 1 in the denominator) and standard error of
 * the mean, sd/√n.
 *
 * ## Method
 * Two passes, each summing in index order, so the same values in the same order give
 * bit-identical results however the trials were scheduled. The second pass sums squared
 * deviations from the mean rather than using Σx² − n·mean², which cancels badly when the
 * spread is small next to the mean (overlaps near 1).
 *
 * ## Special cases
 * - n = 0: every field is NaN (there is nothing to estimate).
 * - n = 1: sd = se = 0 (a single value shows no spread; callers that need to know use n).
 * - Any NaN or ±Infinity among the values propagates.
 *
 * @example
 * meanWithError([0.9, 1, 0.95])
 * // returns { mean: 0.95, sd: 0.05, se: ~0.0289 }
 */
export function meanWithError (values: ArrayLike<number>): MeanWithError {
  const n = values.length
  if (n === 0) return { mean: NaN, sd: NaN, se: NaN }
  let sum = 0
  for (let i = 0; i < n; i++) sum += values[i] as number
  const mean = sum / n
  if (n === 1) return { mean, sd: 0, se: 0 }
  let squares = 0
  for (let i = 0; i < n; i++) {
    const deviation = (values[i] as number) - mean
    squares += deviation * deviation
  }
  const sd = Math.sqrt(squares / (n - 1))
  return { mean, sd, se: sd / Math.sqrt(n) }
}
