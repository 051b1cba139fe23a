/**
 * The results of a threshold search (a spec with `analysis`): each search's crossing with its
 * interval, the evaluated steps drawn around the level, and the finite-size fits when asked for.
 */
import { measureAt, type Curve } from './curves.js'
import { h } from './dom.js'
import { formatCount, formatGridValue, formatValue } from './format.js'
import { measureName, parameterName } from './labels.js'
import { drawPlot } from './plot.js'
import type { ScalingRow, SearchRow, SweepResult } from './types.js'

const STOPS: Record<string, string> = {
  tolerance: 'bracket within tolerance',
  noise: 'level within the noise',
  resolution: 'finest step reached',
  'max-steps': 'step budget used',
  'no-crossing': 'no crossing in the range'
}

/** The other varied parameters of a search or fit; N has its own column. */
function describeValues (values: SearchRow['values']): string {
  const parts = Object.entries(values).filter(([path]) => path !== 'neurons').map(([path, v]) => `${parameterName(path)} ${formatGridValue(v, 4)}`)
  return parts.length === 0 ? '–' : parts.join(', ')
}

const REFERENCE_NAMES: Record<string, string> = {
  'rs-theory': 'replica-symmetric theory',
  'finite-size-simulations': 'finite-size simulations'
}

function interval (low: number | null, high: number | null): string {
  return low === null && high === null ? 'not bounded' : `[${formatValue(low, 4)}, ${formatValue(high, 4)}]`
}

function searchName (search: SearchRow): string {
  const others = describeValues(search.values)
  return others === '–' ? `N = ${search.neurons}` : `N = ${search.neurons}, ${others}`
}

function searchTable (searches: SearchRow[], parameter: string): HTMLElement {
  return h('div', { class: 'table-wrap results-wrap', tabindex: 0, role: 'region', 'aria-label': 'Threshold searches (scrolls sideways)' },
    h('table', { class: 'results' },
      h('caption', {}, `${searches.length} search${searches.length === 1 ? '' : 'es'}; the interval is the fit's confidence interval.`),
      h('thead', {}, h('tr', {},
        ['N', 'other parameters', `${parameterName(parameter)} at the crossing`, 'interval', 'stopped', 'steps', 'trials', 'note']
          .map((head) => h('th', { scope: 'col' }, head)))),
      h('tbody', {}, searches.map((search) => h('tr', {},
        h('th', { scope: 'row' }, String(search.neurons)),
        h('td', {}, describeValues(search.values)),
        h('td', {}, h('strong', {}, formatValue(search.estimate, 4))),
        h('td', {}, interval(search.low, search.high)),
        h('td', {}, STOPS[search.stoppedBy] ?? search.stoppedBy),
        h('td', {}, String(search.stepsUsed)),
        h('td', {}, formatCount(search.trialsUsed)),
        h('td', { class: 'note' }, search.note ?? ''))))))
}

