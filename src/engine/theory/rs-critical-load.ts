import erf from '@stdlib/math-base-special-erf'
import { bisect } from './bisect.js'
import { rsLoadEquation, rsLoadEquationSlope } from './rs-load-equation.js'

export interface CriticalLoad {
  /** α_c: the largest load with a retrieval solution, ≈ 0.137906. */
  alphaC: number
  /** m(α_c) = erf(y_c) ≈ 0.96742: retrieval is still almost perfect when it disappears. */
  overlapAtCritical: number
  /** y_c ≈ 1.51122, where √(2α) = erf(y)/y − (2/√π)e^{−y²} is largest. */
  yC: number
}

/**
 * The replica-symmetric storage capacity of the Hebbian Hopfield network at T = 0
 * (Amit, Gutfreund & Sompolinsky, PRL 55, 1530 (1985); Ann. Phys. 173, 30 (1987)).
 *
 * ## Method
 * α_c is where the retrieval branch folds: the maximum of √(2α)(y) (see `rsLoadEquation`).
 * Its slope changes sign exactly once on [1, 2]; bisection on the slope gives y_c to the
 * last bit, and α_c = ½ (√(2α)(y_c))². Replica-symmetry breaking moves α_c only in the
 * fourth digit (0.138186 at one step, Steffan & Kühn 1994).
 *
 * @example
 * rsCriticalLoad()
 * // returns { alphaC: ~0.137906, overlapAtCritical: ~0.96742, yC: ~1.51122 }
 */
export function rsCriticalLoad (): CriticalLoad {
  const yC = bisect(rsLoadEquationSlope, 1, 2)
  const width = rsLoadEquation(yC)
  return { alphaC: (width * width) / 2, overlapAtCritical: erf(yC), yC }
}
