import erfc from '@stdlib/math-base-special-erfc'
import { checkCount, checkOverlap } from './check-input.js'
import { EngineInputError } from '../errors.js'

/** (2n − 3)!! = 1·3·5·…·(2n − 3); 1 for n = 2. */
export function oddDoubleFactorial (degree: number): number {
  let out = 1
  for (let k = 3; k <= 2 * degree - 3; k += 2) out *= k
  return out
}

/**
 * One-step bit-error probability of a dense associative memory with F(x) = xⁿ on a stored
 * pattern, Gaussian signal-to-noise estimate:
 *
 *   P_error = ½ erfc(√(N^{n−1} / (2K(2n − 3)!!)))
 *
 * (K stored patterns). Krotov & Hopfield, NeurIPS 29 (2016) give the capacity that follows
 * from it (constant recalled from memory); derived here: the signal is F(N) − F(N − 2) ≈
 * 2n N^{n−1} and each other pattern adds a term of variance ≈ 4n² E[r^{2n−2}] =
 * 4n² (2n − 3)!! N^{n−1} (r a sum of N fair ±1 terms). n = 2 is the Hebbian
 * ½ erfc(√(N/(2K))). At N ≈ 100 the tails are not Gaussian: compare within ±30 %.
 *
 * @throws {EngineInputError} when a count is not an integer ≥ 1 or the degree < 2.
 *
 * @example
 * denseCrosstalkErrorGaussian(100, 400, 3)
 * // returns ~1.95e-3
 */
export function denseCrosstalkErrorGaussian (neurons: number, patterns: number, degree: number): number {
  checkCount('neurons', neurons, 1)
  checkCount('patterns', patterns, 1)
  checkCount('degree', degree, 2)
  return 0.5 * erfc(Math.sqrt(Math.pow(neurons, degree - 1) / (2 * patterns * oddDoubleFactorial(degree))))
}

/**
 * Number of patterns a polynomial dense memory stores with no errors in a given memory,
 * K_max ≈ N^{n−1} / (2(2n − 3)!! ln N) (Krotov & Hopfield 2016; constant recalled from memory,
 * re-derived from `denseCrosstalkErrorGaussian`; n = 2 gives N/(2 ln N), McEliece et al. 1987).
 * Asymptotic in N: compare trends and ratios, not the constant.
 *
 * @example
 * denseCapacity(100, 3)
 * // returns ~362
 */
export function denseCapacity (neurons: number, degree: number): number {
  checkCount('neurons', neurons, 2)
  checkCount('degree', degree, 2)
  return Math.pow(neurons, degree - 1) / (2 * oddDoubleFactorial(degree) * Math.log(neurons))
}

/**
 * Bound on the capacity exponent of the exponential dense memory F(x) = eˣ: M = e^{αN}
 * patterns are retrieved from cues with a fraction ρ of wrong bits when
 *
 *   α < I(1 − 2ρ)/2,   I(x) = ½[(1 + x) ln(1 + x) + (1 − x) ln(1 − x)],
 *
 * (Demircigil, Heusel, Löwe, Upgang & Vermet, J. Stat. Phys. 168, 288 (2017); bound recalled
 * from memory). ρ = 0 gives ln 2 / 2 ≈ 0.3466 (M < 2^{N/2}); ρ = 0.1 gives ≈ 0.184.
 *
 * @throws {EngineInputError} when ρ ∉ [0, ½].
 */
export function exponentialCapacityExponent (rho: number): number {
  if (!(rho >= 0 && rho <= 0.5)) throw new EngineInputError('rho', rho, 'must be a fraction of wrong bits in [0, 0.5].')
  const x = 1 - 2 * rho
  checkOverlap('x', x)
  const term = (v: number): number => (v === 0 ? 0 : v * Math.log(v))
  return 0.25 * (term(1 + x) + term(1 - x))
}
