/**
 * The module a compute thread loads. It loads the engine compiled (engine-compilation.ts)
 * before anything else imports it, then the task handler, whose default export is this
 * module's.
 */
import { loadWithEngineCompiled } from '../../runtime/engine-compilation.js'

const { default: handleChunkTask } = await loadWithEngineCompiled(async () => await import('./chunk-handler.js'))

export default handleChunkTask
