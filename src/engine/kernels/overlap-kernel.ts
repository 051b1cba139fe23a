import { EMPTY, unlessMemoryRefused, withKernelHooks, Workspaces, type Workspace } from './wasm.js'
import { SAMPLE_BLOCK, sampleBlockBytes, type KernelExports, type KernelsUsing } from './signatures.js'
import { stateFromKernel, stateToKernel, xoshiroState } from './native-random.js'
import { GlauberTable } from './glauber-table.js'
import type { RandomSource } from '../random/source.js'
import type { ThermalSampling, ThermalTotals } from '../network/network.js'

/**
 * WebAssembly SIMD128 fast path of the overlap-space network (kernel text and memory
 * layout: scripts/gen-kernels.ts).
 *
 * ## Why this shape
 * A visit costs one dot product of a neuron's P pattern entries with the P overlaps, so the
 * patterns are held neuron-major as int8 (one contiguous row per visit, 16 entries per SIMD
 * load, N·P bytes in all) and the overlaps as int16 lanes when N ≤ 32767 (eight products
 * per `i32x4.dot_i16x8_s`), int32 lanes otherwise. Every quantity is an exact integer, so
 * the kernel reproduces the plain path bit for bit. Whole sweeps and synchronous steps run
 * inside one call, and so do whole zero-temperature trials when nothing is observed between
 * sweeps (the shuffle then runs natively on the engine's xoshiro256** state). Otherwise the
 * caller draws the visiting order and Glauber's uniforms before the sweep they serve, in the
 * order the plain path draws them.
 *
 * ## Memory
 * Small networks share one module instance (one linear memory, grown as needed): the network
 * keeps its own copy of the neuron-major patterns, which is copied in when another network
 * used the workspace last. State and overlaps stay canonical in the network's JavaScript
 * arrays and cross the boundary (O(N + P) bytes) on every call. Networks whose patterns take
 * at least `privateBytes` (8 MiB) get an instance of their own holding the only copy, so a
 * big network costs N·P bytes once (plus its pattern-major copy). (One memory per small
 * network would be simpler, but V8 reserves gigabytes of address space per memory and stalls
 * on garbage collection when thousands of networks are built in a row.)
 */
type OverlapExports = KernelsUsing<'overlaps16' | 'overlaps32' | 'transpose' | 'packRows' | 'overlapsBits' | 'runAsync16' | 'sumSquares16'>
/** The other dynamics, in the companion module that runs on the same memory (signatures.ts). */
type MoreExports = Pick<KernelExports, 'sweep16' | 'sweep32' | 'sync16' | 'sync32' | 'glauber16' | 'glauber32' | 'glauberSync16' | 'glauberSync32' | 'runGlauber16' | 'runSync16' | 'runSync32'>

/**
 * Networks whose neuron-major patterns take at least 8 MiB get a private instance, so the
 * shared workspace never holds more than that beyond the networks themselves.
 */
const workspaces = new Workspaces<OverlapExports>('overlap', 8 * 1024 * 1024)

/** Moves the shared/private boundary (tests use it to exercise private instances on small networks). */
export function setOverlapPrivateBytes (bytes: number): void {
  workspaces.privateBytes = bytes
}

/** Largest N for int16 overlap lanes (|m_μ| ≤ N). */
const I16_NEURONS = 32767

let nextId = 1

const align16 = (x: number): number => (x + 15) & ~15
/** Bound on the staging area for the pattern transposition. */
const STAGE_BYTES = 1024 * 1024

/** The fast-path names recorded in provenance. */
export type OverlapKernelName = 'wasm-simd128-overlap-i16' | 'wasm-simd128-overlap-i32'

/**
 * Decides whether the kernel can serve a network of this size: int32 fields must not
 * overflow (|h| ≤ P·(N + 1)) and the layout must fit a 32-bit memory.
 */
