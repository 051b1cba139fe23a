// The entry of a thread started from the TypeScript source (src/runtime/worker-entry.ts): loads
// the module named by the last argument of the thread's argv through tsx's scoped API, which
// also serves that module's later dynamic imports, and hands on its default export. Compiled
// builds (dist/) start threads from their JavaScript modules and never reach this file.
import { tsImport } from 'tsx/esm/api'

const source = process.argv.at(-1)
if (source === undefined || !source.startsWith('file:')) throw new Error(`thread-from-source.mjs: no module to load (argv ends with ${String(source)})`)
const loaded = await tsImport(source, import.meta.url)

export default loaded.default
