import type { NativeSweeps, Network } from './network.js'
import { DenseMemoryKernel } from '../kernels/dense-memory-kernel.js'
import { areFastPathsEnabled } from '../kernels/wasm.js'

/** The interaction F of a dense associative memory. */
export type Interaction = { kind: 'polynomial', degree: number } | { kind: 'exponential' }

/**
 * Dense associative memory of ±1 neurons: energy E = −Σ_μ F(ξ^μ·σ), with F(x) = xⁿ
 * (Krotov & Hopfield, NeurIPS 29 (2016)) or F(x) = eˣ (Demircigil, Heusel, Löwe, Upgang &
 * Vermet, J. Stat. Phys. 168, 288 (2017)). There is no coupling matrix.
 *
 * ## Method
 * The update σ_i ← sign Σ_μ [F(ξ_i^μ + r_μ) − F(−ξ_i^μ + r_μ)], r_μ = Σ_{j≠i} ξ_j^μ σ_j,
 * picks the σ_i of lower energy, so E never increases under asynchronous updates, for any F.
 * The overlaps m_μ = Σ_j ξ_j^μ σ_j are maintained (r_μ = m_μ − ξ_i^μ σ_i), so a visit and a
 * change each cost O(P), and F(ξ + r) − F(−ξ + r) = ξ·D(r) is read from a table over the
 * integers |r| ≤ N − 1:
 * - polynomial: D(r) = (r + 1)ⁿ − (r − 1)ⁿ, an integer, so raw fields are exact integers
 *   (and the tie rule exact) while P·2n·N^{n−1} < 2⁵³; beyond that they are rounded sums.
 *   Physical field h_i = raw / (2n N^{n−1}), i.e. half the energy drop of flipping σ_i up
 *   with E scaled by 1/(n N^{n−1}), so the signal on a stored pattern is ≈ 1 for every n,
 *   and n = 2 gives exactly the Hebbian field with J_ii = 0 (same dynamics at any T).
 * - exponential: D(r) = 2 sinh(1) eʳ; the raw field is Σ_μ ξ_i^μ e^{r_μ − R} with R = max_μ r_μ,
 *   the true field divided by the positive 2 sinh(1) e^R, so nothing overflows (e^N does for
 *   N > 709) and the largest term is 1. Only its sign is meaningful (zero temperature).
 *
 * `energyPerNeuron`: polynomial −Σ_μ (m_μ)ⁿ / (n Nⁿ), the energy E scaled as above and divided
 * by N (n = 2: the Hebbian energy minus P·Σσ_i²/(2N²), i.e. without its self-coupling
 * constant); exponential −(1/N) ln Σ_μ e^{m_μ} = −ln(−E)/N, finite at any N. Both are
 * increasing functions of E, so they never increase when E does not.
 *
 * Whole sweeps and steps run in a WebAssembly SIMD kernel (`fastPath`, kernels/dense-memory-kernel.ts)
 * when the host supports it and, for the polynomial, its sums are exact; its decisions are the
 * ones the per-neuron methods below (the plain path) take.
 */
export class DenseMemoryNetwork implements Network {
  readonly representation = 'dense-memory' as const
  readonly fastPath: string
  readonly native: NativeSweeps | null
  readonly neurons: number
  readonly patternCount: number
  readonly patterns: Int8Array
  readonly fieldScale: number
  readonly state: Int8Array
  readonly bytes: number
  /** Neuron-major patterns, byNeuron[i·stride + μ] (stride P, or the kernel's padded stride). */
  private readonly byNeuron: Int8Array
  private readonly stride: number
  private readonly kernel: DenseMemoryKernel | null
  private readonly overlaps: Int32Array
  private readonly degree: number
  /** Polynomial: D(r) at index r + N − 1. Exponential: e^{−d} at index d = R − r. */
  private readonly table: Float64Array

  constructor (patterns: Int8Array, neurons: number, patternCount: number, interaction: Interaction) {
    const n = neurons
    this.neurons = n
    this.patternCount = patternCount
    this.patterns = patterns
    this.degree = interaction.kind === 'polynomial' ? interaction.degree : 0
    this.table = new Float64Array(2 * n - 1)
    if (this.degree > 0) {
      for (let r = 1 - n; r <= n - 1; r++) this.table[r + n - 1] = integerPower(r + 1, this.degree) - integerPower(r - 1, this.degree)
      this.fieldScale = 1 / (2 * this.degree * Math.pow(n, this.degree - 1))
    } else {
      for (let d = 0; d < this.table.length; d++) this.table[d] = Math.exp(-d)
      this.fieldScale = 1
    }
    this.kernel = areFastPathsEnabled() ? DenseMemoryKernel.create(n, patternCount, this.degree > 0 ? this.degree : null) : null
    if (this.kernel !== null) {
      this.stride = this.kernel.stride
      this.byNeuron = this.kernel.xi
      this.kernel.loadPatterns(patterns)
    } else {
      this.stride = patternCount
      this.byNeuron = new Int8Array(n * patternCount)
      for (let mu = 0; mu < patternCount; mu++) {
        for (let i = 0; i < n; i++) this.byNeuron[i * patternCount + mu] = patterns[mu * n + i]!
      }
    }
    this.fastPath = this.kernel?.name ?? 'js'
    this.overlaps = new Int32Array(patternCount)
    this.state = new Int8Array(n)
    this.bytes = patterns.byteLength + this.byNeuron.byteLength + 4 * patternCount + this.table.byteLength + n
    this.native = this.kernel === null ? null : this.kernelSweeps(this.kernel)
  }

