/**
 * Has V8 compile the engine eagerly, in the two ways that matter to a fresh process: the
 * WebAssembly kernels with its optimising compiler, the whole module at once, when the module
 * is first used; and every JavaScript function with its baseline compiler (Sparkplug) the
 * first time it runs, instead of interpreting it until it has run often enough.
 *
 * Kernels: by default V8 starts wasm functions in its baseline compiler (Liftoff) and
 * recompiles the hot ones in the background, so the first trials of every process run on code
 * several times slower than the steady state: measured on the standard workloads, about a
 * third of a short fresh-process run (bench/RESULTS.md). Optimising the ~20 KB kernel module up
 * front costs about 14 ms once per process and removes that phase.
 *
 * JavaScript: a trial's own JavaScript (cue, measures, the record) runs a few dozen
 * microseconds, and in a fresh process the interpreter runs it several times slower until V8
 * tiers it up. Baseline code from the first call took the W4 workload from a median of 9.0 ms
 * to 8.2 ms and G1 from 27 to 23 ms (fresh processes, nine interleaved runs each, C peers
 * 7.9 and 19.8 ms in the same runs); baseline code is compiled straight from the bytecode
 * without optimisation, in microseconds a function.
 *
 * The flags are process-wide and are read when a function or module is compiled, so this must
 * run before the engine runs its first trial; every entry that runs the engine (compute
 * threads, sandboxed processors, the local CLI run, the benchmark) calls it at load. Results
 * do not depend on it: every tier computes the same values.
 *
 * Loading: V8 still compiles each JavaScript function only on its first call, so the first
 * trial of a process pays for compiling every function a trial reaches (about 1.1 ms of the
 * W4 workload's first trial, measured against 0.3 ms with the engine compiled at load).
 * `loadWithEngineCompiled` loads the engine's modules with lazy compilation off, so that work
 * moves into loading, as a compiled library's does. It applies to modules loaded for the first
 * time, so an entry calls it before anything imports the engine: the compute-thread and
 * sandbox entries (embedded/chunk-worker.ts, redis/worker/sandbox.ts) are thin modules that
 * load the engine this way and then the code that runs chunks. Cost, measured: loading takes
 * the same ~190 ms, the heap holds about 0.5 MiB more bytecode (V8 flushes what stays
 * unused), and a fresh W4 run peaks 4 MiB higher. The CLI's one-thread run keeps lazy
 * compilation: one process runs the whole sweep, and a millisecond is nothing beside it.
 */
import { setFlagsFromString } from 'node:v8'
import { explicitCollector } from './reclaim.js'

let applied = false
let engineLoaded = false

export function compileEngineEagerly (): void {
  if (applied) return
  applied = true
  setFlagsFromString('--no-liftoff')
  setFlagsFromString('--no-wasm-lazy-compilation')
  setFlagsFromString('--always-sparkplug')
}

/**
 * Loads a thread's or process's code with the engine compiled as it loads (see above): the
 * engine's modules with lazy compilation off, then `load` (the code that imports the engine:
 * it finds the engine's modules loaded), then a full collection of the garbage loading left.
 * Without that collection, V8 starts collecting the ~10 MB that loading leaves while the first
 * trials run, and with the service's single-threaded collector (runtime/node-flags.ts) that
 * work runs between them: about 1 ms of the W4 workload and 2 ms of G1 in a fresh process.
 * Call it before any static import of the engine.
 */
export async function loadWithEngineCompiled<T> (load: () => Promise<T>): Promise<T> {
  compileEngineEagerly()
  if (!engineLoaded) {
    engineLoaded = true
    setFlagsFromString('--no-lazy')
    try {
      await import('../engine/index.js')
    } finally {
      setFlagsFromString('--lazy')
    }
  }
  const loaded = await load()
  explicitCollector()?.()
  return loaded
}
