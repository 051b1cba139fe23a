/**
 * In-memory dispatch bookkeeping of one queued or running sweep: which chunks of its stored
 * plan wait, run or are stored, how many attempts each has had, which points still take
 * trial blocks (precision targets), and the stop flag its running chunks watch. Rebuilt after
 * a restart from the stored plan, the stored chunks and the open points.
 */
import { dispatchOrder, type Chunk, type SweepPlan } from '../../sweep/index.js'
import type { NormalisedSpec } from '../../spec/index.js'

export class ActiveSweep {
  readonly id: string
  /** The owner, or '' when tokens are off (the fair-order key). */
  readonly ownerKey: string
  readonly seq: number
  readonly spec: NormalisedSpec
  /** The stored plan, growing when an open point is given another block. */
  readonly plan: Chunk[]
  /** Shared with every thread running one of this sweep's chunks; non-zero = stop. */
  readonly stopFlag = new SharedArrayBuffer(Int32Array.BYTES_PER_ELEMENT)
  startedMs: number | null
  assembling = false
  /** Waiting chunk indices, costliest first (src/sweep/plan.ts dispatchOrder); appended blocks go last. */
  readonly #pending: number[]
  readonly #running = new Set<number>()
  readonly #done = new Set<number>()
  readonly #attempts = new Map<number, number>()
  /** Points whose trial blocks are still being decided. */
  readonly #open: Set<number>
  /** Open points with a decision asked for (and not yet applied). */
  readonly #deciding = new Set<number>()

  constructor (init: { id: string, ownerKey: string, seq: number, spec: NormalisedSpec, plan: SweepPlan, doneIndices: readonly number[], openPoints?: readonly number[], startedMs: number | null }) {
    this.id = init.id
    this.ownerKey = init.ownerKey
    this.seq = init.seq
    this.spec = init.spec
    this.plan = [...init.plan.chunks]
    this.startedMs = init.startedMs
    this.#open = new Set(init.openPoints ?? [])
    for (const index of init.doneIndices) this.#done.add(index)
    this.#pending = dispatchOrder(init.spec, this.plan).filter((index) => !this.#done.has(index))
  }

  get started (): boolean {
    return this.startedMs !== null
  }

  get hasPending (): boolean {
    return this.#pending.length > 0
  }

  get pendingCount (): number {
    return this.#pending.length
  }

  get runningCount (): number {
    return this.#running.size
  }

  /** Every chunk of the plan is stored (a comparison of sets, never of counts) and no point is open. */
  get allDone (): boolean {
    return this.#open.size === 0 && this.plan.every((chunk) => this.#done.has(chunk.index))
  }

  /**
   * One open point whose planned chunks are all stored and that waits for a decision nobody has
   * asked for yet, marked as being decided. One at a time: a point marked here must be decided
   * by the caller, or it would stay marked and the sweep would never end.
   */
  takeDuePoint (): number | undefined {
    for (const point of this.#open) {
      if (this.#deciding.has(point)) continue
      if (this.plan.every((chunk) => chunk.point !== point || this.#done.has(chunk.index))) {
        this.#deciding.add(point)
        return point
      }
    }
    return undefined
  }

  /** The decision on a point was applied (or failed and may be asked again). */
  decided (point: number, closed: boolean): void {
    this.#deciding.delete(point)
    if (closed) this.#open.delete(point)
  }

  /**
   * Chunks appended to the stored plan for an open point: they wait after everything planned
   * before, except those stored already (`stored`: trials taken from earlier sweeps).
   */
  append (chunks: readonly Chunk[], stored: readonly number[] = []): void {
    for (const chunk of chunks) {
      this.plan[chunk.index] = chunk
      if (stored.includes(chunk.index)) this.#done.add(chunk.index)
      else this.#pending.push(chunk.index)
    }
  }

  /** Takes the next waiting chunk in dispatch order and counts an attempt for it. */
  takeNext (): { chunk: Chunk, attempt: number } | undefined {
    const index = this.#pending.shift()
    if (index === undefined) return undefined
    const chunk = this.plan[index]
    if (chunk === undefined || chunk.index !== index) throw new Error(`Chunk plan of sweep ${this.id} is not indexed 0..n-1.`)
    const attempt = (this.#attempts.get(index) ?? 0) + 1
    this.#attempts.set(index, attempt)
    this.#running.add(index)
    return { chunk, attempt }
  }

  /** Marks a running chunk stored. */
  finish (index: number): void {
    this.#running.delete(index)
    this.#done.add(index)
  }

  /** Puts a running chunk back at the front of the queue (a retry). */
  requeue (index: number): void {
    this.#running.delete(index)
    this.#pending.unshift(index)
  }

  /** Forgets a running chunk that stopped on request; it will not run again. */
  drop (index: number): void {
    this.#running.delete(index)
  }

  requestStop (): void {
    Atomics.store(new Int32Array(this.stopFlag), 0, 1)
    this.#pending.length = 0
  }
}
