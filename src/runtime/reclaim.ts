/**
 * The explicit garbage collector for compute threads, handed to the engine as
 * `ChunkRunHooks.reclaim`. A network no longer in use (the previous one of a point, the
 * last one of the previous chunk or search step) is freed only when V8 next collects; with
 * networks of hundreds of MB that leaves two or three of them resident at once, and a
 * point's peak far above the estimate the validator checks against the memory limit
 * (bench/RESULTS.md, memory section). Collecting before a large build keeps the peak at one
 * network. V8 exposes `gc` only under --expose-gc; setting the flag at run time and reading
 * `gc` from a fresh context obtains it without a command-line flag (contexts created after
 * the flag is set get the global).
 */
import { setFlagsFromString } from 'node:v8'
import { runInNewContext } from 'node:vm'

let collector: (() => void) | null | undefined

/** A function that runs a full collection, or undefined where V8 will not expose one. */
export function explicitCollector (): (() => void) | undefined {
  if (collector === undefined) {
    setFlagsFromString('--expose-gc')
    const gc: unknown = runInNewContext('gc')
    collector = typeof gc === 'function' ? () => { (gc as () => void)() } : null
  }
  return collector ?? undefined
}
