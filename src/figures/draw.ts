/**
 * Lays a planned figure out in the house style (docs/figures.md) and writes the SVG: title and
 * subtitle at the top left, the y axis title above the plot, the plot on detached axes with
 * crosses at the tick intersections for a grid, lines named at their ends (or a frameless
 * legend outside the plot), the x axis title under the right end of its axis, the footnote
 * at the bottom. Every plotted point carries its data as attributes (data-x, data-y,
 * data-low, data-high, data-series, data-point), so a reader or a test can check the drawing
 * against the result.
 */
import { makeScale, yDomain, xDomain, type AxisScale } from './axes.js'
import { columnLayout, drawEntries, entryWidth, legendEntries, rowLayout, sampleWidth, type LegendEntry, type PlacedEntry, type Rect } from './legend.js'
import { isRate } from './measures.js'
import type { FigurePlan } from './plan.js'
import { plainText, richText, richTextWidth } from './rich-text.js'
import { marker, seriesStyle, THEME, THEORY_STYLE } from './styles.js'
import { element, escapeXml, exactNumber, polylinePath, px } from './svg.js'
import type { TheoryOverlay } from './theory.js'
import { textWidth, wrapText } from './text-metrics.js'

/** Type sizes and spacings of one figure, from its body size. */
interface Type {
  body: number
  title: number
  subtitle: number
  axisTitle: number
  tick: number
  label: number
  note: number
  annotation: number
  pad: number
  gap: number
  tickLength: number
  marker: number
  cap: number
}

function typeScale (fontSize: number): Type {
  const t = THEME.type
  return {
    body: fontSize,
    title: fontSize * t.title,
    subtitle: fontSize * t.subtitle,
    axisTitle: fontSize * t.axisTitle,
    tick: fontSize * t.tick,
    label: fontSize * t.label,
    note: fontSize * t.note,
    annotation: fontSize * t.annotation,
    pad: Math.max(4, fontSize * 0.8),
    gap: fontSize * 0.45,
    tickLength: fontSize * 0.35,
    marker: fontSize * 0.62,
    cap: fontSize * 0.28
  }
}

/** Most of the width the names of the lines may take beside the plot. */
const SIDE_SHARE = 0.36

// MAIN //

