/**
 * Normalisation and cross-field checks of the `analysis` member. Field-level rules are in
 * the zod schema; what needs the rest of the spec (does the model have the searched
 * parameter, is N an axis for a scaling fit, do the ends of the range run) is here.
 */
import { roundToSignificant, domainViolation } from '../axis.js'
import type { SpecIssue } from '../errors.js'
import { numericAxes, pointAt, variedAt, type GridPoint } from '../grid.js'
import { domainOf, type VariedPath } from '../schema.js'
import type { NormalisedSpec } from '../types.js'
import { ANALYSIS_DEFAULTS } from './schema.js'
import type { NormalisedAnalysis } from './types.js'
import { realisedValue, withParameter } from './parameter.js'

/** What zod hands over for the analysis member (defaults filled, tolerance maybe absent). */
export interface ParsedThresholdAnalysis extends Omit<NormalisedAnalysis, 'tolerance' | 'parameter'> {
  parameter: string
  tolerance?: number | undefined
}

/** A grid point to run the engine's checks on, and which end of the searched range it stands for. */
export interface CheckedPoint extends Pick<GridPoint, 'values' | 'params'> {
  end?: 'from' | 'to'
}

// MAIN //

/** The normalised analysis: the default tolerance written out ((to − from)/32, 12 significant digits). */
export function normaliseAnalysis (parsed: ParsedThresholdAnalysis): NormalisedAnalysis {
  const tolerance = parsed.tolerance ?? roundToSignificant((parsed.to - parsed.from) / ANALYSIS_DEFAULTS.toleranceDivisor)
  return { ...parsed, tolerance, scaling: parsed.scaling === null ? null : { ...parsed.scaling } }
}

/** Does the raw input ask for a search over a load, P/N or P/K (so no pattern count may be given)? */
export function searchesLoad (input: Record<string, unknown>): boolean {
  const analysis = input.analysis
  if (analysis === null || typeof analysis !== 'object') return false
  const parameter = (analysis as Record<string, unknown>).parameter
  return parameter === 'load' || parameter === 'inDegreeLoad'
}

/** Cross-field problems of a normalised spec's analysis, each at the field to change. */
export function analysisIssues (spec: NormalisedSpec): SpecIssue[] {
  const a = spec.analysis
  if (a === undefined) return []
  const issues: SpecIssue[] = []
  const at = (field: string, message: string) => issues.push({ path: `analysis.${field}`, message })
  const path = a.parameter as VariedPath
  const isLoad = path === 'load' || path === 'inDegreeLoad'
  const field = isLoad ? undefined : variedAt(spec, path)
  if (!isLoad && (field === undefined || (field === null && path !== 'rule.threshold'))) {
    at('parameter', `this spec has no ${path} to search (${describeMissing(path)})`)
  } else if (field !== undefined && field !== null && typeof field === 'object') {
    issues.push({ path, message: 'is searched by the analysis, so it cannot also be an axis; give its range as analysis.from … analysis.to' })
  }
  if (isLoad && spec.family.kind === 'supplied') at('parameter', 'a load search draws its patterns; it cannot run on supplied patterns')
  if (path === 'inDegreeLoad' && (spec.dilution === null || !('inDegree' in spec.dilution))) at('parameter', 'the load per input P/K needs a fixed in-degree dilution; search load for P/N')
  if (!(a.from < a.to)) at('to', `must be greater than from (${a.from})`)
  for (const end of ['from', 'to'] as const) {
    const violation = domainViolation(a[end], domainOf(path))
    if (violation !== null) at(end, `${violation} for ${path}`)
  }
  if (a.from < a.to && !(a.tolerance < a.to - a.from)) at('tolerance', `must be smaller than the range to − from = ${roundToSignificant(a.to - a.from)}`)
  if (a.measure === 'success' && !(a.level > 0 && a.level < 1)) at('level', 'a success rate level must lie strictly between 0 and 1')
  if (a.scaling !== null) {
    const sizes = numericAxes(spec).find((axis) => axis.path === 'neurons')?.values.length ?? 1
    const needed = a.scaling.form === 'power' && a.scaling.exponent === null ? 4 : 3
    if (sizes < needed) {
      at('scaling', `needs neurons as an axis of at least ${needed} sizes${needed === 4 ? ' (the exponent is fitted; fix it to need only 3)' : ''}; this spec has ${sizes}`)
    }
  }
  return issues
}

/**
 * The points whose parameters the engine must accept: a grid sweep's points, or for a
 * search both ends of the range at every point of the outer grid (the steps lie between).
 */
export function pointsToCheck (spec: NormalisedSpec, index: number): CheckedPoint[] {
  const point = pointAt(spec, index)
  const a = spec.analysis
  if (a === undefined) return [point]
  return (['from', 'to'] as const).map((end) => {
    const value = realisedValue(a.parameter, point.params, a[end])
    return { end, values: { ...point.values, [a.parameter]: value }, params: withParameter(point.params, a.parameter, a[end]) }
  })
}

function describeMissing (path: string): string {
  switch (path) {
    case 'family.activity': return 'it needs family kind random'
    case 'family.parentOverlap': return 'it needs family kind correlated'
    case 'rule.threshold': return 'it needs rule kind covariance'
    case 'rule.beta': return 'it needs rule kind modern-softmax'
    case 'dilution.keep': return 'it needs a random dilution with keep'
    case 'cue.fraction': return 'it needs cue kind flip or erase'
    default: return 'the model does not use it'
  }
}
