import { EMPTY, unlessMemoryRefused, Workspaces, type Workspace } from './wasm.js'
import type { KernelsUsing } from './signatures.js'
import { GlauberTable } from './glauber-table.js'
import { stateFromKernel, stateToKernel, xoshiroState } from './native-random.js'
import type { RandomSource } from '../random/source.js'

/**
 * WebAssembly fast path of the fixed in-degree network (network/sparse-in-degree.ts; kernel
 * text: "sparse" in scripts/gen-kernels.ts).
 *
 * ## Why this shape
 * A visit reads one field and a change adds Δ·T_ij along an out-list, so the plain path spends
 * most of its time in per-visit JavaScript overhead and in the O(N·K) field build of every
 * trial. Here whole sweeps, steps and zero-temperature trials (shuffles included) run in one
 * call on exact int32 fields, and the field build runs along the out-lists, so the kernel keeps
 * only those (targets and weights, 8·N·K bytes): the network then drops its rows. Integer sums
 * are exact in any order, so every field and every decision is the plain one.
 *
 * Memory as in the other kernels: out-lists under 8 MiB share an instance (copied in when
 * another network used it last); larger ones live in a private instance, as the only copy.
 */
type SparseExports = KernelsUsing<'sparseLoad' | 'sparseSweep' | 'sparseRunAsync' | 'sparseSync' | 'sparseGlauber' | 'sparseGlauberSync'>

const workspaces = new Workspaces<SparseExports>(8 * 1024 * 1024)

/** Moves the shared/private boundary (tests use it to exercise private instances on small networks). */
export function setSparsePrivateBytes (bytes: number): void {
  workspaces.privateBytes = bytes
}

let nextId = 1
const align16 = (x: number): number => (x + 15) & ~15

/** Bytes of the kernel's memory besides the out-lists (memory estimates). */
export function sparseKernelExtraBytes (neurons: number): number {
  return 4 * (neurons + 1) + 4 * neurons + 3 * neurons + 4 * neurons + 8 * neurons + 256
}

export class SparseKernel {
  readonly name = 'wasm-simd128-sparse-in-degree'
  /** Out-list targets and weights (N·K each), filled by the caller: arrays of the network's own, or views into a private memory. */
  readonly targets: Int32Array
  readonly weights: Int32Array
  private readonly ws: Workspace<SparseExports>
  private readonly k: SparseExports
  private readonly isPrivate: boolean
  private readonly id = nextId++
  private readonly n: number
  private readonly edges: number
  private readonly outStart: Int32Array
  private readonly outStartAt: number
  private readonly targetsAt = 0
  private readonly weightsAt: number
  private readonly hAt: number
  private readonly sAt: number
  private readonly nextAt: number
  private readonly prevAt: number
  private readonly orderAt: number
  private readonly noiseAt: number
  private readonly rngAt: number
  private readonly end: number
  private readonly table: GlauberTable
  private buffer: ArrayBuffer | null = null
  private h32: Int32Array = EMPTY.i32
  private s8: Int8Array = EMPTY.i8
  private prev8: Int8Array = EMPTY.i8
  private order32: Int32Array = EMPTY.i32
  private noise64: Float64Array = EMPTY.f64
  private rng32: Int32Array = EMPTY.i32

  /**
   * `outStart` (N + 1 offsets into the out-lists) as the network built it; `fieldBound` bounds
   * every |h_i| (K·max|T|), which must stay below 2³¹. Null without WebAssembly, or when the
   * fields could overflow int32 or the layout does not fit a 32-bit memory.
   */
  static create (outStart: Int32Array, neurons: number, edges: number, fieldBound: number): SparseKernel | null {
    if (fieldBound >= 2 ** 31) return null
    if (8 * edges + sparseKernelExtraBytes(neurons) > 3.5 * 2 ** 30) return null
    const ws = workspaces.for(8 * edges)
    return ws === null ? null : unlessMemoryRefused(() => new SparseKernel(ws, outStart, neurons, edges, fieldBound))
  }

  private constructor (ws: Workspace<SparseExports>, outStart: Int32Array, n: number, edges: number, fieldBound: number) {
    this.ws = ws
    this.k = ws.k
    this.n = n
    this.edges = edges
    this.outStart = outStart
    this.weightsAt = align16(4 * edges)
    this.outStartAt = align16(this.weightsAt + 4 * edges)
    this.hAt = align16(this.outStartAt + 4 * (n + 1))
    this.sAt = align16(this.hAt + 4 * n)
    this.nextAt = align16(this.sAt + n)
    this.prevAt = align16(this.nextAt + n)
    this.orderAt = align16(this.prevAt + n)
    this.noiseAt = align16(this.orderAt + 4 * n)
    this.rngAt = align16(this.noiseAt + 8 * n)
    this.end = this.rngAt + 48
    this.table = new GlauberTable(align16(this.end), fieldBound)
    this.isPrivate = ws.isPrivate
    // A private memory never grows after this (views into it would be detached): the Glauber
    // table's room is reserved now.
    ws.reserve(this.isPrivate ? this.table.at + this.table.bytes : this.end)
    const buffer = ws.k.memory.buffer
    this.targets = this.isPrivate ? new Int32Array(buffer, this.targetsAt, edges) : new Int32Array(edges)
    this.weights = this.isPrivate ? new Int32Array(buffer, this.weightsAt, edges) : new Int32Array(edges)
  }

