/**
 * In-memory bookkeeping of one queued or running sweep: which chunks wait, run or are
 * done, how many attempts each has had, and the stop flag its running chunks watch.
 * Rebuilt from storage after a restart: the plan is a pure function of the spec, and the
 * finished chunks are the stored ones.
 */
import { dispatchOrder, type Chunk, type NormalisedSpec } from '../../spec/index.js'

export class ActiveSweep {
  readonly id: string
  /** The owner, or '' when tokens are off (the fair-order key). */
  readonly ownerKey: string
  readonly seq: number
  readonly spec: NormalisedSpec
  readonly specHash: string
  readonly plan: readonly Chunk[]
  /** Shared with every thread running one of this sweep's chunks; non-zero = stop. */
  readonly stopFlag = new SharedArrayBuffer(Int32Array.BYTES_PER_ELEMENT)
  started: boolean
  startedMs: number | null
  assembling = false
  /** Waiting chunk indices, in dispatch order (costliest first: spec/chunks.ts dispatchOrder). */
  readonly #pending: number[]
  /** Position of each chunk index in the dispatch order. */
  readonly #rank: Int32Array
  readonly #running = new Map<number, number>()
  readonly #done = new Set<number>()
  readonly #attempts = new Map<number, number>()
  readonly #chunksLeftPerPoint = new Map<number, number>()

  constructor (init: {
    id: string
    ownerKey: string
    seq: number
    spec: NormalisedSpec
    specHash: string
    plan: readonly Chunk[]
    doneIndices: readonly number[]
    startedMs: number | null
  }) {
    this.id = init.id
    this.ownerKey = init.ownerKey
    this.seq = init.seq
    this.spec = init.spec
    this.specHash = init.specHash
    this.plan = init.plan
    this.started = init.startedMs !== null
    this.startedMs = init.startedMs
    for (const chunk of init.plan) {
      this.#chunksLeftPerPoint.set(chunk.point, (this.#chunksLeftPerPoint.get(chunk.point) ?? 0) + 1)
    }
    for (const index of init.doneIndices) this.#markDone(index)
    const order = dispatchOrder(init.spec, init.plan)
    this.#rank = new Int32Array(init.plan.length)
    order.forEach((index, position) => { this.#rank[index] = position })
    this.#pending = order.filter(index => !this.#done.has(index))
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

  get allDone (): boolean {
    return this.#done.size === this.plan.length
  }

  get stopRequested (): boolean {
    return Atomics.load(new Int32Array(this.stopFlag), 0) !== 0
  }

  /** Trials finished by chunks still running (not yet stored). */
  get runningTrials (): number {
    let total = 0
    for (const trials of this.#running.values()) total += trials
    return total
  }

  /** Takes the next waiting chunk in dispatch order and counts an attempt for it. */
  takeNext (): { chunk: Chunk, attempt: number } | undefined {
    const index = this.#pending.shift()
    if (index === undefined) return undefined
    const chunk = this.plan[index]
    if (chunk === undefined || chunk.index !== index) throw new Error(`Chunk plan of sweep ${this.id} is not indexed 0..n-1.`)
    const attempt = (this.#attempts.get(index) ?? 0) + 1
    this.#attempts.set(index, attempt)
    this.#running.set(index, 0)
    return { chunk, attempt }
  }

  reportTrials (index: number, trialsDone: number): void {
    if (this.#running.has(index)) this.#running.set(index, trialsDone)
  }

  /** How many grid points finishing this chunk completes (0 or 1). */
  pointsCompletedBy (index: number): number {
    if (this.#done.has(index)) return 0
    const point = this.plan[index]?.point
    return point !== undefined && this.#chunksLeftPerPoint.get(point) === 1 ? 1 : 0
  }

  /** Marks a running chunk finished. */
  finish (index: number): void {
    this.#running.delete(index)
    this.#markDone(index)
  }

  /** Puts a running chunk back at its place in the queue (a retry, or a stop during close). */
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

  #markDone (index: number): void {
    if (this.#done.has(index)) return
    this.#done.add(index)
    const point = this.plan[index]?.point
    if (point !== undefined) this.#chunksLeftPerPoint.set(point, (this.#chunksLeftPerPoint.get(point) ?? 1) - 1)
  }
}
