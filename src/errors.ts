/**
 * The one registry of error codes the service answers with. Every error response is an
 * RFC 9457 problem document carrying one of these codes; docs/errors.md has one row per
 * code and the OpenAPI document lists them as an enum (a test checks that the three agree).
 *
 * Codes are stable: clients branch on `code`, never on `title` or `detail` wording.
 */

export interface ErrorDefinition {
  /** HTTP status the code is always sent with. */
  status: number
  /** Short, fixed summary of the problem type. */
  title: string
  /** Message template for `detail`; `{name}` placeholders are filled from the parameters. */
  detail: string
}

export const ERRORS = {
  MEMSWEEP_MALFORMED_REQUEST: {
    status: 400,
    title: 'Malformed request',
    detail: 'The request could not be read: {reason}'
  },
  MEMSWEEP_UNAUTHENTICATED: {
    status: 401,
    title: 'Authentication required',
    detail: 'This route needs a valid bearer token in the Authorization header ({reason}).'
  },
  MEMSWEEP_FORBIDDEN: {
    status: 403,
    title: 'Not allowed for this token',
    detail: "The token of '{owner}' has the role '{role}', which may not {action}."
  },
  MEMSWEEP_OWNER_ONLY: {
    status: 403,
    title: 'Only the owner may do this',
    detail: "Only the owner of sweep '{id}' may {action}."
  },
  MEMSWEEP_ROUTE_NOT_FOUND: {
    status: 404,
    title: 'No such route',
    detail: 'There is no route {method} {path}.'
  },
  MEMSWEEP_SWEEP_NOT_FOUND: {
    status: 404,
    title: 'Sweep not found',
    detail: "No sweep with id '{id}' is visible to this caller."
  },
  MEMSWEEP_NOT_ACCEPTABLE: {
    status: 406,
    title: 'No acceptable representation',
    detail: "None of the media types in Accept ('{accept}') can be produced here; available: {available}."
  },
  MEMSWEEP_RESULTS_NOT_READY: {
    status: 409,
    title: 'Results not ready',
    detail: "Sweep '{id}' is {status}; results exist once it has succeeded."
  },
  MEMSWEEP_RESULTS_UNAVAILABLE: {
    status: 409,
    title: 'Results will never exist',
    detail: "Sweep '{id}' ended as {status}, so it has no results."
  },
  MEMSWEEP_SWEEP_FINISHED: {
    status: 409,
    title: 'Sweep already finished',
    detail: "Sweep '{id}' already ended as {status}; a finished sweep cannot be canceled. To remove it with everything stored for it, send DELETE with ?purge=true (its owner only; irreversible)."
  },
  MEMSWEEP_SWEEP_ACTIVE: {
    status: 409,
    title: 'Sweep still active',
    detail: "Sweep '{id}' is {status}: cancel it (DELETE without purge) before removing it."
  },
  MEMSWEEP_NOT_RESUMABLE: {
    status: 409,
    title: 'Sweep cannot be resumed',
    detail: "Sweep '{id}' is {status}; only a canceled or failed sweep can be resumed."
  },
  MEMSWEEP_BODY_TOO_LARGE: {
    status: 413,
    title: 'Request body too large',
    detail: 'The request body is larger than the limit of {limit} bytes.'
  },
  MEMSWEEP_UNSUPPORTED_MEDIA_TYPE: {
    status: 415,
    title: 'Unsupported media type',
    detail: "Content-Type '{contentType}' is not accepted; send application/json."
  },
  MEMSWEEP_SPEC_INVALID: {
    status: 422,
    title: 'Invalid sweep spec',
    detail: 'The sweep spec has {count} problem(s); see errors[] for each field.'
  },
  MEMSWEEP_WORK_LIMIT_EXCEEDED: {
    status: 422,
    title: 'Sweep exceeds a work limit',
    detail: "The sweep needs {value} for '{limit}', above this server's limit of {max}."
  },
  MEMSWEEP_IDEMPOTENCY_KEY_REUSED: {
    status: 422,
    title: 'Idempotency-Key reused with a different body',
    detail: "Idempotency-Key '{key}' was first used with a different sweep spec."
  },
  MEMSWEEP_CALLBACK_REFUSED: {
    status: 422,
    title: 'Callback URL refused',
    detail: 'The callback URL cannot be used: {reason}.'
  },
  MEMSWEEP_FIGURE_OPTIONS_UNFIT: {
    status: 422,
    title: 'Figure options do not fit the sweep',
    detail: 'The figure cannot be drawn as asked: {issues}. See errors[] for each option.'
  },
  MEMSWEEP_RATE_LIMITED: {
    status: 429,
    title: 'Too many requests',
    detail: 'At most {max} requests per {window} are allowed; retry in {retryAfter} s.'
  },
  MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS: {
    status: 429,
    title: 'Too many active sweeps',
    detail: '{owner} already has {active} queued or running sweeps (limit {max}); wait for one to finish or cancel one.'
  },
  MEMSWEEP_TOO_MANY_AUTH_FAILURES: {
    status: 429,
    title: 'Too many failed authentications',
    detail: 'More than {max} requests from this address failed authentication within {window}; retry in {retryAfter} s.'
  },
  MEMSWEEP_INTERNAL: {
    status: 500,
    title: 'Internal error',
    detail: 'The server failed to handle the request; quote request id {requestId} when reporting it.'
  },
  MEMSWEEP_NOT_READY: {
    status: 503,
    title: 'Service not ready',
    detail: 'The service cannot take requests right now: {reason}'
  }
} as const satisfies Record<string, ErrorDefinition>

export type ErrorCode = keyof typeof ERRORS
export const ERROR_CODES = Object.keys(ERRORS) as [ErrorCode, ...ErrorCode[]]

/** Problem `type` URI of a code: a URN, so it names the problem without promising a web page. */
export function problemType (code: ErrorCode): string {
  return `urn:memsweep:problem:${code.slice('MEMSWEEP_'.length).toLowerCase().replaceAll('_', '-')}`
}

type DetailParams = Record<string, string | number>

export function formatDetail (code: ErrorCode, params: DetailParams = {}): string {
  return ERRORS[code].detail.replace(/\{(\w+)\}/g, (whole, name: string) => {
    const value = params[name]
    return value === undefined ? whole : String(value)
  })
}

/**
 * An error the API turns into a problem document. `extensions` become extra members of
 * the document (e.g. `errors[]`, `limit`); `headers` are added to the response.
 */
export class ServiceError extends Error {
  readonly code: ErrorCode
  readonly status: number
  readonly extensions: Record<string, unknown>
  readonly headers: Record<string, string>

  constructor (code: ErrorCode, params: DetailParams = {}, options: { extensions?: Record<string, unknown>, headers?: Record<string, string> } = {}) {
    super(formatDetail(code, params))
    this.name = 'ServiceError'
    this.code = code
    this.status = ERRORS[code].status
    this.extensions = options.extensions ?? {}
    this.headers = options.headers ?? {}
  }
}
