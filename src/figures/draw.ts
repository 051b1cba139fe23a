/**
 * Lays a planned figure out on the page and writes the SVG: title and model line at the
 * top, the plot with its axes, the legend, and the note (error bars, provenance) at the
 * bottom. Every plotted point carries its data as attributes (data-x, data-y, data-low,
 * data-high, data-series, data-point), so a reader or a test can check the drawing against
 * the result.
 */
import { makeScale, yDomain, xDomain, type AxisScale } from './axes.js'
import { drawLegend, legendEntries, measureLegend, placeInside, type LegendBox, type Rect } from './legend.js'
import { isRate } from './measures.js'
import type { FigurePlan } from './plan.js'
import { plainText, richText, richTextWidth } from './rich-text.js'
import { marker, seriesStyle, THEORY_STYLE } from './styles.js'
import { element, escapeXml, exactNumber, polylinePath, px } from './svg.js'
import type { TheoryOverlay } from './theory.js'
import { textWidth, wrapText } from './text-metrics.js'

const FONT_FAMILY = "'DejaVu Sans', 'Helvetica Neue', Helvetica, Arial, sans-serif"
const OUTER = 14
const TITLE_FONT = 16
const CONDITIONS_FONT = 11.5
const AXIS_TITLE_FONT = 13
const TICK_FONT = 12
const NOTE_FONT = 10.5
const MARKER_SIZE = 8
const CAP = 3.5
const ANNOTATION_FONT = 11

// MAIN //

export function drawFigure (plan: FigurePlan): string {
  const { width, height } = plan.options
  const id = `msfig-${fingerprint(plan)}`
  const innerWidth = width - 2 * OUTER

  // Small figures (thumbnails, a side panel) keep the plot and drop the model line.
  const compact = width < 480 || height < 320
  const titleLines = wrapText(plan.title, TITLE_FONT * 1.12, innerWidth, compact ? 1 : 3)
  const conditionLines = plan.conditions === '' || compact ? [] : wrapText(plainText(plan.conditions), CONDITIONS_FONT, innerWidth, 2)
  const noteLines = wrapText(plan.note, NOTE_FONT, innerWidth, compact ? 1 : 2)
  let cursor = OUTER + TITLE_FONT
  const header: string[] = []
  for (const line of titleLines) {
    header.push(element('text', { x: OUTER, y: cursor, 'font-size': TITLE_FONT, 'font-weight': 'bold', fill: '#111111' }, escapeXml(line)))
    cursor += TITLE_FONT * 1.25
  }
  cursor += 1
  for (const line of conditionLines) {
    header.push(element('text', { x: OUTER, y: cursor, 'font-size': CONDITIONS_FONT, fill: '#444444' }, escapeXml(line)))
    cursor += CONDITIONS_FONT * 1.3
  }
  // Reference lines are named just above the plot, where no data can hide the name.
  const annotated = plan.theory.some((o) => o.annotation !== undefined)
  const plotTop = cursor + 6 + (annotated ? ANNOTATION_FONT + 4 : 0)
  const noteTop = height - OUTER - noteLines.length * NOTE_FONT * 1.3 + NOTE_FONT
  const plotBottom = noteTop - NOTE_FONT - 10 - AXIS_TITLE_FONT - 10 - TICK_FONT - 8

  // The y scale fixes the tick labels, whose width fixes where the plot starts.
  const yScale = makeYScale(plan, plotBottom, plotTop)
  const yLabelWidth = Math.max(...yScale.ticks.map((t) => textWidth(yScale.label(t), TICK_FONT)), 10)
  const plotLeft = OUTER + AXIS_TITLE_FONT + 10 + yLabelWidth + 7

  const theoryColour = theoryColours(plan.theory)
  const entries = legendEntries(plan.series, plan.theory, theoryColour)
  let legend: { box: LegendBox, left: number, top: number } | null = null
  let plot: Rect = { left: plotLeft, top: plotTop, right: width - OUTER, bottom: plotBottom }
  let xScale = makeXScale(plan, plot)
  if (entries.length > 0) {
    const inside = measureLegend(entries, Math.min(260, (plot.right - plot.left) * 0.6))
    const spot = placeInside(inside, plot, obstacles(plan, xScale, yScale))
    const outsideBox = measureLegend(entries, Math.min(220, width * 0.3))
    if (spot.covered === 0 || compact || outsideBox.width > width * 0.38) {
      // A legend taller than the plot would hide the axes too; the description still names every series.
      legend = inside.height > plot.bottom - plot.top - 8 ? null : { box: inside, left: spot.left, top: spot.top }
    } else {
      plot = { ...plot, right: width - OUTER - outsideBox.width - 10 }
      xScale = makeXScale(plan, plot)
      legend = { box: outsideBox, left: plot.right + 10, top: plot.top }
    }
  }

  const body = [
    element('rect', { x: 0, y: 0, width, height, fill: '#ffffff' }),
    ...header,
    drawGrid(plot, xScale, yScale),
    element('defs', {}, element('clipPath', { id: `${id}-clip` }, element('rect', { x: plot.left, y: plot.top, width: plot.right - plot.left, height: plot.bottom - plot.top }))),
    element('g', { class: 'theory-lines', 'clip-path': `url(#${id}-clip)` }, plan.theory.map((o) => drawTheory(o, xScale, yScale, plot, theoryColour(o)))),
    element('g', { class: 'data', 'clip-path': `url(#${id}-clip)` }, plan.series.map((s) => drawSeries(plan, s.index, xScale, yScale, plan.dodge[s.index] ?? 0))),
    drawAxes(plot, xScale, yScale),
    drawAnnotations(plan.theory, xScale, plot, theoryColour),
    drawAxisTitles(plan, plot, noteTop),
    legend === null ? '' : drawLegend(entries, legend.box, legend.left, legend.top),
    element('g', { class: 'note' }, noteLines.map((line, k) =>
      element('text', { x: OUTER, y: noteTop + k * NOTE_FONT * 1.3, 'font-size': NOTE_FONT, fill: '#555555' }, escapeXml(line))))
  ]
  const o = plan.options
  const root = {
    xmlns: 'http://www.w3.org/2000/svg',
    width,
    height,
    viewBox: `0 0 ${width} ${height}`,
    role: 'img',
    'aria-labelledby': `${id}-title ${id}-desc`,
    'font-family': FONT_FAMILY,
    'data-measure': o.measure,
    'data-x': plan.x,
    'data-series-by': plan.seriesBy ?? '',
    'data-x-scale': o.xScale,
    'data-y-scale': o.yScale,
    'data-error-bars': o.errorBars
  }
  return `<?xml version="1.0" encoding="UTF-8"?>\n${element('svg', root, [
    element('title', { id: `${id}-title` }, escapeXml(plan.title)),
    element('desc', { id: `${id}-desc` }, escapeXml(plan.description)),
    ...body
  ])}\n`
}

