/**
 * The HTTP API as a fastify instance that never listens: server.ts listens, tests inject.
 * Everything it needs arrives as arguments; the queue port is its only way to a backend.
 */
import { randomUUID } from 'node:crypto'
import fastifyRateLimit from '@fastify/rate-limit'
import fastifySwagger from '@fastify/swagger'
import Fastify, { type FastifyInstance, type FastifyServerOptions } from 'fastify'
import { jsonSchemaTransform, serializerCompiler, validatorCompiler, type ZodTypeProvider } from 'fastify-type-provider-zod'
import type { Redis } from 'ioredis'
import type { Logger } from 'pino'
import { SWEEP_ID_MAX_LENGTH, type SweepQueue } from '../backends/port.js'
import type { Config } from '../config.js'
import { ServiceError } from '../errors.js'
import { DEFAULT_LIMITS, type WorkLimits } from '../spec/index.js'
import { EventStreamRegistry } from './event-stream.js'
import { RenderPool } from './render/render-pool.js'
import { authPlugin } from './plugins/auth.js'
import { metricsPlugin } from './plugins/metrics.js'
import { problemsPlugin } from './plugins/problems.js'
import { frameworkProblem, sendProblem } from './problem-reply.js'
import { RequestLogController } from './request-log.js'
import type { RouteContext } from './routes/context.js'
import { bundleRoutes } from './routes/bundle.js'
import { eventRoutes } from './routes/events.js'
import { figureRoutes } from './routes/figure.js'
import { healthRoutes } from './routes/health.js'
import { resultRoutes } from './routes/results.js'
import { sweepRoutes } from './routes/sweeps.js'
import { theoryRoutes } from './routes/theory.js'
import { DEFAULT_WEB_ROOT, webRoutes } from './routes/web.js'
import { docsRoutes } from './routes/docs.js'
import type { TokenTable } from './tokens.js'
import { setUpCallbacks } from './callbacks/setup.js'
import { API_DOCUMENT_INFO } from './openapi-info.js'
import { transformDocument } from './openapi-document.js'

export interface AppDependencies {
  config: Config
  queue: SweepQueue
  logger: Logger
  /** Already loaded tokens; by default they are read from config.tokensFile when the app starts. */
  tokens?: TokenTable | null
  /**
   * A Redis connection for rate-limit counters shared by every API instance (keys under
   * `<REDIS_PREFIX>:rate:` and, for failed authentications, `<REDIS_PREFIX>:auth-failures:`);
   * without it each instance counts on its own.
   */
  rateLimitRedis?: Redis
  /** Folder of the built web page (default dist/web); null leaves the page out. */
  webRoot?: string | null
}

/** A client-supplied X-Request-Id is kept when it is short and plain, so logs can be joined across services. */
const REQUEST_ID = /^[A-Za-z0-9._:-]{1,128}$/

