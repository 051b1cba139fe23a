/**
 * The leading columns of every table a sweep gives (points, trials, trajectories, searches):
 * which sweep, which spec, which seed, then every model parameter of the row, varied or fixed,
 * always the same columns in the same order whatever the sweep varies. Two tables of different
 * sweeps can be stacked as they are and their rows stay apart.
 */
import type { PointParams } from '../engine/index.js'
import type { NormalisedSpec } from '../spec/types.js'
import type { AxisValue } from '../spec/categorical.js'
import { pointAt } from '../spec/grid.js'
import type { CsvCell } from './csv.js'
import { roundCell } from './precision.js'
import type { ResultRow } from './types.js'

/** Who made the row: the sweep (empty for a local run), the spec hash and the master seed. */
export const IDENTITY_COLUMNS = ['sweepId', 'specHash', 'seed'] as const

/**
 * Every model parameter, in canonical order (the order of the spec's varied parameters, with
 * the kind of each group before its members). A parameter that does not apply to a row (the
 * degree of a Hebbian rule, the fraction of a random cue) is an empty cell; `neurons` and
 * `patterns` are the point's N and P; `load` and `inDegreeLoad` are the spec's values, as
 * written, when the spec sets P by them (else empty).
 */
export const PARAMETER_COLUMNS = [
  'neurons', 'patterns', 'load', 'inDegreeLoad',
  'coding', 'family.kind', 'family.activity', 'family.parents', 'family.parentOverlap',
  'rule.kind', 'rule.selfCoupling', 'rule.threshold', 'rule.degree', 'rule.beta',
  'dilution.kind', 'dilution.keep', 'dilution.symmetric', 'dilution.inDegree',
  'cue.kind', 'cue.fraction', 'cue.fill', 'cue.components',
  'dynamics.update', 'dynamics.temperature', 'dynamics.maxSweeps', 'dynamics.burnIn',
  'successThreshold', 'trialsPerNetwork', 'streams'
] as const

/** What the parameters imply: the load per neuron α = P/N and, under a fixed in-degree K, the load per input α_K = P/K. */
export const DERIVED_COLUMNS = ['alpha', 'alphaK'] as const

export type ParameterColumn = typeof PARAMETER_COLUMNS[number]

/** Where a table's rows come from, for the identity columns. */
export interface RowSource {
  sweepId: string | null
  specHash: string
  spec: NormalisedSpec
}

// MAIN //

export function leadingHeader (): string[] {
  return [...IDENTITY_COLUMNS]
}

/** The parameter and derived columns' header. */
export function parameterHeader (): string[] {
  return [...PARAMETER_COLUMNS, ...DERIVED_COLUMNS]
}

export function identityCells (source: RowSource): CsvCell[] {
  return [source.sweepId ?? '', source.specHash, source.spec.seed]
}

/**
 * The parameter cells of grid point `point` (index in the spec's grid, whose varied values are
 * `values`), optionally with some parameters overridden (a search's step: the searched value,
 * its N and P).
 */
export function parameterCells (spec: NormalisedSpec, point: number, values: Record<string, AxisValue>, override: Partial<Record<ParameterColumn, CsvCell>> = {}): CsvCell[] {
  const p: PointParams = pointAt(spec, point).params
  const cells = parameterRecord(spec, p, values)
  for (const [name, value] of Object.entries(override)) cells[name as ParameterColumn] = value
  const { neurons, patterns, 'dilution.inDegree': inDegree } = cells
  const per = (n: CsvCell): CsvCell => typeof patterns === 'number' && typeof n === 'number' && patterns > 0 ? patterns / n : undefined
  return [...PARAMETER_COLUMNS.map((name) => cells[name]), per(neurons), per(inDegree)]
}

/** sweepId, specHash, seed, point, the parameters, alpha, alphaK. */
export function pointLeadingHeader (): string[] {
  return [...leadingHeader(), 'point', ...parameterHeader()]
}

export function pointLeadingCells (source: RowSource, row: ResultRow): CsvCell[] {
  return [...identityCells(source), row.point, ...parameterCells(source.spec, row.point, row.values).map(roundCell)]
}

function parameterRecord (spec: NormalisedSpec, p: PointParams, values: Record<string, AxisValue>): Record<ParameterColumn, CsvCell> {
  const specValue = (path: 'load' | 'inDegreeLoad'): CsvCell => {
    const v = spec[path]
    if (v === undefined) return undefined
    return typeof v === 'number' ? v : values[path] as number
  }
  const rule = p.rule
  const dilution = p.dilution
  const cue = p.cue
  const family = p.family
  return {
    neurons: p.neurons,
    patterns: p.patterns,
    load: specValue('load'),
    inDegreeLoad: specValue('inDegreeLoad'),
    coding: p.coding,
    'family.kind': family.kind,
    'family.activity': family.kind === 'random' ? family.activity : undefined,
    'family.parents': family.kind === 'correlated' ? family.parents : undefined,
    'family.parentOverlap': family.kind === 'correlated' ? family.parentOverlap : undefined,
    'rule.kind': rule.kind,
    'rule.selfCoupling': 'selfCoupling' in rule ? rule.selfCoupling : undefined,
    'rule.threshold': rule.kind === 'covariance' ? rule.threshold : undefined,
    'rule.degree': rule.kind === 'dense-polynomial' ? rule.degree : undefined,
    'rule.beta': rule.kind === 'modern-softmax' ? rule.beta : undefined,
    'dilution.kind': dilution === null ? 'none' : dilution.kind === 'fixed-in-degree' ? 'fixed-in-degree' : 'random',
    'dilution.keep': dilution !== null && dilution.kind !== 'fixed-in-degree' ? dilution.keep : undefined,
    'dilution.symmetric': dilution !== null && dilution.kind !== 'fixed-in-degree' ? dilution.symmetric : undefined,
    'dilution.inDegree': dilution?.kind === 'fixed-in-degree' ? dilution.inDegree : undefined,
    'cue.kind': cue.kind,
    'cue.fraction': cue.kind === 'flip' || cue.kind === 'erase' ? cue.fraction : undefined,
    'cue.fill': cue.kind === 'erase' ? cue.fill : undefined,
    'cue.components': cue.kind === 'mixture' ? cue.components : undefined,
    'dynamics.update': p.dynamics.update,
    'dynamics.temperature': p.dynamics.temperature,
    'dynamics.maxSweeps': p.dynamics.maxSweeps,
    'dynamics.burnIn': p.dynamics.burnIn,
    successThreshold: p.successThreshold,
    trialsPerNetwork: p.trialsPerNetwork,
    streams: spec.streams ?? 'keyed'
  }
}
