/**
 * Naming the lines. The house way is a direct label at the end of each line, in a margin to
 * the right of the plot, when every line ends at the right edge and the labels can sit near
 * their line ends without touching; otherwise a legend without a frame outside the data
 * area, in a column to the right of the plot or in rows under it. Reference lines are named
 * at the top of the plot (annotations) and enter the legend only when their name could not be written there.
 */
import { richText, richTextWidth } from './rich-text.js'
import { marker, seriesStyle, THEME, THEORY_STYLE, type SeriesStyle } from './styles.js'
import { element } from './svg.js'
import type { TheoryKind, TheoryOverlay } from './theory.js'
import type { PlotSeries } from './series.js'
import { truncate, wrapText } from './text-metrics.js'

export interface LegendEntry {
  label: string
  /** Index of the series, or null for a theory line. */
  series: number | null
  style: SeriesStyle | null
  theory: { key: string, kind: TheoryKind, colour: string } | null
}

export interface Rect { left: number, top: number, right: number, bottom: number }

/** A legend entry placed: its sample at (x, y) (the middle of its first line), its text lines after it. */
export interface PlacedEntry { entry: LegendEntry, x: number, y: number, lines: string[] }

export function legendEntries (series: readonly PlotSeries[], theory: readonly TheoryOverlay[], theoryColour: (o: TheoryOverlay) => string): LegendEntry[] {
  const entries: LegendEntry[] = series.map((s) => ({ label: s.label, series: s.index, style: seriesStyle(s.look, s.colour), theory: null }))
  // One theory drawn once per series, each line in its series' colour: one entry says so, in the neutral ink.
  const perSeries = new Map<string, number>()
  for (const o of theory) if (o.baseLabel !== undefined && o.series.length === 1) perSeries.set(`${o.key}|${o.kind}`, (perSeries.get(`${o.key}|${o.kind}`) ?? 0) + 1)
  const sharing = new Map<string, number>()
  for (const o of theory) sharing.set(o.label, (sharing.get(o.label) ?? 0) + 1)
  const seen = new Set<string>()
  for (const o of theory) {
    const grouped = (perSeries.get(`${o.key}|${o.kind}`) ?? 0) > 1 && o.baseLabel !== undefined
    const label = grouped ? `${o.baseLabel!}, one per series in its colour` : o.label
    if (seen.has(label)) continue
    seen.add(label)
    const colour = grouped || sharing.get(o.label)! > 1 ? THEORY_STYLE[o.kind].colour : theoryColour(o)
    entries.push({ label, series: null, style: null, theory: { key: o.key, kind: o.kind, colour } })
  }
  // A single series with no theory needs no legend: the axes say everything.
  return entries.length === 1 && theory.length === 0 ? [] : entries
}

/**
 * What stands before an entry's text: a stretch of the line with its marker (legend), or the
 * marker alone (a direct label, which sits at its line's end already).
 */
export type SampleKind = 'line' | 'marker'

export function sampleWidth (fontSize: number, kind: SampleKind = 'line'): number {
  return fontSize * (kind === 'line' ? 2.2 : 0.75)
}

/** The natural width of an entry: sample, gap, text. */
export function entryWidth (entry: LegendEntry, fontSize: number, kind: SampleKind = 'line'): number {
  return sampleWidth(fontSize, kind) + fontSize * 0.45 + richTextWidth(entry.label, fontSize)
}

/**
 * A column of entries from (left, top), each text cut to `textWidth`; entries that do not
 * fit in `height` are left out and counted in a last line.
 */
export function columnLayout (entries: readonly LegendEntry[], left: number, top: number, textWidth: number, height: number, fontSize: number): { placed: PlacedEntry[], more: number, moreY: number } {
  const step = fontSize * THEME.lineHeight
  const rows = Math.max(1, Math.floor(height / step))
  // Long names wrap to up to three lines, while the column has room for every entry.
  const wrapped = entries.map((entry) => wrapLabel(entry.label, fontSize, textWidth, 3))
  const lines = wrapped.reduce((n, l) => n + l.length, 0) + Math.max(0, entries.length - 1) * 0.3
  const all = lines <= rows ? wrapped : entries.map((entry) => [cutLabel(entry.label, fontSize, textWidth)])
  const placed: PlacedEntry[] = []
  let y = top + step / 2
  for (const [i, entry] of entries.entries()) {
    const entryLines = all[i]!
    const last = i === entries.length - 1
    // Keep a row for the count of those left out.
    if (y + step * (entryLines.length - 1) > top + height - (last ? 0 : step)) break
    placed.push({ entry, x: left, y, lines: entryLines })
    y += step * (entryLines.length + 0.3)
  }
  return { placed, more: entries.length - placed.length, moreY: y }
}

