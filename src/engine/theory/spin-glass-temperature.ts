import { checkLoad } from './check-input.js'

/**
 * Temperature below which the paramagnetic state of the Hebbian network gives way to the
 * spin-glass phase, replica-symmetric theory:
 *
 *   T_g(α) = 1 + √α,
 *
 * from the paramagnet's instability condition β²α = (1 − β)². Source: Amit, Gutfreund &
 * Sompolinsky, Ann. Phys. 173, 30 (1987) (attribution recalled from memory; the formula is
 * re-derived from the RS equations). Retrieval states exist only below the lower line
 * T_M(α) (≈ 1 − 1.95√α at small α).
 *
 * @throws {EngineInputError} when α is negative or not finite.
 *
 * @example
 * spinGlassTemperature(0.04)
 * // returns 1.2
 */
export function spinGlassTemperature (alpha: number): number {
  checkLoad('alpha', alpha)
  return 1 + Math.sqrt(alpha)
}
