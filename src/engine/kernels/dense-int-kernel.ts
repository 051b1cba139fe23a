import { EMPTY, unlessMemoryRefused, Workspaces, type Workspace } from './wasm.js'
import type { KernelsUsing } from './signatures.js'
import { GlauberTable } from './glauber-table.js'

/**
 * WebAssembly SIMD128 fast path of the dense network for integer couplings (kernel text:
 * scripts/gen-kernels.ts): Hebbian couplings on 0/1 neurons, or diluted with a survivor
 * scale that is an integer, are integers of at most P·scale in magnitude.
 *
 * ## Why this shape
 * Stored as int16 the columns take a quarter of the float64 bytes, a change adds a column to
 * int32 fields eight lanes at a time, and a field build is one `i32x4.dot_i16x8_s` per eight
 * couplings. Every sum is an exact integer, as are the plain path's float64 sums of the same
 * integer-valued terms, so the fields, and with them every decision and measure, are the same
 * (a zero field may come out as +0 where the plain path has −0; no result can tell them apart).
 * The network checks eligibility: integer couplings within int16, bias integer, and
 * |bias| + N·max|J| < 2^31 so that no int32 field can overflow.
 *
 * Memory as in the other kernels: matrices under 1 MiB share an instance and are copied in
 * when another network used it last; larger ones own an instance holding the only copy.
 */
type DenseIntExports = KernelsUsing<'dense16Load' | 'dense16Set' | 'dense16Sweep' | 'dense16Glauber' | 'dense16Sync' | 'dense16GlauberSync'>

const workspaces = new Workspaces<DenseIntExports>('dense', 1024 * 1024)

/** Moves the shared/private boundary (tests use it to exercise private instances on small networks). */
export function setDenseIntPrivateBytes (bytes: number): void {
  workspaces.privateBytes = bytes
}

let nextId = 1
const align16 = (x: number): number => (x + 15) & ~15
const INT16_MAX = 32767

/**
 * When the couplings and bias can run on the int16 kernel with exact int32 fields, the bound
 * |bias| + N·max|J| on every field; null otherwise.
 */
export function integerFieldBound (couplings: Float64Array, bias: Float64Array, n: number): number | null {
  let maxJ = 0
  for (let k = 0; k < couplings.length; k++) {
    const x = couplings[k]!
    if (!Number.isInteger(x)) return null
    const a = Math.abs(x)
    if (a > maxJ) {
      if (a > INT16_MAX) return null
      maxJ = a
    }
  }
  let maxBias = 0
  for (let i = 0; i < n; i++) {
    const b = bias[i]!
    if (!Number.isInteger(b)) return null
    maxBias = Math.max(maxBias, Math.abs(b))
  }
  const bound = maxBias + n * maxJ
  return bound < 2 ** 31 ? bound : null
}

export class DenseIntKernel {
  readonly name = 'wasm-simd128-dense-i16'
  /** int16 columns, padded to `stride` entries: the network's own copy, or a view into a private memory. */
  readonly columns: Int16Array
  private readonly ws: Workspace<DenseIntExports>
  private readonly isPrivate: boolean
  private readonly id = nextId++
  private readonly n: number
  private readonly stride: number
  private readonly rowsAreColumns: number
  private readonly bias: Int32Array
  private readonly colsAt = 0
  private readonly biasAt: number
  private readonly hAt: number
  private readonly s16At: number
  private readonly sAt: number
  private readonly nextAt: number
  private readonly prevAt: number
  private readonly orderAt: number
  private readonly noiseAt: number
  private readonly end: number
  /** Glauber's 1 + exp(factor·h) over the integer fields, after the layout (memory reserved on first use). */
  private readonly table: GlauberTable
  private buffer: ArrayBuffer | null = null
  private h32: Int32Array = EMPTY.i32
  private s8: Int8Array = EMPTY.i8
  private prev8: Int8Array = EMPTY.i8
  private order32: Int32Array = EMPTY.i32
  private noise64: Float64Array = EMPTY.f64

  /**
   * `couplings` row-major (J_ij at i·n + j). A matrix symmetric bit for bit (`symmetric`)
   * serves as its own columns and builds fields by row dot products; otherwise the columns
   * are written transposed. Null without WebAssembly SIMD or memory.
   */
  static create (couplings: Float64Array, bias: Float64Array, n: number, symmetric: boolean, fieldBound: number): DenseIntKernel | null {
    const stride = (n + 7) & ~7
    if (2 * n * stride + 32 * stride > 3.5 * 2 ** 30) return null
    const ws = workspaces.for(2 * n * stride)
    return ws === null ? null : unlessMemoryRefused(() => new DenseIntKernel(ws, couplings, bias, n, stride, symmetric, fieldBound))
  }