/** A label wrapped to at most `maxLines` lines of `width`, each cut to fit. */
function wrapLabel (label: string, fontSize: number, width: number, maxLines: number): string[] {
  if (richTextWidth(label, fontSize) <= width) return [label]
  return wrapText(label, fontSize, width, maxLines).map((line) => cutLabel(line, fontSize, width))
}

/** Rows of entries flowing left to right within `width`, from (left, top): the placed entries and the height used. */
export function rowLayout (entries: readonly LegendEntry[], left: number, top: number, width: number, fontSize: number): { placed: PlacedEntry[], height: number } {
  const step = fontSize * THEME.lineHeight
  const gap = fontSize * 1.2
  const placed: PlacedEntry[] = []
  let x = left
  let row = 0
  for (const entry of entries) {
    const textRoom = width - sampleWidth(fontSize) - fontSize * 0.45
    const label = cutLabel(entry.label, fontSize, textRoom)
    const w = sampleWidth(fontSize) + fontSize * 0.45 + richTextWidth(label, fontSize)
    if (x > left && x + w > left + width) { row++; x = left }
    placed.push({ entry, x, y: top + step * (row + 0.5), lines: [label] })
    x += w + gap
  }
  return { placed, height: entries.length === 0 ? 0 : step * (row + 1) }
}

/** A label cut to `width`, keeping its subscripts whole when it fits. */
function cutLabel (label: string, fontSize: number, width: number): string {
  if (richTextWidth(label, fontSize) <= width) return label
  // Cutting inside `_{…}` would break the markup: cut the plain text instead.
  return truncate(label.replace(/_\{([^}]*)\}/g, '_$1'), fontSize, width)
}

/** Draws placed entries (legend or direct labels): a line sample with the series marker, then the text. */
export function drawEntries (placed: readonly PlacedEntry[], fontSize: number, className: string, kind: SampleKind = 'line', more = 0, moreAt: { x: number, y: number } | null = null): string {
  const markerSize = fontSize * 0.62
  const parts = placed.map(({ entry, x, y, lines }) => {
    const x1 = x + sampleWidth(fontSize, kind)
    let sample: string
    let data: Record<string, string | number>
    if (entry.style !== null) {
      const style = entry.style
      sample = (kind === 'line' ? element('line', { x1: x, y1: y, x2: x1, y2: y, stroke: style.colour, 'stroke-width': 1.2, 'stroke-dasharray': style.dash === '' ? null : style.dash }) : '') +
        marker(style, (x + x1) / 2, y, markerSize)
      data = { 'data-series': entry.series!, 'data-marker': style.shape, 'data-filled': String(style.filled), 'data-dash': style.dash === '' ? 'solid' : style.dash }
    } else {
      const t = entry.theory!
      const look = THEORY_STYLE[t.kind]
      sample = element('line', { x1: x, y1: y, x2: x1, y2: y, stroke: t.colour, 'stroke-width': look.width, 'stroke-dasharray': kind === 'marker' || look.dash === '' ? null : look.dash })
      data = { 'data-theory': t.key, 'data-kind': t.kind }
    }
    const text = lines.map((line, k) => element('text', {
      x: x1 + fontSize * 0.45, y: y + fontSize * 0.32 + k * fontSize * THEME.lineHeight, 'font-size': fontSize, fill: THEME.ink
    }, richText(line, fontSize))).join('')
    return element('g', { class: 'legend-entry', ...data }, sample + text)
  })
  if (more > 0 && moreAt !== null) {
    parts.push(element('text', { class: 'legend-more', x: moreAt.x, y: moreAt.y + fontSize * 0.32, 'font-size': fontSize, fill: THEME.muted }, `+ ${more} more`))
  }
  return element('g', { class: className }, parts)
}