export function drawFigure (plan: FigurePlan): string {
  const { width, height } = plan.frame
  const type = typeScale(plan.frame.fontSize)
  const id = `msfig-${fingerprint(plan)}`
  const o = plan.options
  const inner = width - 2 * type.pad
  const lh = THEME.lineHeight

  // Small figures keep the plot: one line each for the title and the footnote, no subtitle.
  const compact = width < type.body * 30 || height < type.body * 21
  const titleLines = o.showTitle ? wrapText(plan.title, type.title, inner, compact ? 1 : 2, 'semibold') : []
  const subtitleLines = o.showSubtitle && plan.subtitle !== '' && !(compact && o.subtitle === undefined) ? wrapText(plainText(plan.subtitle), type.subtitle, inner, compact ? 1 : 2) : []
  const noteLines = o.showFootnote && plan.note !== '' ? wrapText(plan.note, type.note, inner, compact ? 1 : 3) : []

  const header: string[] = []
  let cursor = type.pad
  for (const line of titleLines) {
    header.push(element('text', { class: 'title', x: type.pad, y: cursor + type.title * 0.8, 'font-size': type.title, 'font-weight': 600, fill: THEME.ink }, escapeXml(line)))
    cursor += type.title * lh
  }
  for (const line of subtitleLines) {
    header.push(element('text', { class: 'subtitle', x: type.pad, y: cursor + type.subtitle * 0.8, 'font-size': type.subtitle, fill: THEME.muted }, escapeXml(line)))
    cursor += type.subtitle * lh
  }
  if (header.length > 0) cursor += type.gap
  // The y axis title reads horizontally above the plot, where it has the whole width.
  const yTitle = fitLabel(plan.yTitle, inner, type.axisTitle)
  const yTitleBaseline = cursor + yTitle.size * 0.8
  cursor += yTitle.size * lh + type.gap * 0.5
  const annotated = plan.theory.some((t) => t.annotation !== undefined)
  const plotTop = cursor + (annotated ? type.annotation * lh : 0) + type.gap * 0.5

  // From the bottom up: footnote, x axis title, tick labels.
  const footBlock = noteLines.length * type.note * lh
  const noteTop = height - type.pad - footBlock
  const bottom = noteTop - (noteLines.length > 0 ? type.gap : 0)
  const axisDrop = type.gap * 0.7
  const tickBlock = axisDrop + type.tickLength + type.gap * 0.5 + type.tick * 1.05

  const theoryColour = theoryColours(plan)
  const entries = legendEntries(plan.series, plan.theory, theoryColour)
  // Reference lines named at the top of the plot need no legend entry.
  const inLegend = (shownAnnotations: ReadonlySet<string>) => entries.filter((e) => e.theory === null || e.theory.kind !== 'reference' || !shownAnnotations.has(e.theory.key))

  // Under the plot, top down: tick labels, x axis title, legend rows (when the legend goes there), footnote.
  const layout = (right: number, below: number): { plot: Rect, xs: AxisScale, ys: AxisScale, xTitleBaseline: number, rowsTop: number } => {
    const rowsTop = bottom - below
    const xTitleBaseline = rowsTop - type.axisTitle * 0.3
    const plotBottom = rowsTop - type.axisTitle * lh - tickBlock
    const ys = makeYScale(plan, plotBottom, plotTop, type)
    const yLabelWidth = Math.max(...ys.ticks.map((t) => textWidth(ys.label(t), type.tick)), type.tick)
    const plotLeft = type.pad + yLabelWidth + type.gap * 0.6 + type.tickLength + axisDrop
    const plot = { left: plotLeft, top: plotTop, right: width - type.pad - right, bottom: plotBottom }
    return { plot, xs: makeXScale(plan, plot, type), ys, xTitleBaseline, rowsTop }
  }

  // First choice: names at the line ends.
  let mode: 'none' | 'direct' | 'side' | 'below' = entries.length === 0 ? 'none' : 'direct'
  let frame = layout(0, 0)
  let direct: PlacedEntry[] = []
  let legend: { placed: PlacedEntry[], more: number, moreAt: { x: number, y: number } | null } = { placed: [], more: 0, moreAt: null }
  let annotations = placeAnnotations(plan.theory, frame.xs, frame.plot, type, theoryColour)
  if (mode === 'direct') {
    const margin = Math.max(...inLegend(annotations.keys).map((e) => entryWidth(e, type.label, 'marker'))) + type.gap
    if (margin <= width * SIDE_SHARE) {
      frame = layout(margin, 0)
      annotations = placeAnnotations(plan.theory, frame.xs, frame.plot, type, theoryColour)
      const placed = directLabels(plan, inLegend(annotations.keys), frame, type)
      if (placed !== null) direct = placed
      else mode = 'side'
    } else {
      mode = 'side'
    }
  }
  if (mode === 'side') {
    const natural = Math.max(...entries.map((e) => entryWidth(e, type.label)))
    // Long names go under the plot when there is height to spare; otherwise they are cut to fit beside it.
    const rowsBelow = rowLayout(entries, type.pad, 0, inner, type.label)
    const plotHeightBelow = bottom - rowsBelow.height - type.gap - type.axisTitle * lh - tickBlock - plotTop
    if (natural > width * SIDE_SHARE && plotHeightBelow >= (height - 2 * type.pad) * 0.42) mode = 'below'
    if (mode === 'below') {
      frame = layout(0, rowsBelow.height + type.gap)
      annotations = placeAnnotations(plan.theory, frame.xs, frame.plot, type, theoryColour)
      const shown = inLegend(annotations.keys)
      const rows = rowLayout(shown, type.pad, frame.rowsTop + type.gap * 0.5, inner, type.label)
      legend = { placed: rows.placed, more: 0, moreAt: null }
    } else {
      const columnWidth = Math.min(natural, width * SIDE_SHARE)
      frame = layout(columnWidth + type.gap * 2, 0)
      annotations = placeAnnotations(plan.theory, frame.xs, frame.plot, type, theoryColour)
      const shown = inLegend(annotations.keys)
      const left = frame.plot.right + type.gap * 2
      const textRoom = columnWidth - sampleWidth(type.label) - type.label * 0.45
      const column = columnLayout(shown, left, frame.plot.top, textRoom, frame.plot.bottom - frame.plot.top, type.label)
      legend = { placed: column.placed, more: column.more, moreAt: column.more > 0 ? { x: left, y: column.moreY } : null }
    }
  }
  const { plot, xs, ys, xTitleBaseline } = frame

  const body = [
    element('rect', { x: 0, y: 0, width, height, fill: THEME.paper }),
    ...header,
    element('text', { class: 'y-title', x: type.pad, y: yTitleBaseline, 'font-size': yTitle.size, fill: THEME.ink }, richText(yTitle.text, yTitle.size)),
    drawGrid(plot, xs, ys, type),
    element('defs', {}, element('clipPath', { id: `${id}-clip` }, element('rect', { x: plot.left, y: plot.top, width: plot.right - plot.left, height: plot.bottom - plot.top }))),
    element('g', { class: 'theory-lines', 'clip-path': `url(#${id}-clip)` }, plan.theory.map((t) => drawTheory(t, xs, ys, plot, theoryColour(t)))),
    element('g', { class: 'data', 'clip-path': `url(#${id}-clip)` }, plan.series.map((s) => drawSeries(plan, s.index, xs, ys, plan.dodge[s.index] ?? 0, type))),
    drawAxes(plot, xs, ys, type, axisDrop, width),
    annotations.markup,
    drawXTitle(plan.xTitle, plot, xTitleBaseline, type, width),
    mode === 'direct' ? drawEntries(direct, type.label, 'direct-labels', 'marker') : '',
    mode === 'side' || mode === 'below' ? drawEntries(legend.placed, type.label, 'legend', 'line', legend.more, legend.moreAt) : '',
    noteLines.length === 0
      ? ''
      : element('g', { class: 'note' }, noteLines.map((line, k) =>
        element('text', { x: type.pad, y: noteTop + type.note * (0.8 + k * lh), 'font-size': type.note, fill: THEME.muted }, escapeXml(line))))
  ]
  const root = {
    xmlns: 'http://www.w3.org/2000/svg',
    width: plan.frame.widthAttr,
    height: plan.frame.heightAttr,
    viewBox: `0 0 ${px(width)} ${px(height)}`,
    role: 'img',
    'aria-labelledby': `${id}-title ${id}-desc`,
    'font-family': THEME.fontFamily,
    'data-measure': o.measure,
    'data-x': plan.x,
    'data-series-by': plan.seriesBy ?? '',
    'data-x-scale': o.xScale,
    'data-y-scale': o.yScale,
    'data-error-bars': o.errorBars,
    'data-legend': mode
  }
  return `<?xml version="1.0" encoding="UTF-8"?>\n${element('svg', root, [
    element('title', { id: `${id}-title` }, escapeXml(plan.title)),
    element('desc', { id: `${id}-desc` }, escapeXml(plan.description)),
    ...body
  ])}\n`
}

