/** What one trial produced, and what a grid point's trials sum to. */
import type { EndState } from './end-states.js'

/** How the dynamics ended. `sampled`: T > 0, ran its fixed number of sweeps and time-averaged. */
export type Ending = 'fixed' | 'cycle2' | 'max' | 'sampled'

export { END_STATES, type EndState } from './end-states.js'

export const ENDINGS: readonly Ending[] = ['fixed', 'cycle2', 'max', 'sampled']

export interface StabilityRecord {
  /** Fraction of (pattern, neuron) pairs with ξ_i h_i < 0 when the network sits on the pattern. */
  unstableFraction: number
  /** Fraction with h_i = 0 exactly (kept by the tie rule, so not flipped). */
  tieFraction: number
  /** Fraction of stored patterns that are exact fixed points (no bit with ξ_i h_i < 0). */
  fixedPatternFraction: number
}

/**
 * Overlaps C_μν = (1/N) ξ^μ·ξ^ν between the stored patterns of one network, over all pairs
 * μ < ν (±1 entries; binary coding is read as ±1).
 */
export interface PatternOverlapRecord {
  pairs: number
  /** Mean of C over the pairs. */
  mean: number
  /** Mean of |C|. */
  meanAbs: number
  /** √(mean of C²). */
  rms: number
  /** Largest |C|. */
  maxAbs: number
}

export interface TrialRecord {
  trial: number
  /** Index of the target among the stored patterns. */
  target: number
  /** Initial overlap of the cue with the target. */
  initialOverlap: number
  /** Final target overlap (T > 0: time average after burn-in). */
  overlap: number
  /** Largest |overlap| with any stored pattern other than the target (T > 0: its time average over the measured sweeps). */
  maxOtherOverlap: number
  /** Sweeps performed (synchronous: steps), including the last one that changed nothing. */
  sweeps: number
  ending: Ending
  /**
   * Energy per neuron of the final state, E/N = −(1/2N) Σ_{i≠j} J_ij s_i s_j + (1/N) Σ θ_i s_i.
   * Dense memories and the softmax network report their own energies (network/dense-memory.ts,
   * models/softmax/memory.ts; the softmax one is not divided by N). T > 0: its time
   * average over the measured sweeps.
   */
  energy: number
  /** End-state class (end-states.ts) of the final overlaps; T > 0: of the time-averaged overlaps. */
  endState: EndState
  /** T > 0 only: fraction of the measured sweeps (after burn-in) whose state is in each class. */
  endStateShares?: Record<EndState, number>
  /** T > 0 only: the class of the state after the last sweep. */
  finalEndState?: EndState
  /** T > 0 only: maxOtherOverlap of the state after the last sweep. */
  finalMaxOtherOverlap?: number
  /** T > 0 only: energy of the state after the last sweep. */
  finalEnergy?: number
  /** Mixture cues only: overlap with each component (target, target + 1, … mod P), final or (T > 0) time-averaged. */
  componentOverlaps?: number[]
  /** Present on the first trial of each network when the stability measure is on. */
  stability?: StabilityRecord
  /** Present on the first trial of each network when the pattern-overlap measure is on. */
  patternOverlaps?: PatternOverlapRecord
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
  /** Trials per end-state class (T > 0: of the time-averaged overlaps). */
  endStates: Record<EndState, number>
  /** Mean over the networks whose stability was measured, with the spread over networks. */
  stability: StabilitySummary | null
  /** T > 0 only: mean over trials of each trial's share of measured sweeps in each class (sums to 1). */
  endStateShares?: Record<EndState, number>
  /** T > 0 only: trials per class of the state after the last sweep. */
  finalEndStates?: Record<EndState, number>
  /** T > 0 only: maxOtherOverlap of the state after the last sweep. */
  finalMaxOtherOverlap?: MeanWithError
  /** T > 0 only: energy of the state after the last sweep. */
  finalEnergy?: MeanWithError
  /** Mixture cues only: overlap with each component, in cue order. */
  componentOverlaps?: MeanWithError[]
  /** With measures.overlapTrajectory: the mean target overlap after each sweep (sweep 0: the cue). */
  overlapTrajectory?: TrajectorySummary
  /** With measures.energyTrajectory: the mean energy after each sweep, from sweep 1. */
  energyTrajectory?: TrajectorySummary
  /** With measures.patternOverlaps: the stored sets' overlap statistics, over networks, and their expectations. */
  patternOverlaps?: PatternOverlapSummary
}

export interface StabilitySummary extends StabilityRecord {
  networks: number
  /** Sample standard deviation of each fraction over networks. */
  sd: StabilityRecord
  /** Standard error of each mean over networks (sd/√networks). */
  se: StabilityRecord
}

/**
 * A mean trajectory over a point's trials: index k is sweep firstSweep + k. A trial that
 * stopped (fixed point, 2-cycle) before the longest one holds its last value from then on;
 * `running` counts the trials that had not stopped by that sweep.
 */
export interface TrajectorySummary {
  firstSweep: number
  mean: number[]
  sd: number[]
  se: number[]
  running: number[]
}

export interface PatternOverlapSummary {
  /** Networks measured. */
  networks: number
  /** Pairs per network. */
  pairs: number
  mean: MeanWithError
  meanAbs: MeanWithError
  rms: MeanWithError
  maxAbs: MeanWithError
  /**
   * What the pattern family implies for each statistic (patterns/overlap-expectation.ts):
   * null where the family gives no expectation (supplied patterns, or a statistic the family
   * does not determine in closed form).
   */
  expected: { mean: number | null, rms: number | null, meanAbs: number | null, maxAbs: number | null }
}
