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
 * call on exact int32 fields, and the field build is a gather loop over the rows. Rows and
 * out-lists hold neurons as uint16 and couplings as int16 (N ≤ 65536, |T| ≤ 32767; larger
 * networks keep the plain path): 8 bytes an edge for both, where the plain path keeps 16, and
 * half the memory traffic of a field build. Integer sums are exact in any order, so every field
 * and every decision is the plain one.
 *
 * Memory as in the other kernels: lists under 8 MiB share an instance (copied in when another
 * network used it last); larger ones live in a private instance, as the only copy.
 */
type SparseExports = KernelsUsing<'packRows' | 'overlapsBits' | 'sparseLoad' | 'sparseSweep' | 'sparseRunAsync' | 'sparseSync' | 'sparseGlauber' | 'sparseGlauberSync'>

const workspaces = new Workspaces<SparseExports>('sparse', 8 * 1024 * 1024)

/** Moves the shared/private boundary (tests use it to exercise private instances on small networks). */
export function setSparsePrivateBytes (bytes: number): void {
  workspaces.privateBytes = bytes
}

let nextId = 1
const align16 = (x: number): number => (x + 15) & ~15

/** Largest neuron count and coupling the kernel's uint16 / int16 lists hold. */
const MAX_NEURONS = 65536
const MAX_COUPLING = 32767

/** Whether a network of this size and largest |T| runs on the kernel. */
export function sparseKernelFits (neurons: number, maxCoupling: number): boolean {
  return neurons <= MAX_NEURONS && maxCoupling <= MAX_COUPLING
}

const STAGE_BYTES = 256 * 1024

/** Rows of patterns staged at a time for packing their sign bits. */
const stageRows = (neurons: number, patterns: number): number => Math.max(1, Math.min(patterns, Math.floor(STAGE_BYTES / neurons)))

/** Bytes of the kernel's memory besides its lists of 8 bytes an edge (memory estimates): state, fields, the patterns' sign bits, staging. */
export function sparseKernelExtraBytes (neurons: number, patterns: number): number {
  const words = Math.ceil(neurons / 64)
  return 4 * (neurons + 1) + 4 * neurons + 3 * neurons + 4 * neurons + 8 * neurons + 8 * words * (patterns + 1) + 4 * patterns + stageRows(neurons, patterns) * neurons + 512
}

export class SparseKernel {
  readonly name = 'wasm-simd128-sparse-in-degree'
  /** Rows (inputs, couplings; K per neuron) and out-lists (targets, couplings), filled by the caller: arrays of the kernel's own, or views into a private memory. */
  readonly inputs: Uint16Array
  readonly weights: Int16Array
  readonly targets: Uint16Array
  readonly targetWeights: Int16Array
  private readonly ws: Workspace<SparseExports>
  private readonly k: SparseExports
  private readonly isPrivate: boolean
  private readonly id = nextId++
  private readonly n: number
  private readonly inDegree: number
  private readonly edges: number
  private readonly outStart: Int32Array
  private readonly inputsAt = 0
  private readonly weightsAt: number
  private readonly targetsAt: number
  private readonly targetWeightsAt: number
  private readonly outStartAt: number
  private readonly hAt: number
  private readonly sAt: number
  private readonly nextAt: number
  private readonly prevAt: number
  private readonly orderAt: number
  private readonly noiseAt: number
  private readonly rngAt: number
  // Sign bits of the patterns (pattern-major, `words` 64-bit words a row) and of the state, for
  // overlaps by popcount ("overlapsBits"), and the staging rows that pack them.
  private readonly p: number
  private readonly words: number
  private readonly bitsAt: number
  private readonly sbitsAt: number
  private readonly mAt: number
  private readonly stageAt: number
  private readonly stageRows: number
  /** The packed patterns kept outside a shared memory, copied in when this network becomes resident. */
  private readonly bits: Uint8Array
  private readonly end: number
  private readonly table: GlauberTable
  private buffer: ArrayBuffer | null = null
  private h32: Int32Array = EMPTY.i32
  private s8: Int8Array = EMPTY.i8
  private prev8: Int8Array = EMPTY.i8
  private order32: Int32Array = EMPTY.i32
  private noise64: Float64Array = EMPTY.f64
  private rng32: Int32Array = EMPTY.i32
  private m32: Int32Array = EMPTY.i32

