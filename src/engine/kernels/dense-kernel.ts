import { EMPTY, unlessMemoryRefused, Workspaces, type Workspace } from './wasm.js'
import type { KernelsUsing } from './signatures.js'

/**
 * WebAssembly SIMD128 fast path of the dense network (kernel text: scripts/gen-kernels.ts).
 *
 * ## Why this shape
 * The dense representation keeps float64 local fields h and adds a coupling column to them
 * on every change (O(N) per change, O(1) per visit). Those column updates, the from-scratch
 * field builds h = bias + J s of synchronous steps, and the visit loops run here two lanes
 * at a time (f64x2). Every element sees the plain path's scalar operations in the plain
 * path's order (h + J_ij·s_j, j ascending; no fused multiply-add exists in wasm), so any
 * coupling matrix, integer or not, gives bit-identical fields. Fields are built from exact
 * columns when the network has them (a transposed copy, or a matrix symmetric bit for bit),
 * else row by row in scalar code, as the plain path does.
 *
 * Memory as in the overlap kernel: small networks (columns under 1 MiB) share one instance
 * and copy their columns in when another network used it last; larger ones own an instance
 * whose memory holds the only copy of the columns.
 */
type DenseExports = KernelsUsing<'denseLoad' | 'denseSweep' | 'denseGlauber' | 'denseSync' | 'denseGlauberSync'>

/** Dense networks are built at most a few per second, so all but the smallest get a private memory. */
const workspaces = new Workspaces<DenseExports>('dense', 1024 * 1024)

/** Moves the shared/private boundary (tests use it to exercise private instances on small networks). */
export function setDensePrivateBytes (bytes: number): void {
  workspaces.privateBytes = bytes
}

let nextId = 1
const align16 = (x: number): number => (x + 15) & ~15

export class DenseKernel {
  readonly name: 'wasm-simd128-dense-f64' | 'wasm-simd128-dense-f64-rows'
  /** Columns, cols[j·n + i] = J_ij: a view into a private memory, or the network's own array. */
  readonly columns: Float64Array
  private readonly ws: Workspace<DenseExports>
  private readonly isPrivate: boolean
  private readonly id = nextId++
  private readonly n: number
  private readonly rowwise: number
  private readonly bias: Float64Array
  private readonly colsAt = 0
  private readonly biasAt: number
  private readonly hAt: number
  private readonly sAt: number
  private readonly nextAt: number
  private readonly prevAt: number
  private readonly orderAt: number
  private readonly noiseAt: number
  private readonly end: number
  private buffer: ArrayBuffer | null = null
  private h64: Float64Array = EMPTY.f64
  private s8: Int8Array = EMPTY.i8
  private prev8: Int8Array = EMPTY.i8
  private order32: Int32Array = EMPTY.i32
  private noise64: Float64Array = EMPTY.f64

  /** Null when the host lacks WebAssembly SIMD or the matrix does not fit a 32-bit memory. */
  /**
   * `couplings` row-major (J_ij at i·n + j); `transposed` asks for the columns to be written
   * transposed (an asymmetric matrix), else the rows serve as columns; `exactColumns` says
   * whether the columns are the exact transpose of the rows (see the class notes).
   */
  static create (couplings: Float64Array, transposed: boolean, bias: Float64Array, n: number, exactColumns: boolean): DenseKernel | null {
    if (8 * n * n + 40 * n > 3.5 * 2 ** 30) return null
    const ws = workspaces.for(8 * n * n)
    return ws === null ? null : unlessMemoryRefused(() => new DenseKernel(ws, couplings, transposed, bias, n, exactColumns))
  }

