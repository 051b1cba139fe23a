import { walkSign } from './binomial-walk.js'
import { checkCount, checkOverlap } from './check-input.js'

export interface ExactStepOptions {
  /** Keep J_ii = P/N. @defaultValue false */
  selfCoupling?: boolean
  /**
   * What a zero field does: `random` sets ±1 with equal odds, `keep` leaves the neuron as
   * it was (the engine's T = 0 rule). @defaultValue 'random'
   */
  ties?: 'random' | 'keep'
}

/**
 * Exact expected overlap after one parallel T = 0 update of a Hebbian network of N neurons
 * and P unbiased random ±1 patterns, started from pattern 1 with exactly
 * n_f = round(N(1 − m₀)/2) bits flipped (so the realised m₀ is 1 − 2n_f/N).
 *
 * ## Method
 * For neuron i, N ξ_i^1 h_i = Σ_{j≠i} ξ_j^1 s_j + B (+ P ξ_i^1 s_i with the diagonal kept),
 * where the crosstalk B is a sum of (P − 1)(N − 1) independent fair ±1 terms: the other
 * patterns are independent of the cue. The signal is N m₀ − 1 (+P) for an unflipped bit
 * and N m₀ + 1 (−P) for a flipped one, so each class flips with an exactly binomial
 * probability. E[m₁] = [(N − n_f)·E₊ + n_f·E₋]/N, with E = P[signal + B > 0] −
 * P[signal + B < 0] plus ± P[tie] when ties keep the old state.
 * The N → ∞ limit is `firstParallelStep`.
 *
 * @throws {EngineInputError} on non-integer or too small counts, or m₀ ∉ [−1, 1].
 *
 * @example
 * firstParallelStepExact(1000, 100, 0.6)
 * // returns ~0.94334
 */
export function firstParallelStepExact (
  neurons: number,
  patterns: number,
  m0: number,
  options: ExactStepOptions = {}
): number {
  checkCount('neurons', neurons, 1)
  checkCount('patterns', patterns, 1)
  checkOverlap('m0', m0)
  const flipped = Math.round(neurons * (1 - m0) / 2)
  const steps = (patterns - 1) * (neurons - 1)
  const overlapSum = neurons - 2 * flipped
  const diagonal = options.selfCoupling === true ? patterns : 0
  const tieKeeps = options.ties === 'keep'
  const agreeing = expectedAlignment(overlapSum - 1 + diagonal, steps, tieKeeps ? 1 : 0)
  const disagreeing = expectedAlignment(overlapSum + 1 - diagonal, steps, tieKeeps ? -1 : 0)
  return ((neurons - flipped) * agreeing + flipped * disagreeing) / neurons
}

/** E[ξ s'] for one bit: P[signal + B > 0] − P[signal + B < 0] + tieValue·P[tie]. */
function expectedAlignment (signal: number, steps: number, tieValue: number): number {
  const { below, tie } = walkSign(signal, steps)
  // B is symmetric, so P[signal + B > 0] = P[−signal + B < 0]; this avoids 1 − below − tie
  // losing the small tail.
  const above = walkSign(-signal, steps).below
  return above - below + tieValue * tie
}
