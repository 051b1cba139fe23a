/**
 * Turning any error into an RFC 9457 problem document. Every error status the API sends
 * goes through `sendProblem`, so the body shape, media type and headers never vary.
 */
import type { FastifyError, FastifyReply, FastifyRequest } from 'fastify'
import { hasZodFastifySchemaValidationErrors } from 'fastify-type-provider-zod'
import { ERRORS, ServiceError, problemType, type ErrorCode } from '../errors.js'
import { IdempotencyConflictError, StorageUnavailableError } from '../backends/port.js'
import { SpecValidationError, WorkLimitError } from '../spec/errors.js'
import { MAX_ISSUE_TEXT, MAX_LISTED_ISSUES, PROBLEM_MEDIA_TYPE, type FieldIssue, type Problem } from './schemas/problem.js'
import { SWEEP_ID_RULE } from './schemas/sweep.js'

/**
 * Issue lists are capped (MAX_LISTED_ISSUES, with errorsOmitted counting the rest) and each
 * issue's texts are cut at MAX_ISSUE_TEXT, so an error answer's size never grows with the
 * request's (an unknown key of 100 kB is not repeated back twice).
 */
function clip (text: string): string {
  return text.length <= MAX_ISSUE_TEXT ? text : `${text.slice(0, MAX_ISSUE_TEXT - 1)}…`
}

/** Renders a location as both a dotted path (`grid.values[2]`) and a JSON Pointer (`/grid/values/2`). */
export function fieldIssue (segments: ReadonlyArray<string | number>, message: string): FieldIssue {
  let path = ''
  for (const segment of segments) {
    if (typeof segment === 'number' || /^\d+$/.test(segment)) path += `[${segment}]`
    else path += path === '' ? segment : `.${segment}`
  }
  const pointer = segments.map((s) => `/${String(s).replaceAll('~', '~0').replaceAll('/', '~1')}`).join('')
  return { path: clip(path), pointer: clip(pointer), message: clip(message) }
}

/** The `errors` and `errorsOmitted` members of a validation problem: the first issues, and how many more were found. */
export function listedIssues (issues: readonly FieldIssue[], alreadyOmitted = 0): { errors: FieldIssue[], errorsOmitted: number } {
  const errors = issues.slice(0, MAX_LISTED_ISSUES)
  return { errors, errorsOmitted: alreadyOmitted + issues.length - errors.length }
}

function specInvalid (issues: readonly FieldIssue[], omitted: number): ServiceError {
  const listed = listedIssues(issues, omitted)
  return new ServiceError('MEMSWEEP_SPEC_INVALID', { count: issues.length + omitted }, { extensions: listed })
}

