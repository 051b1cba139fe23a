/**
 * A network with its state and the bookkeeping that makes one visit cheap. Dynamics only
 * talk to this interface; each representation keeps whatever accumulator suits it
 * (overlaps m_μ in overlap space, local fields h_i for a dense coupling matrix).
 *
 * Fields are in *raw* units: the physical local field is `field(i) · fieldScale + bias(i)`
 * where the representation folds the bias into `field`; raw units keep Hebbian fields
 * exact integers so the tie rule (h = 0 keeps the state) is decided exactly.
 */
export interface Network {
  readonly neurons: number
  readonly patternCount: number
  /** Stored patterns, pattern-major ±1: patterns[μ·N + i]. */
  readonly patterns: Int8Array
  /** Multiply a raw field by this to get the physical field h_i. */
  readonly fieldScale: number
  /** Name of the representation, recorded in result provenance. */
  readonly representation: 'overlap-space' | 'dense-incremental'
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
  /** Approximate bytes held by the representation (couplings or patterns, accumulators). */
  readonly bytes: number
}
