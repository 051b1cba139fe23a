/**
 * The grid of a normalised spec: its axes are the varied parameters in canonical order
 * (VARIED_PARAMETERS), the first axis varies slowest. Points are addressed by index and
 * resolved lazily, so a large grid is never materialised.
 */
import { FORMAT_1_PATTERN_LEVEL, type PointParams } from '../engine/index.js'
import { roundToSignificant, type Varied } from './axis.js'
import { ruleLabel, type AxisValue } from './categorical.js'
import { AXIS_ORDER, isCategoricalPath, type CategoricalPath, type VariedPath } from './schema.js'
import type { ConstantRule, NormalisedSpec } from './types.js'

/** An axis of a numeric parameter. */
export interface NumericAxis {
  path: VariedPath
  values: readonly number[]
}

/** An axis of a categorical parameter: rules (by label) or self-coupling flags. */
export interface CategoricalAxis {
  path: CategoricalPath
  values: readonly string[] | readonly boolean[]
}

export type Axis = NumericAxis | CategoricalAxis

export function isNumericAxis (axis: Axis): axis is NumericAxis {
  return !isCategoricalPath(axis.path)
}

export interface GridPoint {
  index: number
  /** The varied parameters at this point, by path, in axis order (a rule axis gives the rule's label). */
  values: Record<string, AxisValue>
  params: PointParams
}

// MAIN //

const axesCache = new WeakMap<NormalisedSpec, readonly Axis[]>()

/** The varied parameter at `path` in a normalised spec, or undefined when the spec has no such field. */
export function variedAt (spec: NormalisedSpec, path: VariedPath): Varied | null | undefined {
  let node: unknown = spec
  for (const key of path.split('.')) {
    if (node === null || typeof node !== 'object') return undefined
    node = (node as Record<string, unknown>)[key]
  }
  if (node === undefined || node === null) return node
  if (typeof node === 'number') return node
  if (typeof node === 'object' && Array.isArray((node as { values?: unknown }).values)) return node as { values: number[] }
  return undefined
}

export function gridAxes (spec: NormalisedSpec): readonly Axis[] {
  const cached = axesCache.get(spec)
  if (cached !== undefined) return cached
  const axes: Axis[] = []
  for (const path of AXIS_ORDER) {
    if (isCategoricalPath(path)) {
      const axis = categoricalAxis(spec, path)
      if (axis !== null) axes.push(axis)
      continue
    }
    const v = variedAt(spec, path)
    if (v !== null && v !== undefined && typeof v === 'object') axes.push({ path, values: v.values })
  }
  axesCache.set(spec, axes)
  return axes
}

/** The numeric axes only (what may go on a figure's x axis or be searched). */
export function numericAxes (spec: NormalisedSpec): readonly NumericAxis[] {
  return gridAxes(spec).filter(isNumericAxis)
}

function categoricalAxis (spec: NormalisedSpec, path: CategoricalPath): CategoricalAxis | null {
  const rule = spec.rule
  if (path === 'rule') return 'values' in rule ? { path, values: rule.values.map(ruleLabel) } : null
  if ('values' in rule || !('selfCoupling' in rule)) return null
  const flag = rule.selfCoupling
  return typeof flag === 'object' ? { path, values: flag.values } : null
}

/** Number of grid points: the product of the axis lengths (1 when nothing varies). */
export function countPoints (spec: NormalisedSpec): number {
  return gridAxes(spec).reduce((n, axis) => n * axis.values.length, 1)
}

/** P for a load α at size N: round(α·N), half away from zero, after rounding α·N to 12 significant digits so 0.145·100 gives 15. */
export function patternsForLoad (load: number, neurons: number): number {
  return Math.round(roundToSignificant(load * neurons))
}

/** The point at `index` (0 ≤ index < countPoints(spec)); the last axis varies fastest. */
export function pointAt (spec: NormalisedSpec, index: number): GridPoint {
  const axes = gridAxes(spec)
  const total = countPoints(spec)
  if (!Number.isSafeInteger(index) || index < 0 || index >= total) {
    throw new RangeError(`invalid argument. Grid point index must be an integer in [0, ${total - 1}]. Value: ${index}.`)
  }
  const values: Record<string, AxisValue> = {}
  let rest = index
  for (let a = axes.length - 1; a >= 0; a--) {
    const axis = axes[a]!
    values[axis.path] = axis.values[rest % axis.values.length]!
    rest = Math.floor(rest / axis.values.length)
  }
  const ordered: Record<string, AxisValue> = {}
  for (const axis of axes) ordered[axis.path] = values[axis.path]!
  return { index, values: ordered, params: resolveParams(spec, ordered) }
}

