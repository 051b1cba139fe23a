/** What one trial produced, and what a grid point's trials sum to. */

/** How the dynamics ended. `sampled`: T > 0, ran its fixed number of sweeps and time-averaged. */
export type Ending = 'fixed' | 'cycle2' | 'max' | 'sampled'

/**
 * Where the final state sits among the stored patterns (q = classification overlap,
 * default 0.9; mixture level = max(0.15, 4/√N)):
 * `target` m_target ≥ q; `reversed` m_target ≤ −q; `other-pattern` some other |m_ν| ≥ q;
 * `mixture` at least two |m_ν| ≥ the mixture level; `other` none of these (spin-glass-like).
 */
export type EndState = 'target' | 'reversed' | 'other-pattern' | 'mixture' | 'other'

export const END_STATES: readonly EndState[] = ['target', 'reversed', 'other-pattern', 'mixture', 'other']
export const ENDINGS: readonly Ending[] = ['fixed', 'cycle2', 'max', 'sampled']

export interface StabilityRecord {
  /** Fraction of (pattern, neuron) pairs with ξ_i h_i < 0 when the network sits on the pattern. */
  unstableFraction: number
  /** Fraction with h_i = 0 exactly (kept by the tie rule, so not flipped). */
  tieFraction: number
  /** Fraction of stored patterns that are exact fixed points (no bit with ξ_i h_i < 0). */
  fixedPatternFraction: number
}

export interface TrialRecord {
  trial: number
  /** Index of the target among the stored patterns. */
  target: number
  /** Initial overlap of the cue with the target. */
  initialOverlap: number
  /** Final target overlap (T > 0: time average after burn-in). */
  overlap: number
  /** Largest |overlap| with any stored pattern other than the target. */
  maxOtherOverlap: number
  /** Sweeps performed (synchronous: steps), including the last one that changed nothing. */
  sweeps: number
  ending: Ending
  /**
   * Energy per neuron of the final state, E/N = −(1/2N) Σ_{i≠j} J_ij s_i s_j + (1/N) Σ θ_i s_i.
   * Dense memories and the softmax network report their own energies (network/dense-memory.ts,
   * models/softmax/memory.ts; the softmax one is not divided by N).
   */
  energy: number
  endState: EndState
  /** Present on the first trial of each network when the stability measure is on. */
  stability?: StabilityRecord
  overlapTrajectory?: number[]
  energyTrajectory?: number[]
}

export interface MeanWithError {
  mean: number
  sd: number
  se: number
}

export interface PointSummary {
  trials: number
  overlap: MeanWithError
  /** Trials with final overlap ≥ the success threshold, with a Wilson 95 % interval on the rate. */
  success: { count: number, rate: number, low: number, high: number }
  sweeps: MeanWithError
  maxOtherOverlap: MeanWithError
  energy: MeanWithError
  endings: Record<Ending, number>
  endStates: Record<EndState, number>
  /** Mean over the networks whose stability was measured. */
  stability: (StabilityRecord & { networks: number }) | null
}
