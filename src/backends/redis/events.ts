/**
 * Sweep events across processes. Whoever changes a sweep (a worker storing progress, the
 * processor finishing it, an API instance canceling it) publishes a small hint on the
 * sweep's channel; each API instance with listeners re-reads the record and hands the
 * listeners a snapshot. Messages are hints, the record is the truth: a hint lost during a
 * reconnect is covered by a slow poll of the record while anyone listens.
 */
import type { Redis } from 'ioredis'
import type { Logger } from 'pino'
import { TERMINAL_STATUSES } from '../port.js'
import type { SweepEvent, SweepRecord } from '../port.js'
import type { KeyLayout } from './keys.js'

export type SweepEventType = SweepEvent['type']

export interface SweepEventHint {
  type: SweepEventType
}

export async function publishSweepEvent (redis: Redis, keys: KeyLayout, sweepId: string, type: SweepEventType): Promise<void> {
  await redis.publish(keys.sweep(sweepId).events, JSON.stringify({ type } satisfies SweepEventHint))
}

/** Tells every worker process to stop the running chunks of these sweeps. */
export async function publishStop (redis: Redis, keys: KeyLayout, sweepId: string): Promise<void> {
  await redis.publish(keys.stopChannel, sweepId)
}

type Listener = (event: SweepEvent) => void

interface Subscription {
  listeners: Set<Listener>
  /** The last snapshot handed out, to tell state changes from progress and to skip repeats. */
  last: SweepRecord | null
  reading: boolean
  /** A hint arrived while a read was in flight: read again afterwards. */
  stale: boolean
}

/**
 * One API instance's listeners, multiplexed over one subscriber connection: a sweep's
 * channel is subscribed while it has at least one listener.
 */
export class RedisSweepEvents {
  readonly #subscriptions = new Map<string, Subscription>()
  readonly #channelToId = new Map<string, string>()
  readonly #poll: NodeJS.Timeout
  #closed = false

  constructor (
    readonly subscriber: Redis,
    readonly keys: KeyLayout,
    readonly readRecord: (id: string) => Promise<SweepRecord | null>,
    readonly logger: Logger,
    pollMs: number
  ) {
    subscriber.on('message', (channel: string) => {
      const id = this.#channelToId.get(channel)
      if (id !== undefined) this.#refresh(id, 'compare')
    })
    this.#poll = setInterval(() => {
      for (const id of this.#subscriptions.keys()) this.#refresh(id, 'compare')
    }, pollMs)
    this.#poll.unref()
  }

  subscribe (id: string, listener: Listener): () => void {
    if (this.#closed) return () => {}
    let subscription = this.#subscriptions.get(id)
    if (subscription === undefined) {
      subscription = { listeners: new Set(), last: null, reading: false, stale: false }
      this.#subscriptions.set(id, subscription)
      const channel = this.keys.sweep(id).events
      this.#channelToId.set(channel, id)
      this.subscriber.subscribe(channel).catch((error: unknown) => {
        this.logger.warn({ err: error, sweepId: id }, 'cannot subscribe to sweep events; falling back to polling')
      })
      // The baseline every later snapshot is compared with, to tell state changes from progress.
      this.#refresh(id, 'baseline')
    }
    subscription.listeners.add(listener)
    return () => this.#unsubscribe(id, listener)
  }

  #unsubscribe (id: string, listener: Listener): void {
    const subscription = this.#subscriptions.get(id)
    if (subscription === undefined) return
    subscription.listeners.delete(listener)
    if (subscription.listeners.size > 0) return
    this.#subscriptions.delete(id)
    const channel = this.keys.sweep(id).events
    this.#channelToId.delete(channel)
    if (!this.#closed) this.subscriber.unsubscribe(channel).catch(() => {})
  }

  /**
   * Reads the record and tells listeners what changed since the last snapshot they got;
   * hints arriving while a read is in flight collapse into one more read.
   */
  #refresh (id: string, mode: 'baseline' | 'compare'): void {
    const subscription = this.#subscriptions.get(id)
    if (subscription === undefined) return
    if (subscription.reading) {
      subscription.stale = true
      return
    }
    subscription.reading = true
    this.readRecord(id).then((record) => {
      if (record === null) return
      if (mode === 'baseline') subscription.last ??= record
      else this.#deliver(subscription, record)
    }).catch((error: unknown) => {
      this.logger.warn({ err: error, sweepId: id }, 'cannot read sweep record for an event')
    }).finally(() => {
      subscription.reading = false
      if (subscription.stale) {
        subscription.stale = false
        this.#refresh(id, 'compare')
      }
    })
  }

  /** Hints only say "look again"; whether it is a state change is decided by comparing records. */
  #deliver (subscription: Subscription, record: SweepRecord): void {
    const last = subscription.last
    const stateChanged = last === null ? TERMINAL_STATUSES.has(record.status) : last.status !== record.status
    const progressChanged = last === null || JSON.stringify(last.progress) !== JSON.stringify(record.progress)
    if (!stateChanged && !progressChanged) return
    subscription.last = record
    const event: SweepEvent = stateChanged ? { type: 'state', sweep: record } : { type: 'progress', sweep: record }
    for (const listener of [...subscription.listeners]) {
      try {
        listener(event)
      } catch (error) {
        this.logger.error({ err: error, sweepId: record.id }, 'sweep event listener threw')
      }
    }
  }

  close (): void {
    this.#closed = true
    clearInterval(this.#poll)
    this.#subscriptions.clear()
    this.#channelToId.clear()
  }
}