/**
 * Names at the line ends, in a margin right of the plot: each line must reach the right end
 * of the x range (a name beside a line that stops short would point at another), and the
 * names, pushed apart so they do not touch, must stay within a line height and a half of
 * their line's end. Null when that is not possible.
 */
function directLabels (plan: FigurePlan, entries: readonly LegendEntry[], frame: { plot: Rect, xs: AxisScale, ys: AxisScale }, type: Type): PlacedEntry[] | null {
  const { plot, xs, ys } = frame
  const xMax = Math.max(...plan.series.flatMap((s) => s.points.map((p) => p.x)))
  const ends: Array<{ entry: LegendEntry, y: number }> = []
  for (const entry of entries) {
    let end: readonly [number, number] | undefined
    if (entry.series !== null) {
      const last = plan.series[entry.series]!.points.at(-1)
      end = last === undefined ? undefined : [last.x, last.y]
    } else {
      const lines = plan.theory.filter((t) => t.key === entry.theory!.key && t.kind === entry.theory!.kind && (t.kind !== 'reference' || t.horizontal === true))
      if (lines.length !== 1) return null
      end = lines[0]!.segments.at(-1)?.at(-1)
    }
    if (end === undefined || !(Math.abs(xs.toPx(end[0]) - xs.toPx(xMax)) < 1)) return null
    ends.push({ entry, y: ys.toPx(clampToDomain(end[1], ys)) })
  }
  if (ends.length === 0) return null
  const step = type.label * THEME.lineHeight
  const ys0 = spreadApart(ends.map((e) => e.y), step, plot.top + step / 2, plot.bottom - step / 2)
  if (ys0 === null) return null
  if (ends.some((e, i) => Math.abs(ys0[i]! - e.y) > step * 1.5)) return null
  const x = plot.right + type.gap
  return ends.map((e, i) => ({ entry: e.entry, x, y: ys0[i]!, lines: [e.entry.label] }))
}

