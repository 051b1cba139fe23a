/**
 * The figure of a sweep that has not succeeded, drawn from the points finished so far
 * (GET …/figure.svg?partial=true) and redrawn as more points finish: the sweep's progress
 * events drive it, at most one drawing in flight and one every REDRAW_MS. It says plainly
 * that it is partial and how many points it holds.
 */
import { call, download, sweepPath } from './api.js'
import { fill, h } from './dom.js'
import { formatCount } from './format.js'
import type { SweepStatus } from './types.js'
import { inBackground, messageOf } from './widgets.js'

/** Shortest time between two drawings: a fast sweep finishes points faster than anyone reads them. */
const REDRAW_MS = 1200

export interface LiveFigure {
  el: HTMLElement
  /** Called with every status the sweep's event stream brings. */
  update: (status: SweepStatus) => void
}

export function liveFigure (id: string, signal: AbortSignal): LiveFigure {
  const image = h('img', { class: 'figure-image', alt: '' })
  const badge = h('span', { class: 'partial-badge', 'data-points': '0' })
  const note = h('p', { class: 'figure-status', role: 'status' }, 'The figure appears here once the first grid point is finished.')
  const figure = h('figure', { class: 'figure partial-figure', hidden: true }, image)
  const saveCsv = h('button', {
    type: 'button',
    class: 'secondary small',
    hidden: true,
    onclick: () => { inBackground(download(`${sweepPath(id)}/results?format=csv&partial=true`, `memsweep-${id}-partial.csv`, 'text/csv')) }
  }, 'Finished points (CSV)')
  const el = h('section', { class: 'panel figure-panel live-figure', 'aria-labelledby': 'live-figure-heading' },
    h('div', { class: 'panel-head' }, h('h2', { id: 'live-figure-heading' }, 'Figure so far'), badge),
    note, figure, h('div', { class: 'actions' }, saveCsv))

  let drawnPoints = 0
  let wanted: SweepStatus | null = null
  let inFlight = false
  let lastDrawn = 0
  let timer: ReturnType<typeof setTimeout> | null = null
  let objectUrl: string | null = null
  signal.addEventListener('abort', () => {
    if (timer !== null) clearTimeout(timer)
    if (objectUrl !== null) URL.revokeObjectURL(objectUrl)
  })

  const draw = async (status: SweepStatus): Promise<void> => {
    inFlight = true
    lastDrawn = Date.now()
    const width = Math.max(360, Math.min(900, Math.round(el.clientWidth - 40) || 720))
    const height = Math.round(Math.max(280, Math.min(width * 0.6, 520)))
    try {
      const response = await call(`${sweepPath(id)}/figure.svg?partial=true&width=${width}&height=${height}`, { headers: { accept: 'image/svg+xml' }, signal, cache: 'no-store' })
      const text = await response.text()
      if (signal.aborted) return
      const doc = new DOMParser().parseFromString(text, 'image/svg+xml')
      const title = doc.querySelector('svg > title')?.textContent?.trim() ?? ''
      if (objectUrl !== null) URL.revokeObjectURL(objectUrl)
      objectUrl = URL.createObjectURL(new Blob([text], { type: 'image/svg+xml' }))
      image.src = objectUrl
      const { pointsDone, pointsTotal } = status.progress
      image.alt = `Partial figure, ${pointsDone} of ${pointsTotal} grid points: ${title}`
      drawnPoints = pointsDone
      figure.hidden = false
      saveCsv.hidden = false
      badge.dataset.points = String(pointsDone)
      fill(badge, `partial · ${formatCount(pointsDone)} of ${formatCount(pointsTotal)} points`)
      note.textContent = status.status === 'running' || status.status === 'queued'
        ? 'Redrawn as points finish; error bars and theory as in the final figure.'
        : `The sweep was ${status.status}: these are the points it finished. Resume it to compute the rest.`
    } catch (error) {
      if (!signal.aborted) note.textContent = `The figure so far could not be drawn: ${messageOf(error)}`
    } finally {
      inFlight = false
      if (wanted !== null && wanted.progress.pointsDone > drawnPoints) schedule()
    }
  }

  function schedule (): void {
    if (timer !== null || inFlight || signal.aborted) return
    timer = setTimeout(() => {
      timer = null
      if (wanted !== null && wanted.progress.pointsDone > drawnPoints) inBackground(draw(wanted))
    }, Math.max(0, lastDrawn + REDRAW_MS - Date.now()))
  }

  return {
    el,
    update: (status) => {
      wanted = status
      if (status.progress.pointsDone > drawnPoints) schedule()
    }
  }
}