/** Splits a JSON Pointer (as fastify reports `instancePath`) into its segments. */
export function pointerSegments (pointer: string): string[] {
  if (pointer === '' || pointer === '/') return []
  return pointer.replace(/^\//, '').split('/').map((s) => s.replaceAll('~1', '/').replaceAll('~0', '~'))
}

/** Routes whose body is a sweep spec: their body problems are spec problems (422), not malformed requests (400). */
const SPEC_BODY_ROUTES = new Set(['/v1/sweeps', '/v1/sweeps/validate', '/v1/theory'])

/** Fastify's own 4xx codes mapped to ours; anything else in 4xx is a malformed request. */
const STATUS_TO_CODE: Record<number, ErrorCode> = {
  401: 'MEMSWEEP_UNAUTHENTICATED',
  404: 'MEMSWEEP_ROUTE_NOT_FOUND',
  406: 'MEMSWEEP_NOT_ACCEPTABLE',
  413: 'MEMSWEEP_BODY_TOO_LARGE',
  415: 'MEMSWEEP_UNSUPPORTED_MEDIA_TYPE',
  503: 'MEMSWEEP_NOT_READY'
}

export interface ErrorContext {
  bodyLimit: number
}

/** Classifies an error thrown anywhere in request handling. Unknown errors become MEMSWEEP_INTERNAL. */
export function toServiceError (error: unknown, request: FastifyRequest, context: ErrorContext): ServiceError {
  if (error instanceof ServiceError) return error
  if (error instanceof SpecValidationError) {
    const issues = error.issues.slice(0, MAX_LISTED_ISSUES).map((issue) => fieldIssue(issue.path === '' ? [] : issue.path.split('.'), issue.message))
    return specInvalid(issues, error.omitted + Math.max(0, error.issues.length - MAX_LISTED_ISSUES))
  }
  if (error instanceof WorkLimitError) {
    return new ServiceError('MEMSWEEP_WORK_LIMIT_EXCEEDED', { limit: error.limit, value: error.value, max: error.max }, {
      extensions: { limit: { name: error.limit, value: error.value, max: error.max } }
    })
  }
  // Each backend issues its own opaque cursors; any of them names its rejection this way.
  if (error instanceof Error && error.name === 'InvalidCursorError') {
    return new ServiceError('MEMSWEEP_MALFORMED_REQUEST', { reason: 'the cursor was not issued by this service' }, {
      extensions: listedIssues([{ ...fieldIssue(['cursor'], 'not a cursor issued by this service'), path: 'querystring.cursor' }])
    })
  }
  if (error instanceof IdempotencyConflictError) {
    return new ServiceError('MEMSWEEP_IDEMPOTENCY_KEY_REUSED', { key: error.key })
  }
  if (error instanceof StorageUnavailableError) {
    return new ServiceError('MEMSWEEP_NOT_READY', { reason: 'its storage is unavailable; the operators have been told, and the service log names the cause' }, { headers: { 'retry-after': '60' } })
  }

  if (hasZodFastifySchemaValidationErrors(error)) {
    const shown = error.validation.slice(0, MAX_LISTED_ISSUES)
    const omitted = error.validation.length - shown.length
    const issues = shown.map((v) => fieldIssue(pointerSegments(v.instancePath), v.message ?? 'is invalid'))
    const where = (error as { validationContext?: string }).validationContext ?? 'request'
    if (where === 'body' && SPEC_BODY_ROUTES.has(request.routeOptions.url ?? '')) return specInvalid(issues, omitted)
    return malformedParts(where, issues, omitted)
  }

  const status = typeof (error as { statusCode?: unknown })?.statusCode === 'number'
    ? (error as { statusCode: number }).statusCode
    : 500
  if (status >= 400 && status < 500) {
    const code = STATUS_TO_CODE[status] ?? 'MEMSWEEP_MALFORMED_REQUEST'
    switch (code) {
      case 'MEMSWEEP_BODY_TOO_LARGE': return new ServiceError(code, { limit: context.bodyLimit })
      case 'MEMSWEEP_UNSUPPORTED_MEDIA_TYPE': return new ServiceError(code, { contentType: request.headers['content-type'] ?? '(none)' })
      case 'MEMSWEEP_UNAUTHENTICATED': return new ServiceError(code, { reason: messageOf(error) }, { headers: { 'www-authenticate': 'Bearer realm="memsweep"' } })
      case 'MEMSWEEP_ROUTE_NOT_FOUND': return new ServiceError(code, { method: request.method, path: request.url.split('?')[0] ?? '' })
      case 'MEMSWEEP_NOT_ACCEPTABLE': return new ServiceError(code, { accept: request.headers.accept ?? '', available: 'application/json' })
      default:
        // Fastify's 4xx messages describe the request ("Body is not valid JSON …"), never the server.
        return new ServiceError('MEMSWEEP_MALFORMED_REQUEST', { reason: messageOf(error) })
    }
  }
  if (status === 503) return new ServiceError('MEMSWEEP_NOT_READY', { reason: 'the server is shutting down' })
  return new ServiceError('MEMSWEEP_INTERNAL', { requestId: String(request.id) })
}

/** A 400 naming the invalid parts of the request (`where`: querystring, params, headers). */
function malformedParts (where: string, issues: readonly FieldIssue[], omitted = 0): ServiceError {
  const located = issues.map((issue) => ({ ...issue, path: issue.path === '' ? where : clip(`${where}.${issue.path}`) }))
  return new ServiceError('MEMSWEEP_MALFORMED_REQUEST', { reason: `invalid ${where}` }, { extensions: listedIssues(located, omitted) })
}

/**
 * Problems for the errors fastify meets before a route is found (`frameworkErrors`): a path
 * parameter longer than the router allows (every route's parameter is a sweep id, so the
 * answer is the one a malformed id gets), a path that is not valid percent-encoding.
 */
export function frameworkProblem (error: FastifyError, request: FastifyRequest): ServiceError {
  switch (error.code) {
    case 'FST_ERR_MAX_PARAM_LENGTH':
      return malformedParts('params', [fieldIssue(['id'], SWEEP_ID_RULE)])
    case 'FST_ERR_BAD_URL':
      return new ServiceError('MEMSWEEP_MALFORMED_REQUEST', { reason: 'the path is not valid percent-encoded UTF-8' })
    default:
      return new ServiceError('MEMSWEEP_INTERNAL', { requestId: String(request.id) })
  }
}

function messageOf (error: unknown): string {
  return error instanceof Error ? error.message : String(error)
}

export function problemBody (error: ServiceError, request: FastifyRequest): Problem {
  return {
    type: problemType(error.code),
    title: ERRORS[error.code].title,
    status: error.status,
    detail: error.message,
    instance: request.url.split('?')[0] ?? '',
    code: error.code,
    requestId: String(request.id),
    ...error.extensions
  }
}

export function sendProblem (reply: FastifyReply, error: ServiceError): FastifyReply {
  for (const [name, value] of Object.entries(error.headers)) reply.header(name, value)
  // Also here, not only in the onRequest hook: answers fastify sends before any hook runs carry it too.
  reply.header('x-request-id', String(reply.request.id))
  // Sent as a string so no response serializer can reshape (or choke on) an error body.
  return reply
    .code(error.status)
    .type(`${PROBLEM_MEDIA_TYPE}; charset=utf-8`)
    .send(JSON.stringify(problemBody(error, reply.request)))
}