export function overlapKernelName (neurons: number, patterns: number): OverlapKernelName | null {
  if (patterns * (neurons + 1) >= 2 ** 31) return null
  if (align16(neurons) * align16(patterns) + OverlapKernel.signBitBytes(neurons, patterns) + 28 * neurons + 10 * patterns > 3.5 * 2 ** 30) return null
  return neurons <= I16_NEURONS ? 'wasm-simd128-overlap-i16' : 'wasm-simd128-overlap-i32'
}

export class OverlapKernel {
  readonly name: OverlapKernelName
  /** Row stride of `xi`: P rounded up to 16. */
  readonly stride: number
  /** Neuron-major patterns, xi[i·stride + μ]; padding entries are 0. */
  readonly xi: Int8Array
  private readonly ws: Workspace<OverlapExports>
  private readonly k: OverlapExports
  private readonly isPrivate: boolean
  private readonly id = nextId++
  private readonly n: number
  private readonly p: number
  private readonly self: number
  private readonly wide: boolean
  // Byte offsets of the layout in the workspace memory.
  private readonly xiAt = 0
  private readonly mAt: number
  private readonly sAt: number
  private readonly nextAt: number
  private readonly prevAt: number
  private readonly orderAt: number
  private readonly noiseAt: number
  private readonly stageAt: number
  private readonly rngAt: number
  // Whole synchronous trials: each neuron's last exact field and the bound at that moment, and
  // the overlaps before a step (see "runSync16Bounded" in the generator).
  private readonly hbAt: number
  private readonly gbAt: number
  private readonly mPrevAt: number
  // Sign bits of the patterns (pattern-major, `words` 64-bit words a row) and of the state:
  // initial overlaps by popcount (see "overlapsBits" in the generator).
  private readonly words: number
  private readonly bitsAt: number
  private readonly sbitsAt: number
  /** The sample block of Glauber trials that sample in the kernel (SAMPLE_BLOCK). */
  private readonly sampleAt: number
  /** The packed patterns kept outside a shared workspace, copied in when this network becomes resident (private memories hold the only copy). */
  private readonly bits: Uint8Array
  private readonly stageRows: number
  private readonly end: number
  /** Glauber's 1 + exp(factor·h) over the integer fields, after the layout (memory reserved on first use). */
  private readonly table: GlauberTable
  private buffer: ArrayBuffer | null = null
  private u8: Uint8Array = EMPTY.u8
  private s8: Int8Array = EMPTY.i8
  private prev8: Int8Array = EMPTY.i8
  private m16: Int16Array = EMPTY.i16
  private m32: Int32Array = EMPTY.i32
  private order32: Int32Array = EMPTY.i32
  private noise64: Float64Array = EMPTY.f64
  private rng32: Int32Array = EMPTY.i32

  /**
   * Null when the host has no WebAssembly SIMD or the size does not suit the kernel. With
   * `onlyWholeAsync` the network will run whole zero-temperature asynchronous trials only, so
   * the companion module of the other dynamics is left uncompiled until something needs it;
   * otherwise it is made ready now, with the network.
   */
  static create (neurons: number, patterns: number, selfTerm: number, onlyWholeAsync = false, thermal = false): OverlapKernel | null {
    const name = overlapKernelName(neurons, patterns)
    if (name === null) return null
    const stride = align16(patterns)
    const ws = workspaces.for(align16(neurons) * stride)
    if (ws === null) return null
    const kernel = unlessMemoryRefused(() => new OverlapKernel(ws, name, neurons, patterns, selfTerm))
    // int32 overlaps have no whole asynchronous trial: they always need the companion.
    if (kernel !== null && (!onlyWholeAsync || kernel.wide)) kernel.more()
    // Glauber dynamics will need the table: its room is taken now, with the network.
    if (kernel !== null && thermal) kernel.reserveTable()
    return kernel
  }