function clampToDomain (v: number, ys: AxisScale): number {
  const [lo, hi] = ys.domain
  if (ys.kind === 'log' && !(v > 0)) return lo
  return Math.min(Math.max(v, Math.min(lo, hi)), Math.max(lo, hi))
}

/**
 * Positions as close to `wanted` as possible, at least `step` apart, within [lo, hi]: the
 * order is kept and overlapping runs are centred on their mean (a few passes converge for
 * the handful of lines a figure names). Null when they cannot fit.
 */
export function spreadApart (wanted: readonly number[], step: number, lo: number, hi: number): number[] | null {
  const n = wanted.length
  if ((n - 1) * step > hi - lo) return null
  const order = wanted.map((y, i) => ({ y, i })).sort((a, b) => a.y - b.y || a.i - b.i)
  const pos = order.map((o) => Math.min(Math.max(o.y, lo), hi))
  for (let pass = 0; pass < 50; pass++) {
    let moved = false
    for (let k = 1; k < n; k++) {
      const overlap = pos[k - 1]! + step - pos[k]!
      if (overlap > 1e-9) {
        pos[k - 1]! -= overlap / 2
        pos[k]! += overlap / 2
        moved = true
      }
    }
    if (pos[0]! < lo) { const d = lo - pos[0]!; for (let k = 0; k < n; k++) pos[k]! += d }
    if (pos[n - 1]! > hi) { const d = pos[n - 1]! - hi; for (let k = 0; k < n; k++) pos[k]! -= d }
    for (let k = 1; k < n; k++) if (pos[k]! < pos[k - 1]! + step) pos[k] = pos[k - 1]! + step
    if (!moved) break
  }
  if (pos[n - 1]! > hi + 1e-6) return null
  const out = new Array<number>(n)
  order.forEach((o, k) => { out[o.i] = pos[k]! })
  return out
}

function makeYScale (plan: FigurePlan, bottom: number, top: number, type: Type): AxisScale {
  const o = plan.options
  const values: number[] = []
  for (const s of plan.series) {
    for (const p of s.points) {
      values.push(p.y)
      if (p.low !== null) values.push(p.low)
      if (p.high !== null) values.push(p.high)
    }
  }
  for (const t of plan.theory) {
    for (const seg of t.segments) for (const [, y] of seg) values.push(y)
    if (t.band !== undefined) values.push(t.band.low, t.band.high)
  }
  const usable = o.yScale === 'log' ? values.filter((v) => v > 0) : values
  const extent: [number, number] | null = usable.length === 0 ? null : [Math.min(...usable), Math.max(...usable)]
  const follows = plan.yFollowsData === true && extent !== null && o.yScale === 'linear'
  const domain: [number, number] = follows
    ? (extent[0] === extent[1] ? [extent[0] - 0.05, extent[1] + 0.05] : extent)
    : yDomain(o.measure, extent, o.yScale)
  const fixed = !follows && o.yScale === 'linear' && (isRate(o.measure) && o.measure !== 'unstableFraction')
  return makeScale(o.yScale, domain, bottom, top, type.body * 4.5, fixed, type.marker * 1.1)
}

