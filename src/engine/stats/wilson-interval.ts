import normalQuantile from '@stdlib/stats-base-dists-normal-quantile'
import { EngineInputError } from '../errors.js'

export interface RateInterval {
  low: number
  high: number
}

/**
 * Wilson score interval for a binomial success rate (Wilson, JASA 22, 209 (1927)).
 *
 * With p̂ = k/n and z the two-sided normal quantile Φ⁻¹(1 − (1 − c)/2):
 *
 *   centre = (p̂ + z²/2n) / (1 + z²/n)
 *   half   = z / (1 + z²/n) · √( p̂(1 − p̂)/n + z²/4n² )
 *
 * Unlike the Wald interval p̂ ± z√(p̂(1−p̂)/n) it never collapses to zero width at k = 0
 * or k = n, which is exactly where success rates of a sweep often sit (every trial
 * recalled, or none).
 *
 * ## Special cases
 * - k = 0 gives low = 0 exactly, k = n gives high = 1 exactly (rounding would otherwise
 *   leave ±1e-17).
 * - n = 0 gives [0, 1]: no trials, no information.
 *
 * @throws {EngineInputError} when n or k is not a non-negative integer, k > n, or the
 *   confidence is not strictly between 0 and 1.
 *
 * @example
 * wilsonInterval(8, 10)
 * // returns { low: ~0.4902, high: ~0.9433 }
 */
export function wilsonInterval (successes: number, n: number, confidence = 0.95): RateInterval {
  if (!Number.isInteger(n) || n < 0) throw new EngineInputError('n', n, 'must be a non-negative integer.')
  if (!Number.isInteger(successes) || successes < 0 || successes > n) {
    throw new EngineInputError('successes', successes, `must be an integer in [0, ${n}].`)
  }
  if (!(confidence > 0 && confidence < 1)) {
    throw new EngineInputError('confidence', confidence, 'must lie strictly between 0 and 1.')
  }
  if (n === 0) return { low: 0, high: 1 }
  const z = normalQuantile(1 - (1 - confidence) / 2, 0, 1)
  const z2n = (z * z) / n
  const rate = successes / n
  const scale = 1 + z2n
  const centre = (rate + z2n / 2) / scale
  const half = (z / scale) * Math.sqrt(rate * (1 - rate) / n + z2n / (4 * n))
  return {
    low: successes === 0 ? 0 : Math.max(0, centre - half),
    high: successes === n ? 1 : Math.min(1, centre + half)
  }
}
