import { EngineInputError } from '../errors.js'

/**
 * Leading-order storage capacity of the covariance rule for sparse patterns of activity a
 * with an optimised threshold, α_c ≈ 1/(2a|ln a|) as a → 0 (Tsodyks & Feigel'man, Europhys.
 * Lett. 6, 101 (1988); recalled from memory, CHECK_VALUES §8). The corrections are
 * logarithmic, so compare ratios α_c(a₁)/α_c(a₂), never the value itself.
 *
 * @throws {EngineInputError} when a ∉ (0, 1).
 *
 * @example
 * sparseCapacityAsymptote(0.1)
 * // returns ~2.171
 */
export function sparseCapacityAsymptote (activity: number): number {
  if (!(activity > 0 && activity < 1)) throw new EngineInputError('activity', activity, 'must lie strictly between 0 and 1.')
  return 1 / (2 * activity * Math.abs(Math.log(activity)))
}
