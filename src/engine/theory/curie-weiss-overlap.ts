import { EngineInputError } from '../errors.js'
import { bisect } from './bisect.js'

/**
 * Overlap of the retrieval state at temperature T and vanishing load (finite P, N → ∞):
 * the positive root of the Curie–Weiss equation
 *
 *   m = tanh(m / T),   T_c = 1,
 *
 * for Glauber dynamics with P(s_i = +1) = 1/(1 + e^{−2h_i/T}) (the engine's convention; a
 * rate 1/(1 + e^{−h/T}) would halve T_c). Parallel (Little) dynamics has the same m below
 * T_c. Source: Amit, Gutfreund & Sompolinsky, PRA 32, 1007 (1985).
 *
 * ## Method
 * On (0, 1], tanh(m/T) − m is positive below the root and negative above it when T < 1;
 * bisection keeps that sign change. Near T_c, m ≈ √(3(1 − T)).
 *
 * ## Special cases
 * - T = 0 gives 1; T ≥ 1 gives 0 (paramagnet).
 *
 * @throws {EngineInputError} when T is negative or NaN.
 *
 * @example
 * curieWeissOverlap(0.6)
 * // returns ~0.90733
 */
export function curieWeissOverlap (temperature: number): number {
  if (!(temperature >= 0)) throw new EngineInputError('temperature', temperature, 'must be ≥ 0.')
  if (temperature === 0) return 1
  if (temperature >= 1) return 0
  const excess = (m: number): number => Math.tanh(m / temperature) - m
  // The smallest bracket end where the sign is already positive; m = 0 itself is the
  // trivial root. Within one rounding of T = 1 there is no resolvable positive root.
  const lo = 1e-300
  if (!(excess(lo) > 0)) return 0
  return bisect(excess, lo, 1)
}
