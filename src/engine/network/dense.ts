import type { Network } from './network.js'

/**
 * Network with an explicit N×N coupling matrix and incrementally maintained local fields.
 *
 * ## Method
 * `couplings[i·N + j]` = J_ij in raw units (physical J = raw · fieldScale), `bias[i]` = −θ_i
 * in raw units. The accumulator `h[i] = Σ_j J_ij s_j + bias_i` is built once per `load`
 * (O(N²)) and updated on each change of s_j by adding (Δs_j) · J_·j: O(N) per change and
 * O(1) per visit, so a sweep with few changes is cheap. Column j is read as a contiguous
 * row: the matrix itself when symmetric, a transposed copy otherwise.
 * Hebbian couplings stored as raw integers stay exact in doubles (|J| ≤ P ≪ 2^53).
 */
export class DenseNetwork implements Network {
  readonly representation = 'dense-incremental' as const
  readonly neurons: number
  readonly patternCount: number
  readonly patterns: Int8Array
  readonly fieldScale: number
  readonly state: Int8Array
  readonly bytes: number
  readonly fastPath = 'js'
  readonly native = null
  private readonly couplings: Float64Array
  private readonly columns: Float64Array
  private readonly bias: Float64Array
  private readonly h: Float64Array

  constructor (options: {
    patterns: Int8Array
    neurons: number
    patternCount: number
    couplings: Float64Array
    bias: Float64Array
    fieldScale: number
    symmetric: boolean
  }) {
    const n = options.neurons
    this.neurons = n
    this.patternCount = options.patternCount
    this.patterns = options.patterns
    this.couplings = options.couplings
    this.bias = options.bias
    this.fieldScale = options.fieldScale
    this.columns = options.symmetric ? options.couplings : transpose(options.couplings, n)
    this.state = new Int8Array(n)
    this.h = new Float64Array(n)
    this.bytes = 8 * n * n * (options.symmetric ? 1 : 2) + 16 * n + options.patterns.length
  }

  load (state: Int8Array): void {
    const n = this.neurons
    this.state.set(state)
    for (let i = 0; i < n; i++) {
      let sum = this.bias[i]!
      const row = i * n
      for (let j = 0; j < n; j++) sum += this.couplings[row + j]! * state[j]!
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
    const n = this.neurons
    const col = this.columns
    const h = this.h
    const base = j * n
    for (let i = 0; i < n; i++) h[i] = h[i]! + delta * col[base + i]!
  }

  energyPerNeuron (): number {
    const n = this.neurons
    let pair = 0
    let threshold = 0
    for (let i = 0; i < n; i++) {
      const s = this.state[i]!
      const coupled = this.h[i]! - this.bias[i]! - this.couplings[i * n + i]! * s
      pair += s * coupled
      threshold += this.bias[i]! * s
    }
    return (-0.5 * pair - threshold) * this.fieldScale / n
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

function transpose (matrix: Float64Array, n: number): Float64Array {
  const out = new Float64Array(n * n)
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) out[j * n + i] = matrix[i * n + j]!
  }
  return out
}
