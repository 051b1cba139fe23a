import erf from '@stdlib/math-base-special-erf'
import { bisect } from './bisect.js'
import { checkLoad, checkOverlap } from './check-input.js'

/** α_c = 2/π of the extremely diluted network at T = 0, where the slope of the map at m = 0 is 1. */
export const DILUTED_CRITICAL_LOAD = 2 / Math.PI

/**
 * Overlap map of the extremely diluted asymmetric Hebbian network at T = 0 (Derrida,
 * Gardner & Zippelius, Europhys. Lett. 4, 167 (1987); citation and result recalled from
 * memory), α = P/K with K inputs per neuron:
 *
 *   m_{t+1} = erf(m_t / √(2α)).
 *
 * Unlike the fully connected network, where this holds for the first parallel step only,
 * here it holds at every step as K ≪ ln N: the inputs of a neuron share no history, so the
 * crosstalk stays Gaussian with variance α and independent of the past. At finite K the
 * crosstalk has variance (P − m²)/K, not P/K (one pattern is the signal, and the signal's
 * own fluctuations count), an O(1/K) correction.
 *
 * ## Special cases
 * α = 0 gives sign(m).
 *
 * @throws {EngineInputError} when m ∉ [−1, 1] or α is negative or not finite.
 *
 * @example
 * dilutedOverlapMap(0.3, 0.3)
 * // returns ~0.41612
 */
export function dilutedOverlapMap (m: number, alpha: number): number {
  checkOverlap('m', m)
  checkLoad('alpha', alpha)
  if (alpha === 0) return Math.sign(m)
  return erf(m / Math.sqrt(2 * alpha))
}

/**
 * The stable fixed point m* > 0 of `dilutedOverlapMap`, the overlap the parallel (or
 * asynchronous) T = 0 dynamics settle at from any m₀ > 0; 0 for α ≥ 2/π, where the map's
 * slope at 0, √(2/(πα)), drops to 1 and retrieval vanishes continuously.
 *
 * @throws {EngineInputError} when α is negative or not finite.
 *
 * @example
 * dilutedRetrievalOverlap(0.4)
 * // returns ~0.79
 */
export function dilutedRetrievalOverlap (alpha: number): number {
  checkLoad('alpha', alpha)
  if (alpha === 0) return 1
  if (alpha >= DILUTED_CRITICAL_LOAD) return 0
  const width = Math.sqrt(2 * alpha)
  const excess = (m: number): number => erf(m / width) - m
  // erf(m/w) − m is positive just above 0 (slope > 1) and at most 0 at 1. Within rounding of
  // α_c the slope is 1 to the last bit and the positive root is unresolvably close to 0.
  const lo = 1e-300
  if (!(excess(lo) > 0)) return 0
  return bisect(excess, lo, 1)
}
