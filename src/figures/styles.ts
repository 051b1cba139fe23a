/**
 * The house style (docs/figures.md): how series, theory lines, text and axes look. Series
 * differ in marker shape, filled or open marker, and dash pattern, so a figure printed in
 * grey still tells them apart; colour (a palette safe for the common colour-vision
 * deficiencies, Okabe & Ito 2008, in our own order) only helps on screen.
 */
import { element, px } from './svg.js'

export const MARKER_SHAPES = ['circle', 'square', 'triangle', 'diamond', 'triangle-down', 'plus', 'pentagon', 'star'] as const
export type MarkerShape = typeof MARKER_SHAPES[number]

/** Dash arrays; '' is a solid line. */
export const SERIES_DASHES = ['', '6 3', '2 2', '8 3 2 3', '12 4', '4 2 1 2 1 2', '1 3', '12 3 3 3'] as const

export const PALETTE = ['#0072B2', '#D55E00', '#009E73', '#CC79A7', '#56B4E9', '#E69F00', '#3B3B3B'] as const

/** Inks and type of the house style. Type sizes are multiples of the body size. */
export const THEME = {
  fontFamily: "'Source Sans 3', 'Source Sans Pro', 'Segoe UI', 'Noto Sans', 'Helvetica Neue', Arial, sans-serif",
  paper: '#ffffff',
  ink: '#1c2128',
  muted: '#59616b',
  /** The crosses that stand for a grid at the tick intersections. */
  grid: '#b9b3a6',
  axis: '#3a4048',
  type: { title: 1.3, subtitle: 0.92, axisTitle: 1, tick: 0.9, label: 0.92, note: 0.8, annotation: 0.85 },
  lineHeight: 1.22
} as const

export interface SeriesStyle {
  shape: MarkerShape
  filled: boolean
  dash: string
  colour: string
}

/**
 * Style of a series: the marker and dash follow `look` (shapes cycle fastest, then
 * filled/open alternates, so the first 16 have distinct markers; dashes cycle on their own
 * period), the colour follows `colour` (the same as `look` unless an overlay colours by sweep).
 */
export function seriesStyle (look: number, colour = look): SeriesStyle {
  const shapes = MARKER_SHAPES.length
  return {
    shape: MARKER_SHAPES[look % shapes]!,
    filled: Math.floor(look / shapes) % 2 === 0,
    dash: SERIES_DASHES[look % SERIES_DASHES.length]!,
    colour: PALETTE[colour % PALETTE.length]!
  }
}

/** Theory lines: darker and heavier than data lines, no markers. */
export const THEORY_STYLE = {
  curve: { dash: '', width: 1.9, colour: '#2b2f36' },
  'per-point': { dash: '7 3 2 3', width: 1.5, colour: '#2b2f36' },
  reference: { dash: '2 3', width: 1.1, colour: '#59616b' }
} as const

/** A marker of `size` px (its bounding width) centred at (cx, cy). */
export function marker (style: SeriesStyle, cx: number, cy: number, size: number): string {
  const r = size / 2
  const paint = { fill: style.filled ? style.colour : THEME.paper, stroke: style.colour, 'stroke-width': Math.max(0.8, size * 0.16) }
  const polygon = (points: ReadonlyArray<readonly [number, number]>): string =>
    element('polygon', { points: points.map(([x, y]) => `${px(cx + x * r)},${px(cy + y * r)}`).join(' '), ...paint })
  switch (style.shape) {
    case 'circle': return element('circle', { cx, cy, r: r * 0.9, ...paint })
    case 'square': return element('rect', { x: cx - r * 0.8, y: cy - r * 0.8, width: r * 1.6, height: r * 1.6, ...paint })
    case 'triangle': return polygon([[0, -1.05], [0.95, 0.65], [-0.95, 0.65]])
    case 'triangle-down': return polygon([[0, 1.05], [0.95, -0.65], [-0.95, -0.65]])
    case 'diamond': return polygon([[0, -1.1], [0.85, 0], [0, 1.1], [-0.85, 0]])
    case 'plus': {
      const a = 0.32
      return polygon([[-a, -1], [a, -1], [a, -a], [1, -a], [1, a], [a, a], [a, 1], [-a, 1], [-a, a], [-1, a], [-1, -a], [-a, -a]])
    }
    case 'pentagon': return polygon(regular(5, 1))
    case 'star': return polygon(starPoints(5, 1.15, 0.5))
  }
}

function regular (sides: number, radius: number): Array<[number, number]> {
  return Array.from({ length: sides }, (_, k) => {
    const angle = -Math.PI / 2 + (2 * Math.PI * k) / sides
    return [radius * Math.cos(angle), radius * Math.sin(angle)]
  })
}

function starPoints (arms: number, outer: number, inner: number): Array<[number, number]> {
  return Array.from({ length: 2 * arms }, (_, k) => {
    const angle = -Math.PI / 2 + (Math.PI * k) / arms
    const radius = k % 2 === 0 ? outer : inner
    return [radius * Math.cos(angle), radius * Math.sin(angle)]
  })
}