function scalingTable (rows: ScalingRow[]): HTMLElement {
  return h('div', { class: 'table-wrap results-wrap', tabindex: 0, role: 'region', 'aria-label': 'Finite-size fits (scrolls sideways)' },
    h('table', { class: 'results' },
      h('caption', {}, 'Weighted least-squares fits of the crossing against N, extrapolated to N → ∞.'),
      h('thead', {}, h('tr', {},
        ['other parameters', 'form', 'limit N → ∞', 'interval', 'exponent b', 'χ² / dof', 'published values', 'note']
          .map((head) => h('th', { scope: 'col' }, head)))),
      h('tbody', {}, rows.map((row) => h('tr', {},
        h('th', { scope: 'row' }, describeValues(row.values)),
        h('td', {}, row.form === 'power' ? 'x∞ + a·N^(−b)' : 'x∞ + a/N'),
        h('td', {}, row.fit === null ? '–' : h('strong', {}, `${formatValue(row.fit.limit.value, 4)} ± ${formatValue(row.fit.limit.se, 2)}`)),
        h('td', {}, row.fit === null ? '–' : `${interval(row.fit.limitInterval.low, row.fit.limitInterval.high)} (${Math.round(row.fit.limitInterval.confidence * 100)} %)`),
        h('td', {}, row.fit === null ? '–' : `${formatValue(row.fit.exponent.value, 3)}${row.fit.exponent.se === null ? ' (fixed)' : ` ± ${formatValue(row.fit.exponent.se, 2)}`}`),
        h('td', {}, row.fit === null ? '–' : `${formatValue(row.fit.chiSquare, 3)} / ${row.fit.degreesOfFreedom}`),
        h('td', { class: 'note' }, row.references.length === 0
          ? '–'
          : row.references.map((r) => h('div', {},
            h('strong', {}, `${formatValue(r.value, 4)}${r.uncertainty === null ? '' : ` ± ${formatValue(r.uncertainty, 2)}`}`),
            ` ${REFERENCE_NAMES[r.name] ?? r.name}`,
            r.deviation === null ? '' : `, ${formatValue(r.deviation, 2)} σ away`,
            h('div', { class: 'sub' }, r.source)))),
        h('td', { class: 'note' }, row.note ?? ''))))))
}

/** The steps of every search around the level, with each crossing and its interval marked. */
function searchFigure (result: SweepResult, searches: SearchRow[], parameter: string, measure: string, level: number): HTMLElement {
  const curves: Curve[] = searches.map((search) => ({
    name: searchName(search),
    points: search.steps
      .map((step) => ({ x: step.value, value: measureAt(step, measure) }))
      .filter((p): p is { x: number, value: NonNullable<typeof p.value> } => p.value !== null)
      .map((p) => ({ x: p.x, ...p.value }))
      .sort((a, b) => a.x - b.x)
  }))
  const svg = drawPlot(curves, {
    title: String(result.spec.label ?? 'Threshold search'),
    xLabel: parameterName(parameter),
    yLabel: measureName(measure),
    xScale: 'linear',
    ...(measure === 'success' ? { yRange: [0, 1] as [number, number] } : {}),
    width: 760,
    level,
    crossings: searches.map((search, curve) => ({ curve, at: search.estimate, low: search.low, high: search.high })),
    description: `${measureName(measure)} at each evaluated value of ${parameterName(parameter)}, for ${searches.length} search(es); dotted line: the level ${level}; bands: the intervals of the crossings.`
  })
  svg.removeAttribute('width')
  svg.removeAttribute('height')
  return h('figure', { class: 'figure search-figure' }, svg,
    h('figcaption', {}, `Every value the search evaluated (error bars: ${measure === 'success' ? 'Wilson 95 % intervals' : '± one standard error'}); the dotted line is the level, each band the interval of a crossing.`))
}

export function analysisView (result: SweepResult): HTMLElement {
  const analysis = (result.spec.analysis ?? {}) as Record<string, unknown>
  const parameter = String(analysis.parameter ?? '')
  const measure = String(analysis.measure ?? 'success')
  const level = typeof analysis.level === 'number' ? analysis.level : 0.5
  const searches = result.searches ?? []
  return h('div', {},
    h('section', { class: 'panel', 'aria-labelledby': 'search-heading' },
      h('h2', { id: 'search-heading' }, `Threshold search: ${parameterName(parameter)} where ${measureName(measure)} crosses ${formatValue(level, 3)}`),
      searchTable(searches, parameter),
      searches.some((s) => s.steps.length > 0) ? searchFigure(result, searches, parameter, measure, level) : null),
    result.scaling === undefined || result.scaling.length === 0
      ? null
      : h('section', { class: 'panel', 'aria-labelledby': 'scaling-heading' },
        h('h2', { id: 'scaling-heading' }, 'Finite-size scaling'),
        scalingTable(result.scaling)))
}
