import type { NativeSweeps, Network } from './network.js'
import { DenseKernel } from '../kernels/dense-kernel.js'
import { DenseIntKernel, integerFieldBound } from '../kernels/dense-int-kernel.js'
import { areFastPathsEnabled } from '../kernels/wasm.js'

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
 *
 * Whole sweeps, steps and field builds run in a WebAssembly SIMD kernel (`fastPath`) when the
 * host supports it: int16 couplings with exact int32 fields when every coupling is an integer
 * (Hebbian on 0/1 neurons, dilution keeping 1 in k), float64 otherwise. Float64 field builds
 * are vectorised when the columns are the exact transpose of the rows (always for the
 * transposed copy; checked bit by bit for a matrix declared symmetric, which numerical rules
 * such as the pseudo-inverse need not be).
 */
export class DenseNetwork implements Network {
  readonly representation = 'dense-incremental' as const
  readonly neurons: number
  readonly patternCount: number
  readonly patterns: Int8Array
  readonly fieldScale: number
  readonly state: Int8Array
  readonly bytes: number
  readonly fastPath: string
  readonly native: NativeSweeps | null
  private readonly kernel: DenseKernel | DenseIntKernel | null
  /** Rows, for the plain field build; null when a kernel builds the fields. */
  private readonly couplings: Float64Array | null
  /** Columns read by the plain `set`; null when the int16 kernel holds the only copy. */
  private readonly columns: Float64Array | null
  private readonly diagonal: Float64Array
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
    this.bias = options.bias
    this.fieldScale = options.fieldScale
    this.diagonal = new Float64Array(n)
    for (let i = 0; i < n; i++) this.diagonal[i] = options.couplings[i * n + i]!
    const exact = !options.symmetric || isExactlySymmetric(options.couplings, n)
    const transposed = !options.symmetric
    let kernel: DenseKernel | DenseIntKernel | null = null
    if (areFastPathsEnabled()) {
      const fieldBound = exact ? integerFieldBound(options.couplings, this.bias, n) : null
      if (fieldBound !== null) kernel = DenseIntKernel.create(options.couplings, this.bias, n, options.symmetric, fieldBound)
      kernel ??= DenseKernel.create(options.couplings, transposed, this.bias, n, exact)
    }
    this.kernel = kernel
    if (kernel === null) {
      this.columns = transposed ? transpose(options.couplings, n) : options.couplings
      this.couplings = options.couplings
    } else {
      // A kernel builds the fields, so the rows are not needed; a private kernel memory holds
      // the only copy of the columns.
      this.columns = kernel instanceof DenseKernel ? kernel.columns : null
      this.couplings = null
    }
    this.fastPath = kernel?.name ?? 'js'
    this.state = new Int8Array(n)
    this.h = new Float64Array(n)
    this.native = kernel === null ? null : kernelSweeps(kernel, this.state, this.h)
    const matrixBytes = kernel instanceof DenseIntKernel
      ? 2 * kernel.columns.length
      : 8 * n * n * (kernel === null && !options.symmetric ? 2 : 1)
    this.bytes = matrixBytes + 24 * n + options.patterns.length
  }

  load (state: Int8Array): void {
    const n = this.neurons
    this.state.set(state)
    if (this.kernel !== null) {
      this.kernel.load(this.state, this.h)
      return
    }
    const rows = this.couplings!
    for (let i = 0; i < n; i++) {
      let sum = this.bias[i]!
      const row = i * n
      for (let j = 0; j < n; j++) sum += rows[row + j]! * state[j]!
      this.h[i] = sum
    }
  }

  field (i: number): number {
    return this.h[i]!
  }

  set (j: number, v: number): void {
    const col = this.columns
    if (col === null) {
      (this.kernel as DenseIntKernel).set(this.state, this.h, j, v)
      return
    }
    const delta = v - this.state[j]!
    if (delta === 0) return
    this.state[j] = v
    const n = this.neurons
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
      const coupled = this.h[i]! - this.bias[i]! - this.diagonal[i]! * s
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

function kernelSweeps (kernel: DenseKernel | DenseIntKernel, state: Int8Array, h: Float64Array): NativeSweeps {
  return {
    sweepZeroTemperature: (order) => kernel.sweep(state, h, order),
    stepZeroTemperature: (previous, checkPrevious) => {
      const outcome = kernel.sync(state, h, previous, checkPrevious)
      return outcome === 1 ? 'fixed' : outcome === 2 ? 'cycle2' : 'changed'
    },
    sweepGlauber: (order, noise, factor) => kernel.glauber(state, h, order, noise, factor),
    stepGlauber: (noise, factor) => kernel.glauberSync(state, h, noise, factor)
  }
}

/** True when J_ij and J_ji are the same double (Object.is: signed zeros count). */
function isExactlySymmetric (matrix: Float64Array, n: number): boolean {
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      if (!Object.is(matrix[i * n + j], matrix[j * n + i])) return false
    }
  }
  return true
}

function transpose (matrix: Float64Array, n: number): Float64Array {
  const out = new Float64Array(n * n)
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) out[j * n + i] = matrix[i * n + j]!
  }
  return out
}
