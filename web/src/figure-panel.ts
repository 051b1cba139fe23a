/**
 * A sweep's figure from the service's figure route, with controls for the measure, the axes,
 * the error bars and the theory overlay. The SVG is fetched with the token and shown as an
 * image from a blob: URL (scripts in an image never run); its title and description become
 * the image's text alternative.
 */
import { ApiProblem, call, download, sweepPath } from './api.js'
import { curvesOf } from './curves.js'
import { fill, h, uid } from './dom.js'
import { MEASURES, measureName, parameterName } from './labels.js'
import { drawPlot } from './plot.js'
import type { SweepResult } from './types.js'
import { inBackground, messageOf } from './widgets.js'

export interface FigureChoice {
  measure: string
  x: string
  series: string
  xScale: 'linear' | 'log'
  yScale: 'linear' | 'log'
  errorBars: 'ci' | 'se' | 'sd' | 'none'
  theory: boolean
}

/** The figure route's query for a choice; `series` '' leaves the grouping to the route. */
export function figureQuery (choice: FigureChoice, width: number, height: number): string {
  const params = new URLSearchParams({
    measure: choice.measure,
    x: choice.x,
    xScale: choice.xScale,
    yScale: choice.yScale,
    errorBars: choice.errorBars,
    theory: String(choice.theory),
    width: String(width),
    height: String(height)
  })
  if (choice.series !== '') params.set('series', choice.series)
  return params.toString()
}

function select (label: string, options: Array<[string, string]>, value: string, onChange: (value: string) => void): HTMLElement {
  const id = uid('fig')
  const el = h('select', { id, onchange: () => onChange(el.value) },
    options.map(([v, text]) => h('option', { value: v, selected: v === value }, text)))
  return h('div', { class: 'control' }, h('label', { for: id }, label), el)
}

/** The varied parameter with the most values, the later one on a tie (as the route defaults). */
function defaultX (result: SweepResult, varied: string[]): string {
  let best = varied[0] ?? ''
  let most = 0
  for (const path of varied) {
    const count = new Set(result.rows.map((row) => row.values[path])).size
    if (count >= most) { best = path; most = count }
  }
  return best
}

export interface FigurePanel {
  panel: HTMLElement
  downloadSvg: () => Promise<void>
}

