/**
 * The committed kernel module (src/engine/kernels/kernels.generated.ts) must be exactly what
 * the generator assembles from its WebAssembly text now, and its exports exactly the table of
 * signatures the engine's TypeScript types come from. After changing a kernel or the table,
 * run `npm run kernels:generate` and commit both.
 */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { assembleKernels, GENERATED_PATH } from '../../../scripts/gen-kernels.js'
import { KERNELS_WASM_BASE64 } from '../../../src/engine/kernels/kernels.generated.js'
import { KERNEL_SIGNATURES, parseParam } from '../../../src/engine/kernels/signatures.js'

interface WasmReflection {
  Module: (new (bytes: Uint8Array) => object) & { exports: (module: object) => Array<{ name: string, kind: string }> }
  Instance: new (module: object, imports: Record<string, Record<string, unknown>>) => { exports: Record<string, unknown> }
}
const wasm = (globalThis as unknown as { WebAssembly: WasmReflection }).WebAssembly
const committed = Uint8Array.from(Buffer.from(KERNELS_WASM_BASE64, 'base64'))

describe('generated kernel module', () => {
  it('has the bytes the generator assembles now (run `npm run kernels:generate` after changing scripts/gen-kernels.ts or the signature table)', async () => {
    const { wasm: fresh, generated } = await assembleKernels()
    expect(fresh.length).toBeGreaterThan(0)
    // Byte for byte: first the module, then the whole generated file around it.
    expect(Buffer.from(committed).equals(Buffer.from(fresh)), `module bytes differ (${committed.length} committed, ${fresh.length} generated)`).toBe(true)
    expect(readFileSync(GENERATED_PATH, 'utf8')).toBe(generated)
  })

  it('exports exactly the functions of the signature table, each taking the parameters the table lists', () => {
    const mod = new wasm.Module(committed)
    const functions = wasm.Module.exports(mod).filter((e) => e.kind === 'function').map((e) => e.name)
    expect([...functions].sort()).toStrictEqual(Object.keys(KERNEL_SIGNATURES).sort())
    const instance = new wasm.Instance(mod, { host: { exp: Math.exp, sweepDone: () => {} } })
    for (const [name, signature] of Object.entries(KERNEL_SIGNATURES)) {
      const fn = instance.exports[name] as (...args: number[]) => unknown
      // An exported WebAssembly function's length is its parameter count.
      expect(fn.length, name).toBe(signature.params.length)
      for (const param of signature.params) expect(['i32', 'f64'], `${name}(${param})`).toContain(parseParam(param).type)
    }
  })
})