  load (state: Int8Array): void {
    this.state.set(state)
    if (this.kernel !== null) {
      this.kernel.overlaps(this.state, this.overlaps)
      return
    }
    const n = this.neurons
    for (let mu = 0; mu < this.patternCount; mu++) {
      let sum = 0
      const base = mu * n
      for (let i = 0; i < n; i++) sum += this.patterns[base + i]! * state[i]!
      this.overlaps[mu] = sum
    }
  }

  field (i: number): number {
    const p = this.patternCount
    const xi = this.byNeuron
    const m = this.overlaps
    const table = this.table
    const si = this.state[i]!
    const base = i * this.stride
    let h = 0
    if (this.degree > 0) {
      const offset = this.neurons - 1
      for (let mu = 0; mu < p; mu++) {
        const x = xi[base + mu]!
        h += x * table[m[mu]! - x * si + offset]!
      }
      return h
    }
    let top = -Infinity
    for (let mu = 0; mu < p; mu++) {
      const r = m[mu]! - xi[base + mu]! * si
      if (r > top) top = r
    }
    for (let mu = 0; mu < p; mu++) {
      const x = xi[base + mu]!
      h += x * table[top - (m[mu]! - x * si)]!
    }
    return h
  }

  set (i: number, v: number): void {
    const delta = v - this.state[i]!
    if (delta === 0) return
    this.state[i] = v
    const p = this.patternCount
    const base = i * this.stride
    for (let mu = 0; mu < p; mu++) this.overlaps[mu] = this.overlaps[mu]! + delta * this.byNeuron[base + mu]!
  }

  energyPerNeuron (): number {
    const n = this.neurons
    const m = this.overlaps
    if (this.degree > 0) {
      let sum = 0
      for (let mu = 0; mu < this.patternCount; mu++) sum += integerPower(m[mu]! / n, this.degree)
      return -sum / this.degree
    }
    let top = -Infinity
    for (let mu = 0; mu < this.patternCount; mu++) if (m[mu]! > top) top = m[mu]!
    let sum = 0
    for (let mu = 0; mu < this.patternCount; mu++) sum += Math.exp(m[mu]! - top)
    return -(top + Math.log(sum)) / n
  }

  rawOverlaps (out: Float64Array): void {
    out.set(this.overlaps)
  }

  readonly rawOverlapWith = (mu: number): number => this.overlaps[mu]!

  private kernelSweeps (kernel: DenseMemoryKernel): NativeSweeps {
    const state = this.state
    const m = this.overlaps
    // The exponential memory runs at zero temperature only (the spec refuses T > 0); should a
    // caller still ask, its Glauber sweeps take the plain per-neuron loop.
    const plainGlauber = (order: Int32Array, noise: Float64Array, factor: number): void => {
      for (let k = 0; k < order.length; k++) {
        const i = order[k]!
        const v = noise[k]! * (1 + Math.exp(factor * this.field(i))) < 1 ? 1 : -1
        if (state[i] !== v) this.set(i, v)
      }
    }
    const plainGlauberStep = (noise: Float64Array, factor: number): void => {
      const next = new Int8Array(this.neurons)
      for (let i = 0; i < this.neurons; i++) next[i] = noise[i]! * (1 + Math.exp(factor * this.field(i))) < 1 ? 1 : -1
      this.load(next)
    }
    return {
      sweepZeroTemperature: (order) => kernel.sweep(state, m, order),
      stepZeroTemperature: (previous, checkPrevious) => {
        const outcome = kernel.sync(state, m, previous, checkPrevious)
        return outcome === 1 ? 'fixed' : outcome === 2 ? 'cycle2' : 'changed'
      },
      sweepGlauber: this.degree > 0 ? (order, noise, factor) => kernel.glauber(state, m, order, noise, factor) : plainGlauber,
      stepGlauber: this.degree > 0 ? (noise, factor) => kernel.glauberSync(state, m, noise, factor) : plainGlauberStep
    }
  }
}

/** xᵏ by repeated multiplication: exact for integers while the result stays below 2⁵³. */
function integerPower (x: number, k: number): number {
  let out = 1
  for (let e = 0; e < k; e++) out *= x
  return out
}
