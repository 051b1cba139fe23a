import { EMPTY, unlessMemoryRefused, Workspaces, type Workspace } from './wasm.js'
import type { KernelsUsing } from './signatures.js'

/**
 * WebAssembly SIMD128 fast path of the dense associative memories (network/dense-memory.ts;
 * kernel text and the argument for exactness: "denseMemory" in scripts/gen-kernels.ts).
 *
 * ## Why this shape
 * The plain visit gathers P table entries and adds them one after the other. Here a visit is
 * a masked sum of a float64 vector that depends on the overlaps only (rebuilt, O(P), when a
 * neuron changes, which rewrites every overlap anyway), two lanes per SIMD operation.
 * - Polynomial F(x) = xⁿ: the field is an integer, computed exactly, so it is the plain
 *   field bit for bit, at any temperature. Only where every sum stays an integer below 2⁵³
 *   (`polynomialKernelFits`); elsewhere the network keeps the plain path.
 * - Exponential: the sign of a quantity with the sign of the exact field decides wherever it
 *   is further from 0 than both computations' rounding errors together; elsewhere (ties and
 *   near-ties) the kernel computes the plain sum itself, in the plain order. Every decision is
 *   the plain decision. Zero temperature only, as the model.
 *
 * Memory as in the overlap kernel: neuron-major int8 patterns (P padded to 16) in a shared
 * instance for small networks (copied in when another network used it last), in a private
 * instance, as the only copy, for networks of 8 MiB of patterns or more.
 */
type MemoryExports = KernelsUsing<'overlaps32' | 'transpose' | 'memVectorPoly' | 'memSweepPoly' | 'memSyncPoly' | 'memGlauberPoly' | 'memGlauberSyncPoly' | 'memSweepExp' | 'memSyncExp'>

const workspaces = new Workspaces<MemoryExports>('memory', 8 * 1024 * 1024)

/** Moves the shared/private boundary (tests use it to exercise private instances on small networks). */
export function setDenseMemoryPrivateBytes (bytes: number): void {
  workspaces.privateBytes = bytes
}

let nextId = 1
const align16 = (x: number): number => (x + 15) & ~15
const STAGE_BYTES = 1024 * 1024

export type DenseMemoryKernelName = 'wasm-simd128-dense-memory-poly' | 'wasm-simd128-dense-memory-exp'

/**
 * Whether the polynomial kernel computes exact fields for degree n: every D(r) = (r+1)ⁿ − (r−1)ⁿ
 * with |r| ≤ N + 1 is an exact double ((N + 2)ⁿ < 2⁵³) and every sum of up to 2P of them stays
 * below 2⁵³ (4·P·max|D| < 2⁵³). Then the plain sums of the same integers are exact too.
 */
export function polynomialKernelFits (neurons: number, patterns: number, degree: number): boolean {
  const limit = 2n ** 53n
  const n = BigInt(neurons)
  const top = (n + 2n) ** BigInt(degree)
  if (top >= limit) return false
  const maxD = top - n ** BigInt(degree)
  return 4n * BigInt(patterns) * maxD < limit
}

/** xᵏ by repeated multiplication, as the plain table computes it (exact below 2⁵³). */
function integerPower (x: number, k: number): number {
  let out = 1
  for (let e = 0; e < k; e++) out *= x
  return out
}

/** Bytes of the kernel's layout beyond the neuron-major patterns (memory estimates). */
export function denseMemoryKernelExtraBytes (neurons: number, patterns: number): number {
  const pp = align16(patterns)
  return 4 * pp + 8 * pp + 16 + 8 * (2 * neurons + 3) + 3 * neurons + 4 * neurons + 8 * neurons + Math.min(pp, Math.max(16, Math.floor(STAGE_BYTES / neurons / 16) * 16)) * neurons + 128
}

