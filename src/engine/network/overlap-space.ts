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
  private readonly byNeuron: Float64Array
  private readonly overlaps: Float64Array
  private readonly selfTerm: number

  constructor (patterns: Int8Array, neurons: number, patternCount: number, selfCoupling: boolean) {
    this.neurons = neurons
    this.patternCount = patternCount
    this.patterns = patterns
    this.fieldScale = 1 / neurons
    this.selfTerm = selfCoupling ? 0 : patternCount
    this.byNeuron = new Float64Array(neurons * patternCount)
    for (let mu = 0; mu < patternCount; mu++) {
      for (let i = 0; i < neurons; i++) this.byNeuron[i * patternCount + mu] = patterns[mu * neurons + i]!
    }
    this.overlaps = new Float64Array(patternCount)
    this.state = new Int8Array(neurons)
    this.bytes = 9 * neurons * patternCount + 8 * patternCount + neurons
  }

  load (state: Int8Array): void {
    if (this.loadChanges(state)) return
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
    // Four independent sums break the add-latency chain (V8 does not vectorise); every
    // term is a small integer, so the regrouping is exact.
    let h0 = 0
    let h1 = 0
    let h2 = 0
    let h3 = 0
    let mu = 0
    for (; mu + 3 < p; mu += 4) {
      const o = base + mu
      h0 += xi[o]! * m[mu]!
      h1 += xi[o + 1]! * m[mu + 1]!
      h2 += xi[o + 2]! * m[mu + 2]!
      h3 += xi[o + 3]! * m[mu + 3]!
    }
    for (; mu < p; mu++) h0 += xi[base + mu]! * m[mu]!
    return (h0 + h1) + (h2 + h3) - this.selfTerm * this.state[i]!
  }

  /**
   * When the new state differs from the current one in few neurons (synchronous steps
   * near a fixed point), update the overlaps from the differences: O(changes·P), not O(N·P).
   */
  private loadChanges (state: Int8Array): boolean {
    const n = this.neurons
    let changes = 0
    const limit = n >> 3
    for (let i = 0; i < n; i++) {
      if (state[i] !== this.state[i] && ++changes > limit) return false
    }
    for (let i = 0; i < n; i++) {
      if (state[i] !== this.state[i]) this.set(i, state[i]!)
    }
    return true
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
