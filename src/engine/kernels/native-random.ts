import { OVERLAP_KERNEL_HEX } from './overlap-kernel.generated.js'
import { areFastPathsEnabled, compileOnce, wasmApi, WASM_PAGE, type WasmMemory } from './wasm.js'
import { Xoshiro256StarStar } from '../random/xoshiro256.js'
import type { RandomSource } from '../random/source.js'

/**
 * The per-sweep Fisher–Yates shuffle run in WebAssembly on native 64-bit words, for the
 * engine's own xoshiro256** streams: a JavaScript draw costs tens of nanoseconds (64-bit
 * arithmetic on 32-bit halves), a native one about one. The kernel continues the stream
 * from the generator's state and writes the state back, so the stream, the order and the
 * generator's last output are exactly those of the plain loop. Other sources return false
 * and the caller shuffles in JavaScript.
 */
interface ShuffleExports {
  memory: WasmMemory
  shuffle: (order: number, n: number, state: number) => void
}

const module = compileOnce(OVERLAP_KERNEL_HEX)
let kernel: ShuffleExports | null | undefined

function shuffleKernel (): ShuffleExports | null {
  if (kernel === undefined) {
    const api = wasmApi()
    const mod = module()
    kernel = api === null || mod === null ? null : new api.Instance(mod, { host: { exp: Math.exp } }).exports as unknown as ShuffleExports
  }
  return kernel
}

/** The generator's state words, [s0 high, s0 low, s1 high, …] (see random/xoshiro256.ts), if reachable. */
function xoshiroState (rng: RandomSource): Int32Array | null {
  if (!(rng instanceof Xoshiro256StarStar)) return null
  const s = (rng as unknown as { s?: unknown }).s
  return s instanceof Int32Array && s.length === 8 ? s : null
}

const STATE_AT = 0
const ORDER_AT = 64

/** Shuffles `order` in place exactly as the plain loop would with `rng`; false if it cannot. */
export function nativeShuffle (order: Int32Array, rng: RandomSource): boolean {
  if (!areFastPathsEnabled()) return false
  const s = xoshiroState(rng)
  if (s === null) return false
  const k = shuffleKernel()
  if (k === null) return false
  const n = order.length
  if (n < 2) return true
  const need = ORDER_AT + 4 * n
  const have = k.memory.buffer.byteLength
  if (need > have) k.memory.grow(Math.ceil((need - have) / WASM_PAGE))
  const buffer = k.memory.buffer
  const state = new Int32Array(buffer, STATE_AT, 10)
  for (let w = 0; w < 4; w++) {
    state[2 * w] = s[2 * w + 1]!
    state[2 * w + 1] = s[2 * w]!
  }
  const view = new Int32Array(buffer, ORDER_AT, n)
  view.set(order)
  k.shuffle(ORDER_AT, n, STATE_AT)
  order.set(view)
  for (let w = 0; w < 4; w++) {
    s[2 * w + 1] = state[2 * w]!
    s[2 * w] = state[2 * w + 1]!
  }
  rng.word[0] = state[8]!
  rng.word[1] = state[9]!
  return true
}
