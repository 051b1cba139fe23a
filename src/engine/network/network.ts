/**
 * A network with its state and the bookkeeping that makes one visit cheap. Dynamics only
 * talk to this interface; each representation keeps whatever accumulator suits it
 * (overlaps m_μ in overlap space, local fields h_i for a dense coupling matrix).
 *
 * Fields are in *raw* units: the physical local field is `field(i) · fieldScale + bias(i)`
 * where the representation folds the bias into `field`; raw units keep Hebbian fields
 * exact integers so the tie rule (h = 0 keeps the state) is decided exactly.
 */
import type { RandomSource } from '../random/source.js'

/** How a synchronous step ended: s(t) = s(t−1) is `fixed`, s(t) = s(t−2) is `cycle2`. */
export type SyncOutcome = 'changed' | 'fixed' | 'cycle2'

export interface Network {
  readonly neurons: number
  readonly patternCount: number
  /** Stored patterns, pattern-major ±1: patterns[μ·N + i]. */
  readonly patterns: Int8Array
  /** Multiply a raw field by this to get the physical field h_i. */
  readonly fieldScale: number
  /** Name of the representation, recorded in result provenance. */
  readonly representation: 'overlap-space' | 'dense-incremental' | 'dense-memory' | 'sparse-in-degree'
  /**
   * Name of the fast path the network runs on ('js' for the plain per-neuron path), recorded
   * in result provenance. Every fast path gives bit-identical results to the plain path.
   */
  readonly fastPath: string
  /** Current state; entries are −1, 0 (erased cue bits only) or +1. Do not write directly. */
  readonly state: Int8Array
  /** Load a state and rebuild the accumulators from scratch. */
  load (state: Int8Array): void
  /** Raw local field of neuron i in the current state, threshold included. */
  field (i: number): number
  /** Set neuron i to v and update the accumulators incrementally. */
  set (i: number, v: number): void
  /** Energy per neuron of the current state, E/N with E = −½ Σ_{i≠j} J_ij s_i s_j + Σ θ_i s_i. */
  energyPerNeuron (): number
  /** Raw overlaps Σ_i ξ_i^μ s_i with every stored pattern, written to out (length P). */
  rawOverlaps (out: Float64Array): void
  /**
   * Raw overlap Σ_i ξ_i^μ s_i with one pattern, read off in O(1) by representations that
   * keep the overlaps current; absent elsewhere (the caller sums over the neurons).
   */
  rawOverlapWith?: (mu: number) => number
  /**
   * Whole sweeps run natively by a fast path, or null: the dynamics then use `field`/`set`.
   * Either way the network ends in exactly the same state.
   */
  readonly native: NativeSweeps | null
  /** Approximate bytes held by the representation (couplings or patterns, accumulators). */
  readonly bytes: number
}

/**
 * What a whole Glauber trial needs to take its thermal samples natively. A sample is the
 * state after a measured sweep: its normalised overlaps o_μ = m_μ/N (unbiased patterns), their
 * sums, the largest |o_ν| over ν ≠ target, the energy per neuron and the end-state class.
 */
export interface ThermalSampling {
  /** Sweeps 1..burnIn are not sampled. */
  readonly burnIn: number
  readonly target: number
  /** The pattern level q: a sample with o_target ≥ q is in class `target` (END_STATES[0]). */
  readonly patternLevel: number
  /** The class (index in END_STATES) of a sample below the pattern level, from its overlaps o[0..P). */
  classify (overlaps: Float64Array): number
}

/** The sums over a trial's samples, each in sweep order, as the plain path accumulates them. */
export interface ThermalTotals {
  /** Σ o_μ over the samples, μ < P. */
  sums: Float64Array
  otherSum: number
  energySum: number
  /** Samples in each end-state class, END_STATES order. */
  classCounts: Int32Array
  count: number
}

/**
 * Whole-sweep operations a fast path runs in one call. Each must leave the network exactly
 * as the per-neuron loops of dynamics/run.ts would, drawing nothing itself: the caller draws
 * the visiting order and Glauber's uniforms first, in the order those loops draw them.
 */
export interface NativeSweeps {
  /**
   * Optional: a whole zero-temperature asynchronous trial (no trajectories) in one call:
   * before each sweep `order` is reshuffled with `rng` when `shuffle` (drawing exactly as
   * dynamics/run.ts does), and the trial stops after the first sweep that changes nothing or
   * after `maxSweeps`. Null when it cannot (for instance another random source), with nothing
   * drawn or changed.
   */
  runZeroTemperature? (order: Int32Array, maxSweeps: number, shuffle: boolean, rng: RandomSource): { sweeps: number, ending: 'fixed' | 'max' } | null
  /**
   * Optional: a whole zero-temperature synchronous trial (no trajectories) in one call, steps
   * t = 1, 2, … as `stepZeroTemperature` with the two-cycle compared from t = 2 on.
   */
  runSynchronous? (previous: Int8Array, maxSteps: number): { sweeps: number, ending: 'fixed' | 'cycle2' | 'max' }
  /**
   * Optional: a whole asynchronous Glauber run of `sweeps` sweeps in one call, drawing from
   * `rng` exactly as dynamics/run.ts does (the reshuffle when `shuffle`, then one uniform per
   * visit). After each sweep the network holds that sweep's state and `afterSweep(sweep)` runs
   * (it may read the network, not change it). False when it cannot (for instance another
   * random source), with nothing drawn or changed.
   */
  runGlauber? (order: Int32Array, sweeps: number, shuffle: boolean, factor: number, rng: RandomSource, afterSweep: (sweep: number) => void): boolean
  /**
   * Optional: the same run, but the fast path takes the thermal samples itself after each
   * sweep past `sampling.burnIn` (unbiased patterns, no trajectories: nothing else is observed
   * between sweeps), with the plain path's arithmetic in its order, and returns their totals.
   * Null when it cannot, with nothing drawn or changed.
   */
  runGlauberSampled? (order: Int32Array, sweeps: number, shuffle: boolean, factor: number, rng: RandomSource, sampling: ThermalSampling): ThermalTotals | null
  /** Zero-temperature asynchronous sweep in `order`; true if any neuron changed. */
  sweepZeroTemperature (order: Int32Array): boolean
  /** Zero-temperature synchronous step; `previous` holds s(t−2) and receives s(t−1) unless the step is `fixed`. */
  stepZeroTemperature (previous: Int8Array, checkPrevious: boolean): SyncOutcome
  /** Asynchronous Glauber sweep: visit k uses noise[k]; s_i ← +1 iff noise[k]·(1 + exp(factor·field(i))) < 1. */
  sweepGlauber (order: Int32Array, noise: Float64Array, factor: number): void
  /** Synchronous Glauber step: neuron i uses noise[i], every field from the current state. */
  stepGlauber (noise: Float64Array, factor: number): void
}
