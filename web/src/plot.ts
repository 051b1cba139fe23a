/**
 * The page's own line figure (used for the comparison overlay): curves with error bars, axes,
 * a legend under the plot. Each curve has its own marker shape and dash pattern besides its
 * colour, so the figure reads in black and white and for colour-blind readers.
 */
import { s } from './dom.js'
import { extentOf, linearTicks, logTicks, type Curve } from './curves.js'
import { formatValue } from './format.js'

/** Dark, well-separated inks; each also differs in lightness, which survives greyscale. */
const INKS = ['#163f6b', '#b24a12', '#1f6e43', '#6b2f83', '#101418', '#8c6a00']
const DASHES = ['', '7 4', '2 3', '10 3 2 3', '4 4', '1 2']
const MARKERS = ['circle', 'square', 'triangle', 'diamond', 'cross', 'ring'] as const

export interface PlotOptions {
  title: string
  xLabel: string
  yLabel: string
  xScale: 'linear' | 'log'
  /** Fixed y range (rates: [0, 1]); otherwise from the data. */
  yRange?: [number, number]
  width: number
  description: string
  /** A horizontal reference line (a threshold search's level). */
  level?: number
  /** Per curve, an estimate on x with its interval (a threshold search's crossing). */
  crossings?: Array<{ curve: number, at: number | null, low: number | null, high: number | null }>
}

export function styleOf (index: number): { ink: string, dash: string, marker: typeof MARKERS[number] } {
  return {
    ink: INKS[index % INKS.length] as string,
    dash: DASHES[index % DASHES.length] as string,
    // Past six curves the inks repeat; shifting the markers keeps every pairing distinct.
    marker: MARKERS[(index + Math.floor(index / INKS.length)) % MARKERS.length] as typeof MARKERS[number]
  }
}

function marker (kind: typeof MARKERS[number], x: number, y: number, ink: string): SVGElement {
  const r = 4.2
  switch (kind) {
    case 'circle': return s('circle', { cx: x, cy: y, r, fill: ink })
    case 'ring': return s('circle', { cx: x, cy: y, r, fill: '#fff', stroke: ink, 'stroke-width': 1.8 })
    case 'square': return s('rect', { x: x - r, y: y - r, width: 2 * r, height: 2 * r, fill: '#fff', stroke: ink, 'stroke-width': 1.8 })
    case 'triangle': return s('path', { d: `M${x} ${y - r * 1.2} L${x + r * 1.1} ${y + r * 0.8} L${x - r * 1.1} ${y + r * 0.8} Z`, fill: ink })
    case 'diamond': return s('path', { d: `M${x} ${y - r * 1.25} L${x + r * 1.1} ${y} L${x} ${y + r * 1.25} L${x - r * 1.1} ${y} Z`, fill: '#fff', stroke: ink, 'stroke-width': 1.8 })
    case 'cross': return s('path', { d: `M${x - r} ${y - r} L${x + r} ${y + r} M${x + r} ${y - r} L${x - r} ${y + r}`, stroke: ink, 'stroke-width': 2.2, fill: 'none' })
  }
}

function cut (text: string, max: number): string {
  return text.length > max ? `${text.slice(0, Math.max(1, max - 1))}…` : text
}

