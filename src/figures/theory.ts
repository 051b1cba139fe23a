/**
 * Theory beside the simulations. Which theory applies is decided where it is computed: a
 * row carries a theory value only when the model matches its assumptions (theoryForPoint).
 * When every row of a series carries one and x is the variable of the closed form (load,
 * temperature, cue fraction), the curve is drawn densely from the theory function over the
 * series' x range; otherwise the rows' own values are joined by a line. Critical loads
 * (x = load) and retrieval temperatures (x = temperature) are vertical reference lines.
 */
import {
  crosstalkErrorGaussian, curieWeissOverlap, firstParallelStep, rsCriticalLoad, rsRetrievalOverlap, type PointParams
} from '../engine/index.js'
import { pointAt, type VariedPath } from '../spec/index.js'
import { type ResultRow, type SweepResult } from '../results/index.js'
import { formatValue } from './labels.js'
import type { FigureMeasure, FigureOptions } from './options.js'
import type { PlotSeries } from './series.js'

export type TheoryKind = 'curve' | 'per-point' | 'reference'

export interface TheoryOverlay {
  /** Theory name as in the result rows (retrievalOverlapRS, criticalLoad, …). */
  key: string
  kind: TheoryKind
  /** Legend label (may hold `_{…}` subscripts). */
  label: string
  /** The label without the series it names, when it names some. */
  baseLabel?: string
  /** The series it applies to. */
  series: number[]
  /** Curves and per-point lines, in data coordinates; a new segment after each gap or jump. */
  segments: Array<Array<readonly [number, number]>>
  /** Reference lines: the x position. */
  at: number | null
  /** Reference lines: the short text written beside the line (`α_{c} = 0.138`). */
  annotation?: string
  /** A band drawn under the line, from low to high in y (an interval of the value the line marks). */
  band?: { low: number, high: number }
  /** A reference line across the plot at a y value (its one segment), not a vertical one at `at`. */
  horizontal?: boolean
}

/** Samples of a dense curve over the full x range. */
export const CURVE_SAMPLES = 240

interface ClosedForm {
  f: (x: number) => number
  /** x values where the function jumps or has a kink: segments end there exactly. */
  breaks: number[]
}

const DENSE_KEYS: Partial<Record<FigureMeasure, string[]>> = {
  overlap: ['retrievalOverlapRS', 'curieWeissOverlap', 'firstStepOverlap'],
  unstableFraction: ['crosstalkErrorGaussian']
}

const PER_POINT_KEYS: Partial<Record<FigureMeasure, string[]>> = {
  // firstStepOverlapExact: the name of the tie-keeping value in results made before both tie rules were given.
  overlap: ['retrievalOverlapRS', 'curieWeissOverlap', 'firstStepOverlap', 'firstStepOverlapExactTiesKeep', 'firstStepOverlapExact', 'mixtureOverlap'],
  unstableFraction: ['crosstalkErrorGaussian', 'crosstalkErrorExact']
}

/** Measures for which the critical load marks where retrieval should fail. */
const REFERENCE_MEASURES = new Set<FigureMeasure>(['success', 'overlap', 'endState'])

/** The one-step keys describe the state after the first parallel step only. */
const FIRST_STEP_KEYS = new Set(['firstStepOverlap', 'firstStepOverlapExactTiesKeep', 'firstStepOverlapExact'])

const LABELS: Record<string, string> = {
  retrievalOverlapRS: 'Replica-symmetric theory',
  curieWeissOverlap: 'Mean field, α → 0: m = tanh(m/T)',
  firstStepOverlap: 'First parallel step (N → ∞)',
  firstStepOverlapExactTiesKeep: 'First parallel step, exact at this N',
  firstStepOverlapExact: 'First parallel step, exact at this N',
  mixtureOverlap: 'Symmetric mixture state (α → 0)',
  crosstalkErrorGaussian: 'Crosstalk error, Gaussian (N → ∞)',
  crosstalkErrorExact: 'Crosstalk error, exact at this N'
}

/**
 * Retrieval overlaps are positive wherever the retrieval state exists; a row's 0 stands for
 * the states left past the retrieval boundary (spin glass, paramagnet), so the line breaks there
 * instead of running along zero.
 */
const NO_SOLUTION_AT_ZERO = new Set(['retrievalOverlapRS'])

const isNumber = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v)

// MAIN //