function makeXScale (plan: FigurePlan, plot: Rect, type: Type): AxisScale {
  const xs = plan.series.flatMap((s) => s.rows.map((row) => row.values[plan.x] as number))
  const extent: [number, number] = xs.length === 0 ? [0, 1] : [Math.min(...xs), Math.max(...xs)]
  const domain = xDomain(extent, plan.options.xScale)
  // Fewer ticks until neighbouring labels keep a gap between them.
  let spacing = type.body * 5.5
  let scale = makeScale(plan.options.xScale, domain, plot.left, plot.right, spacing, false, type.marker * 1.1)
  for (let attempt = 0; attempt < 8 && crowded(scale, type); attempt++) {
    spacing *= 1.4
    scale = makeScale(plan.options.xScale, domain, plot.left, plot.right, spacing, false, type.marker * 1.1)
  }
  return scale
}

function crowded (scale: AxisScale, type: Type): boolean {
  for (let i = 1; i < scale.ticks.length; i++) {
    const [a, b] = [scale.ticks[i - 1]!, scale.ticks[i]!]
    const room = Math.abs(scale.toPx(b) - scale.toPx(a))
    const need = (textWidth(scale.label(a), type.tick) + textWidth(scale.label(b), type.tick)) / 2 + type.body
    if (room < need) return true
  }
  return false
}

/** Small crosses where the ticks meet: the grid, without lines running through the data. */
function drawGrid (plot: Rect, xs: AxisScale, ys: AxisScale, type: Type): string {
  const arm = type.body * 0.22
  const marks: string[] = []
  for (const x of xs.ticks.map((t) => xs.toPx(t))) {
    for (const y of ys.ticks.map((t) => ys.toPx(t))) {
      if (x < plot.left - 0.5 || x > plot.right + 0.5 || y < plot.top - 0.5 || y > plot.bottom + 0.5) continue
      marks.push(`M${px(x - arm)} ${px(y)}h${px(2 * arm)}M${px(x)} ${px(y - arm)}v${px(2 * arm)}`)
    }
  }
  return element('g', { class: 'grid' }, marks.length === 0 ? '' : element('path', { d: marks.join(''), stroke: THEME.grid, 'stroke-width': 0.8, fill: 'none' }))
}

/**
 * Axes set off from the plot by a small gap, each line running from its first tick to its
 * last (the range of the scale, not a box around the data).
 */
function drawAxes (plot: Rect, xs: AxisScale, ys: AxisScale, type: Type, drop: number, width: number): string {
  const ink = { stroke: THEME.axis, 'stroke-width': 0.9, 'stroke-linecap': 'square' }
  const xAxisY = plot.bottom + drop
  const yAxisX = plot.left - drop
  // From the first tick or the start of the range, whichever comes first, to the last tick or its end.
  const span = (scale: AxisScale): [number, number] | [null, null] => {
    const at = [...scale.ticks, ...scale.domain].map((v) => scale.toPx(v))
    return scale.ticks.length === 0 ? [null, null] : [Math.min(...at), Math.max(...at)]
  }
  const xEnds = span(xs)
  const yEnds = span(ys)
  const lines = [
    xEnds[0] === null ? '' : element('line', { x1: xEnds[0]!, x2: xEnds[1]!, y1: xAxisY, y2: xAxisY, ...ink }),
    yEnds[0] === null ? '' : element('line', { x1: yAxisX, x2: yAxisX, y1: yEnds[0]!, y2: yEnds[1]!, ...ink })
  ]
  const labelY = xAxisY + type.tickLength + type.gap * 0.5 + type.tick * 0.8
  const xTicks = xs.ticks.map((t) => {
    const at = xs.toPx(t)
    const label = xs.label(t)
    const half = textWidth(label, type.tick) / 2
    // A label at either end keeps inside the page.
    const centre = Math.min(Math.max(at, type.pad + half), width - type.pad - half)
    return element('g', { class: 'tick', 'data-value': exactNumber(t) }, [
      element('line', { x1: at, x2: at, y1: xAxisY, y2: xAxisY + type.tickLength, ...ink }),
      element('text', { x: centre, y: labelY, 'text-anchor': 'middle', 'font-size': type.tick, fill: THEME.ink }, escapeXml(label))
    ])
  })
  const xMinor = xs.minor.map((t) => element('line', { x1: xs.toPx(t), x2: xs.toPx(t), y1: xAxisY, y2: xAxisY + type.tickLength * 0.6, ...ink }))
  const yTicks = ys.ticks.map((t) => element('g', { class: 'tick', 'data-value': exactNumber(t) }, [
    element('line', { x1: yAxisX - type.tickLength, x2: yAxisX, y1: ys.toPx(t), y2: ys.toPx(t), ...ink }),
    element('text', { x: yAxisX - type.tickLength - type.gap * 0.6, y: ys.toPx(t) + type.tick * 0.33, 'text-anchor': 'end', 'font-size': type.tick, fill: THEME.ink }, escapeXml(ys.label(t)))
  ]))
  const yMinor = ys.minor.map((t) => element('line', { x1: yAxisX - type.tickLength * 0.6, x2: yAxisX, y1: ys.toPx(t), y2: ys.toPx(t), ...ink }))
  return element('g', { class: 'axes' }, [
    ...lines,
    element('g', { class: 'x-axis', 'data-scale': xs.kind }, [...xTicks, ...xMinor]),
    element('g', { class: 'y-axis', 'data-scale': ys.kind }, [...yTicks, ...yMinor])
  ])
}

