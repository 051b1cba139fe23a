/**
 * Curves for the page's own figures (the comparison overlay): result rows → series of points
 * with error bars, and axis ticks. Pure: no DOM.
 */
import { formatGridValue } from './format.js'
import { parameterName } from './labels.js'
import { axisSymbol } from './model-line.js'
import type { ResultRow, SweepResult } from './types.js'

export interface CurvePoint {
  x: number
  y: number
  /** Ends of the error bar, when known. */
  low: number | null
  high: number | null
}

export interface Curve {
  name: string
  points: CurvePoint[]
}

/**
 * The value of a measure at one row, with its error bar: Wilson 95 % interval for the success
 * rate (as the results give it), ± one standard error for means. Null when not measured.
 */
export function measureAt (row: Pick<ResultRow, 'summary'>, measure: string): { y: number, low: number | null, high: number | null } | null {
  const s = row.summary
  const mean = (m: { mean: number | null, se: number | null }): { y: number, low: number | null, high: number | null } | null =>
    m.mean === null ? null : { y: m.mean, low: m.se === null ? null : m.mean - m.se, high: m.se === null ? null : m.mean + m.se }
  switch (measure) {
    case 'success':
      return s.success.rate === null ? null : { y: s.success.rate, low: s.success.low, high: s.success.high }
    case 'overlap': return mean(s.overlap)
    case 'sweeps': return mean(s.sweeps)
    case 'maxOtherOverlap': return mean(s.maxOtherOverlap)
    case 'energy': return mean(s.energy)
    case 'endState': {
      const target = s.endStates.target ?? 0
      return s.trials === 0 ? null : { y: target / s.trials, low: null, high: null }
    }
    case 'unstableFraction':
    case 'fixedPatternFraction': {
      const v = s.stability?.[measure] ?? null
      return v === null ? null : { y: v, low: null, high: null }
    }
    default:
      return null
  }
}

/** The varied parameters of a result (the keys of its rows' values), in grid order. */
export function variedOf (result: SweepResult): string[] {
  return Object.keys(result.rows[0]?.values ?? {})
}

/**
 * One curve per sweep and per combination of its other varied parameters, x ascending.
 * A sweep that does not vary `x` contributes nothing (the caller says so).
 */
export function curvesOf (results: ReadonlyArray<{ name: string, result: SweepResult }>, measure: string, x: string): Curve[] {
  const curves: Curve[] = []
  for (const { name, result } of results) {
    if (!variedOf(result).includes(x)) continue
    const groups = new Map<string, Curve>()
    for (const row of result.rows) {
      const xValue = row.values[x]
      const value = measureAt(row, measure)
      if (typeof xValue !== 'number' || value === null) continue
      const others = Object.entries(row.values).filter(([path]) => path !== x)
      const key = others.map(([path, v]) => `${path}=${v}`).join(',')
      let curve = groups.get(key)
      if (curve === undefined) {
        const detail = others.map(([path, v]) => `${parameterName(path)} ${formatGridValue(v, 4)}`).join(', ')
        curve = { name: detail === '' ? name : `${name} · ${detail}`, points: [] }
        groups.set(key, curve)
        curves.push(curve)
      }
      curve.points.push({ x: xValue, ...value })
    }
    for (const curve of groups.values()) curve.points.sort((a, b) => a.x - b.x)
  }
  return curves
}

/** About `count` round tick values (1, 2 or 5 × 10^k apart) covering [min, max]. */
export function linearTicks (min: number, max: number, count = 5): number[] {
  if (!Number.isFinite(min) || !Number.isFinite(max)) return []
  if (min === max) return [min]
  const raw = (max - min) / Math.max(1, count)
  const power = 10 ** Math.floor(Math.log10(raw))
  const step = [1, 2, 5, 10].map((m) => m * power).find((candidate) => candidate >= raw) ?? 10 * power
  const ticks: number[] = []
  for (let i = Math.ceil(min / step - 1e-9); i * step <= max + step * 1e-9; i++) {
    ticks.push(Number((i * step).toPrecision(12)))
  }
  return ticks
}

/** Powers of ten in [min, max] (both positive); with fewer than two, the 2 and 5 multiples too. */
export function logTicks (min: number, max: number): number[] {
  if (!(min > 0) || !(max > 0)) return []
  const decades: number[] = []
  for (let k = Math.floor(Math.log10(min)); k <= Math.ceil(Math.log10(max)); k++) decades.push(k)
  const pick = (multipliers: number[]): number[] => decades
    .flatMap((k) => multipliers.map((m) => Number((m * 10 ** k).toPrecision(12))))
    .filter((v) => v >= min * (1 - 1e-9) && v <= max * (1 + 1e-9))
  const powers = pick([1])
  return powers.length >= 2 ? powers : pick([1, 2, 5])
}

/** The range a set of curves spans, error bars included; null when they hold no point. */
export function extentOf (curves: readonly Curve[], axis: 'x' | 'y'): [number, number] | null {
  let low = Infinity
  let high = -Infinity
  for (const curve of curves) {
    for (const p of curve.points) {
      const values = axis === 'x' ? [p.x] : [p.y, p.low, p.high]
      for (const v of values) {
        if (v === null || !Number.isFinite(v)) continue
        low = Math.min(low, v)
        high = Math.max(high, v)
      }
    }
  }
  return low <= high ? [low, high] : null
}

/**
 * A sweep's main curve for the list's thumbnail: recall success against the varied parameter
 * with the most values, one line per value of the others (at most four).
 */
export interface Thumbnail {
  x: string
  xMin: number
  xMax: number
  /** Points (x, success rate) per line, x ascending. */
  lines: Array<Array<[number, number]>>
}

const MAX_LINES = 4

/** The thumbnail's data, or null when the result has no curve (one point, a threshold search). Pure. */
export function thumbnailOf (result: SweepResult): Thumbnail | null {
  const rows = result.rows
  if (rows.length < 2) return null
  const paths = Object.keys(rows[0]?.values ?? {})
  let x: string | null = null
  let most = 1
  for (const path of paths) {
    const distinct = new Set(rows.map((row) => row.values[path]))
    if ([...distinct].every((value) => typeof value === 'number') && distinct.size > most) { x = path; most = distinct.size }
  }
  if (x === null) return null
  const xPath = x
  const groups = new Map<string, Array<[number, number]>>()
  for (const row of rows) {
    const rate = row.summary.success.rate
    if (rate === null) continue
    const key = paths.filter((path) => path !== xPath).map((path) => String(row.values[path])).join('|')
    const line = groups.get(key) ?? []
    line.push([row.values[xPath] as number, rate])
    groups.set(key, line)
  }
  const lines = [...groups.values()].slice(0, MAX_LINES).map((line) => line.sort((a, b) => a[0] - b[0]))
  const xs = lines.flat().map(([value]) => value)
  if (xs.length < 2) return null
  return { x: xPath, xMin: Math.min(...xs), xMax: Math.max(...xs), lines }
}

/** What the thumbnail shows, in a few characters: "success vs α". */
export function thumbnailCaption (thumb: Thumbnail): string {
  return `success vs ${axisSymbol(thumb.x)}`
}
