/**
 * Curves of several finished sweeps on one figure (two learning rules' capacity curves, say),
 * drawn in the browser from their results, with a picker of finished sweeps.
 */
import { getJson, getSweep, listSweeps, sweepPath } from '../api.js'
import { fill, h, uid } from '../dom.js'
import { figurePanel } from '../figure-panel.js'
import { formatStamp } from '../format.js'
import type { Dispose } from '../main.js'
import { routeHref } from '../router.js'
import type { SweepResult, SweepStatus } from '../types.js'
import { inBackground, messageOf, notify } from '../widgets.js'

interface Loaded { id: string, name: string, result: SweepResult }

/** Sweeps the overlay route draws at once (MAX_OVERLAID_SWEEPS in src/api/routes/figure.ts). */
const MAX_OVERLAID = 8

/** Names that tell the sweeps apart: the label, with a short id where labels repeat. */
function names (statuses: SweepStatus[]): string[] {
  const labels = statuses.map((s) => s.label ?? 'Untitled sweep')
  return labels.map((label, i) => labels.indexOf(label) === labels.lastIndexOf(label) ? label : `${label} (${statuses[i]?.id.slice(0, 6) ?? ''})`)
}

export function renderCompare (main: HTMLElement, ids: string[]): Dispose {
  const stop = new AbortController()
  const figureSlot = h('div', { class: 'compare-figure' })
  const pickerSlot = h('div', { class: 'picker' })
  main.append(
    h('p', { class: 'crumbs' }, h('a', { href: '#/' }, '← All sweeps')),
    h('div', { class: 'page-head' }, h('h1', {}, 'Compare sweeps')),
    h('p', { class: 'lead' }, 'The curves of two or more finished sweeps on one figure (two learning rules\' capacity curves, say), for the measure and x axis you choose. Each curve has its own marker and line style, so the figure also reads in print.'),
    figureSlot,
    h('section', { class: 'panel', 'aria-labelledby': 'picker-heading' }, h('h2', { id: 'picker-heading' }, 'Sweeps to compare'), pickerSlot))

  const renderPicker = async (): Promise<void> => {
    fill(pickerSlot, h('p', { class: 'loading' }, 'Loading finished sweeps…'))
    try {
      const page = await listSweeps({ status: 'succeeded', limit: 100 }, stop.signal)
      const chosen = new Set(ids)
      if (page.items.length === 0) {
        fill(pickerSlot, h('p', {}, 'No finished sweeps yet. ', h('a', { href: '#/new' }, 'Submit one'), '.'))
        return
      }
      const boxes = page.items.map((item) => {
        const box = h('input', { type: 'checkbox', value: item.id, checked: chosen.has(item.id), id: uid('pick') })
        return { box, row: h('li', {}, box, h('label', { for: box.id }, item.label ?? 'Untitled sweep', ' ', h('span', { class: 'sub' }, `${formatStamp(item.createdAt)} · ${item.progress.pointsTotal} points`))) }
      })
      const go = h('button', {
        type: 'button',
        class: 'primary',
        onclick: () => {
          const picked = boxes.filter((b) => b.box.checked).map((b) => b.box.value)
          if (picked.length < 2) { notify('Pick at least two sweeps.', 'error'); return }
          location.hash = routeHref({ page: 'compare', ids: picked })
        }
      }, ids.length >= 2 ? 'Update the comparison' : 'Compare')
      fill(pickerSlot, h('ul', { class: 'pick-list' }, boxes.map((b) => b.row)), go)
    } catch (error) {
      if (!stop.signal.aborted) fill(pickerSlot, h('p', { class: 'page-error', role: 'alert' }, `Could not list the sweeps: ${messageOf(error)}`))
    }
  }

  const renderFigure = async (): Promise<void> => {
    if (ids.length < 2) {
      fill(figureSlot, h('p', { class: 'hint' }, 'Pick two or more finished sweeps below.'))
      return
    }
    fill(figureSlot, h('p', { class: 'loading' }, 'Loading the results…'))
    let loaded: Loaded[]
    try {
      const statuses = await Promise.all(ids.map(async (id) => await getSweep(id, stop.signal)))
      const unfinished = statuses.filter((s) => s.status !== 'succeeded')
      if (unfinished.length > 0) {
        fill(figureSlot, h('p', { class: 'page-error', role: 'alert' }, `Only finished sweeps have results: ${unfinished.map((s) => `“${s.label ?? s.id}” is ${s.status}`).join(', ')}.`))
        return
      }
      const results = await Promise.all(ids.map(async (id) => await getJson<SweepResult>(`${sweepPath(id)}/results`, { signal: stop.signal })))
      const shown = names(statuses)
      loaded = ids.map((id, i) => ({ id, name: shown[i] as string, result: results[i] as SweepResult }))
      const searches = loaded.filter((item) => item.result.searches !== undefined)
      if (searches.length > 0) {
        fill(figureSlot, h('p', { class: 'page-error', role: 'alert' },
          `Threshold searches have no grid curves to overlay: ${searches.map((item) => `“${item.name}”`).join(', ')}. Their crossings are on their own pages.`))
        return
      }
    } catch (error) {
      if (!stop.signal.aborted) fill(figureSlot, h('p', { class: 'page-error', role: 'alert' }, `Could not load the sweeps: ${messageOf(error)}`))
      return
    }

    const figure = figurePanel({
      route: 'v1/figures/overlay.svg',
      query: { sweeps: ids.join(',') },
      fileStem: 'memsweep-overlay',
      results: loaded.map((item) => ({ name: item.name, result: item.result })),
      seriesControl: false,
      // The overlay route takes a bounded number of sweeps; beyond it the page draws them itself.
      drawHere: ids.length > MAX_OVERLAID
    }, stop.signal)
    const saveSvg = h('button', {
      type: 'button',
      class: 'secondary',
      'data-download': 'svg',
      onclick: () => { figure.downloadSvg().catch((error: unknown) => notify(`Could not download the figure: ${messageOf(error)}`, 'error')) }
    }, 'Figure (SVG)')
    fill(figureSlot,
      h('section', { class: 'panel', 'aria-labelledby': 'overlay-heading' },
        h('div', { class: 'panel-head' }, h('h2', { id: 'overlay-heading' }, `${loaded.length} sweeps overlaid`), saveSvg),
        figure.el),
      h('ul', { class: 'compared' }, loaded.map((item) => h('li', {}, h('a', { href: routeHref({ page: 'sweep', id: item.id }) }, item.name)))))
  }

  inBackground(renderFigure())
  inBackground(renderPicker())
  return () => { stop.abort() }
}