  /**
   * `outStart` (N + 1 offsets into the out-lists) as the network built it; K inputs per neuron;
   * P patterns; `maxCoupling` the largest |T_ij|. Null without WebAssembly, when the lists cannot hold the
   * network (`sparseKernelFits`), when the fields could overflow int32, or when the layout does
   * not fit a 32-bit memory.
   */
  static create (outStart: Int32Array, neurons: number, inDegree: number, patterns: number, maxCoupling: number): SparseKernel | null {
    const edges = neurons * inDegree
    if (!sparseKernelFits(neurons, maxCoupling) || inDegree * maxCoupling >= 2 ** 31) return null
    if (8 * edges + sparseKernelExtraBytes(neurons, patterns) > 3.5 * 2 ** 30) return null
    const ws = workspaces.for(8 * edges)
    return ws === null ? null : unlessMemoryRefused(() => new SparseKernel(ws, outStart, neurons, inDegree, patterns, inDegree * maxCoupling))
  }

  private constructor (ws: Workspace<SparseExports>, outStart: Int32Array, n: number, inDegree: number, p: number, fieldBound: number) {
    this.ws = ws
    this.k = ws.k
    this.n = n
    this.inDegree = inDegree
    const edges = n * inDegree
    this.edges = edges
    this.outStart = outStart
    this.weightsAt = align16(2 * edges)
    this.targetsAt = align16(this.weightsAt + 2 * edges)
    this.targetWeightsAt = align16(this.targetsAt + 2 * edges)
    this.outStartAt = align16(this.targetWeightsAt + 2 * edges)
    this.hAt = align16(this.outStartAt + 4 * (n + 1))
    this.sAt = align16(this.hAt + 4 * n)
    this.nextAt = align16(this.sAt + n)
    this.prevAt = align16(this.nextAt + n)
    this.orderAt = align16(this.prevAt + n)
    this.noiseAt = align16(this.orderAt + 4 * n)
    this.rngAt = align16(this.noiseAt + 8 * n)
    this.p = p
    this.words = Math.ceil(n / 64)
    this.bitsAt = align16(this.rngAt + 48)
    this.sbitsAt = this.bitsAt + 8 * this.words * p
    this.mAt = align16(this.sbitsAt + 8 * this.words)
    this.stageAt = align16(this.mAt + 4 * p)
    this.stageRows = stageRows(n, p)
    this.end = this.stageAt + this.stageRows * n + 16
    this.table = new GlauberTable(align16(this.end), fieldBound)
    this.isPrivate = ws.isPrivate
    // A private memory never grows after this (views into it would be detached): the Glauber
    // table's room is reserved now.
    ws.reserve(this.isPrivate ? this.table.at + this.table.bytes : this.end)
    const buffer = ws.buffer
    this.inputs = this.isPrivate ? new Uint16Array(buffer, this.inputsAt, edges) : new Uint16Array(edges)
    this.weights = this.isPrivate ? new Int16Array(buffer, this.weightsAt, edges) : new Int16Array(edges)
    this.targets = this.isPrivate ? new Uint16Array(buffer, this.targetsAt, edges) : new Uint16Array(edges)
    this.targetWeights = this.isPrivate ? new Int16Array(buffer, this.targetWeightsAt, edges) : new Int16Array(edges)
    this.bits = this.isPrivate ? EMPTY.u8 : new Uint8Array(8 * this.words * p)
  }

  /** Packs the sign bits of the pattern-major ±1 patterns (patterns[μ·N + i]), staged a few rows at a time. */
  loadPatterns (patterns: Int8Array): void {
    const { n, p } = this
    this.enter()
    const u8 = new Uint8Array(this.ws.buffer)
    for (let mu0 = 0; mu0 < p; mu0 += this.stageRows) {
      const rows = Math.min(this.stageRows, p - mu0)
      u8.set(new Uint8Array(patterns.buffer, patterns.byteOffset + mu0 * n, rows * n), this.stageAt)
      this.k.packRows(this.stageAt, n, rows, this.bitsAt + 8 * this.words * mu0, this.words)
    }
    if (!this.isPrivate) this.bits.set(new Uint8Array(u8.buffer, this.bitsAt, this.bits.length))
  }