function makeYScale (plan: FigurePlan, bottom: number, top: number): AxisScale {
  const o = plan.options
  const values: number[] = []
  for (const s of plan.series) {
    for (const p of s.points) {
      values.push(p.y)
      if (p.low !== null) values.push(p.low)
      if (p.high !== null) values.push(p.high)
    }
  }
  for (const t of plan.theory) for (const seg of t.segments) for (const [, y] of seg) values.push(y)
  const usable = o.yScale === 'log' ? values.filter((v) => v > 0) : values
  const extent: [number, number] | null = usable.length === 0 ? null : [Math.min(...usable), Math.max(...usable)]
  const domain = yDomain(o.measure, extent, o.yScale)
  const fixed = o.yScale === 'linear' && (isRate(o.measure) && o.measure !== 'unstableFraction')
  return makeScale(o.yScale, domain, bottom, top, 46, fixed)
}

function makeXScale (plan: FigurePlan, plot: Rect): AxisScale {
  const xs = plan.series.flatMap((s) => s.rows.map((row) => row.values[plan.x] as number))
  const extent: [number, number] = xs.length === 0 ? [0, 1] : [Math.min(...xs), Math.max(...xs)]
  const domain = xDomain(extent, plan.options.xScale)
  // Fewer ticks until neighbouring labels keep a gap between them.
  let spacing = 70
  let scale = makeScale(plan.options.xScale, domain, plot.left, plot.right, spacing)
  for (let attempt = 0; attempt < 6 && crowded(scale); attempt++) {
    spacing *= 1.4
    scale = makeScale(plan.options.xScale, domain, plot.left, plot.right, spacing)
  }
  return scale
}

