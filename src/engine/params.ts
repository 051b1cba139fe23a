/**
 * The fully resolved parameters of one grid point: everything the engine needs to run
 * trials, with every default already filled in and every range already expanded.
 *
 * The service's spec layer (src/spec) validates user input with zod and produces these;
 * the engine trusts them apart from the cheap invariant checks in `checkPointParams`.
 */

/**
 * Neuron coding. `pm1`: ±1 neurons; `binary`: 0/1 neurons (V = (1 + s)/2), which changes
 * the local field (silent units contribute nothing) as well as how patterns are written.
 */
export type Coding = 'pm1' | 'binary'

export type PatternFamily =
  /** Independent entries, each active (+1 or 1) with probability `activity`; 0.5 is unbiased. */
  | { kind: 'random', activity: number }
  /**
   * Hierarchically correlated patterns: `parents` random parent patterns; each stored pattern
   * copies parent (μ mod parents) and re-draws each entry with probability 1 − `parentOverlap`,
   * so the expected overlap of a child with its parent is `parentOverlap` (unbiased entries).
   */
  | { kind: 'correlated', parents: number, parentOverlap: number }
  /** Patterns given by the user: `data[μ][i]` in the chosen coding. */
  | { kind: 'supplied', data: number[][] }

export type LearningRule =
  /** J_ij = (1/N) Σ_μ ξ_i^μ ξ_j^μ (Hopfield 1982). */
  | { kind: 'hebbian', selfCoupling: boolean }
  /** J = (1/N) Ξᵀ C⁻¹ Ξ with C_μν = ξ^μ·ξ^ν / N (Personnaz, Guyon & Dreyfus 1985). */
  | { kind: 'pseudo-inverse', selfCoupling: boolean }
  /** Storkey (1997) incremental rule; self-coupling removed after learning unless kept. */
  | { kind: 'storkey', selfCoupling: boolean }
  /**
   * Covariance rule for biased patterns with activity a (Tsodyks & Feigel'man 1988):
   * J_ij = (1/N) Σ_μ (ξ_i^μ − b)(ξ_j^μ − b), b = 2a − 1, with a uniform threshold θ on the
   * field of the chosen coding; `threshold` is θ/(1 − b²), null → midway between the mean
   * fields of active and silent units (see rules/covariance.ts).
   */
  | { kind: 'covariance', selfCoupling: boolean, threshold: number | null }
  /**
   * Clipped Hebbian synapses (Sompolinsky, PRA 34, 2571 (1986)): J_ij = (√P/N) sign(Σ_μ ξ_i^μ ξ_j^μ),
   * sign(0) = 0, so the couplings have the Hebbian r.m.s. size (see rules/clipped.ts).
   */
  | { kind: 'clipped', selfCoupling: boolean }
  /**
   * Dense associative memory with F(x) = xⁿ (Krotov & Hopfield 2016), `degree` n ≥ 2; n = 2 is
   * the Hebbian network with J_ii = 0 (see network/dense-memory.ts). ±1 neurons, no couplings.
   */
  | { kind: 'dense-polynomial', degree: number }
  /** Dense associative memory with F(x) = eˣ (Demircigil et al. 2017); zero temperature only. */
  | { kind: 'dense-exponential' }
  /**
   * Modern continuous Hopfield network (Ramsauer et al. 2021): continuous state updated by
   * ξ ← X softmax(β Xᵀ ξ) over the unit-length patterns, `beta` = β > 0 (see models/softmax).
   */
  | { kind: 'modern-softmax', beta: number }

export type Dilution = RandomDilution | InDegreeDilution

/** Random dilution of a coupling matrix. `kind` is optional so specs written before other dilutions existed keep their meaning. */
export interface RandomDilution {
  kind?: 'random'
  /** Fraction of couplings kept, in (0, 1]. */
  keep: number
  /** Symmetric dilution keeps or cuts J_ij and J_ji together; asymmetric decides each independently. */
  symmetric: boolean
}

