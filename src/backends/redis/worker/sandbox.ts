/**
 * The module BullMQ's sandbox threads load. It loads the engine compiled
 * (runtime/engine-compilation.ts) before anything else imports it, then the processor, whose
 * default export is this module's.
 */
import { loadWithEngineCompiled } from '../../../runtime/engine-compilation.js'

const { default: processSweepJob } = await loadWithEngineCompiled(async () => await import('./processor.js'))

export default processSweepJob