/** Draws the curves as a standalone SVG document element (downloadable as it is). */
export function drawPlot (curves: readonly Curve[], options: PlotOptions): SVGSVGElement {
  const width = options.width
  const plotHeight = Math.round(width * 0.56)
  const margin = { left: 70, right: 20, top: 44, bottom: 54 }
  const legendRow = 22
  const legendColumns = width >= 640 ? 2 : 1
  const legendHeight = Math.ceil(curves.length / legendColumns) * legendRow + 12
  const height = margin.top + plotHeight + margin.bottom + legendHeight
  const innerW = width - margin.left - margin.right
  const innerH = plotHeight

  const crossings = options.crossings ?? []
  const dataX = extentOf(curves, 'x') ?? [0, 1]
  const crossingXs = crossings.flatMap((c) => [c.low, c.high, c.at]).filter((v): v is number => v !== null && Number.isFinite(v))
  const xExtent: [number, number] = [Math.min(dataX[0], ...crossingXs), Math.max(dataX[1], ...crossingXs)]
  const yExtent = options.yRange ?? extentOf(curves, 'y') ?? [0, 1]
  const logX = options.xScale === 'log' && xExtent[0] > 0
  const pad = (lo: number, hi: number): [number, number] => lo === hi ? [lo - 0.5, hi + 0.5] : [lo, hi]
  const [xLow, xHigh] = logX ? [Math.log10(xExtent[0]), Math.log10(xExtent[1])] : pad(...xExtent)
  // Points at the ends of x keep clear of the frame too.
  const xMargin = (xHigh - xLow) * 0.03
  const [x0, x1] = [xLow - xMargin, xHigh + xMargin]
  const [yLow, yHigh] = pad(...yExtent)
  // A little room above and below, so points at 0 or 1 stay clear of the frame.
  const yMargin = (yHigh - yLow) * (options.yRange === undefined ? 0.05 : 0.03)
  const [y0, y1] = [yLow - yMargin, yHigh + yMargin]
  const xSpan = x1 === x0 ? 1 : x1 - x0
  const xPos = (x: number): number => margin.left + ((logX ? Math.log10(x) : x) - x0) / xSpan * innerW
  const yPos = (y: number): number => margin.top + innerH - (y - y0) / (y1 - y0) * innerH

  const titleId = `plot-title-${Math.random().toString(36).slice(2, 8)}`
  const descId = `${titleId}-desc`
  const svg = s('svg', {
    xmlns: 'http://www.w3.org/2000/svg',
    viewBox: `0 0 ${width} ${height}`,
    width,
    height,
    role: 'img',
    'aria-labelledby': `${titleId} ${descId}`,
    class: 'plot',
    'font-family': 'system-ui, -apple-system, "Segoe UI", Roboto, "DejaVu Sans", sans-serif',
    'font-size': 13
  },
  s('title', { id: titleId }, options.title),
  s('desc', { id: descId }, options.description),
  s('rect', { x: 0, y: 0, width, height, fill: '#ffffff' }),
  // About 8.5 px a character at 15 px bold: a long title is cut, whole in its tooltip and in <title>.
  s('text', { x: margin.left, y: 24, 'font-size': 15, 'font-weight': 600, fill: '#101418' }, cut(options.title, Math.floor((width - margin.left - margin.right) / 8.5)), s('title', {}, options.title)))

  // Grid and ticks.
  const grid = s('g', { stroke: '#d9dde2', 'stroke-width': 1 })
  const labels = s('g', { fill: '#2b323a' })
  const xTicks = logX ? logTicks(xExtent[0], xExtent[1]) : linearTicks(x0, x1, Math.max(3, Math.floor(innerW / 90)))
  for (const t of xTicks) {
    const x = xPos(t)
    grid.append(s('line', { x1: x, x2: x, y1: margin.top, y2: margin.top + innerH }))
    labels.append(s('text', { x, y: margin.top + innerH + 18, 'text-anchor': 'middle' }, formatValue(t, 4)))
  }
  for (const t of linearTicks(y0, y1, Math.max(3, Math.floor(innerH / 60)))) {
    const y = yPos(t)
    grid.append(s('line', { x1: margin.left, x2: margin.left + innerW, y1: y, y2: y }))
    labels.append(s('text', { x: margin.left - 8, y: y + 4, 'text-anchor': 'end' }, formatValue(t, 4)))
  }
  svg.append(grid, labels,
    s('rect', { x: margin.left, y: margin.top, width: innerW, height: innerH, fill: 'none', stroke: '#48515b', 'stroke-width': 1.2 }),
    s('text', { x: margin.left + innerW / 2, y: margin.top + innerH + 42, 'text-anchor': 'middle', fill: '#101418' }, options.xLabel + (logX ? ' (log scale)' : '')),
    s('text', { transform: `translate(18 ${margin.top + innerH / 2}) rotate(-90)`, 'text-anchor': 'middle', fill: '#101418' }, options.yLabel))

  // Crossings under the data: a pale band for the interval, a line in the curve's ink and dash at the estimate.
  for (const crossing of crossings) {
    const style = styleOf(crossing.curve)
    if (crossing.low !== null && crossing.high !== null) {
      svg.append(s('rect', { x: xPos(crossing.low), y: margin.top, width: Math.max(1, xPos(crossing.high) - xPos(crossing.low)), height: innerH, fill: style.ink, 'fill-opacity': 0.1 }))
    }
    if (crossing.at !== null) {
      const x = xPos(crossing.at)
      svg.append(s('line', { x1: x, x2: x, y1: margin.top, y2: margin.top + innerH, stroke: style.ink, 'stroke-width': 1.4, 'stroke-dasharray': style.dash === '' ? '6 3' : style.dash }))
    }
  }
  if (options.level !== undefined) {
    const y = yPos(options.level)
    svg.append(
      s('line', { x1: margin.left, x2: margin.left + innerW, y1: y, y2: y, stroke: '#48515b', 'stroke-width': 1.2, 'stroke-dasharray': '2 3' }),
      s('text', { x: margin.left + innerW - 4, y: y - 5, 'text-anchor': 'end', fill: '#2b323a', 'font-size': 12 }, `level ${formatValue(options.level, 3)}`))
  }

  curves.forEach((curve, index) => {
    const style = styleOf(index)
    const g = s('g', { 'data-curve': curve.name })
    const path = curve.points.map((p, i) => `${i === 0 ? 'M' : 'L'}${xPos(p.x).toFixed(1)} ${yPos(p.y).toFixed(1)}`).join(' ')
    g.append(s('path', { d: path, fill: 'none', stroke: style.ink, 'stroke-width': 1.8, 'stroke-dasharray': style.dash === '' ? null : style.dash }))
    for (const p of curve.points) {
      if (p.low !== null && p.high !== null) {
        const x = xPos(p.x)
        g.append(s('path', {
          d: `M${x} ${yPos(p.low)} V${yPos(p.high)} M${x - 3} ${yPos(p.low)} H${x + 3} M${x - 3} ${yPos(p.high)} H${x + 3}`,
          stroke: style.ink,
          'stroke-width': 1.1,
          fill: 'none'
        }))
      }
      g.append(marker(style.marker, xPos(p.x), yPos(p.y), style.ink))
    }
    svg.append(g)
  })

  // Legend under the plot, so it never hides a curve.
  const legendTop = margin.top + innerH + margin.bottom + 6
  const columnWidth = (width - margin.left - margin.right) / legendColumns
  // About 7 px a character at 13 px: longer names are cut, whole in a tooltip.
  const maxChars = Math.max(12, Math.floor((columnWidth - 52) / 7))
  curves.forEach((curve, index) => {
    const style = styleOf(index)
    const x = margin.left + (index % legendColumns) * columnWidth
    const y = legendTop + Math.floor(index / legendColumns) * legendRow
    svg.append(s('g', {},
      s('line', { x1: x, x2: x + 34, y1: y, y2: y, stroke: style.ink, 'stroke-width': 1.8, 'stroke-dasharray': style.dash === '' ? null : style.dash }),
      marker(style.marker, x + 17, y, style.ink),
      s('text', { x: x + 42, y: y + 4.5, fill: '#101418' },
        cut(curve.name, maxChars),
        s('title', {}, curve.name))))
  })
  return svg
}
