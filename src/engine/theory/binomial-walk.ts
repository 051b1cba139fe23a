import binomialCdf from '@stdlib/stats-base-dists-binomial-cdf'
import binomialPmf from '@stdlib/stats-base-dists-binomial-pmf'

export interface SignProbabilities {
  /** P[offset + B < 0] */
  below: number
  /** P[offset + B = 0] */
  tie: number
}

/**
 * Sign of offset + B, where B is a sum of `steps` independent ±1 terms, each ±1 with
 * probability ½ (a simple random walk after `steps` steps).
 *
 * ## Method
 * B = 2K − steps with K ~ Binomial(steps, ½), so offset + B < 0 exactly when
 * K < t = (steps − offset)/2. If t is an integer, below = P[K ≤ t − 1] and tie = P[K = t];
 * otherwise the walk cannot hit −offset (wrong parity), below = P[K ≤ ⌊t⌋] and tie = 0.
 * The CDF and PMF come from stdlib, which evaluate the regularised incomplete beta and
 * a saddle-point PMF, both accurate far into the tails and for steps of 10⁷ and more.
 *
 * @example
 * walkSign(99, 891) // one stored bit, N = 100, P = 10, J_ii = 0
 * // returns { below: ~3.99e-4, tie: ~1.09e-4 }
 */
export function walkSign (offset: number, steps: number): SignProbabilities {
  if (steps === 0) return { below: offset < 0 ? 1 : 0, tie: offset === 0 ? 1 : 0 }
  const t = (steps - offset) / 2
  if (Number.isInteger(t)) {
    return { below: binomialCdf(t - 1, steps, 0.5), tie: binomialPmf(t, steps, 0.5) }
  }
  return { below: binomialCdf(Math.floor(t), steps, 0.5), tie: 0 }
}