function crowded (scale: AxisScale): boolean {
  for (let i = 1; i < scale.ticks.length; i++) {
    const [a, b] = [scale.ticks[i - 1]!, scale.ticks[i]!]
    const room = Math.abs(scale.toPx(b) - scale.toPx(a))
    const need = (textWidth(scale.label(a), TICK_FONT) + textWidth(scale.label(b), TICK_FONT)) / 2 + 18
    if (room < need) return true
  }
  return false
}

/** Where the data are, in px: what a legend inside the plot must not cover. */
function obstacles (plan: FigurePlan, xs: AxisScale, ys: AxisScale): Array<[number, number]> {
  const out: Array<[number, number]> = []
  const clampY = (v: number): number => ys.toPx(ys.kind === 'log' && !(v > 0) ? ys.domain[0] : v)
  for (const s of plan.series) {
    let previous: [number, number] | null = null
    for (const p of s.points) {
      const here: [number, number] = [xs.toPx(p.x), ys.toPx(p.y)]
      out.push(here)
      if (p.low !== null && p.high !== null) {
        const [top, bottom] = [clampY(p.high), clampY(p.low)]
        for (let k = 0; k <= 4; k++) out.push([here[0], bottom + (top - bottom) * (k / 4)])
      }
      if (previous !== null) for (let k = 1; k < 8; k++) out.push([previous[0] + (here[0] - previous[0]) * (k / 8), previous[1] + (here[1] - previous[1]) * (k / 8)])
      previous = here
    }
  }
  for (const t of plan.theory) {
    if (t.kind === 'reference' && t.at !== null) {
      for (let k = 0; k <= 20; k++) out.push([xs.toPx(t.at), ys.toPx(ys.domain[0]) + (ys.toPx(ys.domain[1]) - ys.toPx(ys.domain[0])) * (k / 20)])
    }
    for (const seg of t.segments) for (const [x, y] of seg) out.push([xs.toPx(x), ys.toPx(y)])
  }
  return out
}

function drawGrid (plot: Rect, xs: AxisScale, ys: AxisScale): string {
  const lines: string[] = []
  const grid = { stroke: '#e6e6e6', 'stroke-width': 1 }
  for (const t of ys.ticks) lines.push(element('line', { x1: plot.left, x2: plot.right, y1: ys.toPx(t), y2: ys.toPx(t), ...grid }))
  for (const t of xs.ticks) lines.push(element('line', { x1: xs.toPx(t), x2: xs.toPx(t), y1: plot.top, y2: plot.bottom, ...grid }))
  return element('g', { class: 'grid' }, lines)
}

function drawAxes (plot: Rect, xs: AxisScale, ys: AxisScale): string {
  const ink = { stroke: '#222222', 'stroke-width': 1 }
  const parts: string[] = [
    element('line', { x1: plot.left, x2: plot.right, y1: plot.bottom, y2: plot.bottom, ...ink }),
    element('line', { x1: plot.left, x2: plot.left, y1: plot.top, y2: plot.bottom, ...ink })
  ]
  const xTicks = xs.ticks.map((t) => element('g', { class: 'tick', 'data-value': exactNumber(t) }, [
    element('line', { x1: xs.toPx(t), x2: xs.toPx(t), y1: plot.bottom, y2: plot.bottom + 5, ...ink }),
    element('text', { x: xs.toPx(t), y: plot.bottom + 8 + TICK_FONT * 0.8, 'text-anchor': 'middle', 'font-size': TICK_FONT, fill: '#222222' }, escapeXml(xs.label(t)))
  ]))
  const xMinor = xs.minor.map((t) => element('line', { x1: xs.toPx(t), x2: xs.toPx(t), y1: plot.bottom, y2: plot.bottom + 3, ...ink }))
  const yTicks = ys.ticks.map((t) => element('g', { class: 'tick', 'data-value': exactNumber(t) }, [
    element('line', { x1: plot.left - 5, x2: plot.left, y1: ys.toPx(t), y2: ys.toPx(t), ...ink }),
    element('text', { x: plot.left - 8, y: ys.toPx(t), 'text-anchor': 'end', 'dominant-baseline': 'central', 'font-size': TICK_FONT, fill: '#222222' }, escapeXml(ys.label(t)))
  ]))
  const yMinor = ys.minor.map((t) => element('line', { x1: plot.left - 3, x2: plot.left, y1: ys.toPx(t), y2: ys.toPx(t), ...ink }))
  return element('g', { class: 'axes' }, [
    ...parts,
    element('g', { class: 'x-axis', 'data-scale': xs.kind }, [...xTicks, ...xMinor]),
    element('g', { class: 'y-axis', 'data-scale': ys.kind }, [...yTicks, ...yMinor])
  ])
}