/** The x axis title ends under the right end of the plot, or starts at its left when it is longer than the plot is wide. */
function drawXTitle (title: string, plot: Rect, baseline: number, type: Type, width: number): string {
  const room = width - 2 * type.pad
  const fitted = fitLabel(title, room, type.axisTitle)
  const w = richTextWidth(fitted.text, fitted.size)
  const right = Math.min(plot.right, width - type.pad)
  const anchorEnd = right - w >= type.pad
  return element('g', { class: 'axis-titles', fill: THEME.ink }, element('text', {
    class: 'x-title', x: anchorEnd ? right : type.pad, y: baseline, 'text-anchor': anchorEnd ? 'end' : 'start', 'font-size': fitted.size
  }, richText(fitted.text, fitted.size)))
}

/** An axis title that fits its room: a smaller size first, then cut with an ellipsis. */
function fitLabel (label: string, room: number, size: number): { text: string, size: number } {
  for (let s = size; s >= size * 0.85; s -= size * 0.05) {
    if (richTextWidth(label, s) <= room) return { text: label, size: s }
  }
  const s = size * 0.85
  return { text: wrapText(plainText(label), s, room, 1)[0] ?? label, size: s }
}

function drawSeries (plan: FigurePlan, index: number, xs: AxisScale, ys: AxisScale, shift: number, type: Type): string {
  const s = plan.series[index]!
  const style = seriesStyle(s.look, s.colour)
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
      const ink = { stroke: style.colour, 'stroke-width': 1 }
      // No caps: a bar is a plain stroke, ended by a short cross-line only when it is long enough to need one.
      const cap = Math.abs(y2 - y1) > type.marker * 2 ? type.cap : 0
      bar = element('g', { class: 'error-bar', 'data-y1': px(y1), 'data-y2': px(y2) }, [
        element('line', { x1: cx, x2: cx, y1, y2, ...ink }),
        cap === 0 ? '' : element('line', { x1: cx - cap, x2: cx + cap, y1, y2: y1, ...ink }),
        cap === 0 ? '' : element('line', { x1: cx - cap, x2: cx + cap, y1: y2, y2, ...ink })
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
    }, bar + marker(style, cx, cy, type.marker))
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
  if (o.kind === 'reference' && o.horizontal === true) {
    const y = ys.toPx(o.segments[0]![0]![1])
    if (y < plot.top || y > plot.bottom) return ''
    return element('g', { ...data, 'data-y': exactNumber(o.segments[0]![0]![1]) }, element('line', { x1: plot.left, x2: plot.right, y1: y, y2: y, ...stroke }))
  }
  if (o.kind === 'reference') {
    const x = xs.toPx(o.at!)
    if (x < plot.left || x > plot.right) return ''
    const line = element('line', { x1: x, x2: x, y1: plot.top, y2: plot.bottom, ...stroke })
    return element('g', { ...data, 'data-at': exactNumber(o.at!) }, line)
  }
  const band = o.band === undefined
    ? ''
    : element('rect', {
      class: 'band',
      x: plot.left,
      width: plot.right - plot.left,
      y: ys.toPx(Math.max(o.band.low, o.band.high)),
      height: Math.abs(ys.toPx(o.band.low) - ys.toPx(o.band.high)),
      fill: colour,
      'fill-opacity': 0.12,
      'data-low': exactNumber(o.band.low),
      'data-high': exactNumber(o.band.high)
    })
  const paths = o.segments.map((seg) => element('path', {
    d: polylinePath(seg.map(([x, y]) => [xs.toPx(x), ys.toPx(y)] as const)),
    'data-xs': seg.map(([x]) => exactNumber(x)).join(' '),
    'data-ys': seg.map(([, y]) => exactNumber(y)).join(' '),
    'stroke-linejoin': 'round',
    ...stroke
  }))
  return element('g', data, [band, ...paths])
}

