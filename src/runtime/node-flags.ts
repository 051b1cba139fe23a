/**
 * Node flags every memsweep process that runs the engine is started with: the npm scripts,
 * the `memsweep` command's shebang, the Dockerfile and docker-compose commands, and the
 * benchmark's engine and worker processes (so it measures the engine as it is deployed).
 *
 * --single-threaded-gc: V8 collects each isolate's garbage on that isolate's own thread
 * instead of handing marking and sweeping to a pool of helper threads. Compute threads keep
 * every core busy, so on a loaded machine the helpers only take time from another thread's
 * chunk. Measured on the W2 capacity curve (new networks every trial, so frequent
 * collections) on the two-core development machine: one process alone ~10 % faster, two at
 * once ~1.85× the throughput of one instead of ~1.55×. V8 cannot switch collectors in a
 * running isolate (changing these flags at run time aborts the process), hence the command
 * line; a process started without them still runs correctly and says so in its log.
 */
export const ENGINE_PROCESS_FLAGS: readonly string[] = ['--single-threaded-gc']

/** The recommended flags this process was not started with (empty when all are present). */
export function missingEngineFlags (): string[] {
  return ENGINE_PROCESS_FLAGS.filter((flag) => !process.execArgv.includes(flag))
}

/**
 * This process's execArgv without the engine flags, for worker threads: V8 flags are
 * process-wide (the threads already run with them) and Node refuses them in a thread's
 * execArgv, which is what a thread inherits by default.
 */
export function threadExecArgv (): string[] {
  return process.execArgv.filter((arg) => !ENGINE_PROCESS_FLAGS.includes(arg))
}
