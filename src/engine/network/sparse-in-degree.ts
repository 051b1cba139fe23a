import type { NativeSweeps, Network } from './network.js'
import type { InDegreeCouplings } from '../rules/in-degree-couplings.js'
import { SparseKernel } from '../kernels/sparse-kernel.js'
import { areFastPathsEnabled } from '../kernels/wasm.js'

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
 *
 * Whole sweeps, steps, zero-temperature trials and field builds run in a WebAssembly kernel
 * (`fastPath`, kernels/sparse-kernel.ts) when the host supports it and the fields fit int32;
 * it builds the fields along the out-lists, so the network then keeps no rows at all.
 */
export class SparseInDegreeNetwork implements Network {
  readonly representation = 'sparse-in-degree' as const
  readonly fastPath: string
  readonly native: NativeSweeps | null
  readonly neurons: number
  readonly patternCount: number
  readonly patterns: Int8Array
  readonly fieldScale: number
  readonly state: Int8Array
  readonly bytes: number
  private readonly inDegree: number
  /** Rows: the inputs and couplings of each neuron (the kernel's compact copies when it runs). */
  private readonly inputs: Int32Array | Uint16Array
  private readonly weights: Int32Array | Int16Array
  private readonly kernel: SparseKernel | null
  /** out(j) = targets[outStart[j] … outStart[j + 1] − 1], with the coupling T_ij of each. */
  private readonly outStart: Int32Array
  private readonly targets: Int32Array | Uint16Array
  private readonly targetWeights: Int32Array | Int16Array
  private readonly h: Float64Array

  constructor (patterns: Int8Array, neurons: number, patternCount: number, couplings: InDegreeCouplings, fieldScale: number) {
    const n = neurons
    const k = couplings.inDegree
    this.neurons = n
    this.patternCount = patternCount
    this.patterns = patterns
    this.fieldScale = fieldScale
    this.inDegree = k
    const { inputs, weights } = couplings
    this.outStart = new Int32Array(n + 1)
    for (let e = 0; e < n * k; e++) this.outStart[inputs[e]! + 1] = this.outStart[inputs[e]! + 1]! + 1
    for (let j = 0; j < n; j++) this.outStart[j + 1] = this.outStart[j + 1]! + this.outStart[j]!
    let maxWeight = 0
    for (let e = 0; e < n * k; e++) maxWeight = Math.max(maxWeight, Math.abs(weights[e]!))
    this.kernel = areFastPathsEnabled() ? SparseKernel.create(this.outStart, n, k, patternCount, maxWeight) : null
    this.targets = this.kernel?.targets ?? new Int32Array(n * k)
    this.targetWeights = this.kernel?.targetWeights ?? new Int32Array(n * k)
    const fill = this.outStart.slice(0, n)
    for (let i = 0; i < n; i++) {
      for (let s = 0; s < k; s++) {
        const j = inputs[i * k + s]!
        const at = fill[j]!++
        this.targets[at] = i
        this.targetWeights[at] = weights[i * k + s]!
      }
    }
    if (this.kernel !== null) {
      this.kernel.inputs.set(inputs)
      this.kernel.weights.set(weights)
      this.kernel.loadPatterns(patterns)
    }
    // The rule's int32 rows become garbage once the kernel holds its compact copy.
    this.inputs = this.kernel?.inputs ?? inputs
    this.weights = this.kernel?.weights ?? weights
    this.fastPath = this.kernel?.name ?? 'js'
    this.state = new Int8Array(n)
    this.h = new Float64Array(n)
    this.bytes = (this.kernel === null ? 16 : 8) * n * k + 4 * (n + 1) + 9 * n + patterns.byteLength
    this.native = this.kernel === null ? null : kernelSweeps(this.kernel, this.state, this.h)
  }

  load (state: Int8Array): void {
    this.state.set(state)
    if (this.kernel !== null) {
      this.kernel.load(this.state, this.h)
      return
    }
    const k = this.inDegree
    const inputs = this.inputs
    const weights = this.weights
    for (let i = 0; i < this.neurons; i++) {
      let sum = 0
      for (let e = i * k; e < i * k + k; e++) sum += weights[e]! * state[inputs[e]!]!
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
    if (this.kernel?.overlaps(this.state, 0, this.patternCount, out) === true) return
    const n = this.neurons
    for (let mu = 0; mu < this.patternCount; mu++) {
      let sum = 0
      for (let i = 0; i < n; i++) sum += this.patterns[mu * n + i]! * this.state[i]!
      out[mu] = sum
    }
  }

  /**
   * One raw overlap: by popcount in the kernel (O(N/64)) when it runs and the state has no 0,
   * else the plain sum. Same integer either way.
   */
  readonly rawOverlapWith = (mu: number): number => {
    if (this.kernel?.overlaps(this.state, mu, 1, this.single) === true) return this.single[0]!
    const n = this.neurons
    let sum = 0
    for (let i = 0; i < n; i++) sum += this.patterns[mu * n + i]! * this.state[i]!
    return sum
  }

  private readonly single = new Float64Array(1)
}

function kernelSweeps (kernel: SparseKernel, state: Int8Array, h: Float64Array): NativeSweeps {
  return {
    runZeroTemperature: (order, maxSweeps, shuffle, rng) => {
      const run = kernel.runAsync(state, h, order, maxSweeps, shuffle, rng)
      return run === null ? null : { sweeps: run.sweeps, ending: run.changedLast ? 'max' : 'fixed' }
    },
    sweepZeroTemperature: (order) => kernel.sweep(state, h, order),
    stepZeroTemperature: (previous, checkPrevious) => {
      const outcome = kernel.sync(state, h, previous, checkPrevious)
      return outcome === 1 ? 'fixed' : outcome === 2 ? 'cycle2' : 'changed'
    },
    sweepGlauber: (order, noise, factor) => kernel.glauber(state, h, order, noise, factor),
    stepGlauber: (noise, factor) => kernel.glauberSync(state, h, noise, factor)
  }
}