export function figurePanel (id: string, label: string, result: SweepResult, signal: AbortSignal): FigurePanel {
  const varied = Object.keys(result.rows[0]?.values ?? {})
  const panel = h('section', { class: 'panel figure-panel', 'aria-labelledby': 'figure-heading' },
    h('h2', { id: 'figure-heading' }, 'Figure'))
  if (varied.length === 0) {
    panel.append(h('p', {}, 'This sweep has a single grid point, so there is no curve to draw: the table below holds its values.'))
    return { panel, downloadSvg: async () => {} }
  }
  const stability = (result.spec.measures as Record<string, unknown> | undefined)?.stability === true
  const choice: FigureChoice = { measure: 'success', x: defaultX(result, varied), series: '', xScale: 'linear', yScale: 'linear', errorBars: 'ci', theory: true }

  const image = h('img', { class: 'figure-image', alt: '' })
  const caption = h('figcaption', {})
  const status = h('p', { class: 'figure-status', role: 'status' })
  const problem = h('p', { class: 'field-error', role: 'alert', hidden: true })
  const figure = h('figure', { class: 'figure', 'aria-busy': 'true' }, image, caption)
  let objectUrl: string | null = null
  let inFlight: AbortController | null = null
  let routeMissing = false
  signal.addEventListener('abort', () => { if (objectUrl !== null) URL.revokeObjectURL(objectUrl) })

  const size = (): [number, number] => {
    const width = Math.max(360, Math.min(1000, Math.round(figure.clientWidth || 760)))
    return [width, Math.round(Math.min(width * 0.66, 620))]
  }

  const showSvg = (text: string): void => {
    const doc = new DOMParser().parseFromString(text, 'image/svg+xml')
    const title = doc.querySelector('svg > title')?.textContent?.trim() ?? ''
    const desc = doc.querySelector('svg > desc')?.textContent?.trim() ?? ''
    if (objectUrl !== null) URL.revokeObjectURL(objectUrl)
    objectUrl = URL.createObjectURL(new Blob([text], { type: 'image/svg+xml' }))
    image.src = objectUrl
    image.alt = [title, desc].filter((t) => t !== '').join('. ') || `${measureName(choice.measure)} against ${parameterName(choice.x)}`
    const bars = { ci: '95 % confidence intervals', se: '± one standard error', sd: '± one standard deviation of single trials', none: 'no error bars' }[choice.errorBars]
    fill(caption,
      h('span', {}, `${measureName(choice.measure)} against ${parameterName(choice.x)}; ${bars}.`),
      desc === '' ? null : h('details', {}, h('summary', {}, 'Text description of the figure'), h('p', {}, desc)))
  }

  /** Without the figure route the page draws the same curves itself (success: Wilson intervals; means: ± s.e.). */
  const drawHere = (): void => {
    const curves = curvesOf([{ name: label, result }], choice.measure, choice.x)
    const rate = ['success', 'endState', 'unstableFraction', 'fixedPatternFraction'].includes(choice.measure)
    const svg = drawPlot(curves, {
      title: label,
      xLabel: parameterName(choice.x),
      yLabel: measureName(choice.measure),
      xScale: choice.xScale,
      ...(rate ? { yRange: [0, 1] as [number, number] } : {}),
      width: size()[0],
      description: `${curves.length} curve(s) of ${measureName(choice.measure)} against ${parameterName(choice.x)}, drawn in the browser from the results.`
    })
    showSvg(new XMLSerializer().serializeToString(svg))
  }

  const load = async (): Promise<void> => {
    inFlight?.abort()
    const controller = new AbortController()
    inFlight = controller
    signal.addEventListener('abort', () => controller.abort(), { once: true })
    figure.setAttribute('aria-busy', 'true')
    status.textContent = 'Drawing the figure…'
    problem.hidden = true
    try {
      if (routeMissing) {
        drawHere()
      } else {
        const [width, height] = size()
        const response = await call(`${sweepPath(id)}/figure.svg?${figureQuery(choice, width, height)}`, { headers: { accept: 'image/svg+xml' }, signal: controller.signal })
        showSvg(await response.text())
      }
      status.textContent = ''
    } catch (error) {
      if (controller.signal.aborted) return
      if (error instanceof ApiProblem && error.status === 404 && error.problem.code === 'MEMSWEEP_ROUTE_NOT_FOUND') {
        routeMissing = true
        drawHere()
        status.textContent = 'Drawn in the browser: this server has no figure route.'
        return
      }
      status.textContent = ''
      problem.hidden = false
      const issues = error instanceof ApiProblem ? (error.problem.errors ?? []).map((e) => e.message) : []
      problem.textContent = `This figure cannot be drawn: ${issues.length > 0 ? issues.join('; ') : messageOf(error)}`
    } finally {
      if (inFlight === controller) figure.setAttribute('aria-busy', 'false')
    }
  }

  const set = <K extends keyof FigureChoice>(key: K) => (value: string): void => {
    (choice as unknown as Record<string, unknown>)[key] = key === 'theory' ? value === 'true' : value
    inBackground(load())
  }

  const measures = MEASURES.filter((m) => m.needsStability !== true || stability).map((m): [string, string] => [m.value, m.short])
  const xOptions = varied.map((path): [string, string] => [path, parameterName(path)])
  const seriesOptions: Array<[string, string]> = [['', 'other varied values'], ...xOptions]
  const theoryId = uid('fig')
  const theoryBox = h('input', { type: 'checkbox', id: theoryId, checked: choice.theory, onchange: () => set('theory')(String(theoryBox.checked)) })

  const controls = h('div', { class: 'figure-controls' },
    select('Measure', measures, choice.measure, set('measure')),
    select('x axis', xOptions, choice.x, set('x')),
    varied.length > 1 ? select('One curve per', seriesOptions, choice.series, set('series')) : null,
    select('x scale', [['linear', 'linear'], ['log', 'logarithmic']], choice.xScale, set('xScale')),
    select('y scale', [['linear', 'linear'], ['log', 'logarithmic']], choice.yScale, set('yScale')),
    select('Error bars', [['ci', '95 % interval'], ['se', '± standard error'], ['sd', '± standard deviation'], ['none', 'none']], choice.errorBars, set('errorBars')),
    h('div', { class: 'control checkbox' }, theoryBox, h('label', { for: theoryId }, 'Theory where it applies')))

  /** Saves the figure as shown (same options) as an SVG file. */
  const downloadSvg = async (): Promise<void> => {
    const name = `memsweep-${id}-${choice.measure}.svg`
    if (!routeMissing) {
      await download(`${sweepPath(id)}/figure.svg?${figureQuery(choice, ...size())}`, name, 'image/svg+xml')
      return
    }
    if (objectUrl === null) return
    const link = h('a', { href: objectUrl, download: name })
    document.body.append(link)
    link.click()
    link.remove()
  }

  panel.append(h('div', { class: 'figure-layout' }, h('div', { class: 'figure-main' }, problem, status, figure), controls))
  queueMicrotask(() => { inBackground(load()) })
  // A window made much wider or narrower gets a figure drawn for its width (text stays legible).
  let drawnWidth = 0
  const resized = new ResizeObserver(() => {
    const width = size()[0]
    if (drawnWidth === 0) { drawnWidth = width; return }
    if (Math.abs(width - drawnWidth) / drawnWidth < 0.15) return
    drawnWidth = width
    inBackground(load())
  })
  resized.observe(figure)
  signal.addEventListener('abort', () => resized.disconnect())
  return { panel, downloadSvg }
}
