/**
 * The committed kernel modules (src/engine/kernels/kernels.generated.ts) must be exactly what
 * the generator assembles from its WebAssembly text now, and their exports exactly the table of
 * signatures the engine's TypeScript types come from. After changing a kernel or the table,
 * run `npm run kernels:generate` and commit both.
 */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { assembleKernels, GENERATED_PATH } from '../../../scripts/gen-kernels.js'
import { KERNEL_MODULE_BYTES } from '../../../src/engine/kernels/kernels.generated.js'
import { KERNEL_MODULES, KERNEL_SIGNATURES, parseParam } from '../../../src/engine/kernels/signatures.js'

interface WasmReflection {
  Module: (new (bytes: Uint8Array) => object) & {
    exports: (module: object) => Array<{ name: string, kind: string }>
    imports: (module: object) => Array<{ module: string, name: string, kind: string }>
  }
  Instance: new (module: object, imports: Record<string, Record<string, unknown>>) => { exports: Record<string, unknown> }
  Memory: new (descriptor: { initial: number }) => object
}
const wasm = (globalThis as unknown as { WebAssembly: WasmReflection }).WebAssembly
const committed = (module: string): Uint8Array => Uint8Array.from(KERNEL_MODULE_BYTES[module]!)

describe('generated kernel modules', () => {
  it('have the bytes the generator assembles now (run `npm run kernels:generate` after changing scripts/gen-kernels.ts or the signature table)', async () => {
    const { wasm: fresh, generated } = await assembleKernels()
    expect(Object.keys(KERNEL_MODULE_BYTES).sort()).toStrictEqual([...KERNEL_MODULES].sort())
    // Byte for byte: first each module, then the whole generated file around them.
    for (const module of KERNEL_MODULES) {
      const bytes = committed(module)
      expect(fresh[module].length, module).toBeGreaterThan(0)
      expect(Buffer.from(bytes).equals(Buffer.from(fresh[module])), `module ${module}: bytes differ (${bytes.length} committed, ${fresh[module].length} generated)`).toBe(true)
    }
    expect(readFileSync(GENERATED_PATH, 'utf8')).toBe(generated)
  })

  it('export exactly the functions of the signature table, each taking the parameters the table lists', () => {
    for (const module of KERNEL_MODULES) {
      const mod = new wasm.Module(committed(module))
      const functions = wasm.Module.exports(mod).filter((e) => e.kind === 'function').map((e) => e.name)
      const listed = Object.entries(KERNEL_SIGNATURES).filter(([, sig]) => (sig.modules as readonly string[]).includes(module)).map(([name]) => name)
      expect([...functions].sort(), module).toStrictEqual(listed.sort())
      // A module that runs on another's memory imports it (overlapMore); the others own one.
      const imports = wasm.Module.imports(mod).map((i) => `${i.module}.${i.name}:${i.kind}`).sort()
      const sharesMemory = imports.includes('env.memory:memory')
      // overlapMore's whole Glauber trials also ask the host to classify the samples they take.
      const hostImports = module === 'overlapMore' ? ['host.classifySample:function', 'host.exp:function', 'host.sweepDone:function'] : ['host.exp:function', 'host.sweepDone:function']
      expect(imports.filter((i) => i !== 'env.memory:memory'), module).toStrictEqual(hostImports)
      expect(sharesMemory ? [] : wasm.Module.exports(mod).filter((e) => e.kind === 'memory').map((e) => e.name), module).toStrictEqual(sharesMemory ? [] : ['memory'])
      const instance = new wasm.Instance(mod, { host: { exp: Math.exp, sweepDone: () => {}, classifySample: () => 0 }, ...(sharesMemory ? { env: { memory: new wasm.Memory({ initial: 1 }) } } : {}) })
      for (const name of listed) {
        const signature = KERNEL_SIGNATURES[name as keyof typeof KERNEL_SIGNATURES]
        const fn = instance.exports[name] as (...args: number[]) => unknown
        // An exported WebAssembly function's length is its parameter count.
        expect(fn.length, `${module}.${name}`).toBe(signature.params.length)
        for (const param of signature.params) expect(['i32', 'f64'], `${name}(${param})`).toContain(parseParam(param).type)
      }
    }
    // Every table entry lives in at least one module.
    for (const [name, signature] of Object.entries(KERNEL_SIGNATURES)) expect(signature.modules.length, name).toBeGreaterThan(0)
  })
})
