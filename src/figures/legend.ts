/**
 * The legend: one entry per series (marker on its line style) and per theory line, in a
 * box placed where it hides the fewest data; outside the plot, to the right, when every
 * place inside would hide some and there is room.
 */
import { richText, richTextWidth } from './rich-text.js'
import { marker, seriesStyle, THEORY_STYLE, type SeriesStyle } from './styles.js'
import { element } from './svg.js'
import type { TheoryKind, TheoryOverlay } from './theory.js'
import type { PlotSeries } from './series.js'
import { wrapText } from './text-metrics.js'

export interface LegendEntry {
  label: string
  series: number | null
  theory: { key: string, kind: TheoryKind, colour: string } | null
}

export interface LegendBox { width: number, height: number, lines: string[][] }

export const LEGEND_FONT = 12
const LINE_HEIGHT = 15
const ENTRY_GAP = 3
const PAD = 7
const SAMPLE = 30

export function legendEntries (series: readonly PlotSeries[], theory: readonly TheoryOverlay[], theoryColour: (o: TheoryOverlay) => string): LegendEntry[] {
  const entries: LegendEntry[] = series.map((s) => ({ label: s.label, series: s.index, theory: null }))
  const sharing = new Map<string, number>()
  for (const o of theory) sharing.set(o.label, (sharing.get(o.label) ?? 0) + 1)
  const seen = new Set<string>()
  for (const o of theory) {
    if (seen.has(o.label)) continue
    seen.add(o.label)
    // One entry stands for several lines of different colours: draw it in the neutral ink.
    const colour = sharing.get(o.label)! > 1 ? THEORY_STYLE[o.kind].colour : theoryColour(o)
    entries.push({ label: o.label, series: null, theory: { key: o.key, kind: o.kind, colour } })
  }
  // A single series with no theory needs no legend: the axes say everything.
  return entries.length === 1 && theory.length === 0 ? [] : entries
}

export function measureLegend (entries: readonly LegendEntry[], maxTextWidth: number): LegendBox {
  const lines = entries.map((e) => wrapText(e.label, LEGEND_FONT, maxTextWidth, 2))
  const textWidth = Math.max(0, ...lines.flat().map((l) => richTextWidth(l, LEGEND_FONT)))
  const rows = lines.reduce((n, l) => n + l.length, 0)
  return {
    width: PAD * 2 + SAMPLE + 8 + textWidth,
    height: PAD * 2 + rows * LINE_HEIGHT + Math.max(0, entries.length - 1) * ENTRY_GAP,
    lines
  }
}

export function drawLegend (entries: readonly LegendEntry[], box: LegendBox, left: number, top: number): string {
  const parts: string[] = [element('rect', {
    x: left, y: top, width: box.width, height: box.height, fill: '#ffffff', 'fill-opacity': 0.9, stroke: '#999999', 'stroke-width': 0.8, rx: 2
  })]
  let y = top + PAD
  entries.forEach((entry, i) => {
    const lines = box.lines[i]!
    const mid = y + LINE_HEIGHT / 2
    const x0 = left + PAD
    let sample: string
    let data: Record<string, string | number>
    if (entry.series !== null) {
      const style: SeriesStyle = seriesStyle(entry.series)
      sample = element('line', { x1: x0, y1: mid, x2: x0 + SAMPLE, y2: mid, stroke: style.colour, 'stroke-width': 1.2, 'stroke-dasharray': style.dash === '' ? null : style.dash }) +
        marker(style, x0 + SAMPLE / 2, mid, 8)
      data = { 'data-series': entry.series, 'data-marker': style.shape, 'data-filled': String(style.filled), 'data-dash': style.dash === '' ? 'solid' : style.dash }
    } else {
      const t = entry.theory!
      const look = THEORY_STYLE[t.kind]
      sample = element('line', { x1: x0, y1: mid, x2: x0 + SAMPLE, y2: mid, stroke: t.colour, 'stroke-width': look.width, 'stroke-dasharray': look.dash === '' ? null : look.dash })
      data = { 'data-theory': t.key, 'data-kind': t.kind }
    }
    const text = lines.map((line, k) => element('text', { x: x0 + SAMPLE + 8, y: mid + k * LINE_HEIGHT, 'dominant-baseline': 'central', 'font-size': LEGEND_FONT, fill: '#111111' }, richText(line, LEGEND_FONT))).join('')
    parts.push(element('g', { class: 'legend-entry', ...data }, sample + text))
    y += lines.length * LINE_HEIGHT + ENTRY_GAP
  })
  return element('g', { class: 'legend' }, parts)
}

export interface Rect { left: number, top: number, right: number, bottom: number }

/**
 * The inside position (corners first, then edge middles) covering the fewest obstacles, with
 * how many it covers.
 */
export function placeInside (box: LegendBox, plot: Rect, obstacles: ReadonlyArray<readonly [number, number]>): { left: number, top: number, covered: number } {
  const m = 8
  const xs = { l: plot.left + m, c: (plot.left + plot.right - box.width) / 2, r: plot.right - m - box.width }
  const ys = { t: plot.top + m, m: (plot.top + plot.bottom - box.height) / 2, b: plot.bottom - m - box.height }
  const candidates: Array<[number, number]> = [[xs.r, ys.t], [xs.l, ys.t], [xs.r, ys.b], [xs.l, ys.b], [xs.c, ys.t], [xs.c, ys.b], [xs.r, ys.m], [xs.l, ys.m]]
  let best = { left: candidates[0]![0], top: candidates[0]![1], covered: Infinity }
  for (const [left, top] of candidates) {
    if (left < plot.left || top < plot.top) continue
    let covered = 0
    for (const [x, y] of obstacles) {
      if (x >= left - 4 && x <= left + box.width + 4 && y >= top - 4 && y <= top + box.height + 4) covered++
    }
    if (covered < best.covered) best = { left, top, covered }
  }
  return best
}
