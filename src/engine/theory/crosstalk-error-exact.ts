import { walkSign, type SignProbabilities } from './binomial-walk.js'
import { checkCount } from './check-input.js'

/**
 * Exact probability, at finite N, that a stored bit of a stored pattern is unstable under
 * Hebbian couplings J_ij = (1/N) Σ_μ ξ_i^μ ξ_j^μ with unbiased random ±1 patterns:
 * `below` = P[ξ_i h_i < 0] (the bit flips) and `tie` = P[h_i = 0].
 *
 * ## Method
 * With the network on pattern 1,
 *
 *   N ξ_i h_i = (N − 1) + B,   B = Σ_{μ≥2} Σ_{j≠i} ξ_i^1 ξ_i^μ ξ_j^μ ξ_j^1,
 *
 * and the (P − 1)(N − 1) terms of B are independent fair ±1 variables (each ξ_j^μ is a
 * fresh coin given everything else), so B is an exactly binomial random walk. Keeping the
 * diagonal J_ii = P/N adds P to the signal: N − 1 + P. A tie is possible only when
 * P(N − 1) is even (J_ii = 0). The Gaussian limit of this is `crosstalkErrorGaussian`.
 *
 * Source: the signal-to-noise decomposition of Hertz, Krogh & Palmer (1991), ch. 2,
 * evaluated without the Gaussian approximation.
 *
 * @throws {EngineInputError} when neurons < 1 or patterns < 1 (or not integers).
 *
 * @example
 * crosstalkErrorExact(1000, 100)
 * // returns { below: ~7.37e-4, tie: ~1.63e-5 }
 * crosstalkErrorExact(1000, 100, { selfCoupling: true })
 * // returns { below: ~2.35e-4, tie: ~5.66e-6 }
 */
export function crosstalkErrorExact (
  neurons: number,
  patterns: number,
  options: { selfCoupling?: boolean } = {}
): SignProbabilities {
  checkCount('neurons', neurons, 1)
  checkCount('patterns', patterns, 1)
  const signal = neurons - 1 + (options.selfCoupling === true ? patterns : 0)
  return walkSign(signal, (patterns - 1) * (neurons - 1))
}
