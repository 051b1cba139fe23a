// The sandbox entry when memsweep runs from its TypeScript source (tests, `npm run worker`
// without a build). Node 20 worker threads ignore a `--import tsx` in their execArgv for
// modules imported later, so the processor is loaded through tsx's scoped API instead.
// Compiled builds (dist/) load sandbox.js directly and never reach this file.
import { tsImport } from 'tsx/esm/api'

const sandbox = await tsImport('./sandbox.ts', import.meta.url)

export default sandbox.default
