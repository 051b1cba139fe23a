/** The results of a sweep as a table: one row per grid point, the main measures with their uncertainty. */
import { h } from './dom.js'
import { formatGridValue, formatValue } from './format.js'
import { parameterName } from './labels.js'
import type { ResultRow, SweepResult } from './types.js'

/** Rows shown before "show all": long tables stay quick to render and to scroll past. */
const FIRST_ROWS = 60

interface Column {
  head: string
  title?: string
  cell: (row: ResultRow) => string
}

function columnsOf (result: SweepResult): Column[] {
  const varied = Object.keys(result.rows[0]?.values ?? {})
  const columns: Column[] = varied.map((path) => ({ head: parameterName(path), cell: (row) => formatGridValue(row.values[path], 6) }))
  if (!varied.includes('neurons')) columns.push({ head: 'N', title: 'neurons', cell: (row) => String(row.params.neurons) })
  if (!varied.includes('patterns')) columns.push({ head: 'P', title: 'stored patterns', cell: (row) => String(row.params.patterns) })
  columns.push(
    { head: 'α = P/N', title: 'realised load', cell: (row) => formatValue(row.params.alpha, 4) },
    { head: 'trials', cell: (row) => String(row.summary.trials) },
    {
      head: 'success rate',
      title: 'fraction of trials whose final overlap reached the success threshold, with the Wilson 95 % interval',
      cell: (row) => {
        const { rate, low, high } = row.summary.success
        return low === null || high === null ? formatValue(rate) : `${formatValue(rate)} [${formatValue(low)}, ${formatValue(high)}]`
      }
    },
    {
      head: 'final overlap',
      title: 'mean final overlap with the cued pattern ± standard deviation over trials',
      cell: (row) => `${formatValue(row.summary.overlap.mean)} ± ${formatValue(row.summary.overlap.sd, 2)}`
    },
    { head: 'sweeps', title: 'mean number of sweeps until the dynamics stopped', cell: (row) => formatValue(row.summary.sweeps.mean) },
    {
      head: 'ended at cue',
      title: 'fraction of trials whose final state is the cued pattern',
      cell: (row) => row.summary.trials === 0 ? '–' : formatValue((row.summary.endStates.target ?? 0) / row.summary.trials)
    })
  const theoryNames = [...new Set(result.rows.flatMap((row) => Object.keys(row.theory)))].sort()
  for (const name of theoryNames) {
    columns.push({ head: `theory: ${name}`, title: 'mean-field theory value where it applies', cell: (row) => formatValue(row.theory[name] ?? null, 4) })
  }
  return columns
}

export function resultsTable (result: SweepResult): HTMLElement {
  const columns = columnsOf(result)
  const body = h('tbody')
  const renderRows = (count: number): void => {
    body.replaceChildren(...result.rows.slice(0, count).map((row) =>
      h('tr', {}, columns.map((column, index) => index === 0
        ? h('th', { scope: 'row' }, column.cell(row))
        : h('td', {}, column.cell(row))))))
  }
  renderRows(FIRST_ROWS)
  const table = h('table', { class: 'results' },
    h('caption', {}, `${result.rows.length} grid point${result.rows.length === 1 ? '' : 's'}. Hover a column head for its meaning.`),
    h('thead', {}, h('tr', {}, columns.map((column) => h('th', { scope: 'col', title: column.title ?? null }, column.head)))),
    body)
  const wrap = h('div', { class: 'table-wrap results-wrap', tabindex: 0, role: 'region', 'aria-label': 'Results table (scrolls sideways)' }, table)
  if (result.rows.length <= FIRST_ROWS) return wrap
  const all = h('button', {
    type: 'button',
    class: 'secondary',
    onclick: () => { renderRows(result.rows.length); all.remove() }
  }, `Show all ${result.rows.length} rows`)
  return h('div', {}, wrap, all)
}
