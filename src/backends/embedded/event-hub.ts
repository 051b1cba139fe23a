/**
 * Per-sweep listeners of the embedded backend (in this process). State changes go out at once; progress is coalesced to at most one
 * event per interval per sweep, always followed by a trailing event so the last value is
 * never lost. Snapshots are built only when someone listens.
 */
import type { Logger } from 'pino'
import type { SweepEvent, SweepRecord } from '../port.js'

type Listener = (event: SweepEvent) => void

export class LocalSweepEvents {
  #listeners = new Map<string, Set<Listener>>()
  #lastProgressAt = new Map<string, number>()
  #pendingProgress = new Map<string, NodeJS.Timeout>()
  readonly #intervalMs: number
  readonly #snapshot: (id: string) => SweepRecord | null
  readonly #logger: Logger | undefined

  constructor (intervalMs: number, snapshot: (id: string) => SweepRecord | null, logger?: Logger) {
    this.#intervalMs = intervalMs
    this.#snapshot = snapshot
    this.#logger = logger
  }

  subscribe (id: string, listener: Listener): () => void {
    let set = this.#listeners.get(id)
    if (set === undefined) {
      set = new Set()
      this.#listeners.set(id, set)
    }
    set.add(listener)
    return () => {
      const current = this.#listeners.get(id)
      if (current === undefined) return
      current.delete(listener)
      if (current.size === 0) {
        this.#listeners.delete(id)
        this.#cancelPending(id)
      }
    }
  }

  /** Emits a state event now, superseding any progress event still waiting. */
  state (record: SweepRecord): void {
    this.#cancelPending(record.id)
    this.#lastProgressAt.set(record.id, Date.now())
    this.#deliver(record.id, { type: 'state', sweep: record })
  }

  progress (id: string): void {
    if (!this.#listeners.has(id) || this.#pendingProgress.has(id)) return
    const wait = (this.#lastProgressAt.get(id) ?? 0) + this.#intervalMs - Date.now()
    if (wait <= 0) {
      this.#emitProgress(id)
      return
    }
    const timer = setTimeout(() => {
      this.#pendingProgress.delete(id)
      this.#emitProgress(id)
    }, wait)
    timer.unref()
    this.#pendingProgress.set(id, timer)
  }

  /** Forgets a sweep that reached a terminal state (listeners may stay until they unsubscribe). */
  settle (id: string): void {
    this.#cancelPending(id)
    this.#lastProgressAt.delete(id)
  }

  close (): void {
    for (const timer of this.#pendingProgress.values()) clearTimeout(timer)
    this.#pendingProgress.clear()
    this.#listeners.clear()
  }

  #emitProgress (id: string): void {
    const record = this.#snapshot(id)
    if (record === null) return
    this.#lastProgressAt.set(id, Date.now())
    this.#deliver(id, { type: 'progress', sweep: record })
  }

  #cancelPending (id: string): void {
    const timer = this.#pendingProgress.get(id)
    if (timer !== undefined) clearTimeout(timer)
    this.#pendingProgress.delete(id)
  }

  #deliver (id: string, event: SweepEvent): void {
    const set = this.#listeners.get(id)
    if (set === undefined) return
    for (const listener of [...set]) {
      try {
        listener(event)
      } catch (error) {
        // One broken listener (e.g. a closed SSE stream) must not starve the others.
        this.#logger?.warn({ err: error, sweepId: id }, 'sweep event listener threw')
      }
    }
  }
}
