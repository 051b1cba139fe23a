/**
 * Stop requests from a worker process to its sandboxed chunk threads, through shared memory.
 *
 * A chunk runs synchronously inside its thread, so the thread's event loop (and with it
 * every message, including BullMQ's AbortSignal relay) is blocked until the chunk ends.
 * Shared memory is the one channel such a thread can still read: the engine's
 * `shouldStop` callback, called between trials, looks at this board.
 *
 * Layout (Int32 words): [0] number of sweep ids ever posted, [1] hand-back flag (the
 * process is shutting down: stop every chunk and return it to the queue), then a ring of
 * SLOTS ids, each a length word followed by the id's bytes.
 */

const HEADER_WORDS = 2
const SLOTS = 64
/** Sweep ids are UUIDs (36 bytes); room for anything up to 60. */
const ID_BYTES = 60
const SLOT_WORDS = 1 + ID_BYTES / 4

export const STOP_BOARD_BYTES = (HEADER_WORDS + SLOTS * SLOT_WORDS) * 4

export function createStopBoardBuffer (): SharedArrayBuffer {
  return new SharedArrayBuffer(STOP_BOARD_BYTES)
}

/** The worker process's side: posts ids of sweeps whose chunks must stop. Single writer. */
export class StopBoardWriter {
  readonly #words: Int32Array
  readonly #bytes: Uint8Array

  constructor (buffer: SharedArrayBuffer) {
    this.#words = new Int32Array(buffer)
    this.#bytes = new Uint8Array(buffer)
  }

  postStop (sweepId: string): void {
    const encoded = Buffer.from(sweepId, 'utf8')
    if (encoded.length > ID_BYTES) throw new RangeError(`invalid argument. sweepId: longer than ${ID_BYTES} bytes. Value: ${sweepId}.`)
    const posted = Atomics.load(this.#words, 0)
    const slot = posted % SLOTS
    const base = HEADER_WORDS + slot * SLOT_WORDS
    this.#bytes.fill(0, (base + 1) * 4, (base + SLOT_WORDS) * 4)
    this.#bytes.set(encoded, (base + 1) * 4)
    Atomics.store(this.#words, base, encoded.length)
    // Publishing the new count last makes the slot's bytes visible before readers look.
    Atomics.store(this.#words, 0, posted + 1)
  }

  requestHandBack (): void {
    Atomics.store(this.#words, 1, 1)
  }
}

/** A chunk thread's side: is the sweep it is running asked to stop? */
export class StopBoardReader {
  readonly #words: Int32Array
  readonly #bytes: Uint8Array
  #seen = 0
  /** Stops posted per sweep id since this reader started (a resumed sweep may be stopped again later). */
  #posts = new Map<string, number>()

  constructor (buffer: SharedArrayBuffer) {
    this.#words = new Int32Array(buffer)
    this.#bytes = new Uint8Array(buffer)
  }

  handBackRequested (): boolean {
    return Atomics.load(this.#words, 1) !== 0
  }

  /**
   * Stops posted for this sweep so far. A chunk notes the count when it starts and stops once
   * it grows: stops posted before (for an earlier run of a sweep since resumed) do not stop it.
   * Cheap when nothing new was posted: one atomic load.
   */
  stopsPosted (sweepId: string): number {
    const posted = Atomics.load(this.#words, 0)
    if (posted !== this.#seen) this.#readNew(posted)
    return this.#posts.get(sweepId) ?? 0
  }

  #readNew (posted: number): void {
    // If more than SLOTS ids arrived since the last look, the oldest are overwritten; the
    // worker process re-posts stops for sweeps it still runs, so none is lost for long.
    const from = Math.max(this.#seen, posted - SLOTS)
    for (let n = from; n < posted; n++) {
      const base = HEADER_WORDS + (n % SLOTS) * SLOT_WORDS
      const length = Atomics.load(this.#words, base)
      const start = (base + 1) * 4
      const id = Buffer.from(this.#bytes.subarray(start, start + length)).toString('utf8')
      const count = this.#posts.get(id) ?? 0
      this.#posts.delete(id)
      this.#posts.set(id, count + 1)
    }
    this.#seen = posted
    // Bounded memory in a long-lived thread: only recent ids matter (a Map keeps insertion order).
    if (this.#posts.size > 4 * SLOTS) this.#posts = new Map([...this.#posts].slice(-2 * SLOTS))
  }
}
