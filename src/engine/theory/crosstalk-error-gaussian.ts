import erfc from '@stdlib/math-base-special-erfc'
import { checkLoad } from './check-input.js'

/**
 * Probability that one stored bit is unstable when the network sits on a stored pattern,
 * for Hebbian couplings in the large-N Gaussian-crosstalk approximation:
 *
 *   P_error(α) = ½ erfc(1 / √(2α))                      (J_ii = 0)
 *   P_error(α) = ½ erfc((1 + α) / √(2α))                (J_ii = α kept)
 *
 * Source: Hertz, Krogh & Palmer, Introduction to the Theory of Neural Computation (1991),
 * ch. 2, signal-to-noise analysis of the Hebb rule. The crosstalk term ξ_i h_i − 1 is a sum
 * of (P − 1)(N − 1)/N² independent ±1/N terms, approximated by a Gaussian of variance α.
 * Keeping the diagonal adds a deterministic P/N = α to the signal.
 *
 * It overestimates the exact finite-N value (see `crosstalkErrorExact`) by 10–50 % for
 * N ≤ 500, so tests against simulations use the exact value.
 *
 * ## Special cases
 * α = 0 gives 0 (no crosstalk).
 *
 * @throws {EngineInputError} when α is negative, NaN or infinite.
 *
 * @example
 * crosstalkErrorGaussian(0.1)
 * // returns ~7.83e-4
 */
export function crosstalkErrorGaussian (alpha: number, options: { selfCoupling?: boolean } = {}): number {
  checkLoad('alpha', alpha)
  if (alpha === 0) return 0
  const signal = options.selfCoupling === true ? 1 + alpha : 1
  return 0.5 * erfc(signal / Math.sqrt(2 * alpha))
}