export class DenseMemoryKernel {
  readonly name: DenseMemoryKernelName
  /** Row stride of `xi`: P rounded up to 16. */
  readonly stride: number
  /** Neuron-major patterns, xi[i·stride + μ] (padding 0): the network's own copy, or a view into a private memory. */
  readonly xi: Int8Array
  private readonly ws: Workspace<MemoryExports>
  private readonly k: MemoryExports
  private readonly isPrivate: boolean
  private readonly id = nextId++
  private readonly n: number
  private readonly p: number
  private readonly polynomial: boolean
  /** Polynomial: D(r) at r + off; exponential: e^{−d} at d. */
  private readonly table: Float64Array
  private readonly off: number
  private readonly xiAt = 0
  private readonly mAt: number
  private readonly sAt: number
  private readonly nextAt: number
  private readonly prevAt: number
  private readonly orderAt: number
  private readonly noiseAt: number
  private readonly vecAt: number
  private readonly sumsAt: number
  private readonly tableAt: number
  private readonly stageAt: number
  private readonly stageRows: number
  private readonly end: number
  private buffer: ArrayBuffer | null = null
  private u8: Uint8Array = EMPTY.u8
  private s8: Int8Array = EMPTY.i8
  private prev8: Int8Array = EMPTY.i8
  private m32: Int32Array = EMPTY.i32
  private order32: Int32Array = EMPTY.i32
  private noise64: Float64Array = EMPTY.f64

  /**
   * `degree` for F(x) = xⁿ, null for the exponential. Null when the host lacks WebAssembly
   * SIMD, the polynomial's sums would not be exact, or the layout does not fit a 32-bit memory.
   */
  static create (neurons: number, patterns: number, degree: number | null): DenseMemoryKernel | null {
    if (degree !== null && !polynomialKernelFits(neurons, patterns, degree)) return null
    if (neurons * align16(patterns) + denseMemoryKernelExtraBytes(neurons, patterns) > 3.5 * 2 ** 30) return null
    const ws = workspaces.for(neurons * align16(patterns))
    return ws === null ? null : unlessMemoryRefused(() => new DenseMemoryKernel(ws, neurons, patterns, degree))
  }

  private constructor (ws: Workspace<MemoryExports>, n: number, p: number, degree: number | null) {
    this.ws = ws
    this.k = ws.k
    this.n = n
    this.p = p
    this.polynomial = degree !== null
    this.name = this.polynomial ? 'wasm-simd128-dense-memory-poly' : 'wasm-simd128-dense-memory-exp'
    const pp = align16(p)
    this.stride = pp
    this.off = n + 1
    if (degree !== null) {
      this.table = new Float64Array(2 * n + 3)
      for (let r = -n - 1; r <= n + 1; r++) this.table[r + this.off] = integerPower(r + 1, degree) - integerPower(r - 1, degree)
    } else {
      this.table = new Float64Array(2 * n + 2)
      for (let d = 0; d < this.table.length; d++) this.table[d] = Math.exp(-d)
    }
    this.mAt = align16(n * pp)
    this.sAt = align16(this.mAt + 4 * pp)
    this.nextAt = align16(this.sAt + n)
    this.prevAt = align16(this.nextAt + n)
    this.orderAt = align16(this.prevAt + n)
    this.noiseAt = align16(this.orderAt + 4 * n)
    this.vecAt = align16(this.noiseAt + 8 * n)
    this.sumsAt = align16(this.vecAt + 8 * pp)
    this.tableAt = align16(this.sumsAt + 16)
    this.stageAt = align16(this.tableAt + 8 * this.table.length)
    this.stageRows = Math.min(pp, Math.max(16, Math.floor(STAGE_BYTES / n / 16) * 16))
    this.end = this.stageAt + this.stageRows * n + 32
    this.isPrivate = ws.isPrivate
    ws.reserve(this.end)
    this.xi = this.isPrivate ? new Int8Array(ws.buffer, 0, n * pp) : new Int8Array(n * pp)
  }

  /** Fills `xi` from pattern-major ±1 patterns (patterns[μ·N + i]), 16×16 tiles at a time (as the overlap kernel). */
  loadPatterns (patterns: Int8Array): void {
    const { n, p } = this
    this.enter(false)
    const u8 = this.u8
    for (let mu0 = 0; mu0 < p; mu0 += this.stageRows) {
      const rows = Math.min(this.stageRows, p - mu0)
      const padded = align16(rows)
      u8.set(new Uint8Array(patterns.buffer, patterns.byteOffset + mu0 * n, rows * n), this.stageAt)
      u8.fill(0, this.stageAt + rows * n, this.stageAt + padded * n + 32)
      this.k.transpose(this.stageAt, n, align16(n), this.xiAt + mu0, this.stride, padded)
    }
    if (!this.isPrivate) this.xi.set(new Int8Array(u8.buffer, this.xiAt, n * this.stride))
  }

  /** m = Σ_i s_i ξ_i from scratch. */
  overlaps (state: Int8Array, m: Int32Array): void {
    this.enter()
    this.s8.set(state)
    this.k.overlaps32(this.xiAt, this.mAt, this.sAt, this.n, this.stride)
    m.set(this.m32.subarray(0, this.p))
  }