function resolveParams (spec: NormalisedSpec, values: Record<string, AxisValue>): PointParams {
  const at = (path: VariedPath, v: Varied): number => typeof v === 'number' ? v : values[path] as number
  const neurons = at('neurons', spec.neurons)
  const dilution: PointParams['dilution'] = spec.dilution === null
    ? null
    : 'inDegree' in spec.dilution
      ? { kind: 'fixed-in-degree', inDegree: at('dilution.inDegree', spec.dilution.inDegree) }
      : { keep: at('dilution.keep', spec.dilution.keep), symmetric: spec.dilution.symmetric }
  const patterns = spec.patterns !== undefined
    ? at('patterns', spec.patterns)
    : spec.load !== undefined
      ? patternsForLoad(at('load', spec.load), neurons)
      : spec.inDegreeLoad !== undefined
        ? patternsForLoad(at('inDegreeLoad', spec.inDegreeLoad), dilution?.kind === 'fixed-in-degree' ? dilution.inDegree : neurons)
        : spec.family.kind === 'supplied' ? spec.family.data.length : 0
  const f = spec.family
  const family: PointParams['family'] = f.kind === 'random'
    ? { kind: 'random', activity: at('family.activity', f.activity) }
    : f.kind === 'correlated'
      ? { kind: 'correlated', parents: at('family.parents', f.parents), parentOverlap: at('family.parentOverlap', f.parentOverlap) }
      : { kind: 'supplied', data: patterns < f.data.length ? f.data.slice(0, patterns) : f.data }
  const rule = resolveRule(spec.rule, values, at)
  const c = spec.cue
  const cue: PointParams['cue'] = c.kind === 'flip'
    ? { kind: 'flip', fraction: at('cue.fraction', c.fraction) }
    : c.kind === 'erase'
      ? { kind: 'erase', fraction: at('cue.fraction', c.fraction), fill: c.fill }
      : c.kind === 'mixture' ? { kind: 'mixture', components: at('cue.components', c.components) } : { kind: 'random' }
  const params: PointParams = {
    neurons,
    patterns,
    coding: spec.coding,
    family,
    rule,
    dilution,
    cue,
    dynamics: {
      update: spec.dynamics.update,
      temperature: at('dynamics.temperature', spec.dynamics.temperature),
      maxSweeps: at('dynamics.maxSweeps', spec.dynamics.maxSweeps),
      burnIn: at('dynamics.burnIn', spec.dynamics.burnIn)
    },
    measures: { ...spec.measures },
    successThreshold: at('successThreshold', spec.successThreshold),
    trialsPerNetwork: at('trialsPerNetwork', spec.trialsPerNetwork)
  }
  // Format 1 classified end states at 0.9 whatever the success threshold; it keeps that meaning.
  if (spec.version === 1) params.patternLevel = FORMAT_1_PATTERN_LEVEL
  return params
}

function resolveRule (r: NormalisedSpec['rule'], values: Record<string, AxisValue>, at: (path: VariedPath, v: Varied) => number): PointParams['rule'] {
  if ('values' in r) {
    const label = values.rule
    const chosen = r.values.find((entry) => ruleLabel(entry) === label)
    if (chosen === undefined) throw new Error(`internal: no rule labelled ${String(label)} on the rule axis`)
    return { ...chosen } satisfies ConstantRule
  }
  const coupling = (flag: boolean | { values: boolean[] }): boolean => typeof flag === 'boolean' ? flag : values['rule.selfCoupling'] as boolean
  switch (r.kind) {
    case 'covariance': return { kind: 'covariance', selfCoupling: coupling(r.selfCoupling), threshold: r.threshold === null ? null : at('rule.threshold', r.threshold) }
    case 'dense-polynomial': return { kind: r.kind, degree: at('rule.degree', r.degree) }
    case 'dense-exponential': return { kind: r.kind }
    case 'modern-softmax': return { kind: r.kind, beta: at('rule.beta', r.beta) }
    default: return { kind: r.kind, selfCoupling: coupling(r.selfCoupling) }
  }
}