  /** The companion module's exports on this network's workspace. */
  private more (): MoreExports {
    const more = this.ws.companion<MoreExports>('overlapMore')
    if (more === null) throw new Error('the overlapMore kernel module could not be instantiated')
    return more
  }

  private constructor (ws: Workspace<OverlapExports>, name: OverlapKernelName, n: number, p: number, selfTerm: number) {
    this.ws = ws
    this.k = ws.k
    this.name = name
    this.n = n
    this.p = p
    this.self = selfTerm
    this.wide = name === 'wasm-simd128-overlap-i32'
    const np = align16(n)
    const pp = align16(p)
    this.stride = pp
    this.mAt = align16(np * pp)
    this.sAt = align16(this.mAt + pp * (this.wide ? 4 : 2))
    this.nextAt = align16(this.sAt + n)
    this.prevAt = align16(this.nextAt + n)
    this.orderAt = align16(this.prevAt + n)
    this.noiseAt = align16(this.orderAt + 4 * n)
    this.rngAt = align16(this.noiseAt + 8 * n)
    this.hbAt = align16(this.rngAt + 48)
    this.gbAt = align16(this.hbAt + 4 * n)
    this.mPrevAt = align16(this.gbAt + 8 * n)
    this.words = Math.ceil(n / 64)
    this.bitsAt = align16(this.mPrevAt + 2 * pp)
    this.sbitsAt = this.bitsAt + 8 * this.words * p
    this.sampleAt = align16(this.sbitsAt + 8 * this.words)
    this.stageAt = align16(this.sampleAt + sampleBlockBytes(pp))
    // Pattern rows staged for the transposer in chunks of about STAGE_BYTES (multiples of 16
    // rows), so no second pattern-sized buffer stays behind in a private memory.
    this.stageRows = Math.min(pp, Math.max(16, Math.floor(STAGE_BYTES / n / 16) * 16))
    this.end = this.stageAt + this.stageRows * n + 32
    this.table = new GlauberTable(align16(this.end), p * (n + 1))
    this.isPrivate = ws.isPrivate
    // A private memory never grows after this (`xi` is a view into it): the Glauber table's
    // room is reserved now; a shared one grows on first thermal use.
    ws.reserve(this.isPrivate ? this.table.at + this.table.bytes : this.end)
    this.xi = this.isPrivate ? new Int8Array(ws.buffer, 0, n * pp) : new Int8Array(n * pp)
    this.bits = this.isPrivate ? EMPTY.u8 : new Uint8Array(8 * this.words * p)
  }

  /** Bytes of the packed sign bits of the patterns. */
  static signBitBytes (neurons: number, patterns: number): number {
    return 8 * Math.ceil(neurons / 64) * patterns
  }

