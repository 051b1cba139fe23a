import { EngineInputError } from '../errors.js'

/**
 * Overlap of the symmetric n-pattern mixture state sign(ξ¹ + … + ξⁿ) with each of its
 * components, at T = 0 and vanishing load (Amit, Gutfreund & Sompolinsky, PRA 32, 1007
 * (1985)):
 *
 *   m_n = E|ξ¹ + … + ξⁿ| / n = C(n − 1, (n − 1)/2) / 2^{n−1}   (n odd)
 *
 * giving 1, 1/2, 3/8, 5/16, 35/128 for n = 1, 3, 5, 7, 9, and ≈ √(2/(πn)) for large n.
 *
 * ## Method
 * The central binomial ratio as the product Π_{k=1}^{(n−1)/2} (2k − 1)/(2k), which
 * neither overflows nor needs the gamma function.
 *
 * @throws {EngineInputError} when n is not a positive odd integer: even mixtures have ties
 *   in the sign and are unstable at every temperature.
 *
 * @example
 * mixtureOverlap(5)
 * // returns 0.375
 */
export function mixtureOverlap (n: number): number {
  if (!(Number.isInteger(n) && n >= 1 && n % 2 === 1)) {
    throw new EngineInputError('components', n, 'must be a positive odd integer.')
  }
  let m = 1
  for (let k = 1; 2 * k < n; k++) m *= (2 * k - 1) / (2 * k)
  return m
}
