import { EMPTY, unlessMemoryRefused, Workspaces, type Workspace } from './wasm.js'
import type { KernelsUsing } from './signatures.js'

/**
 * WebAssembly SIMD128 fast path of the modern softmax network (models/softmax/memory.ts; kernel
 * text: "softmax" in scripts/gen-kernels.ts).
 *
 * ## Why this shape
 * An update is two passes over the P × d patterns: the overlaps x^μ·ξ (each a sequential sum
 * over the entries) and the weighted sum Σ_μ c_μ x^μ. The plain loops add one term at a time
 * to one accumulator; here eight overlaps (or sixteen entries of the sum) advance side by side
 * in SIMD lanes, each lane adding the plain terms in the plain order. A ±1 entry times a double
 * is that double with its sign flipped or kept, done exactly by XOR with the sign bit, so
 * every lane computes the plain double bit for bit. The exponentials, the largest score and
 * the normalisation stay in the plain JavaScript (O(P) per update).
 *
 * Memory: the patterns keep their pattern-major layout (the kernels read past the end of a
 * row; see the generator). A network with 8 MiB of patterns or more owns a private instance
 * whose memory holds the only copy (`patterns` is a view into it); smaller ones share an
 * instance and copy their patterns in when another network used it last.
 */
type SoftmaxExports = KernelsUsing<'softmaxOverlaps' | 'softmaxAccumulate'>

const workspaces = new Workspaces<SoftmaxExports>('softmax', 8 * 1024 * 1024)

/** Moves the shared/private boundary (tests use it to exercise private instances on small networks). */
export function setSoftmaxPrivateBytes (bytes: number): void {
  workspaces.privateBytes = bytes
}

let nextId = 1
const align16 = (x: number): number => (x + 15) & ~15

/** Bytes the kernel adds beside the patterns (memory estimates): state, overlaps, coefficients, sums. */
export function softmaxKernelExtraBytes (dimension: number, patterns: number): number {
  return 16 * align16(dimension) + 16 * patterns + 64
}

export class SoftmaxKernel {
  readonly name = 'wasm-simd128-softmax'
  /** The patterns, pattern-major: the caller's array (shared instance) or a view into the private memory. */
  readonly patterns: Int8Array
  private readonly ws: Workspace<SoftmaxExports>
  private readonly k: SoftmaxExports
  private readonly isPrivate: boolean
  private readonly id = nextId++
  private readonly d: number
  private readonly p: number
  private readonly patAt = 0
  private readonly stAt: number
  private readonly ovAt: number
  private readonly coefAt: number
  private readonly outAt: number
  private readonly end: number
  private buffer: ArrayBuffer | null = null
  private st64: Float64Array = EMPTY.f64
  private ov64: Float64Array = EMPTY.f64
  private coef64: Float64Array = EMPTY.f64
  private out64: Float64Array = EMPTY.f64

  /**
   * Null when the host lacks WebAssembly SIMD or the layout does not fit a 32-bit memory. With
   * `patterns` null the caller fills `patterns` itself afterwards (a private memory then holds
   * the only copy from the start: no second pattern-sized array exists even while building).
   */
  static create (patterns: Int8Array | null, dimension: number, count: number): SoftmaxKernel | null {
    if (dimension * count + softmaxKernelExtraBytes(dimension, count) > 3.5 * 2 ** 30) return null
    const ws = workspaces.for(dimension * count)
    return ws === null ? null : unlessMemoryRefused(() => new SoftmaxKernel(ws, patterns, dimension, count))
  }

  private constructor (ws: Workspace<SoftmaxExports>, patterns: Int8Array | null, d: number, p: number) {
    this.ws = ws
    this.k = ws.k
    this.d = d
    this.p = p
    const dd = align16(d)
    // 16 bytes of slack: the last row is read 16 bytes at a time past its end.
    this.stAt = align16(d * p + 16)
    this.ovAt = this.stAt + 8 * dd
    this.coefAt = align16(this.ovAt + 8 * p)
    this.outAt = align16(this.coefAt + 8 * p)
    this.end = this.outAt + 8 * dd
    this.isPrivate = ws.isPrivate
    ws.reserve(this.end)
    if (this.isPrivate) {
      this.patterns = new Int8Array(ws.buffer, this.patAt, d * p)
      if (patterns !== null) this.patterns.set(patterns)
    } else {
      this.patterns = patterns ?? new Int8Array(d * p)
    }
  }

  /** out[μ] = (x^μ·state)·scale for every pattern, as the plain loop computes it. */
  overlaps (state: Float64Array, out: Float64Array, scale: number): void {
    this.enter()
    this.st64.set(state.subarray(0, this.d))
    this.k.softmaxOverlaps(this.patAt, this.d, this.stAt, this.ovAt, this.p, scale)
    out.set(this.ov64)
  }

  /** out[i] = Σ_μ coef[μ]·x_i^μ for i < d, each sum from +0 in μ order, as the plain loop computes it. */
  accumulate (coef: Float64Array, out: Float64Array): void {
    this.enter()
    this.coef64.set(coef.subarray(0, this.p))
    this.k.softmaxAccumulate(this.patAt, this.d, this.coefAt, this.outAt, this.p)
    out.set(this.out64.subarray(0, this.d))
  }

  private enter (): void {
    const ws = this.ws
    if (!this.isPrivate) ws.reserve(this.end)
    const buffer = ws.buffer
    if (buffer !== this.buffer) {
      this.buffer = buffer
      this.st64 = new Float64Array(buffer, this.stAt, align16(this.d))
      this.ov64 = new Float64Array(buffer, this.ovAt, this.p)
      this.coef64 = new Float64Array(buffer, this.coefAt, this.p)
      this.out64 = new Float64Array(buffer, this.outAt, align16(this.d))
    }
    if (ws.residentId !== this.id) {
      if (!this.isPrivate) new Int8Array(buffer, this.patAt, this.d * this.p).set(this.patterns)
      // State padding must be +0: the overlap pass adds its sign-flipped copies.
      this.st64.fill(0)
      ws.residentId = this.id
    }
  }
}
