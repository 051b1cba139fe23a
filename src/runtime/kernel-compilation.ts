/**
 * Has V8 compile the engine's WebAssembly kernels with its optimising compiler, the whole
 * module at once, when the module is first used.
 *
 * By default V8 starts wasm functions in its baseline compiler (Liftoff) and recompiles the
 * hot ones in the background, so the first trials of every process run on code several
 * times slower than the steady state: measured on the standard workloads, about a third of
 * a short fresh-process run (bench/RESULTS.md). Optimising the ~20 KB kernel module up front
 * costs about 14 ms once per process and removes that phase. The flags are process-wide and
 * are read when a module is compiled, so this must run before the engine builds its first
 * network; every entry that runs the engine (compute threads, sandboxed processors, the
 * local CLI run, the benchmark) calls it at load. Results do not depend on it: the compiled
 * code computes the same integers either way.
 */
import { setFlagsFromString } from 'node:v8'

let applied = false

export function compileKernelsOptimised (): void {
  if (applied) return
  applied = true
  setFlagsFromString('--no-liftoff')
  setFlagsFromString('--no-wasm-lazy-compilation')
}
