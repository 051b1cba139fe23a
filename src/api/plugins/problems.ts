/**
 * One error handler and one not-found handler for the whole app, so that every error status
 * (400 … 5xx, including fastify's own body-parser, validation and 404 answers) comes back as
 * an RFC 9457 problem document. 5xx answers never carry the underlying message.
 */
import type { FastifyInstance } from 'fastify'
import fp from 'fastify-plugin'
import { ServiceError } from '../../errors.js'
import { sendProblem, toServiceError } from '../problem-reply.js'

export interface ProblemsOptions {
  bodyLimit: number
  /** Level of the line about a 4xx answer: the client's mistake, not the server's (see request-log.ts). */
  clientErrorLevel: 'info' | 'debug'
}

async function problems (app: FastifyInstance, options: ProblemsOptions): Promise<void> {
  app.setErrorHandler((error, request, reply) => {
    const problem = toServiceError(error, request, { bodyLimit: options.bodyLimit })
    if (problem.status >= 500) {
      request.log.error({ err: error, method: request.method, url: request.url }, 'request failed')
    } else {
      request.log[options.clientErrorLevel]({ code: problem.code, status: problem.status }, problem.message)
    }
    return sendProblem(reply, problem)
  })

  app.setNotFoundHandler((request, reply) => {
    return sendProblem(reply, new ServiceError('MEMSWEEP_ROUTE_NOT_FOUND', { method: request.method, path: request.url.split('?')[0] ?? '' }))
  })
}

export const problemsPlugin = fp(problems, { name: 'memsweep-problems', fastify: '5.x' })
