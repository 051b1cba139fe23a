import erf from '@stdlib/math-base-special-erf'

const TWO_OVER_SQRT_PI = 2 / Math.sqrt(Math.PI)

/**
 * The T = 0 replica-symmetric retrieval equations of Amit, Gutfreund & Sompolinsky
 * (PRL 55, 1530 (1985); Ann. Phys. 173, 30 (1987)), m = erf(y), y = m/√(2αr),
 * C = √(2/(παr)) e^{−y²}, r = (1 − C)^{−2}, reduce to one equation in y:
 *
 *   √(2α) = erf(y)/y − (2/√π) e^{−y²}.
 *
 * This returns the right-hand side, √(2α) as a function of y > 0. It rises from 0 at
 * y → 0 to a maximum √(2α_c) at y_c ≈ 1.511 and falls like 1/y for large y; the retrieval
 * state is the root with y > y_c.
 *
 * @example
 * rsLoadEquation(1.5112)
 * // returns ~0.5252 (= √(2 · 0.137906))
 */
export function rsLoadEquation (y: number): number {
  return erf(y) / y - TWO_OVER_SQRT_PI * Math.exp(-y * y)
}

/** d/dy of `rsLoadEquation`: (2/√π) e^{−y²} (1/y + 2y) − erf(y)/y². Zero at y_c. */
export function rsLoadEquationSlope (y: number): number {
  return TWO_OVER_SQRT_PI * Math.exp(-y * y) * (1 / y + 2 * y) - erf(y) / (y * y)
}
