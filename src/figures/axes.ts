/**
 * Axis scales and ticks. d3-scale supplies the mapping and the 'nice' tick values (1, 2, 5
 * times a power of ten); this module decides the domains: what each measure's natural range
 * is, how far the data and the error bars reach, and where a log axis puts labelled and
 * unlabelled ticks.
 */
import { format } from 'd3-format'
import { scaleLinear, scaleLog } from 'd3-scale'
import type { FigureMeasure } from './options.js'

export interface AxisScale {
  kind: 'linear' | 'log'
  domain: readonly [number, number]
  /** Data value → px. */
  toPx: (value: number) => number
  /** Labelled ticks. */
  ticks: number[]
  /** Unlabelled ticks (log axes: 2…9 × 10^k when the labelled ones are sparser). */
  minor: number[]
  label: (value: number) => string
}

/** Units kept free between the plot's edges and the first and last data values by default, so markers never sit on an edge. */
export const AXIS_INSET = 9

// MAIN //

/**
 * The y domain of a measure: rates keep [0, 1] so figures compare at a glance, overlaps keep
 * their top at 1, counts start at 0; anything else follows the data (with its error bars).
 */
export function yDomain (measure: FigureMeasure, extent: readonly [number, number] | null, kind: 'linear' | 'log'): [number, number] {
  if (kind === 'log') {
    if (extent === null) return [0.1, 1]
    const [lo, hi] = extent
    return lo === hi ? [lo / 2, hi * 2] : [lo, hi]
  }
  switch (measure) {
    case 'success':
    case 'endState':
    case 'fixedPatternFraction':
      return [0, 1]
    case 'overlap':
      return [Math.max(-1, Math.min(0, extent?.[0] ?? 0)), 1]
    case 'maxOtherOverlap':
    case 'patternOverlapMeanAbs':
    case 'patternOverlapMaxAbs':
      return [0, Math.min(1, Math.max(extent?.[1] ?? 1, 1e-9))]
    case 'sweeps':
    case 'unstableFraction':
      return [0, Math.max(extent?.[1] ?? 1, 1e-12)]
    case 'energy': {
      if (extent === null) return [-1, 0]
      const [lo, hi] = extent
      return lo === hi ? [lo - Math.max(0.5, Math.abs(lo) * 0.1), hi + Math.max(0.5, Math.abs(hi) * 0.1)] : [lo, hi]
    }
  }
}

/** The x domain: the data's extent, widened around a single value. */
export function xDomain (extent: readonly [number, number], kind: 'linear' | 'log'): [number, number] {
  const [lo, hi] = extent
  if (lo !== hi) return [lo, hi]
  if (kind === 'log') return [lo / 2, hi * 2]
  return lo === 0 ? [-0.5, 0.5] : [lo - Math.abs(lo) * 0.1, hi + Math.abs(hi) * 0.1]
}

/**
 * A scale from `domain` onto the interval [start, end] (end < start for a y axis), less
 * `inset` at each end, with about one labelled tick per `spacing` units. Linear domains are
 * widened to nice values unless `exactEnds` holds (fixed ranges such as [0, 1]).
 */
export function makeScale (kind: 'linear' | 'log', domain: readonly [number, number], start: number, end: number, spacing: number, exactEnds = false, inset = AXIS_INSET): AxisScale {
  const direction = end >= start ? 1 : -1
  const range: [number, number] = [start + direction * inset, end - direction * inset]
  const count = Math.max(2, Math.round(Math.abs(end - start) / spacing))
  if (kind === 'linear') {
    const scale = scaleLinear().domain([domain[0], domain[1]]).range(range)
    if (!exactEnds) scale.nice(count)
    const ticks = scale.ticks(count)
    const formatTick = scale.tickFormat(count)
    const [lo, hi] = scale.domain() as [number, number]
    return { kind, domain: [lo, hi], toPx: (v) => scale(v), ticks, minor: [], label: (v) => formatTick(v).replace('-', '−') }
  }
  const scale = scaleLog().domain([domain[0], domain[1]]).range(range)
  const { major, minor } = logTicks(domain[0], domain[1], count)
  // Labels of one axis share one style: all powers of ten once any would need it.
  const exponents = major.map((v) => Math.log10(v))
  const powersOnly = exponents.every((e) => Math.abs(e - Math.round(e)) < 1e-9)
  const asPowers = powersOnly && (exponents.some((e) => e < -2 || e > 4) || major.length >= 4)
  return { kind, domain: [domain[0], domain[1]], toPx: (v) => scale(v), ticks: major, minor, label: asPowers ? powerLabel : logLabel }
}

/**
 * Log ticks: powers of ten when the range spans enough decades for `count` labels (every
 * k-th power when there are too many), otherwise 1, 2, 5 × 10^k, otherwise every 1…9 × 10^k;
 * the rest of 1…9 × 10^k become minor ticks.
 */
export function logTicks (lo: number, hi: number, count: number): { major: number[], minor: number[] } {
  const inside = (v: number): boolean => v >= lo * (1 - 1e-12) && v <= hi * (1 + 1e-12)
  const first = Math.floor(Math.log10(lo))
  const last = Math.ceil(Math.log10(hi))
  const all: number[] = []
  for (let e = first; e <= last; e++) {
    for (let m = 1; m <= 9; m++) {
      const v = Number((m * 10 ** e).toPrecision(12))
      if (inside(v)) all.push(v)
    }
  }
  const powers = all.filter((v) => mantissa(v) === 1)
  let major: number[]
  if (powers.length >= Math.min(3, count)) {
    const stride = Math.max(1, Math.ceil(powers.length / Math.max(count, 2)))
    major = powers.filter((v) => Math.round(Math.log10(v)) % stride === 0)
  } else {
    const oneTwoFive = all.filter((v) => [1, 2, 5].includes(mantissa(v)))
    major = oneTwoFive.length >= 2 ? oneTwoFive : all
  }
  if (major.length < 2) major = [lo, hi]
  const majorSet = new Set(major)
  const decades = last - first
  const minor = decades <= 8 ? all.filter((v) => !majorSet.has(v)) : []
  return { major, minor }
}

function mantissa (v: number): number {
  return Math.round(v / 10 ** Math.floor(Math.log10(v) + 1e-12))
}

const SUPERSCRIPT: Record<string, string> = { '-': '⁻', 0: '⁰', 1: '¹', 2: '²', 3: '³', 4: '⁴', 5: '⁵', 6: '⁶', 7: '⁷', 8: '⁸', 9: '⁹' }
const shortNumber = format('~g')

function powerLabel (v: number): string {
  return `10${String(Math.round(Math.log10(v))).split('').map((c) => SUPERSCRIPT[c] ?? c).join('')}`
}

/** Plain decimals between 10⁻³ and 10⁵, powers of ten beyond. */
function logLabel (v: number): string {
  const exponent = Math.log10(v)
  if ((exponent < -3 || exponent > 5) && Math.abs(exponent - Math.round(exponent)) < 1e-9) return powerLabel(v)
  return shortNumber(v).replace('-', '−')
}
