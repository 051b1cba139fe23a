/**
 * Errors raised by the spec layer. Each carries the data an HTTP layer needs to answer
 * with a 4xx naming the offending field (or limit) without parsing messages.
 */

export interface SpecIssue {
  /** Dotted path of the offending field inside the submitted spec ('' for the spec itself), e.g. 'dynamics.temperature', 'family.data.3.17'. */
  path: string
  message: string
}

/**
 * The submitted spec is malformed or describes work the engine cannot do. Lists the issues
 * found, up to a bound; `omitted` counts those found beyond it.
 */
export class SpecValidationError extends Error {
  readonly issues: SpecIssue[]
  readonly omitted: number

  constructor (issues: SpecIssue[], omitted = 0) {
    const first = issues[0]
    const head = first === undefined ? 'invalid sweep spec' : `${first.path === '' ? '(spec)' : first.path}: ${first.message}`
    const others = issues.length - 1 + omitted
    const more = others > 0 ? ` (and ${others} more issue${others > 1 ? 's' : ''})` : ''
    super(`Invalid sweep spec. ${head}${more}`)
    this.name = 'SpecValidationError'
    this.issues = issues
    this.omitted = omitted
    Object.setPrototypeOf(this, new.target.prototype)
  }
}

export const WORK_LIMIT_NAMES = ['maxNeurons', 'maxPoints', 'maxTrials', 'maxBytes', 'maxCpuSeconds', 'maxStoredBytes'] as const
export type WorkLimitName = typeof WORK_LIMIT_NAMES[number]

/** The spec is valid but asks for more than this service allows; raised before anything is allocated. */
export class WorkLimitError extends RangeError {
  readonly limit: WorkLimitName
  readonly value: number
  readonly max: number

  constructor (limit: WorkLimitName, value: number, max: number) {
    super(`Sweep exceeds ${limit}: it needs ${value}, the limit is ${max}.`)
    this.name = 'WorkLimitError'
    this.limit = limit
    this.value = value
    this.max = max
    Object.setPrototypeOf(this, new.target.prototype)
  }
}
