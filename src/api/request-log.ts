/**
 * How loud fastify's per-request lines are. A lab server answers pollers and event streams
 * all day, so "incoming request" / "request completed" lines are debug by default (LOG_REQUESTS
 * puts them at info, as an access log). Anything that needs an operator stays visible:
 * errors, failed responses (5xx) and broken streams keep their levels.
 */
import Fastify, { type FastifyReply, type FastifyRequest } from 'fastify'

type RequestLevel = 'info' | 'debug'

export class RequestLogController extends Fastify.LogController {
  readonly #level: RequestLevel

  constructor (level: RequestLevel) {
    super()
    this.#level = level
  }

  override incomingRequest (request: FastifyRequest): void {
    if (this.isLogDisabled(request)) return
    request.log[this.#level]({ req: request }, 'incoming request')
  }

  override requestCompleted (error: Error | null | undefined, request: FastifyRequest, reply: FastifyReply): void {
    if (this.isLogDisabled(request)) return
    if (error !== null && error !== undefined) {
      reply.log.error({ res: reply, err: error, responseTime: reply.elapsedTime }, 'request errored')
    } else if (reply.statusCode >= 500) {
      reply.log.warn({ res: reply, responseTime: reply.elapsedTime }, 'request completed')
    } else {
      reply.log[this.#level]({ res: reply, responseTime: reply.elapsedTime }, 'request completed')
    }
  }

  override routeNotFound (request: FastifyRequest): void {
    if (this.isLogDisabled(request)) return
    request.log[this.#level]({ method: request.method, url: request.url }, 'route not found')
  }

  override streamError (error: Error & { code?: string }, request: FastifyRequest, reply: FastifyReply): void {
    if (error.code === 'ERR_STREAM_PREMATURE_CLOSE') {
      // A client that goes away mid-answer is ordinary.
      if (!this.isLogDisabled(request)) reply.log[this.#level]({ res: reply }, 'stream closed prematurely')
      return
    }
    super.streamError(error, request, reply)
  }
}