/**
 * Names of the reference lines, just above the plot where no data can hide them. Several
 * lines close together: their values alone (the legend names them), and any that would
 * still overlap its left neighbour is left out rather than drawn over it.
 */
function placeAnnotations (theory: readonly TheoryOverlay[], xs: AxisScale, plot: Rect, type: Type, colour: (o: TheoryOverlay) => string): { markup: string, keys: Set<string> } {
  const lines = theory.filter((o) => o.kind === 'reference' && o.at !== null && o.annotation !== undefined).sort((a, b) => a.at! - b.at!)
  const size = type.annotation
  const place = (text: (o: TheoryOverlay) => string) => lines.map((o) => {
    const half = richTextWidth(text(o), size) / 2
    return { o, text: text(o), left: Math.min(Math.max(xs.toPx(o.at!), plot.left + half), plot.right - half) - half, width: 2 * half }
  })
  const space = size * 0.35
  const overlapping = (boxes: ReturnType<typeof place>) => boxes.some((b, i) => i > 0 && b.left < boxes[i - 1]!.left + boxes[i - 1]!.width + space)
  let boxes = place((o) => o.annotation!)
  let full = true
  if (overlapping(boxes)) { boxes = place((o) => o.annotation!.split(' = ').pop()!); full = false }
  const kept: typeof boxes = []
  for (const box of boxes) if (kept.length === 0 || box.left >= kept[kept.length - 1]!.left + kept[kept.length - 1]!.width + space) kept.push(box)
  const texts = kept.map(({ o, text, left, width }) => element('text', {
    class: 'annotation',
    'data-theory': o.key,
    'data-label': plainText(text),
    x: left + width / 2,
    y: plot.top - type.gap * 0.8,
    'text-anchor': 'middle',
    'font-size': size,
    fill: colour(o)
  }, richText(text, size)))
  // A line is named by its annotation only when the annotation says what it is, and every line of that theory has one.
  const keys = new Set<string>()
  if (full) {
    for (const key of new Set(lines.map((o) => o.key))) {
      if (lines.filter((o) => o.key === key).every((o) => kept.some((k) => k.o === o))) keys.add(key)
    }
  }
  return { markup: texts.length === 0 ? '' : element('g', { class: 'annotations' }, texts), keys }
}

/** One theory line per key is dark; several lines of one theory take their series' colours. */
function theoryColours (plan: FigurePlan): (o: TheoryOverlay) => string {
  const count = new Map<string, number>()
  for (const o of plan.theory) count.set(`${o.key}|${o.kind}`, (count.get(`${o.key}|${o.kind}`) ?? 0) + 1)
  return (o) => {
    if (count.get(`${o.key}|${o.kind}`)! > 1 && o.series.length === 1) {
      const s = plan.series[o.series[0]!]!
      return seriesStyle(s.look, s.colour).colour
    }
    return THEORY_STYLE[o.kind].colour
  }
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
