import type { NativeSweeps, Network } from './network.js'
import type { InDegreeCouplings } from '../rules/in-degree-couplings.js'

/**
 * Network with a fixed number K of inputs per neuron, held as adjacency lists: memory
 * O(N·K) instead of N² words, so N = 10⁵ with K = 50 fits easily.
 *
 * ## Method
 * Row i lists the inputs j of neuron i and the raw couplings T_ij (integers). The local
 * fields h_i = Σ_{j ∈ in(i)} T_ij s_j are maintained: `load` builds them in O(N·K), and a
 * change of s_j adds Δs_j · T_ij to the fields of the neurons j projects to, read from the
 * transposed lists (out(j), O(K) on average). Integer sums are exact, so the tie rule
 * (h = 0 keeps s_i) is decided exactly. The couplings are asymmetric: the energy reported
 * is E/N with E = −½ Σ_i s_i h_i, which is **not** a Lyapunov function here.
 */
export class SparseInDegreeNetwork implements Network {
  readonly representation = 'sparse-in-degree' as const
  readonly fastPath = 'js'
  readonly native: NativeSweeps | null = null
  readonly neurons: number
  readonly patternCount: number
  readonly patterns: Int8Array
  readonly fieldScale: number
  readonly state: Int8Array
  readonly bytes: number
  private readonly inDegree: number
  private readonly inputs: Int32Array
  private readonly weights: Int32Array
  /** out(j) = targets[outStart[j] … outStart[j + 1] − 1], with the coupling T_ij of each. */
  private readonly outStart: Int32Array
  private readonly targets: Int32Array
  private readonly targetWeights: Int32Array
  private readonly h: Float64Array

  constructor (patterns: Int8Array, neurons: number, patternCount: number, couplings: InDegreeCouplings, fieldScale: number) {
    const n = neurons
    const k = couplings.inDegree
    this.neurons = n
    this.patternCount = patternCount
    this.patterns = patterns
    this.fieldScale = fieldScale
    this.inDegree = k
    this.inputs = couplings.inputs
    this.weights = couplings.weights
    this.outStart = new Int32Array(n + 1)
    for (let e = 0; e < n * k; e++) this.outStart[this.inputs[e]! + 1] = this.outStart[this.inputs[e]! + 1]! + 1
    for (let j = 0; j < n; j++) this.outStart[j + 1] = this.outStart[j + 1]! + this.outStart[j]!
    this.targets = new Int32Array(n * k)
    this.targetWeights = new Int32Array(n * k)
    const fill = this.outStart.slice(0, n)
    for (let i = 0; i < n; i++) {
      for (let s = 0; s < k; s++) {
        const j = this.inputs[i * k + s]!
        const at = fill[j]!++
        this.targets[at] = i
        this.targetWeights[at] = this.weights[i * k + s]!
      }
    }
    this.state = new Int8Array(n)
    this.h = new Float64Array(n)
    this.bytes = 16 * n * k + 4 * (n + 1) + 9 * n + patterns.byteLength
  }

  load (state: Int8Array): void {
    this.state.set(state)
    const k = this.inDegree
    for (let i = 0; i < this.neurons; i++) {
      let sum = 0
      for (let e = i * k; e < i * k + k; e++) sum += this.weights[e]! * state[this.inputs[e]!]!
      this.h[i] = sum
    }
  }

  field (i: number): number {
    return this.h[i]!
  }

  set (j: number, v: number): void {
    const delta = v - this.state[j]!
    if (delta === 0) return
    this.state[j] = v
    for (let e = this.outStart[j]!; e < this.outStart[j + 1]!; e++) {
      const i = this.targets[e]!
      this.h[i] = this.h[i]! + delta * this.targetWeights[e]!
    }
  }

  energyPerNeuron (): number {
    let sum = 0
    for (let i = 0; i < this.neurons; i++) sum += this.state[i]! * this.h[i]!
    return -0.5 * sum * this.fieldScale / this.neurons
  }

  rawOverlaps (out: Float64Array): void {
    const n = this.neurons
    for (let mu = 0; mu < this.patternCount; mu++) {
      let sum = 0
      for (let i = 0; i < n; i++) sum += this.patterns[mu * n + i]! * this.state[i]!
      out[mu] = sum
    }
  }
}