  private constructor (ws: Workspace<DenseExports>, couplings: Float64Array, transposed: boolean, bias: Float64Array, n: number, exactColumns: boolean) {
    this.ws = ws
    this.n = n
    this.rowwise = exactColumns ? 0 : 1
    this.name = exactColumns ? 'wasm-simd128-dense-f64' : 'wasm-simd128-dense-f64-rows'
    this.bias = bias
    this.isPrivate = ws.isPrivate
    this.biasAt = align16(8 * n * n)
    this.hAt = align16(this.biasAt + 8 * n)
    this.sAt = align16(this.hAt + 8 * n)
    this.nextAt = align16(this.sAt + n)
    this.prevAt = align16(this.nextAt + n)
    this.orderAt = align16(this.prevAt + n)
    this.noiseAt = align16(this.orderAt + 4 * n)
    this.end = this.noiseAt + 8 * n
    ws.reserve(this.end)
    const buffer = ws.buffer
    if (this.isPrivate) {
      new Float64Array(buffer, this.biasAt, n).set(bias)
      this.columns = new Float64Array(buffer, this.colsAt, n * n)
      if (transposed) transposeInto(couplings, this.columns, n)
      else this.columns.set(couplings)
    } else {
      this.columns = transposed ? transposeInto(couplings, new Float64Array(n * n), n) : couplings
      ws.residentId = 0
    }
  }

  /** h = bias + J s. */
  load (state: Int8Array, h: Float64Array): void {
    const k = this.enter()
    this.s8.set(state)
    k.denseLoad(this.colsAt, this.biasAt, this.sAt, this.hAt, this.n, this.rowwise)
    h.set(this.h64)
  }

  sweep (state: Int8Array, h: Float64Array, order: Int32Array): boolean {
    const k = this.enter()
    this.pass(state, h)
    this.order32.set(order)
    const changed = k.denseSweep(this.colsAt, this.sAt, this.hAt, this.orderAt, this.n)
    this.leave(state, h)
    return changed !== 0
  }

  glauber (state: Int8Array, h: Float64Array, order: Int32Array, noise: Float64Array, factor: number): void {
    const k = this.enter()
    this.pass(state, h)
    this.order32.set(order)
    this.noise64.set(noise.subarray(0, this.n))
    k.denseGlauber(this.colsAt, this.sAt, this.hAt, this.orderAt, this.noiseAt, this.n, factor)
    this.leave(state, h)
  }

  /** 0 changed, 1 fixed point (nothing written back), 2 two-cycle. */
  sync (state: Int8Array, h: Float64Array, previous: Int8Array, check: boolean): number {
    const k = this.enter()
    this.pass(state, h)
    this.prev8.set(previous)
    const outcome = k.denseSync(this.colsAt, this.biasAt, this.sAt, this.hAt, this.nextAt, this.prevAt, this.n, check ? 1 : 0, this.rowwise)
    if (outcome !== 1) {
      previous.set(this.prev8)
      this.leave(state, h)
    }
    return outcome
  }

  glauberSync (state: Int8Array, h: Float64Array, noise: Float64Array, factor: number): void {
    const k = this.enter()
    this.pass(state, h)
    this.noise64.set(noise.subarray(0, this.n))
    k.denseGlauberSync(this.colsAt, this.biasAt, this.sAt, this.hAt, this.nextAt, this.noiseAt, this.n, factor, this.rowwise)
    this.leave(state, h)
  }

  private enter (): DenseExports {
    const ws = this.ws
    const n = this.n
    ws.reserve(this.end)
    const buffer = ws.buffer
    if (buffer !== this.buffer) {
      this.buffer = buffer
      this.h64 = new Float64Array(buffer, this.hAt, n)
      this.s8 = new Int8Array(buffer, this.sAt, n)
      this.prev8 = new Int8Array(buffer, this.prevAt, n)
      this.order32 = new Int32Array(buffer, this.orderAt, n)
      this.noise64 = new Float64Array(buffer, this.noiseAt, n)
    }
    if (ws.residentId !== this.id) {
      if (!this.isPrivate) {
        new Float64Array(buffer, this.colsAt, n * n).set(this.columns)
        new Float64Array(buffer, this.biasAt, n).set(this.bias)
      }
      ws.residentId = this.id
    }
    return ws.k
  }

  private pass (state: Int8Array, h: Float64Array): void {
    this.s8.set(state)
    this.h64.set(h)
  }

  private leave (state: Int8Array, h: Float64Array): void {
    state.set(this.s8)
    h.set(this.h64)
  }
}

/** out[j·n + i] = matrix[i·n + j]; written straight into the kernel memory, so no transposed copy is left behind. */
function transposeInto (matrix: Float64Array, out: Float64Array, n: number): Float64Array {
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) out[j * n + i] = matrix[i * n + j]!
  }
  return out
}
