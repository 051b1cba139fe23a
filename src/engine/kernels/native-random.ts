import { areFastPathsEnabled, instantiateKernels, WASM_PAGE } from './wasm.js'
import type { KernelsUsing } from './signatures.js'
import { Xoshiro256StarStar } from '../random/xoshiro256.js'
import type { RandomSource } from '../random/source.js'

/**
 * Bulk draws from the engine's own xoshiro256** streams run in WebAssembly on native 64-bit
 * words: the per-sweep Fisher–Yates shuffle, the cue's choice of bits, unbiased pattern rows
 * and Glauber's uniforms. A JavaScript draw
 * costs tens of nanoseconds (64-bit arithmetic on 32-bit halves), a native one about one.
 * The kernel continues the stream from the generator's state and writes the state and the
 * last output back, so the stream and every value drawn are exactly those of the plain
 * loops. For any other RandomSource the functions return false and the caller draws in
 * JavaScript.
 */
type RandomExports = KernelsUsing<'shuffle' | 'partialShuffle' | 'markChosen' | 'unbiasedRows' | 'uniforms'>

let kernel: RandomExports | null | undefined

function randomKernel (): RandomExports | null {
  if (kernel === undefined) {
    kernel = instantiateKernels<RandomExports>('random')
  }
  return kernel
}

/** The generator's state words, [s0 high, s0 low, s1 high, …] (see random/xoshiro256.ts), if reachable. */
export function xoshiroState (rng: RandomSource): Int32Array | null {
  if (!areFastPathsEnabled() || !(rng instanceof Xoshiro256StarStar)) return null
  return rng.stateWords
}

const STATE_AT = 0
const DATA_AT = 64
const CHUNK_BYTES = 4 * 1024 * 1024

let viewsOf: ArrayBuffer | null = null
let stateView = new Int32Array(0)
let dataView32 = new Int32Array(0)
/** The memory's buffer, read again only after this module grows it (reading it is a host call). */
let buffer: ArrayBuffer | null = null

/** Kernel with at least `bytes` of data room, the generator's state copied in (little-endian words). */
function enter (s: Int32Array, bytes: number): RandomExports | null {
  const k = randomKernel()
  if (k === null) return null
  const need = DATA_AT + bytes
  buffer ??= k.memory.buffer
  const have = buffer.byteLength
  if (need > have) {
    k.memory.grow(Math.ceil((need - have) / WASM_PAGE))
    buffer = k.memory.buffer
  }
  if (buffer !== viewsOf) {
    viewsOf = buffer
    stateView = new Int32Array(buffer, STATE_AT, 10)
    dataView32 = new Int32Array(buffer, DATA_AT, (buffer.byteLength - DATA_AT) >> 2)
  }
  for (let w = 0; w < 4; w++) {
    stateView[2 * w] = s[2 * w + 1]!
    stateView[2 * w + 1] = s[2 * w]!
  }
  return k
}

function leave (s: Int32Array, rng: RandomSource): void {
  for (let w = 0; w < 4; w++) {
    s[2 * w + 1] = stateView[2 * w]!
    s[2 * w] = stateView[2 * w + 1]!
  }
  rng.word[0] = stateView[8]!
  rng.word[1] = stateView[9]!
}

/** Shuffles `order` in place exactly as the plain Fisher–Yates loop would with `rng`; false if it cannot. */
export function nativeShuffle (order: Int32Array, rng: RandomSource): boolean {
  const s = xoshiroState(rng)
  if (s === null) return false
  const n = order.length
  if (n < 2) return true
  const k = enter(s, 4 * n)
  if (k === null) return false
  dataView32.set(order)
  k.shuffle(DATA_AT, n, STATE_AT)
  order.set(dataView32.subarray(0, n))
  leave(s, rng)
  return true
}

/**
 * Resets `idx` to the identity and moves `count` distinct entries to its front exactly as
 * the plain partial Fisher–Yates loop of the cue would with `rng` (k < count:
 * j = k + below(n − k), swap); false if it cannot.
 */