  /** One zero-temperature asynchronous sweep in `order`; true if a neuron changed. */
  sweep (state: Int8Array, m: Int32Array, order: Int32Array): boolean {
    this.enter()
    this.pass(state, m)
    this.order32.set(order)
    const changed = this.polynomial
      ? this.k.memSweepPoly(this.xiAt, this.mAt, this.sAt, this.orderAt, this.n, this.stride, this.p, this.vecAt, this.tableAt, this.off, this.sumsAt)
      : this.k.memSweepExp(this.xiAt, this.mAt, this.sAt, this.orderAt, this.n, this.stride, this.p, this.vecAt, this.tableAt, this.sumsAt)
    this.leave(state, m)
    return changed !== 0
  }

  /** One zero-temperature synchronous step: 0 changed, 1 fixed point (nothing written back), 2 two-cycle. */
  sync (state: Int8Array, m: Int32Array, previous: Int8Array, check: boolean): number {
    this.enter()
    this.pass(state, m)
    this.prev8.set(previous)
    const c = check ? 1 : 0
    const outcome = this.polynomial
      ? this.k.memSyncPoly(this.xiAt, this.mAt, this.sAt, this.nextAt, this.prevAt, this.n, this.stride, this.p, this.vecAt, this.tableAt, this.off, this.sumsAt, c)
      : this.k.memSyncExp(this.xiAt, this.mAt, this.sAt, this.nextAt, this.prevAt, this.n, this.stride, this.p, this.vecAt, this.tableAt, this.sumsAt, c)
    if (outcome !== 1) {
      previous.set(this.prev8)
      this.leave(state, m)
    }
    return outcome
  }

  /** Polynomial only: one asynchronous Glauber sweep with noise[k] the uniform of the k-th visit. */
  glauber (state: Int8Array, m: Int32Array, order: Int32Array, noise: Float64Array, factor: number): void {
    this.enter()
    this.pass(state, m)
    this.order32.set(order)
    this.noise64.set(noise.subarray(0, this.n))
    this.k.memGlauberPoly(this.xiAt, this.mAt, this.sAt, this.orderAt, this.noiseAt, this.n, this.stride, this.p, this.vecAt, this.tableAt, this.off, this.sumsAt, factor)
    this.leave(state, m)
  }

  /** Polynomial only: one synchronous Glauber step with noise[i] the uniform of neuron i. */
  glauberSync (state: Int8Array, m: Int32Array, noise: Float64Array, factor: number): void {
    this.enter()
    this.pass(state, m)
    this.noise64.set(noise.subarray(0, this.n))
    this.k.memGlauberSyncPoly(this.xiAt, this.mAt, this.sAt, this.nextAt, this.noiseAt, this.n, this.stride, this.p, this.vecAt, this.tableAt, this.off, this.sumsAt, factor)
    this.leave(state, m)
  }

  /** Makes this network's layout current: memory large enough, views fresh, patterns and table resident. */
  private enter (copyPatterns = true): void {
    const ws = this.ws
    if (!this.isPrivate) ws.reserve(this.end)
    const buffer = ws.buffer
    if (buffer !== this.buffer) {
      this.buffer = buffer
      this.u8 = new Uint8Array(buffer)
      this.s8 = new Int8Array(buffer, this.sAt, this.n)
      this.prev8 = new Int8Array(buffer, this.prevAt, this.n)
      this.m32 = new Int32Array(buffer, this.mAt, align16(this.p))
      this.order32 = new Int32Array(buffer, this.orderAt, this.n)
      this.noise64 = new Float64Array(buffer, this.noiseAt, this.n)
    }
    if (ws.residentId !== this.id) {
      new Float64Array(buffer, this.tableAt, this.table.length).set(this.table)
      // Padding overlaps stay 0, so padding lanes of the vector never matter.
      this.m32.fill(0)
      if (!this.isPrivate && copyPatterns) this.u8.set(new Uint8Array(this.xi.buffer, this.xi.byteOffset, this.xi.length), this.xiAt)
      ws.residentId = this.id
    }
  }

  private pass (state: Int8Array, m: Int32Array): void {
    this.s8.set(state)
    this.m32.set(m)
  }

  private leave (state: Int8Array, m: Int32Array): void {
    state.set(this.s8)
    m.set(this.m32.subarray(0, this.p))
  }
}
