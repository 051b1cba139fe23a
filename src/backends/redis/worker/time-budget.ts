/**
 * The time a worker process has left, shared with its sandbox threads: a worker inside a
 * batch allocation (`maxRuntimeMs`) must take no chunk it cannot finish before its limit.
 * The process sets the instant after which no chunk may still run; a sandbox, before it runs
 * a chunk, compares the chunk's estimated CPU time (src/sweep/chunk-cost.ts) scaled by this
 * machine's measured speed against the time left, and hands the chunk back to the queue
 * unrun when it does not fit (the process then takes no more).
 *
 * A chunk thread's event loop is blocked while it computes, so the one channel both sides
 * can read at any time is shared memory (as for stop-board.ts). Layout (BigInt64 words):
 * [0] instant (epoch ms) after which no chunk may run, 0 for none; [1] µs of compute of
 * chunks run here; [2] their estimated µs.
 */

const WORDS = 3
const UNTIL = 0
const COMPUTE_US = 1
const ESTIMATE_US = 2
const MEASURED_FROM_SECONDS = 0.05

export function createTimeBudgetBuffer (): SharedArrayBuffer {
  return new SharedArrayBuffer(WORDS * BigInt64Array.BYTES_PER_ELEMENT)
}

/** The process's side: sets the limit, reads how many chunks did not fit. */
export class TimeBudgetWriter {
  readonly #words: BigInt64Array

  constructor (buffer: SharedArrayBuffer) {
    this.#words = new BigInt64Array(buffer)
  }

  /** From now on, no chunk may still run after `epochMs`. Only ever moves earlier. */
  limitTo (epochMs: number): void {
    const current = Number(Atomics.load(this.#words, UNTIL))
    if (current === 0 || epochMs < current) Atomics.store(this.#words, UNTIL, BigInt(Math.floor(epochMs)))
  }

  /** Measured compute time over estimated CPU time of the chunks run here (1 before any ran). */
  slowness (): number {
    return slownessOf(this.#words)
  }
}

/** A sandbox thread's side: does a chunk fit, and what did the last one cost. */
export class TimeBudgetReader {
  readonly #words: BigInt64Array

  constructor (buffer: SharedArrayBuffer) {
    this.#words = new BigInt64Array(buffer)
  }

  /** Whether a chunk of `estimatedSeconds` started at `nowMs` ends before the limit, at this machine's measured speed. */
  fits (estimatedSeconds: number, nowMs: number): boolean {
    const until = Number(Atomics.load(this.#words, UNTIL))
    if (until === 0) return true
    return nowMs + estimatedSeconds * 1000 * slownessOf(this.#words) <= until
  }

  /**
   * Records a chunk run here, so later estimates are scaled to this machine's speed. Chunks
   * estimated under MEASURED_FROM_SECONDS are left out: their fixed costs (a thread's first
   * kernel compilation, opening streams) dwarf the model's count and would inflate the scale.
   */
  recordRun (estimatedSeconds: number, computeMs: number): void {
    if (estimatedSeconds < MEASURED_FROM_SECONDS) return
    Atomics.add(this.#words, COMPUTE_US, BigInt(Math.round(computeMs * 1000)))
    Atomics.add(this.#words, ESTIMATE_US, BigInt(Math.max(1, Math.round(estimatedSeconds * 1e6))))
  }
}

/**
 * Summed over chunks, so many tiny chunks (whose fixed costs dwarf their estimates) weigh
 * as little as the work they hold.
 */
function slownessOf (words: BigInt64Array): number {
  const estimate = Number(Atomics.load(words, ESTIMATE_US))
  return estimate === 0 ? 1 : Number(Atomics.load(words, COMPUTE_US)) / estimate
}
