import type { NativeSweeps, Network } from './network.js'

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
 */
export class DenseMemoryNetwork implements Network {
  readonly representation = 'dense-memory' as const
  readonly fastPath = 'js'
  readonly native: NativeSweeps | null = null
  readonly neurons: number
  readonly patternCount: number
  readonly patterns: Int8Array
  readonly fieldScale: number
  readonly state: Int8Array
  readonly bytes: number
  private readonly byNeuron: Int8Array
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
    this.byNeuron = new Int8Array(n * patternCount)
    for (let mu = 0; mu < patternCount; mu++) {
      for (let i = 0; i < n; i++) this.byNeuron[i * patternCount + mu] = patterns[mu * n + i]!
    }
    this.overlaps = new Int32Array(patternCount)
    this.state = new Int8Array(n)
    this.bytes = 2 * patterns.byteLength + 4 * patternCount + this.table.byteLength + n
  }

  load (state: Int8Array): void {
    this.state.set(state)
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
    const base = i * p
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
    const base = i * p
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
    for (let mu = 0; mu < this.patternCount; mu++) out[mu] = this.overlaps[mu]!
  }
}

/** xᵏ by repeated multiplication: exact for integers while the result stays below 2⁵³. */
function integerPower (x: number, k: number): number {
  let out = 1
  for (let e = 0; e < k; e++) out *= x
  return out
}
