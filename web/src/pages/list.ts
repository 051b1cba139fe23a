/**
 * All sweeps, newest first: status, owner, submission time and live progress, with a status
 * filter, cancel, and a selection of finished sweeps to compare.
 */
import { ApiProblem, cancelSweep, followSweep, listSweeps, TERMINAL } from '../api.js'
import { fill, h } from '../dom.js'
import { formatAgo, formatStamp } from '../format.js'
import type { Dispose } from '../main.js'
import { routeHref } from '../router.js'
import { STATUS_NAMES, type SweepStatus, type SweepStatusName } from '../types.js'
import { inBackground, confirmAction, messageOf, notify, progressView, statusBadge, statusWord, type ProgressView } from '../widgets.js'

/** Event streams the list keeps open at once: browsers allow about six connections per server. */
const MAX_STREAMS = 3
/** How often the list itself is re-read, to show sweeps submitted elsewhere. */
const REFRESH_MS = 8000
const PAGE_SIZE = 25

interface Row {
  status: SweepStatus
  tr: HTMLTableRowElement
  progress: ProgressView
  statusCell: HTMLTableCellElement
  actionCell: HTMLTableCellElement
  stream: AbortController | null
}

let rememberedFilter: SweepStatusName | null = null

export function renderList (main: HTMLElement): Dispose {
  const stop = new AbortController()
  const rows = new Map<string, Row>()
  const selected = new Set<string>()
  let filter = rememberedFilter
  let cursor: string | null = null
  let showOwner = false

  const body = h('tbody')
  const ownerHead = h('th', { scope: 'col', class: 'col-owner', hidden: true }, 'Owner')
  const table = h('table', { class: 'sweeps' },
    h('caption', { class: 'visually-hidden' }, 'Sweeps, newest first'),
    h('thead', {}, h('tr', {},
      h('th', { scope: 'col', class: 'col-pick' }, h('span', { class: 'visually-hidden' }, 'Pick to compare')),
      h('th', { scope: 'col' }, 'Sweep'),
      h('th', { scope: 'col' }, 'Status'),
      ownerHead,
      h('th', { scope: 'col' }, 'Submitted'),
      h('th', { scope: 'col', class: 'col-progress' }, 'Progress'),
      h('th', { scope: 'col', class: 'col-actions' }, h('span', { class: 'visually-hidden' }, 'Actions')))),
    body)
  const empty = h('p', { class: 'empty', hidden: true })
  const more = h('button', { type: 'button', class: 'secondary', hidden: true, onclick: () => { inBackground(load(false)) } }, 'Show older sweeps')
  const problem = h('p', { class: 'page-error', role: 'alert', hidden: true })
  const compareLink = h('a', { class: 'button secondary', href: '#/compare', 'aria-disabled': 'true' }, 'Compare selected')
  const compareHint = h('span', { class: 'hint', id: 'compare-hint' }, 'Tick two or more finished sweeps to compare them.')

  const filterSelect = h('select', {
    id: 'status-filter',
    onchange: () => {
      filter = filterSelect.value === '' ? null : filterSelect.value as SweepStatusName
      rememberedFilter = filter
      inBackground(load(true))
    }
  },
  h('option', { value: '' }, 'all statuses'),
  STATUS_NAMES.map((name) => h('option', { value: name, selected: name === filter }, statusWord(name))))

  main.append(
    h('div', { class: 'page-head' },
      h('h1', {}, 'Sweeps'),
      h('a', { class: 'button primary', href: '#/new' }, 'New sweep')),
    h('div', { class: 'toolbar' },
      h('div', { class: 'control' }, h('label', { for: 'status-filter' }, 'Show'), filterSelect),
      h('div', { class: 'compare-bar' }, compareHint, compareLink)),
    problem,
    h('div', { class: 'table-wrap' }, table),
    empty,
    h('div', { class: 'list-foot' }, more))

  const updateCompare = (): void => {
    const ids = [...selected]
    const ready = ids.length >= 2
    compareLink.setAttribute('aria-disabled', String(!ready))
    compareLink.href = ready ? routeHref({ page: 'compare', ids }) : '#/compare'
    compareHint.textContent = ready ? `${ids.length} finished sweeps picked.` : 'Tick two or more finished sweeps to compare them.'
  }

  const openStreams = (): void => {
    let open = [...rows.values()].filter((r) => r.stream !== null).length
    for (const row of rows.values()) {
      if (open >= MAX_STREAMS) break
      if (row.stream !== null || TERMINAL.has(row.status.status)) continue
      const controller = new AbortController()
      stop.signal.addEventListener('abort', () => controller.abort(), { once: true })
      row.stream = controller
      open++
      followSweep(row.status.id, (status) => updateRow(row, status), controller.signal)
        .catch(() => undefined)
        .finally(() => {
          row.stream = null
          if (!stop.signal.aborted) openStreams()
        })
    }
  }

  const actionsFor = (row: Row): Node[] => {
    const { status } = row
    if (TERMINAL.has(status.status)) return []
    const label = status.label ?? status.id
    return [h('button', {
      type: 'button',
      class: 'small danger-outline',
      'aria-label': `Cancel ${label}`,
      onclick: async () => {
        const sure = await confirmAction({
          title: 'Cancel this sweep?',
          body: `“${label}” stops within about a second. Trials already run are not kept, and there will be no results.`,
          confirm: 'Cancel sweep',
          keep: 'Keep it running'
        })
        if (!sure) return
        try {
          updateRow(row, await cancelSweep(status.id))
          notify(`Canceled “${label}”.`)
        } catch (error) {
          notify(`Could not cancel: ${messageOf(error)}`, 'error')
        }
      }
    }, 'Cancel')]
  }

  const pickFor = (status: SweepStatus): Node => {
    const label = status.label ?? status.id
    if (status.status !== 'succeeded') return h('span', { class: 'visually-hidden' }, 'not finished')
    return h('input', {
      type: 'checkbox',
      'aria-label': `Pick “${label}” to compare`,
      checked: selected.has(status.id),
      onchange: (event: Event) => {
        if ((event.target as HTMLInputElement).checked) selected.add(status.id)
        else selected.delete(status.id)
        updateCompare()
      }
    })
  }

  function updateRow (row: Row, status: SweepStatus): void {
    const changed = row.status.status !== status.status
    row.status = status
    row.progress.update(status)
    row.tr.dataset.status = status.status
    if (changed) {
      fill(row.statusCell, statusBadge(status.status))
      fill(row.actionCell, ...actionsFor(row))
      fill(row.tr.cells[0] as HTMLTableCellElement, pickFor(status))
    }
  }

  const buildRow = (status: SweepStatus): Row => {
    const label = status.label ?? 'Untitled sweep'
    const progress = progressView(label, true)
    const statusCell = h('td', {}, statusBadge(status.status))
    const actionCell = h('td', { class: 'col-actions' })
    const tr = h('tr', { 'data-id': status.id, 'data-status': status.status },
      h('td', { class: 'col-pick' }, pickFor(status)),
      h('td', { class: 'col-label' },
        h('a', { href: routeHref({ page: 'sweep', id: status.id }) }, label),
        h('div', { class: 'sub' }, h('code', {}, status.id.slice(0, 8)))),
      statusCell,
      h('td', { class: 'col-owner', hidden: !showOwner }, status.owner ?? '–'),
      h('td', { class: 'col-time' }, h('span', { class: 'narrow-only' }, 'submitted '), h('time', { datetime: status.createdAt, title: formatStamp(status.createdAt) }, formatAgo(status.createdAt, Date.now()))),
      h('td', { class: 'col-progress' }, progress.el),
      actionCell)
    const row: Row = { status, tr, progress, statusCell, actionCell, stream: null }
    progress.update(status)
    fill(actionCell, ...actionsFor(row))
    return row
  }

  const setOwnerColumn = (items: SweepStatus[]): void => {
    if (!items.some((item) => item.owner !== null) || showOwner) return
    showOwner = true
    ownerHead.hidden = false
    for (const cell of table.querySelectorAll<HTMLElement>('td.col-owner')) cell.hidden = false
  }

  let loading = false
  async function load (reset: boolean): Promise<void> {
    if (loading) return
    loading = true
    try {
      const page = await listSweeps({ status: filter, cursor: reset ? null : cursor, limit: PAGE_SIZE }, stop.signal)
      problem.hidden = true
      if (reset) {
        for (const row of rows.values()) row.stream?.abort()
        rows.clear()
        body.replaceChildren()
      }
      setOwnerColumn(page.items)
      for (const status of page.items) {
        const known = rows.get(status.id)
        if (known !== undefined) { updateRow(known, status); continue }
        const row = buildRow(status)
        rows.set(status.id, row)
        body.append(row.tr)
      }
      cursor = page.nextCursor
      more.hidden = cursor === null
      empty.hidden = rows.size > 0
      table.hidden = rows.size === 0
      fill(empty, filter === null
        ? ['No sweeps yet. ', h('a', { href: '#/new' }, 'Start one from an example'), '.']
        : [`No ${statusWord(filter)} sweeps.`])
      openStreams()
    } catch (error) {
      if (stop.signal.aborted) return
      problem.hidden = false
      problem.textContent = error instanceof ApiProblem && error.status === 401
        ? 'The sweeps are only shown with a valid access token.'
        : `Could not load the sweeps: ${messageOf(error)}`
    } finally {
      loading = false
    }
  }

  /** Re-reads the first page: new sweeps go on top, known ones are updated. */
  async function refresh (): Promise<void> {
    if (loading || document.hidden) return
    try {
      const page = await listSweeps({ status: filter, limit: PAGE_SIZE }, stop.signal)
      setOwnerColumn(page.items)
      for (const status of [...page.items].reverse()) {
        const known = rows.get(status.id)
        if (known !== undefined) { updateRow(known, status); continue }
        const row = buildRow(status)
        rows.set(status.id, row)
        body.prepend(row.tr)
      }
      empty.hidden = rows.size > 0
      table.hidden = rows.size === 0
      openStreams()
    } catch {
      // The next refresh tries again; a lasting problem shows on the next full load.
    }
  }

  const ticker = setInterval(() => {
    const now = Date.now()
    for (const row of rows.values()) row.progress.tick(now)
  }, 1000)
  const refresher = setInterval(() => { inBackground(refresh()) }, REFRESH_MS)
  updateCompare()
  inBackground(load(true))

  return () => {
    stop.abort()
    clearInterval(ticker)
    clearInterval(refresher)
  }
}
