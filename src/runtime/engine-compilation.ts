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
 */
import { setFlagsFromString } from 'node:v8'

let applied = false

export function compileEngineEagerly (): void {
  if (applied) return
  applied = true
  setFlagsFromString('--no-liftoff')
  setFlagsFromString('--no-wasm-lazy-compilation')
  setFlagsFromString('--always-sparkplug')
}
