/**
 * How series and theory lines look. Series differ in marker shape, filled or open marker,
 * and dash pattern, so a figure printed in grey still tells them apart; colour (a palette
 * safe for the common colour-vision deficiencies, Okabe & Ito 2008) only helps on screen.
 */
import { element, px } from './svg.js'

export const MARKER_SHAPES = ['circle', 'square', 'triangle', 'diamond', 'triangle-down', 'plus', 'pentagon', 'star'] as const
export type MarkerShape = typeof MARKER_SHAPES[number]

/** Dash arrays; '' is a solid line. */
export const SERIES_DASHES = ['', '6 3', '2 2', '8 3 2 3', '12 4', '4 2 1 2 1 2', '1 3', '12 3 3 3'] as const

export const PALETTE = ['#0072B2', '#D55E00', '#009E73', '#CC79A7', '#E69F00', '#56B4E9', '#000000'] as const

export interface SeriesStyle {
  shape: MarkerShape
  filled: boolean
  dash: string
  colour: string
}

/**
 * Style of series i: shapes cycle fastest, then filled/open alternates, so the first 16
 * series have distinct markers; dash patterns cycle on their own period.
 */
export function seriesStyle (i: number): SeriesStyle {
  const shapes = MARKER_SHAPES.length
  return {
    shape: MARKER_SHAPES[i % shapes]!,
    filled: Math.floor(i / shapes) % 2 === 0,
    dash: SERIES_DASHES[i % SERIES_DASHES.length]!,
    colour: PALETTE[i % PALETTE.length]!
  }
}

/** Theory lines: darker and heavier than data lines, no markers. */
export const THEORY_STYLE = {
  curve: { dash: '', width: 2, colour: '#222222' },
  'per-point': { dash: '7 3 2 3', width: 1.6, colour: '#222222' },
  reference: { dash: '3 3', width: 1.2, colour: '#555555' }
} as const

/** A marker of `size` px (its bounding width) centred at (cx, cy). */
export function marker (style: SeriesStyle, cx: number, cy: number, size: number): string {
  const r = size / 2
  const paint = { fill: style.filled ? style.colour : '#ffffff', stroke: style.colour, 'stroke-width': 1.3 }
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