  /**
   * Fills `xi` from pattern-major ±1 patterns (patterns[μ·N + i]): rows are staged as they
   * are (stride N) and transposed 16×16 at a time. Columns past N read the next row; they land
   * in rows i ≥ N of the layout, which no visit reads. Missing patterns of the last block are
   * staged as zeros, so the padding entries of every real row are 0.
   */
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
      this.k.packRows(this.stageAt, n, rows, this.bitsAt + 8 * this.words * mu0, this.words)
    }
    if (!this.isPrivate) {
      this.xi.set(new Int8Array(u8.buffer, this.xiAt, n * this.stride))
      this.bits.set(new Uint8Array(u8.buffer, this.bitsAt, this.bits.length))
    }
  }

  /** m = Ξᵀ s: by popcount for a ±1 state, by multiply-adds when the state holds erased (0) entries. */
  overlaps (state: Int8Array, m: Int32Array): void {
    this.enter()
    this.s8.set(state)
    if (this.k.overlapsBits(this.bitsAt, this.words, this.sAt, this.sbitsAt, this.n, this.p, this.stride, this.mAt, this.wide ? 1 : 0) === 0) {
      const fn = this.wide ? this.k.overlaps32 : this.k.overlaps16
      fn(this.xiAt, this.mAt, this.sAt, this.n, this.stride)
    }
    this.leave(state, m, false)
  }

  /** Σ_μ m_μ², exactly the plain loop's sum (int16 overlaps), or null (int32 overlaps: the caller sums). */
  sumSquares (m: Int32Array): number | null {
    if (this.wide) return null
    this.enter()
    this.m16.set(m)
    return this.k.sumSquares16(this.mAt, this.stride)
  }

  /** One zero-temperature asynchronous sweep in `order`; true if a neuron changed. */
  sweep (state: Int8Array, m: Int32Array, order: Int32Array): boolean {
    this.enter()
    this.pass(state, m)
    this.order32.set(order)
    const more = this.more()
    const fn = this.wide ? more.sweep32 : more.sweep16
    const changed = fn(this.xiAt, this.mAt, this.sAt, this.orderAt, this.n, this.stride, this.self)
    this.leave(state, m, true)
    return changed !== 0
  }

  /**
   * A whole zero-temperature asynchronous trial from the loaded state: before each sweep the
   * order is reshuffled with `rng` (when `shuffle`), as the plain loop does. Returns the sweeps
   * and whether the last one still changed a neuron (the sweep limit was hit), or null when
   * this kernel cannot (int32 overlaps, or a random source other than the engine's
   * xoshiro256**), leaving everything untouched.
   */
  runAsync (state: Int8Array, m: Int32Array, order: Int32Array, maxSweeps: number, shuffle: boolean, rng: RandomSource): { sweeps: number, changedLast: boolean } | null {
    if (this.wide) return null
    const words = shuffle ? xoshiroState(rng) : null
    if (shuffle && words === null) return null
    this.enter()
    this.pass(state, m)
    this.order32.set(order)
    if (words !== null) stateToKernel(words, rng, this.rng32)
    const r = this.k.runAsync16(this.xiAt, this.mAt, this.sAt, this.orderAt, this.n, this.stride, this.self, this.rngAt, maxSweeps, shuffle ? 1 : 0, this.p, this.hbAt, this.gbAt)
    this.leave(state, m, true)
    order.set(this.order32)
    if (words !== null) stateFromKernel(this.rng32, words, rng)
    return { sweeps: r >>> 1, changedLast: (r & 1) === 1 }
  }

  /**
   * A whole zero-temperature synchronous trial from the loaded state: steps until a fixed
   * point, a two-cycle or `maxSteps`. `previous` ends as the plain loop leaves it.
   */
  runSync (state: Int8Array, m: Int32Array, previous: Int8Array, maxSteps: number): { steps: number, ending: 'fixed' | 'cycle2' | 'max' } {
    this.enter()
    this.pass(state, m)
    this.prev8.set(previous)
    const more = this.more()
    const r = this.wide
      ? more.runSync32(this.xiAt, this.mAt, this.sAt, this.nextAt, this.prevAt, this.n, this.stride, this.self, maxSteps)
      : more.runSync16(this.xiAt, this.mAt, this.sAt, this.nextAt, this.prevAt, this.n, this.stride, this.self, maxSteps, this.hbAt, this.gbAt, this.mPrevAt)
    previous.set(this.prev8)
    this.leave(state, m, true)
    const ending = r & 3
    return { steps: r >>> 2, ending: ending === 1 ? 'fixed' : ending === 2 ? 'cycle2' : 'max' }
  }

  /** One zero-temperature synchronous step: 0 changed, 1 fixed point, 2 two-cycle (see the kernel). */
  sync (state: Int8Array, m: Int32Array, previous: Int8Array, check: boolean): number {
    this.enter()
    this.pass(state, m)
    this.prev8.set(previous)
    const more = this.more()
    const fn = this.wide ? more.sync32 : more.sync16
    const outcome = fn(this.xiAt, this.mAt, this.sAt, this.nextAt, this.prevAt, this.n, this.stride, this.self, check ? 1 : 0)
    if (outcome !== 1) {
      previous.set(this.prev8)
      this.leave(state, m, true)
    }
    return outcome
  }

  /** One asynchronous Glauber sweep with noise[k] the uniform of the k-th visit. */
  glauber (state: Int8Array, m: Int32Array, order: Int32Array, noise: Float64Array, factor: number): void {
    const half = this.enterThermal(factor)
    this.pass(state, m)
    this.order32.set(order)
    this.noise64.set(noise.subarray(0, this.n))
    const more = this.more()
    const fn = this.wide ? more.glauber32 : more.glauber16
    fn(this.xiAt, this.mAt, this.sAt, this.orderAt, this.noiseAt, this.n, this.stride, this.self, factor, this.table.at, half)
    this.leave(state, m, true)
  }

  /** One synchronous Glauber step with noise[i] the uniform of neuron i. */
  glauberSync (state: Int8Array, m: Int32Array, noise: Float64Array, factor: number): void {
    const half = this.enterThermal(factor)
    this.pass(state, m)
    this.noise64.set(noise.subarray(0, this.n))
    const more = this.more()
    const fn = this.wide ? more.glauberSync32 : more.glauberSync16
    fn(this.xiAt, this.mAt, this.sAt, this.nextAt, this.noiseAt, this.n, this.stride, this.self, factor, this.table.at, half)
    this.leave(state, m, true)
  }

  /**
   * A whole asynchronous Glauber run from the loaded state: `sweeps` sweeps, each after the
   * reshuffle of `order` (when `shuffle`) and drawing its uniforms, all from `rng` as the plain
   * loop does. After each sweep, `state` and `m` hold the network's state and `afterSweep(sweep)`
   * runs. False when this kernel cannot (int32 overlaps, or a random source other than the
   * engine's xoshiro256**), with nothing drawn or changed.
   */
  runGlauber (state: Int8Array, m: Int32Array, order: Int32Array, sweeps: number, shuffle: boolean, factor: number, rng: RandomSource, afterSweep: (sweep: number) => void): boolean {
    return this.wholeGlauber(state, m, order, sweeps, factor, rng, (half, more) => {
      withKernelHooks({
        sweepDone: (sweep) => {
          this.leave(state, m, true)
          afterSweep(sweep)
        }
      }, () => more.runGlauber16(this.xiAt, this.mAt, this.sAt, this.orderAt, this.n, this.stride, this.self, this.rngAt, sweeps, shuffle ? 1 : 0, factor, this.table.at, half, this.p, 0, 0, 0, 0))
    })
  }

  /**
   * `runGlauber` with the thermal samples taken in the kernel (no call per sweep): returns
   * their totals, or null when this kernel cannot (as `runGlauber`).
   */
  runGlauberSampled (state: Int8Array, m: Int32Array, order: Int32Array, sweeps: number, shuffle: boolean, factor: number, rng: RandomSource, sampling: ThermalSampling): ThermalTotals | null {
    const block = this.sampleAt
    const ran = this.wholeGlauber(state, m, order, sweeps, factor, rng, (half, more) => {
      this.u8.fill(0, block, block + sampleBlockBytes(this.stride))
      const overlaps = new Float64Array(this.u8.buffer, block + SAMPLE_BLOCK.overlaps, this.p)
      withKernelHooks({ classifySample: () => sampling.classify(overlaps) }, () => more.runGlauber16(this.xiAt, this.mAt, this.sAt, this.orderAt, this.n, this.stride, this.self, this.rngAt, sweeps, shuffle ? 1 : 0, factor, this.table.at, half,
        this.p, sampling.burnIn, sampling.target, sampling.patternLevel, block))
    })
    if (!ran) return null
    const totals = new Float64Array(this.u8.buffer, block, 2)
    return {
      sums: new Float64Array(this.u8.buffer, block + SAMPLE_BLOCK.overlaps + 8 * this.stride, this.p).slice(),
      otherSum: totals[0]!,
      energySum: totals[1]!,
      classCounts: new Int32Array(this.u8.buffer, block + SAMPLE_BLOCK.classCounts, 7).slice(),
      count: new Int32Array(this.u8.buffer, block + SAMPLE_BLOCK.count, 1)[0]!
    }
  }

  /** For tests: a copy of the Glauber table as the last sweep left it (entry k is field k − half; 0 = never needed). */
  glauberTableSnapshot (): { half: number, values: Float64Array } {
    const half = this.table.halfWidth
    const values = half < 0 ? new Float64Array(0) : new Float64Array(this.ws.buffer, this.table.at, 2 * half + 1).slice()
    return { half, values }
  }

  /**
   * The frame of a whole Glauber run: state, order and generator into the kernel, `run`, then
   * all of them back; false when this kernel cannot (int32 overlaps, another random source),
   * with nothing drawn or changed.
   */
  private wholeGlauber (state: Int8Array, m: Int32Array, order: Int32Array, sweeps: number, factor: number, rng: RandomSource, run: (half: number, more: MoreExports) => void): boolean {
    if (this.wide || sweeps < 1) return false
    const words = xoshiroState(rng)
    if (words === null) return false
    const half = this.enterThermal(factor)
    this.pass(state, m)
    this.order32.set(order)
    stateToKernel(words, rng, this.rng32)
    run(half, this.more())
    this.leave(state, m, true)
    order.set(this.order32)
    stateFromKernel(this.rng32, words, rng)
    return true
  }

  /** Grows the workspace to hold the Glauber table after the layout. */
  private reserveTable (): void {
    this.ws.reserve(this.table.at + this.table.bytes)
  }

  /** Enters with room for the Glauber table, ready for `factor`; returns its half-width. */
  private enterThermal (factor: number): number {
    const ws = this.ws
    this.reserveTable()
    this.enter()
    const half = this.table.prepare(ws.buffer, factor, ws.claimed <= this.table.at)
    ws.claim(this.table.at + this.table.bytes)
    return half
  }

  /** Makes this network's layout current: memory large enough, views fresh, patterns resident. */
  private enter (copyPatterns = true): void {
    const ws = this.ws
    if (!this.isPrivate) ws.reserve(this.end)
    ws.claim(this.end)
    const buffer = ws.buffer
    if (buffer !== this.buffer) {
      this.buffer = buffer
      this.u8 = new Uint8Array(buffer)
      this.s8 = new Int8Array(buffer, this.sAt, this.n)
      this.prev8 = new Int8Array(buffer, this.prevAt, this.n)
      this.m16 = new Int16Array(buffer, this.mAt, this.p)
      this.m32 = new Int32Array(buffer, this.mAt, this.p)
      this.order32 = new Int32Array(buffer, this.orderAt, this.n)
      this.noise64 = new Float64Array(buffer, this.noiseAt, this.n)
      this.rng32 = new Int32Array(buffer, this.rngAt, 10)
    }
    if (ws.residentId !== this.id) {
      this.table.invalidate()
      if (!this.isPrivate && copyPatterns) {
        this.u8.set(new Uint8Array(this.xi.buffer, this.xi.byteOffset, this.xi.length), this.xiAt)
        this.u8.set(this.bits, this.bitsAt)
      }
      ws.residentId = this.id
    }
  }

  /** State and overlaps into the workspace. */
  private pass (state: Int8Array, m: Int32Array): void {
    this.s8.set(state)
    if (this.wide) this.m32.set(m)
    else this.m16.set(m)
  }

  private leave (state: Int8Array, m: Int32Array, withState: boolean): void {
    if (withState) state.set(this.s8)
    m.set(this.wide ? this.m32 : this.m16)
  }
}
