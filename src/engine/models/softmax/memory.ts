import { SoftmaxKernel } from '../../kernels/softmax-kernel.js'
import { areFastPathsEnabled } from '../../kernels/wasm.js'
import { generatePatterns } from '../../patterns/generate.js'
import type { PointParams } from '../../params.js'
import type { RandomSource } from '../../random/source.js'

/**
 * Modern continuous Hopfield network (Ramsauer et al., "Hopfield Networks is All You Need",
 * ICLR 2021, arXiv:2008.02217): continuous state ξ ∈ ℝ^d, stored patterns x^μ as the columns
 * of X, and the update
 *
 *   ξ ← X softmax(β Xᵀ ξ),
 *
 * which never increases the energy
 *
 *   E(ξ) = −β⁻¹ ln Σ_μ exp(β x^μᵀ ξ) + ½ ξᵀξ + β⁻¹ ln P + ½ M²,   M = max_μ ‖x^μ‖
 *
 * (P = number of patterns; the paper's N). Here the patterns are the ±1 patterns scaled to
 * unit length, x^μ = ξ^μ/√d, so M = 1 and β has the scale of the paper's bounds; a state
 * σ ∈ {−1, 0, 1}^d of the spin models enters as σ/√d, and the overlap x^μᵀξ equals the usual
 * (1/d) ξ^μ·σ on such states.
 *
 * ## Method
 * Scores a_μ = β x^μᵀξ, then softmax with the largest score subtracted (exp(a_μ − max) ≤ 1,
 * so nothing overflows for any β), then the weighted sum of patterns. O(P·d) per update,
 * no allocation. The ±1 entries are kept as int8 and scaled by 1/√d on the fly.
 *
 * The two O(P·d) passes run in a WebAssembly SIMD kernel (`fastPath`, kernels/softmax-kernel.ts)
 * when the host supports it; it computes the loops below bit for bit.
 */
export class SoftmaxMemory {
  readonly dimension: number
  readonly patternCount: number
  /** Stored ±1 patterns, pattern-major: patterns[μ·d + i]. */
  readonly patterns: Int8Array
  readonly beta: number
  /** Name of the fast path ('js' for the plain loops), recorded in provenance. */
  readonly fastPath: string
  private readonly scale: number
  private readonly weights: Float64Array
  private readonly kernel: SoftmaxKernel | null
  /** The kernel's coefficients c_μ of the weighted sum. */
  private readonly coefficients: Float64Array

  /**
   * `patterns` as drawn, or a function that draws them into the array it is given (so a fast
   * path can have them drawn straight into its own memory, holding the only copy).
   */
  constructor (patterns: Int8Array | ((into: Int8Array) => void), dimension: number, patternCount: number, beta: number) {
    this.dimension = dimension
    this.patternCount = patternCount
    this.beta = beta
    this.scale = 1 / Math.sqrt(dimension)
    this.weights = new Float64Array(patternCount)
    const given = typeof patterns === 'function' ? null : patterns
    this.kernel = areFastPathsEnabled() ? SoftmaxKernel.create(given, dimension, patternCount) : null
    this.patterns = this.kernel?.patterns ?? given ?? new Int8Array(dimension * patternCount)
    if (typeof patterns === 'function') patterns(this.patterns)
    this.fastPath = this.kernel?.name ?? 'js'
    this.coefficients = new Float64Array(this.kernel === null ? 0 : patternCount)
  }

  /** Draws the point's patterns from `rng` into the memory's own storage (see the constructor). */
  static draw (p: PointParams, beta: number, rng: RandomSource): SoftmaxMemory {
    return new SoftmaxMemory((into) => { generatePatterns(p, rng, into) }, p.neurons, p.patterns, beta)
  }

  /** x^μᵀ state for every stored pattern, into out (length P). */
  overlaps (state: Float64Array, out: Float64Array): void {
    if (this.kernel !== null) {
      this.kernel.overlaps(state, out, this.scale)
      return
    }
    const d = this.dimension
    for (let mu = 0; mu < this.patternCount; mu++) {
      let dot = 0
      const base = mu * d
      for (let i = 0; i < d; i++) dot += this.patterns[base + i]! * state[i]!
      out[mu] = dot * this.scale
    }
  }

  /** out ← X softmax(β Xᵀ state); out must not alias state. */
  update (state: Float64Array, out: Float64Array): void {
    const d = this.dimension
    const w = this.weights
    const top = this.scores(state)
    let total = 0
    for (let mu = 0; mu < this.patternCount; mu++) {
      w[mu] = Math.exp(w[mu]! - top)
      total += w[mu]!
    }
    if (this.kernel !== null) {
      for (let mu = 0; mu < this.patternCount; mu++) this.coefficients[mu] = w[mu]! * this.scale / total
      this.kernel.accumulate(this.coefficients, out)
      return
    }
    out.fill(0, 0, d)
    for (let mu = 0; mu < this.patternCount; mu++) {
      const c = w[mu]! * this.scale / total
      const base = mu * d
      for (let i = 0; i < d; i++) out[i] = out[i]! + c * this.patterns[base + i]!
    }
  }

  /**
   * E(state) as above, with the log-sum-exp taken around its largest term. `overlaps`, when
   * given, must be `overlaps(state)` already computed (it saves the O(P·d) pass).
   */
  energy (state: Float64Array, overlaps?: Float64Array): number {
    const top = overlaps === undefined ? this.scores(state) : this.scoresFrom(overlaps)
    let total = 0
    for (let mu = 0; mu < this.patternCount; mu++) total += Math.exp(this.weights[mu]! - top)
    let norm = 0
    for (let i = 0; i < this.dimension; i++) norm += state[i]! * state[i]!
    return -(top + Math.log(total)) / this.beta + 0.5 * norm + Math.log(this.patternCount) / this.beta + 0.5
  }

  /** Scores a_μ = β x^μᵀ state into the weights buffer; returns their maximum. */
  private scores (state: Float64Array): number {
    this.overlaps(state, this.weights)
    return this.scoresFrom(this.weights)
  }

  /** Scores β·overlaps[μ] into the weights buffer (overlaps may be that buffer); returns their maximum. */
  private scoresFrom (overlaps: Float64Array): number {
    let top = -Infinity
    for (let mu = 0; mu < this.patternCount; mu++) {
      const a = this.beta * overlaps[mu]!
      this.weights[mu] = a
      if (a > top) top = a
    }
    return top
  }

  /** Approximate bytes held. */
  get bytes (): number {
    return this.patterns.byteLength + this.weights.byteLength + this.coefficients.byteLength
  }
}
