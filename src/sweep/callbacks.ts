/**
 * Completion callbacks, once for both backends: a sweep submitted with a callback URL gets
 * one POST of a small JSON event per terminal state it reaches (succeeded, failed, canceled;
 * a resumed sweep that ends again gets another). The store keeps an outbox: the terminal
 * move itself arms the delivery (in the same transaction or script), and any API instance
 * may claim a due delivery, which leases it, so one instance sends it at a time. A failed
 * attempt is retried with exponential backoff; every attempt is recorded in the sweep's
 * status (`callback`). Delivery is at least once: an instance that dies mid-send leaves the
 * lease to expire and another sends again, so the event carries an id receivers can dedupe on.
 *
 * This module knows nothing of HTTP: the sender (signing, the address guard, the request)
 * is the API's, passed in.
 */
import type { SweepStatus } from './state.js'

export const CALLBACK_STATES = ['waiting', 'pending', 'delivered', 'failed'] as const
/**
 * waiting: the sweep has not ended; pending: an event is due or being retried; delivered:
 * the receiver answered 2xx; failed: every attempt failed.
 */
export type CallbackState = typeof CALLBACK_STATES[number]

/** A sweep's callback as its status shows it. */
export interface CallbackStatus {
  url: string
  state: CallbackState
  /** Attempts made for the current event. */
  attempts: number
  lastError: string | null
}

/** A due delivery, as claimed from the store's outbox. */
export interface CallbackDelivery {
  sweepId: string
  owner: string | null
  url: string
  /** Counts the sweep's terminal states: a settle for an older one changes nothing. */
  generation: number
  status: Extract<SweepStatus, 'succeeded' | 'failed' | 'canceled'>
  finishedMs: number
  /** Attempts made before this one. */
  attempts: number
}

export type CallbackSettlement =
  | { delivered: true }
  | { delivered: false, error: string, retryAtMs: number | null }

export interface CallbackRetryPolicy {
  /** Attempts in all before the delivery is given up. */
  attempts: number
  firstDelayMs: number
  maxDelayMs: number
}

/** 8 attempts over about 4 minutes: 2 s, 4 s, 8 s, … 128 s between them. */
export const DEFAULT_CALLBACK_RETRY: CallbackRetryPolicy = { attempts: 8, firstDelayMs: 2000, maxDelayMs: 5 * 60_000 }

/** The wait after the n-th failed attempt (n ≥ 1), or null when no attempt is left. */
export function callbackRetryDelayMs (policy: CallbackRetryPolicy, attemptsMade: number): number | null {
  if (attemptsMade >= policy.attempts) return null
  return Math.min(policy.maxDelayMs, policy.firstDelayMs * 2 ** (attemptsMade - 1))
}

/** The JSON event a receiver gets. Links are absolute when the API knows its public base URL, else paths. */
export interface CallbackEvent {
  /** `<sweep id>.<generation>`: the same for every retry of one event. */
  id: string
  type: 'sweep.finished'
  sweepId: string
  status: CallbackDelivery['status']
  finishedAt: string
  links: { status: string, results?: string }
}

export function callbackEvent (delivery: CallbackDelivery, base: string): CallbackEvent {
  const status = `${base}/v1/sweeps/${delivery.sweepId}`
  return {
    id: `${delivery.sweepId}.${delivery.generation}`,
    type: 'sweep.finished',
    sweepId: delivery.sweepId,
    status: delivery.status,
    finishedAt: new Date(delivery.finishedMs).toISOString(),
    links: delivery.status === 'succeeded' ? { status, results: `${status}/results` } : { status }
  }
}

/** The API's side: posts one event; resolves with an error text instead of throwing. */
export type CallbackSender = (delivery: CallbackDelivery) => Promise<{ ok: true } | { ok: false, error: string }>

/** The outbox moves of the store contract (src/sweep/store.ts). */
export interface CallbackOutbox {
  /** Due deliveries, each leased to the caller until `nowMs + leaseMs` (another caller does not get it meanwhile). */
  claimCallbacks (nowMs: number, leaseMs: number, limit: number): Promise<CallbackDelivery[]>
  /** Records an attempt's outcome; ignored when the sweep has reached a newer terminal state (or is gone). */
  settleCallback (sweepId: string, generation: number, settlement: CallbackSettlement): Promise<void>
}

export interface CallbackDispatcherOptions {
  /** @defaultValue 1000 */
  pollMs?: number
  /** Longer than a send may take (its timeout), so a lease never runs out under a live sender. @defaultValue 30000 */
  leaseMs?: number
  retry?: CallbackRetryPolicy
  onError?: (error: unknown) => void
}

/** Claims due deliveries and sends them, until stopped. One per API instance. */
export class CallbackDispatcher {
  readonly #outbox: CallbackOutbox
  readonly #send: CallbackSender
  readonly #options: Required<Omit<CallbackDispatcherOptions, 'onError'>> & Pick<CallbackDispatcherOptions, 'onError'>
  #timer: NodeJS.Timeout | null = null
  #running: Promise<void> | null = null
  #stopped = false

  constructor (outbox: CallbackOutbox, send: CallbackSender, options: CallbackDispatcherOptions = {}) {
    this.#outbox = outbox
    this.#send = send
    this.#options = { pollMs: options.pollMs ?? 1000, leaseMs: options.leaseMs ?? 30_000, retry: options.retry ?? DEFAULT_CALLBACK_RETRY, onError: options.onError }
  }

  start (): void {
    const tick = (): void => {
      if (this.#stopped) return
      this.#running = this.runOnce().then(() => {}, (error: unknown) => this.#options.onError?.(error)).finally(() => {
        this.#running = null
        if (!this.#stopped) this.#timer = setTimeout(tick, this.#options.pollMs)
      })
    }
    this.#timer = setTimeout(tick, 0)
  }

  /** Sends every delivery due now; resolves when they are settled. */
  async runOnce (nowMs = Date.now()): Promise<number> {
    const due = await this.#outbox.claimCallbacks(nowMs, this.#options.leaseMs, 20)
    await Promise.all(due.map(async (delivery) => {
      const outcome = await this.#send(delivery).catch((error: unknown) => ({ ok: false as const, error: error instanceof Error ? error.message : String(error) }))
      const settlement: CallbackSettlement = outcome.ok
        ? { delivered: true }
        : { delivered: false, error: outcome.error, retryAtMs: retryAt(this.#options.retry, delivery.attempts + 1) }
      await this.#outbox.settleCallback(delivery.sweepId, delivery.generation, settlement)
    }))
    return due.length
  }

  async stop (): Promise<void> {
    this.#stopped = true
    if (this.#timer !== null) clearTimeout(this.#timer)
    await this.#running
  }
}

function retryAt (policy: CallbackRetryPolicy, attemptsMade: number): number | null {
  const delay = callbackRetryDelayMs(policy, attemptsMade)
  return delay === null ? null : Date.now() + delay
}
