/**
 * Varied numeric parameters. Any numeric field of a sweep spec is either a plain number or
 * an axis object, expanded here into an explicit list of values:
 *
 *   { "values": [0.05, 0.1, 0.2] }                          listed values, kept in the given order
 *   { "from": 0.02, "to": 0.24, "step": 0.02 }              from, from ± step, … up to `to` (inclusive when hit)
 *   { "from": 100, "to": 1600, "count": 5, "scale": "log" } `count` values evenly spaced, linear (default) or log
 *
 * Generated values come out as the decimals a person would write: a `step` axis snaps each
 * value to the decimal grid of its `from` and `step` (0.02 + 5·0.02 gives 0.12, not
 * 0.12000000000000001; −0.3 + 3·0.1 gives 0, not 5.55e-17), and every generated value is
 * rounded to 12 significant digits, with values within 1e-12 of the axis' span of zero
 * set to zero.
 * For integer parameters, `count` axes round to the nearest integer and `step` axes must
 * start and move in whole numbers. Axes never hold duplicates.
 */
import { z } from 'zod'

// VARIABLES //

/** Most values a single axis may hold; checked before any value is generated. */
export const MAX_AXIS_VALUES = 10_000

/** Significant digits kept in generated axis values. */
export const AXIS_SIGNIFICANT_DIGITS = 12

/** A last step that lands within this fraction of a step of `to` counts as reaching it. */
const STEP_TOLERANCE = 1e-9

/** Generated values closer to zero than this fraction of the axis' span are zero (a crossing of zero). */
const ZERO_SNAP = 1e-12

/** `toFixed` accepts at most this many digits; finer decimal grids are left to the significant-digit rounding. */
const MAX_FIXED_DIGITS = 100

export interface NumericDomain {
  integer: boolean
  min?: number
  minExclusive?: boolean
  max?: number
  maxExclusive?: boolean
}

/** An axis as the user may write it (already type-checked by zod). */
export interface AxisInput {
  values?: number[] | undefined
  from?: number | undefined
  to?: number | undefined
  step?: number | undefined
  count?: number | undefined
  scale?: 'linear' | 'log' | undefined
}

/** A varied parameter after normalisation: a constant, or an expanded axis. */
export type Varied = number | { values: number[] }

// MAIN //

export function roundToSignificant (x: number, digits = AXIS_SIGNIFICANT_DIGITS): number {
  if (x === 0 || !Number.isFinite(x)) return x === 0 ? 0 : x
  return Number(x.toPrecision(digits))
}

/**
 * Digits after the decimal point in the shortest decimal form of `x` (0.25 → 2, 1e-7 → 7,
 * 3 → 0): the grid a value written by a person lives on.
 */
export function decimalPlaces (x: number): number {
  if (!Number.isFinite(x)) return 0
  const [mantissa = '', exponent = '0'] = Math.abs(x).toString().split('e')
  const fraction = mantissa.split('.')[1]?.length ?? 0
  return Math.max(0, fraction - Number(exponent))
}

/** Rounds a generated axis value: to the decimal grid (when given), to zero near a crossing, to 12 significant digits. */
function tidyGenerated (raw: number, span: number, decimals: number | null): number {
  let x = decimals !== null && decimals <= MAX_FIXED_DIGITS ? Number(raw.toFixed(decimals)) : raw
  if (Math.abs(x) <= ZERO_SNAP * span) x = 0
  return roundToSignificant(x)
}

/** Why `x` is outside `domain`, or null when it is inside. */
export function domainViolation (x: number, domain: NumericDomain): string | null {
  if (!Number.isFinite(x)) return `${x} is not a finite number`
  if (domain.integer && !Number.isSafeInteger(x)) return `${x} is not an integer`
  if (domain.min !== undefined && (domain.minExclusive === true ? x <= domain.min : x < domain.min)) {
    return `${x} is below the allowed range (${describeDomain(domain)})`
  }
  if (domain.max !== undefined && (domain.maxExclusive === true ? x >= domain.max : x > domain.max)) {
    return `${x} is above the allowed range (${describeDomain(domain)})`
  }
  return null
}