  /** h = T s. */
  load (state: Int8Array, h: Float64Array): void {
    this.enter()
    this.s8.set(state)
    this.k.sparseLoad(this.outStartAt, this.targetsAt, this.weightsAt, this.sAt, this.hAt, this.n)
    h.set(this.h32)
  }

  sweep (state: Int8Array, h: Float64Array, order: Int32Array): boolean {
    this.enter()
    this.pass(state, h)
    this.order32.set(order)
    const changed = this.k.sparseSweep(this.outStartAt, this.targetsAt, this.weightsAt, this.sAt, this.hAt, this.orderAt, this.n)
    this.leave(state, h)
    return changed !== 0
  }

  /**
   * A whole zero-temperature asynchronous trial (reshuffles drawn natively from the engine's
   * xoshiro256** stream): the sweeps and whether the last changed a neuron; null, with nothing
   * drawn or changed, for another random source.
   */
  runAsync (state: Int8Array, h: Float64Array, order: Int32Array, maxSweeps: number, shuffle: boolean, rng: RandomSource): { sweeps: number, changedLast: boolean } | null {
    const words = shuffle ? xoshiroState(rng) : null
    if (shuffle && words === null) return null
    this.enter()
    this.pass(state, h)
    this.order32.set(order)
    if (words !== null) stateToKernel(words, rng, this.rng32)
    const r = this.k.sparseRunAsync(this.outStartAt, this.targetsAt, this.weightsAt, this.sAt, this.hAt, this.orderAt, this.n, this.rngAt, maxSweeps, shuffle ? 1 : 0)
    this.leave(state, h)
    order.set(this.order32)
    if (words !== null) stateFromKernel(this.rng32, words, rng)
    return { sweeps: r >>> 1, changedLast: (r & 1) === 1 }
  }

  /** 0 changed, 1 fixed point (nothing written back), 2 two-cycle. */
  sync (state: Int8Array, h: Float64Array, previous: Int8Array, check: boolean): number {
    this.enter()
    this.pass(state, h)
    this.prev8.set(previous)
    const outcome = this.k.sparseSync(this.outStartAt, this.targetsAt, this.weightsAt, this.sAt, this.hAt, this.nextAt, this.prevAt, this.n, check ? 1 : 0)
    if (outcome !== 1) {
      previous.set(this.prev8)
      this.leave(state, h)
    }
    return outcome
  }

  glauber (state: Int8Array, h: Float64Array, order: Int32Array, noise: Float64Array, factor: number): void {
    const half = this.enterThermal(factor)
    this.pass(state, h)
    this.order32.set(order)
    this.noise64.set(noise.subarray(0, this.n))
    this.k.sparseGlauber(this.outStartAt, this.targetsAt, this.weightsAt, this.sAt, this.hAt, this.orderAt, this.noiseAt, this.n, factor, this.table.at, half)
    this.leave(state, h)
  }

  glauberSync (state: Int8Array, h: Float64Array, noise: Float64Array, factor: number): void {
    const half = this.enterThermal(factor)
    this.pass(state, h)
    this.noise64.set(noise.subarray(0, this.n))
    this.k.sparseGlauberSync(this.outStartAt, this.targetsAt, this.weightsAt, this.sAt, this.hAt, this.nextAt, this.noiseAt, this.n, factor, this.table.at, half)
    this.leave(state, h)
  }

  private enterThermal (factor: number): number {
    this.ws.reserve(this.table.at + this.table.bytes)
    this.enter()
    return this.table.prepare(this.ws.k.memory.buffer, factor)
  }

  private enter (): void {
    const ws = this.ws
    if (!this.isPrivate) ws.reserve(this.end)
    const buffer = ws.k.memory.buffer
    if (buffer !== this.buffer) {
      this.buffer = buffer
      this.h32 = new Int32Array(buffer, this.hAt, this.n)
      this.s8 = new Int8Array(buffer, this.sAt, this.n)
      this.prev8 = new Int8Array(buffer, this.prevAt, this.n)
      this.order32 = new Int32Array(buffer, this.orderAt, this.n)
      this.noise64 = new Float64Array(buffer, this.noiseAt, this.n)
      this.rng32 = new Int32Array(buffer, this.rngAt, 10)
    }
    if (ws.residentId !== this.id) {
      this.table.invalidate()
      new Int32Array(buffer, this.outStartAt, this.n + 1).set(this.outStart)
      if (!this.isPrivate) {
        new Int32Array(buffer, this.targetsAt, this.edges).set(this.targets)
        new Int32Array(buffer, this.weightsAt, this.edges).set(this.weights)
      }
      ws.residentId = this.id
    }
  }

  private pass (state: Int8Array, h: Float64Array): void {
    this.s8.set(state)
    this.h32.set(h)
  }

  private leave (state: Int8Array, h: Float64Array): void {
    state.set(this.s8)
    h.set(this.h32)
  }
}