export function planTheory (
  series: readonly PlotSeries[],
  results: readonly SweepResult[],
  x: VariedPath,
  options: FigureOptions
): TheoryOverlay[] {
  if (!options.theory) return []
  const overlays: TheoryOverlay[] = []
  for (const s of series) {
    if (s.rows.length === 0) continue
    const spec = results[s.sweep]!.spec
    const params = pointAt(spec, s.rows[0]!.point).params
    const oneStep = s.rows.every((row) => pointAt(spec, row.point).params.dynamics.maxSweeps === 1)
    const drawn = new Set<string>()
    for (const key of DENSE_KEYS[options.measure] ?? []) {
      if (FIRST_STEP_KEYS.has(key) && !oneStep) continue
      if (!denseApplies(key, s.rows, spec, x)) continue
      const form = closedForm(key, x, params)
      if (form === null) continue
      const xs = s.rows.map((row) => row.values[x] as number)
      overlays.push({ key, kind: 'curve', label: LABELS[key]!, series: [s.index], segments: sample(form, Math.min(...xs), Math.max(...xs), options.xScale, options.yScale), at: null })
      drawn.add(key)
    }
    for (const key of PER_POINT_KEYS[options.measure] ?? []) {
      if (drawn.has(key) || (FIRST_STEP_KEYS.has(key) && !oneStep)) continue
      const segments = perPointSegments(s.rows, key, x, options.yScale)
      if (segments.reduce((n, seg) => n + seg.length, 0) < 2) continue
      overlays.push({ key, kind: 'per-point', label: LABELS[key] ?? key, series: [s.index], segments, at: null })
    }
    if (REFERENCE_MEASURES.has(options.measure)) {
      const reference = criticalLoadLine(s.rows, x, params) ?? retrievalTemperatureLine(s.rows, x)
      if (reference !== null) overlays.push({ ...reference, series: [s.index], segments: [] })
    }
  }
  return labelDistinct(merge(overlays), series)
}

/** Whether the rows say the theory behind `key` holds along the whole series. */
function denseApplies (key: string, rows: readonly ResultRow[], spec: SweepResult['spec'], x: VariedPath): boolean {
  if (key === 'curieWeissOverlap') {
    // The rows at T = 0 carry the T = 0 theory instead; the curve still starts at m = 1 there.
    const hot = rows.filter((row) => pointAt(spec, row.point).params.dynamics.temperature > 0)
    return x === 'dynamics.temperature' && hot.length > 0 && hot.every((row) => isNumber(row.theory[key]))
  }
  return rows.every((row) => isNumber(row.theory[key]))
}

function closedForm (key: string, x: VariedPath, p: PointParams): ClosedForm | null {
  const selfCoupling = 'selfCoupling' in p.rule && p.rule.selfCoupling
  // Along a series N is fixed, so patterns P map to the load P/N.
  const toLoad = x === 'load' ? (v: number) => v : x === 'patterns' ? (v: number) => v / p.neurons : null
  const loadScale = x === 'patterns' ? p.neurons : 1
  switch (key) {
    case 'retrievalOverlapRS':
      // The closed form is the T = 0 branch; at T > 0 the rows' own values are joined instead.
      if (toLoad === null || p.dynamics.temperature > 0) return null
      {
        // Drawn only where the retrieval state exists: past α_c the theory has no retrieval solution (the m = 0 states left are not this curve).
        const { alphaC } = rsCriticalLoad()
        return { f: (v) => (toLoad(v) > alphaC ? NaN : rsRetrievalOverlap(toLoad(v))), breaks: [alphaC * loadScale] }
      }
    case 'curieWeissOverlap':
      return x === 'dynamics.temperature' ? { f: curieWeissOverlap, breaks: [1] } : null
    case 'firstStepOverlap': {
      if (p.cue.kind !== 'flip') return null
      const alpha = p.patterns / p.neurons
      if (x === 'cue.fraction') return { f: (v) => firstParallelStep(1 - 2 * v, alpha, { selfCoupling }), breaks: [] }
      if (toLoad === null) return null
      // The engine flips exactly round(f·N) neurons.
      const m0 = 1 - 2 * Math.round(p.cue.fraction * p.neurons) / p.neurons
      return { f: (v) => firstParallelStep(m0, toLoad(v), { selfCoupling }), breaks: [] }
    }
    case 'crosstalkErrorGaussian':
      if (toLoad === null) return null
      return { f: (v) => crosstalkErrorGaussian(toLoad(v), { selfCoupling }), breaks: [] }
    default:
      return null
  }
}

function sample (form: ClosedForm, lo: number, hi: number, xScale: 'linear' | 'log', yScale: 'linear' | 'log'): Array<Array<readonly [number, number]>> {
  if (!(hi > lo)) return []
  const log = xScale === 'log' && lo > 0
  const t = (v: number): number => (log ? Math.log(v) : v)
  const inverse = (u: number): number => (log ? Math.exp(u) : u)
  const cuts = [lo, ...form.breaks.filter((b) => b > lo && b < hi).sort((a, b) => a - b), hi]
  const segments: Array<Array<readonly [number, number]>> = []
  for (let k = 0; k + 1 < cuts.length; k++) {
    const a = cuts[k]!
    const b = cuts[k + 1]!
    const count = Math.max(8, Math.round(CURVE_SAMPLES * (t(b) - t(a)) / (t(hi) - t(lo))))
    const xs: number[] = []
    for (let i = 0; i <= count; i++) xs.push(i === 0 ? a : i === count ? b : inverse(t(a) + (t(b) - t(a)) * (i / count)))
    // Just past a jump the function takes its value on the far side.
    if (k > 0) xs[0] = a + (b - a) * 1e-9
    let current: Array<readonly [number, number]> = []
    for (const v of xs) {
      const y = form.f(v)
      if (!isNumber(y) || (yScale === 'log' && !(y > 0))) {
        if (current.length > 0) segments.push(current)
        current = []
        continue
      }
      current.push([v, y])
    }
    if (current.length > 0) segments.push(current)
  }
  return segments
}

