/**
 * Sends a completion callback (src/sweep/callbacks.ts gives the when and how often): the
 * event as JSON, signed with the owner's secret, posted with a timeout to the address the
 * guard allowed, redirects not followed. Answers 2xx count as delivered.
 */
import { request as httpRequest } from 'node:http'
import { request as httpsRequest } from 'node:https'
import { isIP } from 'node:net'
import { callbackEvent, type CallbackDelivery, type CallbackSender } from '../../sweep/index.js'
import { guardedLookup, refusedAddress, type CallbackTargetPolicy } from './address-guard.js'
import { SIGNATURE_HEADER, signCallback } from './signature.js'

export interface CallbackSenderOptions {
  policy: CallbackTargetPolicy
  /** The owner's signing secret; null when none is configured (the event is not sent). */
  secretFor: (owner: string | null) => string | null
  /** Absolute base of the links in the event (PUBLIC_URL), or '' for paths. */
  baseUrl: string
  /** @defaultValue 10000 */
  timeoutMs?: number
  userAgent: string
}

export function createCallbackSender (options: CallbackSenderOptions): CallbackSender {
  const lookup = guardedLookup(options.policy)
  return async (delivery: CallbackDelivery) => {
    const secret = options.secretFor(delivery.owner)
    if (secret === null) return { ok: false, error: 'no callback secret is configured for this owner' }
    const url = new URL(delivery.url)
    const host = url.hostname.startsWith('[') ? url.hostname.slice(1, -1) : url.hostname
    // An address in the URL is connected to without a lookup: judge it here.
    const refused = isIP(host) !== 0 && !options.policy.hosts.has(host) ? refusedAddress(host, options.policy) : null
    if (refused !== null) return { ok: false, error: `refused: ${refused}` }
    const body = JSON.stringify(callbackEvent(delivery, options.baseUrl))
    const headers = {
      'content-type': 'application/json',
      'content-length': String(Buffer.byteLength(body)),
      'user-agent': options.userAgent,
      'memsweep-event-id': `${delivery.sweepId}.${delivery.generation}`,
      [SIGNATURE_HEADER]: signCallback(secret, body, Math.floor(Date.now() / 1000))
    }
    const send = url.protocol === 'https:' ? httpsRequest : httpRequest
    return await new Promise((resolve) => {
      const req = send(url, { method: 'POST', headers, lookup, timeout: options.timeoutMs ?? 10_000 }, (response) => {
        response.resume()
        const status = response.statusCode ?? 0
        resolve(status >= 200 && status < 300 ? { ok: true } : { ok: false, error: `the receiver answered ${status}` })
      })
      req.on('timeout', () => req.destroy(new Error(`no answer within ${options.timeoutMs ?? 10_000} ms`)))
      req.on('error', (error) => resolve({ ok: false, error: error.message.slice(0, 300) }))
      req.end(body)
    })
  }
}
