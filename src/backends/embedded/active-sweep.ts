/**
 * In-memory dispatch bookkeeping of one queued or running sweep: which chunks of its stored
 * plan wait, run or are stored, how many attempts each has had, and the stop flag its
 * running chunks watch. Rebuilt after a restart from the stored plan and the stored chunks.
 */
import { dispatchOrder, planComplete, type Chunk, type SweepPlan } from '../../sweep/index.js'
import type { NormalisedSpec } from '../../spec/index.js'

export class ActiveSweep {
  readonly id: string
  /** The owner, or '' when tokens are off (the fair-order key). */
  readonly ownerKey: string
  readonly seq: number
  readonly spec: NormalisedSpec
  readonly plan: readonly Chunk[]
  /** Shared with every thread running one of this sweep's chunks; non-zero = stop. */
  readonly stopFlag = new SharedArrayBuffer(Int32Array.BYTES_PER_ELEMENT)
  startedMs: number | null
  assembling = false
  /** Waiting chunk indices, in dispatch order (costliest first: src/sweep/plan.ts dispatchOrder). */
  readonly #pending: number[]
  /** Position of each chunk index in the dispatch order. */
  readonly #rank: Int32Array
  readonly #running = new Set<number>()
  readonly #done = new Set<number>()
  readonly #attempts = new Map<number, number>()

  constructor (init: { id: string, ownerKey: string, seq: number, spec: NormalisedSpec, plan: SweepPlan, doneIndices: readonly number[], startedMs: number | null }) {
    this.id = init.id
    this.ownerKey = init.ownerKey
    this.seq = init.seq
    this.spec = init.spec
    this.plan = init.plan.chunks
    this.startedMs = init.startedMs
    for (const index of init.doneIndices) this.#done.add(index)
    const order = dispatchOrder(init.spec, this.plan)
    this.#rank = new Int32Array(this.plan.length)
    order.forEach((index, position) => { this.#rank[index] = position })
    this.#pending = order.filter((index) => !this.#done.has(index))
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

  /** Every chunk of the plan is stored: a comparison of sets, never of counts. */
  get allDone (): boolean {
    return planComplete(this.plan, this.#done)
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

  /** Puts a running chunk back at its place in the queue (a retry). */
  requeue (index: number): void {
    this.#running.delete(index)
    let at = 0
    while (at < this.#pending.length && this.#rank[this.#pending[at] as number]! < this.#rank[index]!) at++
    this.#pending.splice(at, 0, index)
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