export function describeDomain (domain: NumericDomain): string {
  const kind = domain.integer ? 'integer' : 'number'
  const low = domain.min === undefined ? '' : `${domain.min} ${domain.minExclusive === true ? '<' : '≤'} `
  const high = domain.max === undefined ? '' : ` ${domain.maxExclusive === true ? '<' : '≤'} ${domain.max}`
  return `${low}${kind}${high}`
}

/** The zod schema of one value of a parameter with this domain. */
export function scalarSchema (domain: NumericDomain): z.ZodNumber {
  let schema = domain.integer ? z.int() : z.number()
  if (domain.min !== undefined) schema = domain.minExclusive === true ? schema.gt(domain.min) : schema.gte(domain.min)
  if (domain.max !== undefined) schema = domain.maxExclusive === true ? schema.lt(domain.max) : schema.lte(domain.max)
  return schema
}

/**
 * The zod schema of a varied parameter: a number, or an axis object whose form and
 * expansion are checked here so that every problem is reported with the axis' path.
 */
export function variedSchema (domain: NumericDomain, description: string) {
  const value = scalarSchema(domain)
  const axis = z.strictObject({
    values: z.array(value).min(1).max(MAX_AXIS_VALUES).optional().describe('Explicit axis values, used in the order given.'),
    from: value.optional().describe('First value of a generated axis.'),
    to: value.optional().describe('Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it).'),
    step: z.number().positive().optional().describe('Distance between consecutive values (positive; the axis runs from `from` towards `to`).'),
    count: z.int().min(1).max(MAX_AXIS_VALUES).optional().describe('Number of evenly spaced values from `from` to `to`, both included.'),
    scale: z.enum(['linear', 'log']).optional().describe('Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.')
  }).superRefine((input, ctx) => {
    // Bad bounds, steps or counts are already reported on their own fields.
    if (!fieldsWellFormed(input, domain)) return
    const result = expandAxis(input, domain)
    if ('problem' in result) ctx.addIssue({ code: 'custom', message: result.problem })
  }).describe('An axis of values for this parameter; several axes in one spec form a grid (Cartesian product).')
  return z.union([value, axis], {
    error: (issue) => {
      if (issue.input === undefined) return 'required'
      if (typeof issue.input === 'number') return domainViolation(issue.input, domain) ?? undefined
      return 'expected a number or an axis object ({ values } | { from, to, step } | { from, to, count, scale })'
    }
  }).describe(description)
}

function fieldsWellFormed (input: AxisInput, domain: NumericDomain): boolean {
  const inDomain = (x: number | undefined) => x === undefined || domainViolation(x, domain) === null
  const { step, count } = input
  return inDomain(input.from) && inDomain(input.to) &&
    (step === undefined || (Number.isFinite(step) && step > 0)) &&
    (count === undefined || (Number.isSafeInteger(count) && count >= 1 && count <= MAX_AXIS_VALUES)) &&
    (input.values === undefined || (input.values.length >= 1 && input.values.length <= MAX_AXIS_VALUES && input.values.every(inDomain)))
}

/**
 * Expands an axis into its values, or says why it cannot. Never allocates more than
 * MAX_AXIS_VALUES numbers: the length is known before any value is generated.
 */
