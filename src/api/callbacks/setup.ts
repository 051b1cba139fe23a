/**
 * Completion callbacks in the API: who may name which target (the address guard and the
 * owners' signing secrets, checked at submission), and the sender this instance starts on
 * the queue's outbox once the app is ready.
 */
import type { FastifyInstance } from 'fastify'
import type { SweepQueue } from '../../backends/port.js'
import type { Config } from '../../config.js'
import { ServiceError } from '../../errors.js'
import { fieldIssue, listedIssues } from '../problem-reply.js'
import { loadTokens, type TokenTable } from '../tokens.js'
import { checkCallbackTarget, parseAllowedTargets, type CallbackTargetPolicy } from './address-guard.js'
import { createCallbackSender } from './sender.js'

export interface CallbackTargets {
  policy: CallbackTargetPolicy
  secretFor: (owner: string | null) => string | null
  /**
   * The URL to store for a submission, or a 422 problem naming `querystring.callbackUrl`:
   * refused target, or no secret to sign with.
   */
  accept: (url: string, owner: string | null) => Promise<string>
}

/** @throws {RangeError} for a CALLBACK_ALLOWED_HOSTS entry that is no host, address or network. */
export function setUpCallbacks (app: FastifyInstance, config: Config, queue: SweepQueue, tokens: TokenTable | null | undefined): CallbackTargets {
  const policy = parseAllowedTargets(config.callbacks.allowedTargets)
  let table: TokenTable | null = tokens ?? null
  const secretFor = (owner: string | null): string | null => owner === null ? config.callbacks.anonymousSecret : table?.callbackSecret(owner) ?? null
  const refuse = (reason: string): never => {
    throw new ServiceError('MEMSWEEP_CALLBACK_REFUSED', { reason }, {
      extensions: listedIssues([{ ...fieldIssue(['callbackUrl'], reason), path: 'querystring.callbackUrl' }])
    })
  }
  app.addHook('onReady', async () => {
    if (tokens === undefined && config.tokensFile !== null) table = await loadTokens(config.tokensFile)
    queue.startCallbacks(createCallbackSender({ policy, secretFor, baseUrl: config.publicUrl ?? '', userAgent: 'memsweep-callbacks' }), {
      pollMs: Math.min(1000, config.callbacks.firstRetryDelayMs),
      retry: { attempts: config.callbacks.attempts, firstDelayMs: config.callbacks.firstRetryDelayMs, maxDelayMs: 5 * 60_000 },
      onError: (err) => app.log.warn({ err }, 'cannot send completion callbacks')
    })
  })
  return {
    policy,
    secretFor,
    accept: async (url, owner) => {
      if (secretFor(owner) === null) {
        refuse(owner === null
          ? 'this server has no callback signing secret (the operator sets CALLBACK_SECRET)'
          : `no callback signing secret is configured for '${owner}' (the operator adds a line ${owner}:<secret>:callback-secret to the tokens file)`)
      }
      const checked = await checkCallbackTarget(url, policy)
      if (!checked.ok) refuse(checked.reason)
      return url
    }
  }
}