export function buildApp (deps: AppDependencies): FastifyInstance {
  const { config, queue, logger } = deps
  const requestLogLevel = config.logRequests ? 'info' : 'debug'
  const options: FastifyServerOptions = {
    loggerInstance: logger,
    logController: new RequestLogController(requestLogLevel),
    bodyLimit: config.bodyLimit,
    trustProxy: config.trustProxy,
    genReqId: (req) => {
      const offered = req.headers['x-request-id']
      return typeof offered === 'string' && REQUEST_ID.test(offered) ? offered : randomUUID()
    },
    // Fastify's own closing answer is not a problem document; the hook below sends one instead.
    return503OnClosing: false,
    // Every path parameter is a sweep id: a longer one is refused by the router itself, and
    // answered (like a bad percent-encoding) with the problem a malformed id gets.
    routerOptions: { maxParamLength: SWEEP_ID_MAX_LENGTH },
    frameworkErrors: (error, request, reply) => {
      const problem = frameworkProblem(error, request)
      if (problem.status >= 500) request.log.error({ err: error, url: request.url }, 'request failed before routing')
      else request.log.info({ code: problem.code, status: problem.status, reason: error.code }, problem.message)
      sendProblem(reply, problem)
    },
    // Keep-alive sockets would otherwise hold close() until their idle timeout.
    forceCloseConnections: 'idle'
  }
  const app = Fastify(options).withTypeProvider<ZodTypeProvider>()
  app.setValidatorCompiler(validatorCompiler)
  app.setSerializerCompiler(serializerCompiler)
  // Only JSON bodies are accepted; fastify's built-in text/plain parser would let text through to a 422.
  app.removeContentTypeParser('text/plain')

  const limits: Required<WorkLimits> = { ...DEFAULT_LIMITS, ...config.limits }
  const streams = new EventStreamRegistry()
  const render = new RenderPool()
  const context: RouteContext = {
    queue,
    limits,
    maxActiveSweepsPerOwner: config.maxActiveSweepsPerOwner,
    heartbeatMs: config.sseHeartbeatSeconds * 1000,
    streams,
    render,
    callbacks: setUpCallbacks(app as unknown as FastifyInstance, config, queue, deps.tokens)
  }

  let shuttingDown = false
  app.addHook('onRequest', async (request, reply) => {
    reply.header('x-request-id', request.id)
    if (shuttingDown) {
      reply.header('connection', 'close')
      throw new ServiceError('MEMSWEEP_NOT_READY', { reason: 'the server is shutting down' }, { headers: { 'retry-after': '5' } })
    }
  })
  // Open event streams would keep the server from closing: end them first.
  app.addHook('onClose', async () => { await render.close() })
  app.addHook('preClose', async () => {
    shuttingDown = true
    streams.endAll()
  })

  app.register(problemsPlugin, { bodyLimit: config.bodyLimit, clientErrorLevel: requestLogLevel })
  app.register(metricsPlugin, { queue })
  // Before the rate limiter: its own failed-authentication counter is a second limiter in a
  // scope of its own, which must not find the first one's decorators.
  app.register(authPlugin, {
    tokens: deps.tokens,
    tokensFile: config.tokensFile,
    failureLimit: config.authFailureLimit,
    ...(deps.rateLimitRedis === undefined ? {} : { failureStore: { redis: deps.rateLimitRedis, nameSpace: `${config.redisPrefix}:auth-failures:` } })
  })
  app.register(fastifyRateLimit, {
    max: config.rateLimit.max,
    timeWindow: config.rateLimit.windowSeconds * 1000,
    // After authentication, so a lab's users behind one NAT address do not share a budget.
    hook: 'preParsing',
    ...(deps.rateLimitRedis === undefined
      ? {}
      // A Redis hiccup must not take the API down: requests pass uncounted until it is back.
      : { redis: deps.rateLimitRedis, nameSpace: `${config.redisPrefix}:rate:`, skipOnError: true }),
    keyGenerator: (request) => request.principal?.owner !== null && request.principal?.owner !== undefined
      ? `owner:${request.principal.owner}`
      : `ip:${request.ip}`,
    errorResponseBuilder: (_request, context) => new ServiceError('MEMSWEEP_RATE_LIMITED', {
      max: context.max,
      window: `${config.rateLimit.windowSeconds} s`,
      retryAfter: Math.ceil(context.ttl / 1000)
    }, { extensions: { retryAfter: Math.ceil(context.ttl / 1000) } })
  })
  app.register(fastifySwagger, {
    openapi: {
      openapi: '3.1.0',
      ...API_DOCUMENT_INFO
    },
    transform: jsonSchemaTransform,
    transformObject: transformDocument
  })
  app.register(healthRoutes, { queue })
  app.register(sweepRoutes, context)
  app.register(resultRoutes, context)
  app.register(eventRoutes, context)
  app.register(theoryRoutes, context)
  app.register(webRoutes, { root: deps.webRoot === undefined ? DEFAULT_WEB_ROOT : deps.webRoot })
  app.register(docsRoutes)
  app.register(figureRoutes, context)
  app.register(bundleRoutes, context)
  return app as unknown as FastifyInstance
}