export function expandAxis (axis: AxisInput, domain: NumericDomain): { values: number[] } | { problem: string } {
  const generatedKeys = (['from', 'to', 'step', 'count', 'scale'] as const).filter((k) => axis[k] !== undefined)
  if (axis.values !== undefined) {
    if (generatedKeys.length > 0) return { problem: `an axis with 'values' takes no ${generatedKeys.map((k) => `'${k}'`).join(', ')}` }
    return checkValues(axis.values, domain, 'values')
  }
  const { from, to, step, count, scale } = axis
  if (from === undefined || to === undefined) {
    return { problem: 'an axis needs either \'values\', or \'from\' and \'to\' with one of \'step\' or \'count\'' }
  }
  if ((step === undefined) === (count === undefined)) {
    return { problem: 'a generated axis needs exactly one of \'step\' or \'count\'' }
  }
  if (step !== undefined) {
    if (scale !== undefined) return { problem: '\'scale\' applies to \'count\' axes only; a \'step\' axis is linear' }
    return stepAxis(from, to, step, domain)
  }
  return countAxis(from, to, count as number, scale ?? 'linear', domain)
}

function stepAxis (from: number, to: number, step: number, domain: NumericDomain): { values: number[] } | { problem: string } {
  if (domain.integer && !Number.isSafeInteger(step)) return { problem: `this parameter takes integers, so 'step' must be a whole number (got ${step})` }
  const quotient = Math.abs(to - from) / step
  const intervals = Math.floor(quotient + STEP_TOLERANCE * Math.max(1, quotient))
  if (!(intervals + 1 <= MAX_AXIS_VALUES)) {
    return { problem: `this axis would hold ${formatCount(intervals + 1)} values; at most ${MAX_AXIS_VALUES} are allowed` }
  }
  const direction = to >= from ? 1 : -1
  const decimals = Math.max(decimalPlaces(from), decimalPlaces(step))
  const span = Math.abs(to - from)
  const values: number[] = []
  for (let i = 0; i <= intervals; i++) {
    const raw = from + direction * i * step
    values.push(domain.integer ? Math.round(raw) : tidyGenerated(raw, span, decimals))
  }
  return checkValues(values, domain, 'generated')
}

function countAxis (from: number, to: number, count: number, scale: 'linear' | 'log', domain: NumericDomain): { values: number[] } | { problem: string } {
  if (count === 1 && from !== to) return { problem: `a 'count' of 1 needs 'from' equal to 'to' (got ${from} and ${to})` }
  if (scale === 'log' && !(from > 0 && to > 0)) return { problem: `a log-scaled axis needs positive 'from' and 'to' (got ${from} and ${to})` }
  const values: number[] = []
  for (let i = 0; i < count; i++) {
    let raw: number
    if (i === 0) raw = from
    else if (i === count - 1) raw = to
    else if (scale === 'log') raw = from * Math.pow(to / from, i / (count - 1))
    else raw = from + (to - from) * (i / (count - 1))
    values.push(domain.integer ? Math.round(raw) : tidyGenerated(raw, Math.abs(to - from), null))
  }
  return checkValues(values, domain, 'generated')
}

function checkValues (values: number[], domain: NumericDomain, origin: 'values' | 'generated'): { values: number[] } | { problem: string } {
  const seen = new Set<number>()
  for (const v of values) {
    const violation = domainViolation(v, domain)
    if (violation !== null) return { problem: `axis value ${violation}` }
    // -0 and 0 are the same grid value.
    const key = v === 0 ? 0 : v
    if (seen.has(key)) {
      return {
        problem: origin === 'values'
          ? `axis values must be distinct; ${v} appears more than once`
          : `this axis generates ${v} more than once${domain.integer ? ' after rounding to integers' : ''}; use fewer values or a wider range`
      }
    }
    seen.add(key)
  }
  return { values: values.map((v) => (v === 0 ? 0 : v)) }
}

function formatCount (n: number): string {
  return Number.isFinite(n) && n < 1e15 ? String(n) : n.toExponential(2)
}

/** A varied parameter in normalised form: constants stay numbers, axes become `{ values }`. */
export function normaliseVaried (input: number | AxisInput, domain: NumericDomain): Varied {
  if (typeof input === 'number') return input === 0 ? 0 : input
  const result = expandAxis(input, domain)
  if ('problem' in result) throw new Error(`internal: axis passed validation but cannot expand: ${result.problem}`)
  return { values: result.values }
}
