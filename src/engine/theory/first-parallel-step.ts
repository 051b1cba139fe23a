import erf from '@stdlib/math-base-special-erf'
import { checkLoad, checkOverlap } from './check-input.js'

/**
 * Overlap m₁ after one parallel (synchronous) T = 0 update of a Hebbian network started at
 * overlap m₀ with one pattern, in the large-N limit:
 *
 *   m₁ = erf(m₀ / √(2α))                                                   (J_ii = 0)
 *   m₁ = ½(1 + m₀) erf((m₀ + α)/√(2α)) + ½(1 − m₀) erf((m₀ − α)/√(2α))     (J_ii = α)
 *
 * Exact for the first step as N → ∞ (Gardner, Derrida & Mottishaw, J. Physique 48, 741
 * (1987); attribution recalled from memory). It follows from the signal-to-noise argument:
 * the crosstalk is Gaussian with variance α, independent of the state, at step one only.
 * With the diagonal kept, a bit that agrees with the pattern gets +α extra signal and one
 * that disagrees gets −α. Later steps are not given by iterating this map.
 *
 * ## Special cases
 * α = 0 gives sign(m₀) (no crosstalk; m₀ = 0 stays 0).
 *
 * @throws {EngineInputError} when m₀ ∉ [−1, 1] or α is negative or not finite.
 *
 * @example
 * firstParallelStep(0.6, 0.1)
 * // returns ~0.9422
 * firstParallelStep(0.6, 0.1, { selfCoupling: true })
 * // returns ~0.9557
 */
export function firstParallelStep (m0: number, alpha: number, options: { selfCoupling?: boolean } = {}): number {
  checkOverlap('m0', m0)
  checkLoad('alpha', alpha)
  if (alpha === 0) return Math.sign(m0)
  const width = Math.sqrt(2 * alpha)
  if (options.selfCoupling !== true) return erf(m0 / width)
  return 0.5 * (1 + m0) * erf((m0 + alpha) / width) + 0.5 * (1 - m0) * erf((m0 - alpha) / width)
}
