/**
 * The results of a sweep as a table that fits the page: one row per grid point; the varied
 * parameters stay pinned at the left while the measures scroll; a column chooser shows or
 * hides the rest; theory headers are readable, and their tooltips say which theory (mean-field
 * or exact at finite N); every ± says whether it is a standard deviation or a standard error.
 */
import { h, uid } from './dom.js'
import { formatGridValue, formatValue } from './format.js'
import { parameterName } from './labels.js'
import { theoryKind, theoryName, theoryTooltip } from './theory-names.js'
import type { ResultRow, SweepResult } from './types.js'

/** Rows shown before "show all": long tables stay quick to render and to scroll past. */
const FIRST_ROWS = 60

interface Column {
  key: string
  head: string
  title?: string
  /** Stays at the left while the table scrolls sideways. */
  pinned?: boolean
  /** Shown until the reader hides it in the chooser. */
  shown: boolean
  group: 'grid' | 'measure' | 'theory'
  cell: (row: ResultRow) => string
}

const plusMinus = (mean: number | null, spread: number | null, digits = 3): string =>
  mean === null ? '–' : `${formatValue(mean, digits)} ± ${formatValue(spread, 2)}`

export function columnsOf (result: SweepResult): Column[] {
  const varied = Object.keys(result.rows[0]?.values ?? {})
  const columns: Column[] = varied.map((path) => ({ key: `grid:${path}`, head: parameterName(path), pinned: true, shown: true, group: 'grid', cell: (row) => formatGridValue(row.values[path], 6) }))
  if (!varied.includes('neurons')) columns.push({ key: 'neurons', head: 'N', title: 'neurons', shown: true, group: 'grid', cell: (row) => String(row.params.neurons) })
  if (!varied.includes('patterns')) columns.push({ key: 'patterns', head: 'P', title: 'stored patterns', shown: true, group: 'grid', cell: (row) => String(row.params.patterns) })
  columns.push(
    { key: 'alpha', head: 'α = P/N', title: 'realised load', shown: true, group: 'grid', cell: (row) => formatValue(row.params.alpha, 4) },
    { key: 'trials', head: 'trials', shown: true, group: 'measure', cell: (row) => String(row.summary.trials) },
    {
      key: 'success',
      head: 'success rate [95 % CI]',
      title: 'fraction of trials whose final overlap reached the success threshold, with the Wilson 95 % score interval',
      shown: true,
      group: 'measure',
      cell: (row) => {
        const { rate, low, high } = row.summary.success
        return low === null || high === null ? formatValue(rate) : `${formatValue(rate)} [${formatValue(low)}, ${formatValue(high)}]`
      }
    },
    { key: 'overlap-sd', head: 'final overlap ± SD', title: 'mean final overlap with the cued pattern ± one standard deviation of single trials (SD)', shown: true, group: 'measure', cell: (row) => plusMinus(row.summary.overlap.mean, row.summary.overlap.sd) },
    { key: 'overlap-se', head: 'final overlap ± SE', title: 'mean final overlap ± one standard error of the mean (SE = SD/√trials)', shown: false, group: 'measure', cell: (row) => plusMinus(row.summary.overlap.mean, row.summary.overlap.se, 4) },
    { key: 'sweeps', head: 'sweeps ± SE', title: 'mean number of sweeps until the dynamics stopped ± one standard error of the mean (SE)', shown: true, group: 'measure', cell: (row) => plusMinus(row.summary.sweeps.mean, row.summary.sweeps.se) },
    { key: 'other', head: 'largest other overlap ± SD', title: 'mean largest overlap with a pattern other than the cued one ± one standard deviation of single trials (SD)', shown: false, group: 'measure', cell: (row) => plusMinus(row.summary.maxOtherOverlap.mean, row.summary.maxOtherOverlap.sd) },
    { key: 'energy', head: 'energy per neuron ± SE', title: 'mean final energy per neuron ± one standard error of the mean (SE)', shown: false, group: 'measure', cell: (row) => plusMinus(row.summary.energy.mean, row.summary.energy.se, 4) },
    {
      key: 'target',
      head: 'ended at cue',
      title: 'fraction of trials whose final state is the cued pattern',
      shown: true,
      group: 'measure',
      cell: (row) => row.summary.trials === 0 ? '–' : formatValue((row.summary.endStates.target ?? 0) / row.summary.trials)
    })
  const theoryNames = [...new Set(result.rows.flatMap((row) => Object.keys(row.theory)))].sort()
  for (const name of theoryNames) {
    const kind = theoryKind(name)
    columns.push({
      key: `theory:${name}`,
      head: `${theoryName(name)} (${kind === 'mean-field' ? 'MF' : kind === 'exact finite-N' ? 'exact N' : 'def.'})`,
      title: theoryTooltip(name),
      shown: kind !== 'definition',
      group: 'theory',
      cell: (row) => formatValue(row.theory[name] ?? null, 4)
    })
  }
  return columns
}

