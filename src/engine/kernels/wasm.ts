/**
 * The little of the WebAssembly JS API the kernels use, typed here because the project's
 * TypeScript libraries carry no WebAssembly declarations, plus the switch that lets tests
 * run the plain JavaScript path on purpose.
 */
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

/** The host's WebAssembly API, or null where there is none. */
export function wasmApi (): WasmApi | null {
  return (globalThis as { WebAssembly?: WasmApi }).WebAssembly ?? null
}

export function hexToBytes (hex: string): Uint8Array {
  const out = new Uint8Array(hex.length >> 1)
  for (let k = 0; k < out.length; k++) out[k] = parseInt(hex.slice(2 * k, 2 * k + 2), 16)
  return out
}

/** Compiles `hex` once; null when the host lacks WebAssembly or a feature the module uses (SIMD128). */
export function compileOnce (hex: string): () => object | null {
  let compiled: object | null | undefined
  return () => {
    if (compiled === undefined) {
      const api = wasmApi()
      const bytes = hexToBytes(hex)
      compiled = api !== null && api.validate(bytes) ? new api.Module(bytes) : null
    }
    return compiled
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