function drawAxisTitles (plan: FigurePlan, plot: Rect, noteTop: number): string {
  const xTitleY = noteTop - NOTE_FONT - 10
  const yTitleX = OUTER + AXIS_TITLE_FONT * 0.8
  const yMid = (plot.top + plot.bottom) / 2
  const x = fitLabel(plan.xTitle, plot.right - plot.left + 40)
  const y = fitLabel(plan.yTitle, plot.bottom - plot.top + 20)
  return element('g', { class: 'axis-titles', fill: '#111111' }, [
    element('text', { class: 'x-title', x: (plot.left + plot.right) / 2, y: xTitleY, 'text-anchor': 'middle', 'font-size': x.size }, richText(x.text, x.size)),
    element('text', { class: 'y-title', x: yTitleX, y: yMid, 'text-anchor': 'middle', 'font-size': y.size, transform: `rotate(-90 ${px(yTitleX)} ${px(yMid)})` }, richText(y.text, y.size))
  ])
}

/** An axis title that fits its room: a smaller font first, then cut with an ellipsis. */
function fitLabel (label: string, room: number): { text: string, size: number } {
  for (let size = AXIS_TITLE_FONT; size >= AXIS_TITLE_FONT - 2; size -= 0.5) {
    if (richTextWidth(label, size) <= room) return { text: label, size }
  }
  const size = AXIS_TITLE_FONT - 2
  return { text: wrapText(label, size, room, 1)[0] ?? label, size }
}

function drawSeries (plan: FigurePlan, index: number, xs: AxisScale, ys: AxisScale, shift: number): string {
  const s = plan.series[index]!
  const style = seriesStyle(index)
  const byPoint = new Map(s.points.map((p) => [p.point, p]))
  // A row without a value leaves a gap in the line rather than a bridge over it.
  const path = polylinePath(s.rows.map((row) => {
    const p = byPoint.get(row.point)
    return p === undefined ? null : [xs.toPx(p.x) + shift, ys.toPx(p.y)] as const
  }))
  const line = s.points.length < 2
    ? ''
    : element('path', { class: 'series-line', d: path, fill: 'none', stroke: style.colour, 'stroke-width': 1.2, 'stroke-dasharray': style.dash === '' ? null : style.dash, 'stroke-linejoin': 'round' })
  const bottom = ys.domain[0]
  const points = s.points.map((p) => {
    const cx = xs.toPx(p.x) + shift
    const cy = ys.toPx(p.y)
    let bar = ''
    if (p.low !== null && p.high !== null) {
      const y1 = ys.toPx(ys.kind === 'log' && !(p.low > 0) ? bottom : p.low)
      const y2 = ys.toPx(p.high)
      const ink = { stroke: style.colour, 'stroke-width': 1.1 }
      bar = element('g', { class: 'error-bar', 'data-y1': px(y1), 'data-y2': px(y2) }, [
        element('line', { x1: cx, x2: cx, y1, y2, ...ink }),
        element('line', { x1: cx - CAP, x2: cx + CAP, y1, y2: y1, ...ink }),
        element('line', { x1: cx - CAP, x2: cx + CAP, y1: y2, y2, ...ink })
      ])
    }
    return element('g', {
      class: 'point',
      'data-series': index,
      'data-sweep': s.sweep,
      'data-point': p.point,
      'data-x': exactNumber(p.x),
      'data-y': exactNumber(p.y),
      'data-low': p.low === null ? null : exactNumber(p.low),
      'data-high': p.high === null ? null : exactNumber(p.high),
      'data-n': p.n,
      'data-cx': px(cx),
      'data-cy': px(cy)
    }, bar + marker(style, cx, cy, MARKER_SIZE))
  })
  return element('g', {
    class: 'series',
    'data-series': index,
    'data-sweep': s.sweep,
    'data-label': plainText(s.label),
    'data-marker': style.shape,
    'data-filled': String(style.filled),
    'data-dash': style.dash === '' ? 'solid' : style.dash,
    'data-colour': style.colour
  }, [line, ...points])
}