/** Sets each pinned column's left offset to the widths of the pinned columns before it. */
function pinColumns (table: HTMLTableElement): void {
  const head = table.tHead?.rows[0]
  if (head === undefined) return
  let left = 0
  const offsets: number[] = []
  for (const cell of Array.from(head.cells)) {
    if (!cell.classList.contains('pinned')) break
    offsets.push(left)
    left += cell.getBoundingClientRect().width
  }
  for (const row of Array.from(table.rows)) {
    offsets.forEach((offset, index) => {
      const cell = row.cells[index]
      if (cell !== undefined) cell.style.left = `${offset}px`
    })
  }
}

export function resultsTable (result: SweepResult): HTMLElement {
  const columns = columnsOf(result)
  const body = h('tbody')
  const head = h('tr', {}, columns.map((column) => h('th', {
    scope: 'col',
    class: [column.pinned === true ? 'pinned' : '', `col-${column.group}`].join(' ').trim(),
    title: column.title ?? null,
    'data-col': column.key
  }, column.head)))
  let shownRows = FIRST_ROWS
  const renderRows = (): void => {
    body.replaceChildren(...result.rows.slice(0, shownRows).map((row) =>
      h('tr', {}, columns.map((column, index) => h(index === 0 ? 'th' : 'td', {
        ...(index === 0 ? { scope: 'row' } : {}),
        class: [column.pinned === true ? 'pinned' : '', `col-${column.group}`].join(' ').trim(),
        'data-col': column.key
      }, column.cell(row))))))
    applyVisibility()
  }
  const table = h('table', { class: 'results' },
    h('caption', {}, `${result.rows.length} grid point${result.rows.length === 1 ? '' : 's'}. SD: standard deviation of single trials; SE: standard error of the mean; MF: mean-field theory (N → ∞); exact N: exact at this N. Hover a column head for its meaning.`),
    h('thead', {}, head),
    body)

  function applyVisibility (): void {
    const hidden = new Set(columns.filter((column) => !column.shown).map((column) => column.key))
    for (const cell of Array.from(table.querySelectorAll<HTMLElement>('[data-col]'))) cell.hidden = hidden.has(cell.dataset.col ?? '')
    requestAnimationFrame(() => pinColumns(table))
  }

  const choices = columns.filter((column) => column.pinned !== true).map((column) => {
    const id = uid('col')
    const box = h('input', {
      type: 'checkbox',
      id,
      checked: column.shown,
      onchange: () => {
        column.shown = box.checked
        count.textContent = countText()
        applyVisibility()
      }
    })
    return h('li', { class: `choice-${column.group}` }, box, h('label', { for: id, title: column.title ?? null }, column.head))
  })
  const countText = (): string => `Columns: ${columns.filter((column) => column.shown).length} of ${columns.length}`
  const count = h('span', {}, countText())
  const chooser = h('details', { class: 'column-chooser' }, h('summary', {}, count), h('ul', {}, choices))

  renderRows()
  const wrap = h('div', { class: 'table-wrap results-wrap', tabindex: 0, role: 'region', 'aria-label': 'Results table (scrolls sideways; the grid columns stay in place)' }, table)
  new ResizeObserver(() => pinColumns(table)).observe(table)
  const parts: HTMLElement[] = [chooser, wrap]
  if (result.rows.length > FIRST_ROWS) {
    const all = h('button', {
      type: 'button',
      class: 'secondary',
      onclick: () => { shownRows = result.rows.length; renderRows(); all.remove() }
    }, `Show all ${result.rows.length} rows`)
    parts.push(all)
  }
  return h('div', { class: 'results-block' }, parts)
}
