import erf from '@stdlib/math-base-special-erf'
import { bisect } from './bisect.js'
import { checkLoad } from './check-input.js'
import { rsCriticalLoad } from './rs-critical-load.js'
import { rsLoadEquation } from './rs-load-equation.js'

/**
 * Overlap m(α) of the retrieval state of the Hebbian Hopfield network (J_ii = 0) at T = 0,
 * replica-symmetric theory of Amit, Gutfreund & Sompolinsky (PRL 55, 1530 (1985);
 * Ann. Phys. 173, 30 (1987)):
 *
 *   √(2α) = erf(y)/y − (2/√π) e^{−y²},   m = erf(y),   larger root y > y_c.
 *
 * This is an equilibrium property of the state near the pattern. Dynamics reach it only
 * from a cue inside its basin, and at finite N the apparent capacity is nearer 0.145
 * (finite-size effects dominate for 0.13 < α < 0.2), so compare with simulations at
 * α ≤ 0.12 and N ≥ 1000.
 *
 * ## Method
 * Bisection for y on [y_c, max(y_c, 2/√(2α))]: the right-hand side is below erf(y)/y ≤ 1/y,
 * so it is at most half of √(2α) at the upper end (a margin no rounding can erase; at
 * y = 1/√(2α) the two sides agree to the last bit for small α, which made the bracket fail)
 * and at least √(2α) at y_c whenever α ≤ α_c.
 *
 * ## Special cases
 * - α = 0 gives 1.
 * - α > α_c gives 0: no retrieval branch (the network falls to states with m ≈ 0).
 *
 * @throws {EngineInputError} when α is negative, NaN or infinite.
 *
 * @example
 * rsRetrievalOverlap(0.1)
 * // returns ~0.9979993
 */
export function rsRetrievalOverlap (alpha: number): number {
  checkLoad('alpha', alpha)
  if (alpha === 0) return 1
  const { alphaC, yC, overlapAtCritical } = rsCriticalLoad()
  if (alpha > alphaC) return 0
  if (alpha === alphaC) return overlapAtCritical
  const width = Math.sqrt(2 * alpha)
  const y = bisect(z => rsLoadEquation(z) - width, yC, Math.max(yC, 2 / width))
  return erf(y)
}