  private constructor (ws: Workspace<DenseIntExports>, couplings: Float64Array, bias: Float64Array, n: number, stride: number, symmetric: boolean, fieldBound: number) {
    this.ws = ws
    this.n = n
    this.stride = stride
    this.rowsAreColumns = symmetric ? 1 : 0
    this.isPrivate = ws.isPrivate
    this.biasAt = align16(2 * n * stride)
    this.hAt = align16(this.biasAt + 4 * stride)
    this.s16At = align16(this.hAt + 4 * stride)
    this.sAt = align16(this.s16At + 2 * stride)
    this.nextAt = align16(this.sAt + n)
    this.prevAt = align16(this.nextAt + n)
    this.orderAt = align16(this.prevAt + n)
    this.noiseAt = align16(this.orderAt + 4 * n)
    this.end = this.noiseAt + 8 * n
    this.table = new GlauberTable(align16(this.end), fieldBound)
    // A private memory never grows after this (`columns` is a view into it): the Glauber
    // table's room is reserved now; a shared one grows on first thermal use.
    ws.reserve(this.isPrivate ? this.table.at + this.table.bytes : this.end)
    this.bias = new Int32Array(stride)
    this.bias.set(bias)
    this.columns = this.isPrivate ? new Int16Array(ws.buffer, this.colsAt, n * stride) : new Int16Array(n * stride)
    const cols = this.columns
    if (symmetric) {
      for (let j = 0; j < n; j++) cols.set(couplings.subarray(j * n, (j + 1) * n), j * stride)
    } else {
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) cols[j * stride + i] = couplings[i * n + j]!
      }
    }
    if (this.isPrivate) new Int32Array(ws.buffer, this.biasAt, stride).set(this.bias)
    ws.residentId = this.isPrivate ? this.id : 0
  }

  /** h = bias + J s. */
  load (state: Int8Array, h: Float64Array): void {
    const k = this.enter()
    this.s8.set(state)
    k.dense16Load(this.colsAt, this.biasAt, this.sAt, this.s16At, this.hAt, this.n, this.stride, this.rowsAreColumns)
    h.set(this.h32.subarray(0, this.n))
  }

  /** s_j ← v with the fields updated (the per-neuron API). */
  set (state: Int8Array, h: Float64Array, j: number, v: number): void {
    const delta = v - state[j]!
    if (delta === 0) return
    const k = this.enter()
    this.h32.set(h)
    k.dense16Set(this.colsAt, this.hAt, this.stride, j, delta)
    state[j] = v
    h.set(this.h32.subarray(0, this.n))
  }

  sweep (state: Int8Array, h: Float64Array, order: Int32Array): boolean {
    const k = this.enter()
    this.pass(state, h)
    this.order32.set(order)
    const changed = k.dense16Sweep(this.colsAt, this.sAt, this.hAt, this.orderAt, this.n, this.stride)
    this.leave(state, h)
    return changed !== 0
  }

  glauber (state: Int8Array, h: Float64Array, order: Int32Array, noise: Float64Array, factor: number): void {
    const k = this.enterThermal()
    const half = this.table.prepare(this.ws.buffer, factor)
    this.pass(state, h)
    this.order32.set(order)
    this.noise64.set(noise.subarray(0, this.n))
    k.dense16Glauber(this.colsAt, this.sAt, this.hAt, this.orderAt, this.noiseAt, this.n, this.stride, factor, this.table.at, half)
    this.leave(state, h)
  }

  /** 0 changed, 1 fixed point (nothing written back), 2 two-cycle. */
  sync (state: Int8Array, h: Float64Array, previous: Int8Array, check: boolean): number {
    const k = this.enter()
    this.pass(state, h)
    this.prev8.set(previous)
    const outcome = k.dense16Sync(this.colsAt, this.biasAt, this.sAt, this.s16At, this.hAt, this.nextAt, this.prevAt, this.n, this.stride, check ? 1 : 0, this.rowsAreColumns)
    if (outcome !== 1) {
      previous.set(this.prev8)
      this.leave(state, h)
    }
    return outcome
  }

  glauberSync (state: Int8Array, h: Float64Array, noise: Float64Array, factor: number): void {
    const k = this.enterThermal()
    const half = this.table.prepare(this.ws.buffer, factor)
    this.pass(state, h)
    this.noise64.set(noise.subarray(0, this.n))
    k.dense16GlauberSync(this.colsAt, this.biasAt, this.sAt, this.s16At, this.hAt, this.nextAt, this.noiseAt, this.n, this.stride, factor, this.rowsAreColumns, this.table.at, half)
    this.leave(state, h)
  }

  /** Enters with room for the Glauber table. */
  private enterThermal (): DenseIntExports {
    this.ws.reserve(this.table.at + this.table.bytes)
    return this.enter()
  }

  private enter (): DenseIntExports {
    const ws = this.ws
    ws.reserve(this.end)
    const buffer = ws.buffer
    if (buffer !== this.buffer) {
      this.buffer = buffer
      this.h32 = new Int32Array(buffer, this.hAt, this.stride)
      this.s8 = new Int8Array(buffer, this.sAt, this.n)
      this.prev8 = new Int8Array(buffer, this.prevAt, this.n)
      this.order32 = new Int32Array(buffer, this.orderAt, this.n)
      this.noise64 = new Float64Array(buffer, this.noiseAt, this.n)
    }
    if (ws.residentId !== this.id) {
      this.table.invalidate()
      new Int16Array(buffer, this.colsAt, this.columns.length).set(this.columns)
      new Int32Array(buffer, this.biasAt, this.stride).set(this.bias)
      ws.residentId = this.id
    }
    return ws.k
  }

  private pass (state: Int8Array, h: Float64Array): void {
    this.s8.set(state)
    this.h32.set(h)
  }

  private leave (state: Int8Array, h: Float64Array): void {
    state.set(this.s8)
    h.set(this.h32.subarray(0, this.n))
  }
}