export function nativePartialShuffle (idx: Int32Array, count: number, rng: RandomSource): boolean {
  const s = xoshiroState(rng)
  if (s === null) return false
  const n = idx.length
  if (count === 0) {
    // Nothing is drawn, so the generator (and its last output) must stay untouched.
    for (let i = 0; i < n; i++) idx[i] = i
    return true
  }
  const k = enter(s, 4 * n)
  if (k === null) return false
  k.partialShuffle(DATA_AT, n, count, STATE_AT)
  idx.set(dataView32.subarray(0, n))
  leave(s, rng)
  return true
}

/**
 * The cue's flips or erasures in place: chooses `count` distinct entries of `state` exactly as
 * `nativePartialShuffle` (the plain partial Fisher–Yates loop) would with `rng`, then negates
 * them, or sets them to 0 when `erase`. False (nothing drawn or changed) if it cannot.
 */
export function nativeMarkChosen (state: Int8Array, count: number, erase: boolean, rng: RandomSource): boolean {
  const s = xoshiroState(rng)
  if (s === null) return false
  if (count === 0) return true
  const n = state.length
  const sAt = DATA_AT + ((4 * n + 15) & ~15)
  const k = enter(s, sAt - DATA_AT + n)
  if (k === null) return false
  new Int8Array(buffer!, sAt, n).set(state)
  k.partialShuffle(DATA_AT, n, count, STATE_AT)
  k.markChosen(DATA_AT, sAt, count, erase ? 1 : 0)
  state.set(new Int8Array(buffer!, sAt, n))
  leave(s, rng)
  return true
}

/**
 * Writes `count` unbiased ±1 rows of n entries from out[offset] on, exactly as `count` calls
 * of the plain bit-by-bit fill would; false if it cannot.
 */
export function nativeUnbiasedRows (out: Int8Array, offset: number, n: number, count: number, rng: RandomSource): boolean {
  const s = xoshiroState(rng)
  if (s === null) return false
  if (n * count === 0) return true
  // Bounded chunks, so a big network does not leave a pattern-sized workspace behind.
  const rows = Math.max(1, Math.min(count, Math.floor(CHUNK_BYTES / n)))
  const k = enter(s, n * rows + 64)
  if (k === null) return false
  for (let row = 0; row < count; row += rows) {
    const take = Math.min(rows, count - row)
    k.unbiasedRows(DATA_AT, n, take, STATE_AT)
    out.set(new Int8Array(buffer!, DATA_AT, n * take), offset + row * n)
    // The kernel stored the state where the next chunk reads it.
  }
  leave(s, rng)
  return true
}

let dataView64 = new Float64Array(0)

/** Fills out[0..count) with `count` successive `rng.uniform()` values; false if it cannot. */
export function nativeUniforms (out: Float64Array, count: number, rng: RandomSource): boolean {
  const s = xoshiroState(rng)
  if (s === null) return false
  if (count === 0) return true
  const k = enter(s, 8 * count)
  if (k === null) return false
  if (dataView64.buffer !== viewsOf || dataView64.length < count) dataView64 = new Float64Array(viewsOf!, DATA_AT, count)
  k.uniforms(DATA_AT, count, STATE_AT)
  out.set(dataView64.subarray(0, count))
  leave(s, rng)
  return true
}

/**
 * Copies a generator's state words into a kernel's state area: four little-endian 64-bit
 * words, then its last output (kept if the kernel draws nothing).
 */
export function stateToKernel (s: Int32Array, rng: RandomSource, view: Int32Array): void {
  for (let w = 0; w < 4; w++) {
    view[2 * w] = s[2 * w + 1]!
    view[2 * w + 1] = s[2 * w]!
  }
  view[8] = rng.word[0]!
  view[9] = rng.word[1]!
}

/** Copies a kernel's state area back into the generator (state words and last output). */
export function stateFromKernel (view: Int32Array, s: Int32Array, rng: RandomSource): void {
  for (let w = 0; w < 4; w++) {
    s[2 * w + 1] = view[2 * w]!
    s[2 * w] = view[2 * w + 1]!
  }
  rng.word[0] = view[8]!
  rng.word[1] = view[9]!
}
