import type { Network } from './network.js'

/**
 * Hebbian network held in overlap space: no coupling matrix at all.
 *
 * ## Method
 * With J_ij = (1/N) Σ_μ ξ_i^μ ξ_j^μ (Hopfield 1982), the raw field is
 *   N·h_i = Σ_μ ξ_i^μ m_μ − P s_i,   m_μ = Σ_j ξ_j^μ s_j,
 * the −P s_i term removing the self-coupling J_ii = P/N (kept when `selfCoupling`).
 * A visit costs O(P) and a change O(P), against O(N) for a coupling row, and memory is
 * N·P bytes instead of N² words. All arithmetic is on small integers, so it is exact.
 * Patterns are stored neuron-major (ξ_i^· contiguous) because a visit reads one neuron's
 * entries for every pattern.
 */
export class OverlapSpaceNetwork implements Network {
  readonly representation = 'overlap-space' as const
  readonly neurons: number
  readonly patternCount: number
  readonly patterns: Int8Array
  readonly fieldScale: number
  readonly state: Int8Array
  readonly bytes: number
  private readonly byNeuron: Int8Array
  private readonly overlaps: Int32Array
  private readonly selfTerm: number

  constructor (patterns: Int8Array, neurons: number, patternCount: number, selfCoupling: boolean) {
    this.neurons = neurons
    this.patternCount = patternCount
    this.patterns = patterns
    this.fieldScale = 1 / neurons
    this.selfTerm = selfCoupling ? 0 : patternCount
    this.byNeuron = new Int8Array(neurons * patternCount)
    for (let mu = 0; mu < patternCount; mu++) {
      for (let i = 0; i < neurons; i++) this.byNeuron[i * patternCount + mu] = patterns[mu * neurons + i]!
    }
    this.overlaps = new Int32Array(patternCount)
    this.state = new Int8Array(neurons)
    this.bytes = 2 * neurons * patternCount + 4 * patternCount + neurons
  }

  load (state: Int8Array): void {
    this.state.set(state)
    const p = this.patternCount
    const n = this.neurons
    const m = this.overlaps
    m.fill(0)
    for (let mu = 0; mu < p; mu++) {
      let sum = 0
      const base = mu * n
      for (let i = 0; i < n; i++) sum += this.patterns[base + i]! * state[i]!
      m[mu] = sum
    }
  }

  field (i: number): number {
    const p = this.patternCount
    const xi = this.byNeuron
    const m = this.overlaps
    const base = i * p
    let h = 0
    for (let mu = 0; mu < p; mu++) h += xi[base + mu]! * m[mu]!
    return h - this.selfTerm * this.state[i]!
  }

  set (i: number, v: number): void {
    const delta = v - this.state[i]!
    if (delta === 0) return
    this.state[i] = v
    const p = this.patternCount
    const xi = this.byNeuron
    const m = this.overlaps
    const base = i * p
    for (let mu = 0; mu < p; mu++) m[mu] = m[mu]! + delta * xi[base + mu]!
  }

  energyPerNeuron (): number {
    // Σ_{i≠j} J_ij s_i s_j = (1/N)(Σ_μ m_μ² − P Σ_i s_i²)
    let sumSq = 0
    for (let mu = 0; mu < this.patternCount; mu++) sumSq += this.overlaps[mu]! * this.overlaps[mu]!
    let active = 0
    for (let i = 0; i < this.neurons; i++) active += this.state[i]! * this.state[i]!
    const n = this.neurons
    return -(sumSq - this.patternCount * active) / (2 * n * n)
  }

  rawOverlaps (out: Float64Array): void {
    for (let mu = 0; mu < this.patternCount; mu++) out[mu] = this.overlaps[mu]!
  }
}
