/**
 * Bearer-token authentication (@fastify/bearer-auth, RFC 6750 header parsing) that puts the
 * caller's `Principal` on every request. Without a token table every caller is the single,
 * unnamed owner with full rights. Routes marked `config: { public: true }` (health and
 * readiness) never need a token.
 * @see https://github.com/fastify/fastify-bearer-auth
 */
import fastifyBearerAuth from '@fastify/bearer-auth'
import fastifyRateLimit from '@fastify/rate-limit'
import type { FastifyInstance, FastifyRequest } from 'fastify'
import fp from 'fastify-plugin'
import type { Redis } from 'ioredis'
import { ServiceError } from '../../errors.js'
import { loadTokens, type Principal, type Role, type TokenTable } from '../tokens.js'

declare module 'fastify' {
  interface FastifyRequest {
    principal: Principal
  }
  interface FastifyContextConfig {
    /** Reachable without a token even when tokens are configured. */
    public?: boolean
  }
}

const SINGLE_USER: Principal = Object.freeze({ owner: null, role: 'admin' })
const ANONYMOUS: Principal = Object.freeze({ owner: null, role: 'read' })

export interface AuthOptions {
  /** A loaded token table (tests); when undefined, `tokensFile` is read. */
  tokens?: TokenTable | null | undefined
  tokensFile: string | null
  /** Failed authentications per client address and window before 429. */
  failureLimit: { max: number, windowSeconds: number }
  /** Where API instances share the failure counts (keys `<nameSpace><address>`); without it each counts on its own. */
  failureStore?: { redis: Redis, nameSpace: string }
}

async function auth (app: FastifyInstance, options: AuthOptions): Promise<void> {
  const tokens = options.tokens !== undefined
    ? options.tokens
    : options.tokensFile === null ? null : await loadTokens(options.tokensFile)
  app.decorateRequest('principal', null as unknown as Principal)
  if (tokens === null) {
    app.addHook('onRequest', async (request) => { request.principal = SINGLE_USER })
    return
  }
  await app.register(fastifyBearerAuth, {
    keys: [],
    addHook: false,
    verifyErrorLogLevel: 'info',
    auth (key: string, request: FastifyRequest): boolean {
      const principal = tokens.lookup(key)
      if (principal === null) return false
      request.principal = principal
      return true
    }
  })
  const verify = app.verifyBearerAuth
  if (verify === undefined) throw new Error('@fastify/bearer-auth did not decorate verifyBearerAuth')
  // Only failures are counted, and only after the token was checked: a valid token always
  // passes, so colleagues behind one address are never locked out by someone's broken script.
  // The counter is a rate limiter of its own, in a scope of its own, applied to no route: the
  // hook below counts a request only when its authentication has failed.
  const { max, windowSeconds } = options.failureLimit
  let countFailure: ((request: FastifyRequest) => Promise<{ isAllowed: boolean, isExceeded?: boolean, ttlInSeconds?: number }>) | null = null
  await app.register(async (scope) => {
    await scope.register(fastifyRateLimit, {
      global: false,
      max,
      timeWindow: windowSeconds * 1000,
      keyGenerator: (request) => request.ip,
      ...(options.failureStore === undefined ? {} : { redis: options.failureStore.redis, nameSpace: options.failureStore.nameSpace, skipOnError: true })
    })
    countFailure = scope.createRateLimit()
  })
  app.addHook('onRequest', async (request, reply) => {
    request.principal = ANONYMOUS
    if (request.routeOptions.config.public === true) return
    const error = await new Promise<Error | undefined>((resolve) => { verify(request, reply, resolve) })
    if (error === undefined) return
    const counted = countFailure === null ? { isAllowed: true } : await countFailure(request)
    if (!counted.isAllowed && counted.isExceeded === true) {
      const retryAfter = Math.max(1, counted.ttlInSeconds ?? windowSeconds)
      throw new ServiceError('MEMSWEEP_TOO_MANY_AUTH_FAILURES', { max, window: `${windowSeconds} s`, retryAfter }, {
        headers: { 'retry-after': String(retryAfter) },
        extensions: { retryAfter }
      })
    }
    throw new ServiceError('MEMSWEEP_UNAUTHENTICATED', {
      reason: request.headers.authorization === undefined ? 'no Authorization header' : 'the token is not known'
    }, { headers: { 'www-authenticate': 'Bearer realm="memsweep"' } })
  })
}

export const authPlugin = fp(auth, { name: 'memsweep-auth', fastify: '5.x' })

/** Actions a role may take, checked by the routes that change state. */
const ALLOWED: Record<Role, ReadonlySet<'submit' | 'cancel'>> = {
  submit: new Set(['submit', 'cancel']),
  read: new Set(),
  admin: new Set(['submit', 'cancel'])
}

export function requireAction (principal: Principal, action: 'submit' | 'cancel'): void {
  if (!ALLOWED[principal.role].has(action)) {
    throw new ServiceError('MEMSWEEP_FORBIDDEN', { owner: principal.owner ?? 'anonymous', role: principal.role, action: `${action} sweeps` })
  }
}

/** Refuses (403) what only the admin may do: `action` completes "may not …". */
export function requireAdmin (principal: Principal, action: string): void {
  if (principal.role !== 'admin') {
    throw new ServiceError('MEMSWEEP_FORBIDDEN', { owner: principal.owner ?? 'anonymous', role: principal.role, action })
  }
}

/** Whether the caller may see a sweep: its owner, or an admin. Others get 404, never 403, so ids leak nothing. */
export function canSee (principal: Principal, sweepOwner: string | null): boolean {
  return principal.role === 'admin' || principal.owner === sweepOwner
}