function perPointSegments (rows: readonly ResultRow[], key: string, x: VariedPath, yScale: 'linear' | 'log'): Array<Array<readonly [number, number]>> {
  const segments: Array<Array<readonly [number, number]>> = []
  let current: Array<readonly [number, number]> = []
  for (const row of rows) {
    const y = row.theory[key]
    if (!isNumber(y) || (yScale === 'log' && !(y > 0)) || (NO_SOLUTION_AT_ZERO.has(key) && y === 0)) {
      if (current.length > 0) segments.push(current)
      current = []
      continue
    }
    current.push([row.values[x] as number, y])
  }
  if (current.length > 0) segments.push(current)
  return segments
}

function criticalLoadLine (rows: readonly ResultRow[], x: VariedPath, p: PointParams): Omit<TheoryOverlay, 'series' | 'segments'> | null {
  if (x !== 'load' && x !== 'patterns') return null
  const values = rows.map((row) => row.theory.criticalLoad)
  const first = values[0]
  if (!isNumber(first) || !values.every((v) => v === first)) return null
  const at = x === 'load' ? first : first * p.neurons
  // Lines outside the simulated range say nothing about these data.
  const xs = rows.map((row) => row.values[x] as number)
  if (at < Math.min(...xs) || at > Math.max(...xs)) return null
  const value = formatValue(Number(at.toPrecision(3)))
  return {
    key: 'criticalLoad',
    kind: 'reference',
    label: first === 1 ? 'Critical load α_{c} (pseudo-inverse rule)' : 'Critical load α_{c} (replica-symmetric)',
    at,
    annotation: x === 'load' ? `α_{c} = ${value}` : `P_{c} = ${value}`
  }
}

/**
 * At fixed load the replica-symmetric retrieval state is gone above T_M(α) (`retrievalTemperature`,
 * the same for every T > 0 row of a series; T = 0 rows do not carry it): a vertical line on a
 * temperature axis, where the series' overlap should fall.
 */
function retrievalTemperatureLine (rows: readonly ResultRow[], x: VariedPath): Omit<TheoryOverlay, 'series' | 'segments'> | null {
  if (x !== 'dynamics.temperature') return null
  const values = rows.map((row) => row.theory.retrievalTemperature).filter(isNumber)
  const first = values[0]
  if (first === undefined || !values.every((v) => v === first)) return null
  const xs = rows.map((row) => row.values[x] as number)
  if (first < Math.min(...xs) || first > Math.max(...xs)) return null
  return {
    key: 'retrievalTemperature',
    kind: 'reference',
    label: 'Retrieval temperature T_{M} (replica-symmetric)',
    at: first,
    annotation: `T_{M} = ${formatValue(Number(first.toPrecision(3)))}`
  }
}

/** Identical overlays (same theory, same numbers) are drawn once for all their series. */
function merge (overlays: readonly TheoryOverlay[]): TheoryOverlay[] {
  const bySignature = new Map<string, TheoryOverlay>()
  for (const overlay of overlays) {
    const signature = JSON.stringify([overlay.key, overlay.kind, overlay.label, overlay.at, overlay.segments])
    const existing = bySignature.get(signature)
    if (existing === undefined) bySignature.set(signature, { ...overlay, series: [...overlay.series] })
    else existing.series.push(...overlay.series)
  }
  return [...bySignature.values()]
}

/**
 * When one theory gives different lines for different series, or holds for only some of
 * them, each line names its series.
 */
function labelDistinct (overlays: TheoryOverlay[], series: readonly PlotSeries[]): TheoryOverlay[] {
  const perKey = new Map<string, number>()
  for (const o of overlays) perKey.set(`${o.key}|${o.kind}`, (perKey.get(`${o.key}|${o.kind}`) ?? 0) + 1)
  const drawn = series.filter((s) => s.points.length > 0).length
  return overlays.map((o) => {
    const partial = series.length > 1 && o.series.length < drawn
    const several = perKey.get(`${o.key}|${o.kind}`)! > 1 && o.kind !== 'reference'
    if (!partial && !several) return o
    const names = o.series.map((i) => series[i]!.label)
    return { ...o, label: `${o.label}, ${names.join('; ')}`, baseLabel: o.label }
  })
}