  /**
   * Raw overlaps Σ_i ξ_i^μ s_i with patterns first … first + count − 1 into out, by popcount of
   * the sign bits; false (nothing written) when the state holds a 0, where the identity fails.
   */
  overlaps (state: Int8Array, first: number, count: number, out: Float64Array): boolean {
    this.enter()
    this.s8.set(state)
    if (this.k.overlapsBits(this.bitsAt + 8 * this.words * first, this.words, this.sAt, this.sbitsAt, this.n, count, count, this.mAt, 1) === 0) return false
    for (let mu = 0; mu < count; mu++) out[mu] = this.m32[mu]!
    return true
  }

  /** h = T s. */
  load (state: Int8Array, h: Float64Array): void {
    this.enter()
    this.s8.set(state)
    this.k.sparseLoad(this.inputsAt, this.weightsAt, this.sAt, this.hAt, this.n, this.inDegree)
    h.set(this.h32)
  }

  sweep (state: Int8Array, h: Float64Array, order: Int32Array): boolean {
    this.enter()
    this.pass(state, h)
    this.order32.set(order)
    const changed = this.k.sparseSweep(this.outStartAt, this.targetsAt, this.targetWeightsAt, this.sAt, this.hAt, this.orderAt, this.n)
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
    const r = this.k.sparseRunAsync(this.outStartAt, this.targetsAt, this.targetWeightsAt, this.sAt, this.hAt, this.orderAt, this.n, this.rngAt, maxSweeps, shuffle ? 1 : 0)
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
    const outcome = this.k.sparseSync(this.outStartAt, this.targetsAt, this.targetWeightsAt, this.sAt, this.hAt, this.nextAt, this.prevAt, this.n, check ? 1 : 0)
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
    this.k.sparseGlauber(this.outStartAt, this.targetsAt, this.targetWeightsAt, this.sAt, this.hAt, this.orderAt, this.noiseAt, this.n, factor, this.table.at, half)
    this.leave(state, h)
  }

  glauberSync (state: Int8Array, h: Float64Array, noise: Float64Array, factor: number): void {
    const half = this.enterThermal(factor)
    this.pass(state, h)
    this.noise64.set(noise.subarray(0, this.n))
    this.k.sparseGlauberSync(this.outStartAt, this.targetsAt, this.targetWeightsAt, this.sAt, this.hAt, this.nextAt, this.noiseAt, this.n, factor, this.table.at, half)
    this.leave(state, h)
  }

  private enterThermal (factor: number): number {
    this.ws.reserve(this.table.at + this.table.bytes)
    this.enter()
    return this.table.prepare(this.ws.buffer, factor)
  }

  private enter (): void {
    const ws = this.ws
    if (!this.isPrivate) ws.reserve(this.end)
    const buffer = ws.buffer
    if (buffer !== this.buffer) {
      this.buffer = buffer
      this.h32 = new Int32Array(buffer, this.hAt, this.n)
      this.s8 = new Int8Array(buffer, this.sAt, this.n)
      this.prev8 = new Int8Array(buffer, this.prevAt, this.n)
      this.order32 = new Int32Array(buffer, this.orderAt, this.n)
      this.noise64 = new Float64Array(buffer, this.noiseAt, this.n)
      this.rng32 = new Int32Array(buffer, this.rngAt, 10)
      this.m32 = new Int32Array(buffer, this.mAt, this.p)
    }
    if (ws.residentId !== this.id) {
      this.table.invalidate()
      new Int32Array(buffer, this.outStartAt, this.n + 1).set(this.outStart)
      if (!this.isPrivate) {
        new Uint16Array(buffer, this.inputsAt, this.edges).set(this.inputs)
        new Int16Array(buffer, this.weightsAt, this.edges).set(this.weights)
        new Uint16Array(buffer, this.targetsAt, this.edges).set(this.targets)
        new Int16Array(buffer, this.targetWeightsAt, this.edges).set(this.targetWeights)
        new Uint8Array(buffer, this.bitsAt, this.bits.length).set(this.bits)
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
