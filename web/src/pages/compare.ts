/**
 * Curves of several finished sweeps on one figure (two learning rules' capacity curves, say),
 * drawn in the browser from their results, with a picker of finished sweeps.
 */
import { getJson, getSweep, listSweeps, sweepPath } from '../api.js'
import { curvesOf, variedOf } from '../curves.js'
import { fill, h, uid } from '../dom.js'
import { formatStamp } from '../format.js'
import { MEASURES, measureName, parameterName } from '../labels.js'
import type { Dispose } from '../main.js'
import { drawPlot } from '../plot.js'
import { routeHref } from '../router.js'
import type { SweepResult, SweepStatus } from '../types.js'
import { inBackground, messageOf, notify } from '../widgets.js'

interface Loaded { id: string, name: string, result: SweepResult }

const RATE_MEASURES = new Set(['success', 'endState', 'unstableFraction', 'fixedPatternFraction'])

function labelled (label: string, control: HTMLElement): HTMLElement {
  const id = uid('cmp')
  control.id = id
  return h('div', { class: 'control' }, h('label', { for: id }, label), control)
}

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
    h('p', { class: 'lead' }, 'The curves of two or more finished sweeps on one figure, for the measure and x axis you choose. Each sweep keeps its own marker and line style, so the figure also reads in print.'),
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
    } catch (error) {
      if (!stop.signal.aborted) fill(figureSlot, h('p', { class: 'page-error', role: 'alert' }, `Could not load the sweeps: ${messageOf(error)}`))
      return
    }

    const axisCount = new Map<string, number>()
    for (const item of loaded) for (const path of variedOf(item.result)) axisCount.set(path, (axisCount.get(path) ?? 0) + 1)
    const shared = [...axisCount.entries()].filter(([, n]) => n === loaded.length).map(([path]) => path)
    const anyAxis = [...axisCount.keys()]
    if (anyAxis.length === 0) {
      fill(figureSlot, h('p', { class: 'page-error' }, 'None of these sweeps varies a parameter, so there is no curve to overlay.'))
      return
    }
    const stability = loaded.every((item) => (item.result.spec.measures as Record<string, unknown> | undefined)?.stability === true)
    const measureSelect = h('select', {}, MEASURES.filter((m) => m.needsStability !== true || stability).map((m) => h('option', { value: m.value }, m.short)))
    const xSelect = h('select', {}, (shared.length > 0 ? shared : anyAxis).map((path) => h('option', { value: path }, parameterName(path))))
    const scaleSelect = h('select', {}, h('option', { value: 'linear' }, 'linear'), h('option', { value: 'log' }, 'logarithmic'))
    const note = h('p', { class: 'hint', role: 'status' })
    const plotSlot = h('figure', { class: 'figure' })
    let svg: SVGSVGElement | null = null

    const draw = (): void => {
      const measure = measureSelect.value
      const x = xSelect.value
      const curves = curvesOf(loaded.map((item) => ({ name: item.name, result: item.result })), measure, x)
      const missing = loaded.filter((item) => !variedOf(item.result).includes(x)).map((item) => `“${item.name}”`)
      note.textContent = missing.length === 0 ? '' : `Left out, since they do not vary ${parameterName(x)}: ${missing.join(', ')}.`
      const width = Math.max(360, Math.min(1000, Math.round(plotSlot.clientWidth || 900)))
      svg = drawPlot(curves, {
        title: `${measureName(measure)} against ${parameterName(x)}`,
        xLabel: parameterName(x),
        yLabel: measureName(measure),
        xScale: scaleSelect.value === 'log' ? 'log' : 'linear',
        ...(RATE_MEASURES.has(measure) ? { yRange: [0, 1] as [number, number] } : {}),
        width,
        description: `${curves.length} curves from ${loaded.length} sweeps: ${loaded.map((item) => item.name).join('; ')}. Error bars: Wilson 95 % intervals for rates, ± one standard error for means.`
      })
      fill(plotSlot, svg, h('figcaption', {}, measure === 'success'
        ? 'Error bars: Wilson 95 % intervals of the success rate.'
        : RATE_MEASURES.has(measure) ? 'Fractions of trials; no error bars.' : 'Error bars: ± one standard error of the mean.'))
    }

    for (const select of [measureSelect, xSelect, scaleSelect]) select.addEventListener('change', draw)
    const saveSvg = h('button', {
      type: 'button',
      class: 'secondary',
      onclick: () => {
        if (svg === null) return
        const blob = new Blob([new XMLSerializer().serializeToString(svg)], { type: 'image/svg+xml' })
        const href = URL.createObjectURL(blob)
        const link = h('a', { href, download: 'memsweep-comparison.svg' })
        document.body.append(link)
        link.click()
        link.remove()
        setTimeout(() => URL.revokeObjectURL(href), 10_000)
      }
    }, 'Figure (SVG)')
    fill(figureSlot,
      h('section', { class: 'panel', 'aria-label': 'Comparison figure' },
        h('div', { class: 'figure-controls' },
          labelled('Measure', measureSelect), labelled('x axis', xSelect), labelled('x scale', scaleSelect), saveSvg),
        note,
        plotSlot),
      h('ul', { class: 'compared' }, loaded.map((item) => h('li', {}, h('a', { href: routeHref({ page: 'sweep', id: item.id }) }, item.name)))))
    draw()
  }

  inBackground(renderFigure())
  inBackground(renderPicker())
  return () => { stop.abort() }
}
