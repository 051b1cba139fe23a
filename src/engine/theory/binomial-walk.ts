import binomialCdf from '@stdlib/stats-base-dists-binomial-cdf'
import binomialPmf from '@stdlib/stats-base-dists-binomial-pmf'
import erfc from '@stdlib/math-base-special-erfc'

export interface SignProbabilities {
  /** P[offset + B < 0] */
  below: number
  /** P[offset + B = 0] */
  tie: number
}

/**
 * Up to this many steps the walk's law comes from stdlib's binomial CDF and PMF, accurate to
 * ~1e-10 there (checked against SciPy in test/engine/theory/fixtures). Beyond it stdlib's
 * incomplete beta loses accuracy (~1e-8 at 10⁹ steps) and near the median fails outright
 * (a CDF of −0.43 at 3·10¹⁰ steps), while the Edgeworth expansion below becomes exact to
 * rounding in the bulk.
 */
export const STDLIB_WALK_STEPS = 2 ** 24

/**
 * Sign of offset + B, where B is a sum of `steps` independent ±1 terms, each ±1 with
 * probability ½ (a simple random walk after `steps` steps).
 *
 * ## Method
 * B = 2K − steps with K ~ Binomial(steps, ½), so offset + B < 0 exactly when
 * K < t = (steps − offset)/2. If t is an integer, below = P[K ≤ t − 1] and tie = P[K = t];
 * otherwise the walk cannot hit −offset (wrong parity), below = P[K ≤ ⌊t⌋] and tie = 0.
 * Up to 2²⁴ steps the CDF and PMF come from stdlib (regularised incomplete beta and a
 * saddle-point PMF, accurate far into the tails). Beyond, the Edgeworth expansion of the
 * symmetric binomial to O(1/n), with the continuity correction (derived here; its O(1/n)
 * term was checked against exact summation at n = 2000 and 8000):
 *
 *   P[K ≤ k] ≈ Φ(x) + φ(x)(x³ − x)/(12n),            x = (k + ½ − n/2)/(√n/2),
 *   P[K = k] ≈ (2/√n) φ(x)[1 − (x⁴ − 6x² + 3)/(12n)],  x = (k − n/2)/(√n/2),
 *
 * whose error is O(n⁻²): below 1e-13 absolute for n ≥ 2²⁴; in the far tails the relative
 * error grows like x⁸/n² (1e-6 at 10 standard deviations).
 *
 * @example
 * walkSign(99, 891) // one stored bit, N = 100, P = 10, J_ii = 0
 * // returns { below: ~3.99e-4, tie: ~1.09e-4 }
 */
export function walkSign (offset: number, steps: number): SignProbabilities {
  if (steps === 0) return { below: offset < 0 ? 1 : 0, tie: offset === 0 ? 1 : 0 }
  const t = (steps - offset) / 2
  if (Number.isInteger(t)) return { below: t >= 1 ? symmetricBinomialCdf(t - 1, steps) : 0, tie: symmetricBinomialPmf(t, steps) }
  return { below: symmetricBinomialCdf(Math.floor(t), steps), tie: 0 }
}

/** P[K ≤ k] for K ~ Binomial(n, ½). */
export function symmetricBinomialCdf (k: number, n: number): number {
  if (k < 0) return 0
  if (k >= n) return 1
  if (n <= STDLIB_WALK_STEPS) return binomialCdf(k, n, 0.5)
  const x = (k + 0.5 - n / 2) / (Math.sqrt(n) / 2)
  // Φ(x) = ½ erfc(−x/√2) keeps full relative accuracy in the lower tail.
  const value = 0.5 * erfc(-x / Math.SQRT2) + normalDensity(x) * (x * x * x - x) / (12 * n)
  return Math.min(1, Math.max(0, value))
}

/** P[K = k] for K ~ Binomial(n, ½). */
export function symmetricBinomialPmf (k: number, n: number): number {
  if (k < 0 || k > n) return 0
  if (n <= STDLIB_WALK_STEPS) return binomialPmf(k, n, 0.5)
  const x = (k - n / 2) / (Math.sqrt(n) / 2)
  const x2 = x * x
  return Math.max(0, (2 / Math.sqrt(n)) * normalDensity(x) * (1 - (x2 * x2 - 6 * x2 + 3) / (12 * n)))
}

function normalDensity (x: number): number {
  return Math.exp(-0.5 * x * x) / Math.sqrt(2 * Math.PI)
}
