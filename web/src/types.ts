/**
 * Names for the API's shapes as the page reads them. The shapes themselves are generated
 * from openapi/openapi.json (src/api-types/openapi.d.ts, `npm run openapi:generate`): the
 * page carries no copy of its own, so a changed route schema shows up here as a type error.
 */
import type { components } from '../../src/api-types/openapi.js'

type Schemas = components['schemas']

export type SweepStatusName = Schemas['SweepStatus']

export const STATUS_NAMES: readonly SweepStatusName[] = ['queued', 'running', 'succeeded', 'failed', 'canceled']

export type SweepProgress = Schemas['SweepProgress']
export type SweepStatus = Schemas['Sweep']
export type SweepDetail = Schemas['SweepDetail']
export type SweepList = Schemas['SweepList']
/** The body of POST /v1/sweeps/{id}/extend. */
export type Extension = Schemas['SweepExtensionInput']
/** The body of PATCH /v1/sweeps/{id}. */
export type Annotation = Schemas['SweepAnnotationInput']

/** A spec as JSON: the page edits it as a plain object. */
export type Spec = Record<string, unknown>

export type FieldIssue = Schemas['FieldIssue']

/**
 * A problem document (RFC 9457) as the page may receive it: a proxy in front of the service
 * can answer with less than the service's full problem, so only the status is certain.
 */
export type Problem = Partial<Schemas['Problem']> & Pick<Schemas['Problem'], 'status'>

export type WorkEstimate = Schemas['WorkEstimate']
export type Validation = Schemas['SpecValidation']
export type MeanWithError = Schemas['MeanWithError']
export type ResultRow = Schemas['ResultRow']
export type SearchStep = Schemas['SearchStep']
/** One threshold search of an analysis spec. */
export type SearchRow = Schemas['SearchRow']
/** One finite-size fit of an analysis spec with `analysis.scaling`. */
export type ScalingRow = Schemas['ScalingRow']
export type SweepResult = Schemas['SweepResult']
