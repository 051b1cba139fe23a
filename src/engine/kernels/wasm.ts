/**
 * The little of the WebAssembly JS API the kernels use, typed here because the project's
 * TypeScript libraries carry no WebAssembly declarations, plus the switch that lets tests
 * run the plain JavaScript path on purpose.
 */
import { KERNEL_MODULE_BYTES } from './kernels.generated.js'
import type { KernelModule } from './signatures.js'

export interface WasmMemory {
  readonly buffer: ArrayBuffer
  grow (pages: number): number
}

export interface WasmInstance {
  readonly exports: Record<string, unknown>
}

interface WasmApi {
  validate (bytes: Uint8Array): boolean
  Module: new (bytes: Uint8Array) => object
  Instance: new (module: object, imports: Record<string, Record<string, unknown>>) => WasmInstance
}

export const WASM_PAGE = 65536

/** Placeholders for views that are made on first use, so building a network allocates no throwaway buffers. */
export const EMPTY = {
  u8: new Uint8Array(0),
  i8: new Int8Array(0),
  i16: new Int16Array(0),
  i32: new Int32Array(0),
  f64: new Float64Array(0)
} as const

/** The host's WebAssembly API, or null where there is none. */
export function wasmApi (): WasmApi | null {
  return (globalThis as { WebAssembly?: WasmApi }).WebAssembly ?? null
}

const compiled = new Map<KernelModule, object | null>()

/**
 * One of the engine's kernel modules, compiled once per process on first use (so a process
 * compiles only the kernels it runs); null when the host lacks WebAssembly or a feature the
 * module uses (SIMD128, bulk memory).
 */
function kernelModule (name: KernelModule): object | null {
  let mod = compiled.get(name)
  if (mod === undefined) {
    const api = wasmApi()
    const bytes = Uint8Array.from(KERNEL_MODULE_BYTES[name]!)
    mod = api !== null && api.validate(bytes) ? new api.Module(bytes) : null
    compiled.set(name, mod)
  }
  return mod
}

/** What a kernel that runs several sweeps in one call asks of its caller while it runs. */
export interface KernelHooks {
  /** After each sweep, the sweep's number (the caller may read the state and observe). */
  sweepDone?: (sweep: number) => void
  /** The end-state class index of the sample the kernel just took (overlaps in its sample block). */
  classifySample?: () => number
}

let hooks: KernelHooks = {}

/** Runs `body` (a call into a kernel that runs several sweeps) with `during` answering the kernel's calls to the host. */
export function withKernelHooks<R> (during: KernelHooks, body: () => R): R {
  hooks = during
  try {
    return body()
  } finally {
    hooks = {}
  }
}

/** The modules' imports: the host's exponential (the plain path's Math.exp) and the hooks. */
const HOST = {
  host: {
    exp: Math.exp,
    sweepDone: (sweep: number): void => { hooks.sweepDone?.(sweep) },
    classifySample: (): number => {
      if (hooks.classifySample === undefined) throw new Error('a kernel asked to classify a sample with no classifier given')
      return hooks.classifySample()
    }
  }
}

/**
 * A fresh instance of a kernel module, or null without WebAssembly SIMD: with its own linear
 * memory, or on `memory` for a module that imports one (overlapMore).
 */
export function instantiateKernels<T> (module: KernelModule, memory?: WasmMemory): T | null {
  const api = wasmApi()
  const mod = kernelModule(module)
  if (api === null || mod === null) return null
  return new api.Instance(mod, memory === undefined ? HOST : { ...HOST, env: { memory } }).exports as unknown as T
}

/** A kernel module instance whose linear memory holds one or more networks' data. */
export class Workspace<T extends { memory: WasmMemory }> {
  /** The network whose data the memory holds now (shared workspaces copy theirs in on entry). */
  residentId = 0
  /**
   * The memory's current buffer. Reading `memory.buffer` costs a call into the host on every
   * kernel entry; the memory only grows through `reserve` (no kernel grows it), so the buffer
   * is read again only then.
   */
  #buffer: ArrayBuffer
  constructor (readonly k: T, readonly isPrivate: boolean) {
    this.#buffer = k.memory.buffer
  }

  get buffer (): ArrayBuffer {
    return this.#buffer
  }

  #companions = new Map<KernelModule, unknown>()

  /**
   * An instance of a module that runs on this workspace's memory (overlapMore), made and
   * compiled on first use and kept; null without WebAssembly SIMD.
   */
  companion<U> (module: KernelModule): U | null {
    if (!this.#companions.has(module)) this.#companions.set(module, instantiateKernels<U>(module, this.k.memory))
    return this.#companions.get(module) as U | null
  }

  /**
   * Bytes [0, claimed) may have been written; the memory beyond has held zero since it was
   * created or grown. Meaningful only where every user claims what it writes before writing:
   * the overlap-space kernel claims its layout on every entry and its Glauber table when it
   * prepares it, and reads this to skip zeroing a table in pristine memory. No other kernel
   * reads it.
   */
  claimed = 0

  /** Records that bytes below `end` may be written. */
  claim (end: number): void {
    this.claimed = Math.max(this.claimed, end)
  }

  /** Grows the memory to at least `bytes`; throws RangeError when the host refuses. */
  reserve (bytes: number): void {
    const have = this.#buffer.byteLength
    if (bytes > have) {
      this.k.memory.grow(Math.ceil((bytes - have) / WASM_PAGE))
      this.#buffer = this.k.memory.buffer
    }
  }
}

/**
 * Where one kind of network keeps its kernel data. Small networks share one instance (one
 * linear memory, grown as needed) and copy their data in when another network used it last;
 * a network whose large array takes `privateBytes` or more gets an instance of its own that
 * holds the only copy. (One instance per network would be simpler, but V8 reserves gigabytes
 * of address space per memory and stalls on garbage collection when thousands of networks
 * are built in a row.)
 */
export class Workspaces<T extends { memory: WasmMemory }> {
  #shared: Workspace<T> | null | undefined

  /** `privateBytes` is public so tests can exercise private instances on small networks. */
  constructor (private readonly module: KernelModule, public privateBytes: number) {}

  /** The workspace for a network whose large array takes `bytes`; null without WebAssembly SIMD. */
  for (bytes: number): Workspace<T> | null {
    if (bytes >= this.privateBytes) {
      const k = instantiateKernels<T>(this.module)
      return k === null ? null : new Workspace(k, true)
    }
    if (this.#shared === undefined) {
      const k = instantiateKernels<T>(this.module)
      this.#shared = k === null ? null : new Workspace(k, false)
    }
    return this.#shared
  }
}

/**
 * Builds a kernel, or returns null when the host refused to grow a memory for it: the plain
 * path needs less memory, so the network falls back to it.
 */
export function unlessMemoryRefused<K> (build: () => K): K | null {
  try {
    return build()
  } catch (error) {
    if (error instanceof RangeError) return null
    throw error
  }
}

let fastPathsEnabled = true

/**
 * Whether networks built from now on may use the WebAssembly fast paths (default true).
 * The fast paths give bit-identical results; switching them off exists so tests and
 * benchmarks can run the plain path on the same stream and compare.
 */
export function setFastPathsEnabled (enabled: boolean): void {
  fastPathsEnabled = enabled
}

export function areFastPathsEnabled (): boolean {
  return fastPathsEnabled
}