function drawTheory (o: TheoryOverlay, xs: AxisScale, ys: AxisScale, plot: Rect, colour: string): string {
  const look = THEORY_STYLE[o.kind]
  const stroke = { fill: 'none', stroke: colour, 'stroke-width': look.width, 'stroke-dasharray': look.dash === '' ? null : look.dash }
  const data = { class: 'theory', 'data-theory': o.key, 'data-kind': o.kind, 'data-series': o.series.join(' '), 'data-label': plainText(o.label) }
  if (o.kind === 'reference') {
    const x = xs.toPx(o.at!)
    if (x < plot.left || x > plot.right) return ''
    const line = element('line', { x1: x, x2: x, y1: plot.top, y2: plot.bottom, ...stroke })
    return element('g', { ...data, 'data-at': exactNumber(o.at!) }, line)
  }
  const paths = o.segments.map((seg) => element('path', {
    d: polylinePath(seg.map(([x, y]) => [xs.toPx(x), ys.toPx(y)] as const)),
    'data-xs': seg.map(([x]) => exactNumber(x)).join(' '),
    'data-ys': seg.map(([, y]) => exactNumber(y)).join(' '),
    'stroke-linejoin': 'round',
    ...stroke
  }))
  return element('g', data, paths)
}

function drawAnnotations (theory: readonly TheoryOverlay[], xs: AxisScale, plot: Rect, colour: (o: TheoryOverlay) => string): string {
  const lines = theory.filter((o) => o.kind === 'reference' && o.at !== null && o.annotation !== undefined).sort((a, b) => a.at! - b.at!)
  // Several lines close together: their values alone (the legend names them), and any that
  // would still overlap its left neighbour is left out rather than drawn over it.
  const place = (text: (o: TheoryOverlay) => string) => lines.map((o) => {
    const half = richTextWidth(text(o), ANNOTATION_FONT) / 2
    return { o, text: text(o), left: Math.min(Math.max(xs.toPx(o.at!), plot.left + half), plot.right - half) - half, width: 2 * half }
  })
  const overlapping = (boxes: ReturnType<typeof place>) => boxes.some((b, i) => i > 0 && b.left < boxes[i - 1]!.left + boxes[i - 1]!.width + 4)
  let boxes = place((o) => o.annotation!)
  if (overlapping(boxes)) boxes = place((o) => o.annotation!.split(' = ').pop()!)
  const kept: typeof boxes = []
  for (const box of boxes) if (kept.length === 0 || box.left >= kept[kept.length - 1]!.left + kept[kept.length - 1]!.width + 4) kept.push(box)
  const texts = kept.map(({ o, text, left, width }) => element('text', {
    class: 'annotation',
    'data-theory': o.key,
    'data-label': plainText(text),
    x: left + width / 2,
    y: plot.top - 5,
    'text-anchor': 'middle',
    'font-size': ANNOTATION_FONT,
    fill: colour(o)
  }, richText(text, ANNOTATION_FONT)))
  return texts.length === 0 ? '' : element('g', { class: 'annotations' }, texts)
}

/** One theory line per key is black; several lines of one theory take their series' colours. */
function theoryColours (theory: readonly TheoryOverlay[]): (o: TheoryOverlay) => string {
  const count = new Map<string, number>()
  for (const o of theory) count.set(`${o.key}|${o.kind}`, (count.get(`${o.key}|${o.kind}`) ?? 0) + 1)
  return (o) => (count.get(`${o.key}|${o.kind}`)! > 1 && o.series.length === 1 ? seriesStyle(o.series[0]!).colour : THEORY_STYLE[o.kind].colour)
}

/** A short deterministic id prefix, so several figures can share one page without id clashes. */
function fingerprint (plan: FigurePlan): string {
  const text = JSON.stringify([plan.results.map((r) => r.specHash), plan.options])
  let hash = 0x811c9dc5
  for (let i = 0; i < text.length; i++) {
    hash ^= text.charCodeAt(i)
    hash = Math.imul(hash, 0x01000193) >>> 0
  }
  return hash.toString(16).padStart(8, '0')
}