/**
 * Extremely diluted asymmetric network (Derrida, Gardner & Zippelius 1987): every neuron
 * receives exactly `inDegree` = K inputs from distinct other neurons chosen at random,
 * independently for each neuron, with J_ij = (1/K) Σ_μ ξ_i^μ ξ_j^μ (Hebbian) or the clipped
 * version on those connections. Stored as adjacency lists (network/sparse-in-degree.ts).
 */
export interface InDegreeDilution {
  kind: 'fixed-in-degree'
  inDegree: number
}

export type Cue =
  /** The target with exactly round(fraction·N) distinct bits flipped. */
  | { kind: 'flip', fraction: number }
  /** The target with exactly round(fraction·N) distinct bits erased: set to 0 (neutral) or to fresh random values. */
  | { kind: 'erase', fraction: number, fill: 'zero' | 'random' }
  /** A uniformly random state, unrelated to any pattern. */
  | { kind: 'random' }
  /** sign(ξ^t + ξ^{t+1} + … ) over `components` consecutive stored patterns starting at the target (ties → +1). */
  | { kind: 'mixture', components: number }

export type UpdateScheme =
  /** One neuron at a time, a fresh uniformly random permutation each sweep. */
  | 'async-random'
  /** One neuron at a time, in index order 0..N−1 every sweep. */
  | 'async-sequential'
  /** All neurons at once from the previous state (Little dynamics). */
  | 'sync'

export interface Dynamics {
  update: UpdateScheme
  /**
   * Temperature T ≥ 0. T = 0: s_i ← sign(h_i), a zero field keeps s_i (the tie rule).
   * T > 0: Glauber, P(s_i = +1) = 1 / (1 + exp(−2 h_i / T)), so T_c = 1 at vanishing load.
   */
  temperature: number
  /** Upper bound on sweeps (synchronous: steps). */
  maxSweeps: number
  /** T > 0 only: sweeps discarded before time averages start. */
  burnIn: number
}

export interface Measures {
  /** Record the target overlap after every sweep. */
  overlapTrajectory: boolean
  /** Record the energy per neuron after every sweep. */
  energyTrajectory: boolean
  /** One-step stability of every stored pattern of the trial's network (costs O(N·P·P) per network). */
  stability: boolean
  /**
   * Statistics of the overlaps between the stored patterns of each network (costs O(N·P·P/2)
   * per network). Absent means false. Output only: left out of the stream key (keyedParams).
   */
  patternOverlaps?: boolean
}

export interface PointParams {
  /** N, the number of neurons. */
  neurons: number
  /** P, the number of stored patterns. */
  patterns: number
  coding: Coding
  family: PatternFamily
  rule: LearningRule
  dilution: Dilution | null
  cue: Cue
  dynamics: Dynamics
  measures: Measures
  /** A trial succeeds when its final target overlap is at least this. */
  successThreshold: number
  /**
   * Pattern level q of the end-state classes (end-states.ts): a state is at the target when
   * m_t ≥ q, at another pattern when |m_ν| ≥ |q|. Absent means the success threshold, so
   * `target` and success agree (spec format 2); format-1 specs set 0.9. Output only: left out
   * of the stream key (keyedParams).
   */
  patternLevel?: number
  /**
   * Consecutive trials that share one network (pattern set and couplings). 1 draws a new
   * pattern set for every trial; larger values amortise expensive rules (pseudo-inverse, Storkey).
   */
  trialsPerNetwork: number
}

/** The pattern level q of a point: its own, or else its success threshold. */
export function patternLevelOf (p: PointParams): number {
  return p.patternLevel ?? p.successThreshold
}

/**
 * The parameters a point's random streams are keyed by: everything except the output-only
 * members added after streams were first keyed (`patternLevel`, `measures.patternOverlaps`),
 * which change no draw and no dynamics. Leaving them out keeps the keys, and so the trials,
 * of every point that does not use them exactly as before; two points that differ only in
 * them draw the same trials.
 */
export function keyedParams (p: PointParams): PointParams {
  const { patternLevel: _level, measures, ...rest } = p
  const { patternOverlaps: _overlaps, ...keptMeasures } = measures
  return { ...rest, measures: keptMeasures }
}
