/**
 * A figure from the service's figure routes (one sweep, or several overlaid), with controls
 * for the measure, the axes, the error bars and the theory overlay. The SVG is fetched with
 * the token and shown as an image from a blob: URL (scripts in an image never run); its title
 * and description become the image's text alternative. Where the server has no such route,
 * the page draws the same curves itself from the results (plot.ts).
 */
import { ApiProblem, call, download } from './api.js'
import { curvesOf, variedOf } from './curves.js'
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

/** The figure routes' query for a choice; `series` '' leaves the grouping to the route. */
export function figureQuery (choice: FigureChoice, width: number, height: number, extra: Record<string, string> = {}): string {
  const params = new URLSearchParams({
    ...extra,
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

const RATE_MEASURES = new Set(['success', 'endState', 'unstableFraction', 'fixedPatternFraction'])

/** Where a figure comes from and what it shows. */
export interface FigureSource {
  /** The route, relative: 'v1/sweeps/<id>/figure.svg' or 'v1/figures/overlay.svg'. */
  route: string
  /** Query parameters besides the choice (the overlay's `sweeps`). */
  query: Record<string, string>
  /** File names of downloads start with this. */
  fileStem: string
  /** The results shown, named as their curves are; the page draws from them when the route is missing. */
  results: ReadonlyArray<{ name: string, result: SweepResult }>
  /** Title of the page's own drawing; default: the measure against x. */
  title?: string
  /** Offer "one curve per" (a single sweep); an overlay has one series per sweep. */
  seriesControl: boolean
  /** Draw in the page from the start (the route cannot take this many sweeps). */
  drawHere?: boolean
}

function select (label: string, options: Array<[string, string]>, value: string, onChange: (value: string) => void): HTMLElement {
  const id = uid('fig')
  const el = h('select', { id, onchange: () => onChange(el.value) },
    options.map(([v, text]) => h('option', { value: v, selected: v === value }, text)))
  return h('div', { class: 'control' }, h('label', { for: id }, label), el)
}

/** The varied parameter with the most values, the later one on a tie (as the routes default). */
function defaultX (results: FigureSource['results'], candidates: string[]): string {
  let best = candidates[0] ?? ''
  let most = 0
  for (const path of candidates) {
    const count = new Set(results.flatMap(({ result }) => result.rows.map((row) => row.values[path]))).size
    if (count >= most) { best = path; most = count }
  }
  return best
}

export interface FigurePanel {
  el: HTMLElement
  downloadSvg: () => Promise<void>
  /** Saves the figure as shown, sized for a single journal column (85 mm), as PDF or PNG (300 dpi). */
  downloadPrint: (format: 'pdf' | 'png') => Promise<void>
}

export function figurePanel (source: FigureSource, signal: AbortSignal): FigurePanel {
  const el = h('div', { class: 'figure-block' })
  const variedSets = source.results.map(({ result }) => variedOf(result))
  const anyVaried = [...new Set(variedSets.flat())]
  // The routes need an x that every sweep varies; the page's own drawing leaves the others out.
  const shared = anyVaried.filter((path) => variedSets.every((set) => set.includes(path)))
  if (anyVaried.length === 0) {
    el.append(h('p', {}, source.results.length === 1
      ? 'This sweep has a single grid point, so there is no curve to draw: the table below holds its values.'
      : 'None of these sweeps varies a parameter, so there is no curve to overlay.'))
    return { el, downloadSvg: async () => {}, downloadPrint: async () => {} }
  }
  let drawHere = source.drawHere === true || shared.length === 0
  const xChoices = drawHere ? anyVaried : shared
  const stability = source.results.every(({ result }) => (result.spec.measures as Record<string, unknown> | undefined)?.stability === true)
  const choice: FigureChoice = { measure: 'success', x: defaultX(source.results, xChoices), series: '', xScale: 'linear', yScale: 'linear', errorBars: 'ci', theory: true }

  const image = h('img', { class: 'figure-image', alt: '' })
  const caption = h('figcaption', {})
  const status = h('p', { class: 'figure-status', role: 'status' })
  const problem = h('p', { class: 'field-error', role: 'alert', hidden: true })
  const figure = h('figure', { class: 'figure', 'aria-busy': 'true' }, image, caption)
  let objectUrl: string | null = null
  let inFlight: AbortController | null = null
  signal.addEventListener('abort', () => { if (objectUrl !== null) URL.revokeObjectURL(objectUrl) })

  const size = (): [number, number] => {
    const width = Math.max(360, Math.min(1000, Math.round(figure.clientWidth || 760)))
    // Narrow figures get taller, so the legend and the axes still leave room for the curves.
    const height = Math.round(Math.max(280, Math.min(width * (width < 600 ? 0.95 : 0.66), 620)))
    return [width, height]
  }

  const showSvg = (text: string): void => {
    const doc = new DOMParser().parseFromString(text, 'image/svg+xml')
    const title = doc.querySelector('svg > title')?.textContent?.trim() ?? ''
    const desc = doc.querySelector('svg > desc')?.textContent?.trim() ?? ''
    if (objectUrl !== null) URL.revokeObjectURL(objectUrl)
    objectUrl = URL.createObjectURL(new Blob([text], { type: 'image/svg+xml' }))
    image.src = objectUrl
    image.alt = [title, desc].filter((t) => t !== '').join('. ') || `${measureName(choice.measure)} against ${parameterName(choice.x)}`
    const bars = drawHere
      ? (choice.measure === 'success' ? 'Wilson 95 % intervals' : RATE_MEASURES.has(choice.measure) ? 'no error bars' : '± one standard error')
      : { ci: '95 % confidence intervals', se: '± one standard error', sd: '± one standard deviation of single trials', none: 'no error bars' }[choice.errorBars]
    fill(caption,
      h('span', {}, `${measureName(choice.measure)} against ${parameterName(choice.x)}; ${bars}.`),
      desc === '' ? null : h('details', {}, h('summary', {}, 'Text description of the figure'), h('p', {}, desc)))
  }

  const localOnly: HTMLElement[] = []
  /** The page's own drawing has no theory overlay, log y axis or choice of error bars. */
  const markDrawnHere = (): void => {
    for (const control of localOnly) {
      control.setAttribute('disabled', '')
      control.title = 'Only the server\'s figure route offers this'
    }
  }

  const drawInPage = (): void => {
    markDrawnHere()
    const curves = curvesOf(source.results, choice.measure, choice.x)
    const left = source.results.filter(({ result }) => !variedOf(result).includes(choice.x)).map(({ name }) => `“${name}”`)
    const svg = drawPlot(curves, {
      title: source.title ?? `${measureName(choice.measure)} against ${parameterName(choice.x)}`,
      xLabel: parameterName(choice.x),
      yLabel: measureName(choice.measure),
      xScale: choice.xScale,
      ...(RATE_MEASURES.has(choice.measure) ? { yRange: [0, 1] as [number, number] } : {}),
      width: size()[0],
      description: `${curves.length} curve(s) of ${measureName(choice.measure)} against ${parameterName(choice.x)}, drawn in the browser from the results.`
    })
    showSvg(new XMLSerializer().serializeToString(svg))
    status.textContent = `Drawn in the browser from the results.${left.length === 0 ? '' : ` Left out, since they do not vary ${parameterName(choice.x)}: ${left.join(', ')}.`}`
  }

  const routeUrl = (): string => `${source.route}?${figureQuery(choice, ...size(), source.query)}`

  const load = async (): Promise<void> => {
    inFlight?.abort()
    const controller = new AbortController()
    inFlight = controller
    signal.addEventListener('abort', () => controller.abort(), { once: true })
    figure.setAttribute('aria-busy', 'true')
    status.textContent = 'Drawing the figure…'
    problem.hidden = true
    try {
      if (drawHere) {
        drawInPage()
      } else {
        const response = await call(routeUrl(), { headers: { accept: 'image/svg+xml' }, signal: controller.signal })
        showSvg(await response.text())
        status.textContent = ''
      }
    } catch (error) {
      if (controller.signal.aborted) return
      if (error instanceof ApiProblem && error.status === 404 && error.problem.code === 'MEMSWEEP_ROUTE_NOT_FOUND') {
        drawHere = true
        drawInPage()
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
  const xOptions = xChoices.map((path): [string, string] => [path, parameterName(path)])
  const theoryId = uid('fig')
  const theoryBox = h('input', { type: 'checkbox', id: theoryId, checked: choice.theory, onchange: () => set('theory')(String(theoryBox.checked)) })
  const yScale = select('y scale', [['linear', 'linear'], ['log', 'logarithmic']], choice.yScale, set('yScale'))
  const errorBars = select('Error bars', [['ci', '95 % interval'], ['se', '± standard error'], ['sd', '± standard deviation'], ['none', 'none']], choice.errorBars, set('errorBars'))
  const series = source.seriesControl && anyVaried.length > 1 ? select('One curve per', [['', 'other varied values'], ...xOptions], choice.series, set('series')) : null
  localOnly.push(...[yScale, errorBars, series].flatMap((c) => c === null ? [] : [...c.querySelectorAll('select')]), theoryBox)
  const controls = h('div', { class: 'figure-controls' },
    select('Measure', measures, choice.measure, set('measure')),
    select('x axis', xOptions, choice.x, set('x')),
    series,
    select('x scale', [['linear', 'linear'], ['log', 'logarithmic']], choice.xScale, set('xScale')),
    yScale,
    errorBars,
    h('div', { class: 'control checkbox' }, theoryBox, h('label', { for: theoryId }, 'Theory where it applies')))

  /** Saves the figure as shown (same options) as an SVG file. */
  const downloadSvg = async (): Promise<void> => {
    const name = `${source.fileStem}-${choice.measure}.svg`
    if (!drawHere) {
      await download(routeUrl(), name, 'image/svg+xml')
      return
    }
    if (objectUrl === null) return
    const link = h('a', { href: objectUrl, download: name })
    document.body.append(link)
    link.click()
    link.remove()
  }

  const downloadPrint = async (format: 'pdf' | 'png'): Promise<void> => {
    if (drawHere) throw new Error('this server draws no figure files, so only the SVG drawn here can be saved')
    const params = new URLSearchParams(figureQuery(choice, ...size(), source.query))
    params.delete('width')
    params.delete('height')
    params.set('column', 'single')
    await download(`${source.route.replace(/\.svg$/, `.${format}`)}?${params.toString()}`, `${source.fileStem}-${choice.measure}.${format}`, format === 'pdf' ? 'application/pdf' : 'image/png')
  }

  el.append(h('div', { class: 'figure-layout' }, h('div', { class: 'figure-main' }, problem, status, figure), controls))
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
  return { el, downloadSvg, downloadPrint }
}
