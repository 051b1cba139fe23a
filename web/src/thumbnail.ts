/**
 * A sweep's main curve as a thumbnail for the list (its data: curves.ts thumbnailOf), on a
 * fixed 0–1 scale so thumbnails compare at a glance.
 */
import { s } from './dom.js'
import type { Thumbnail } from './curves.js'
import { formatGridValue } from './format.js'

const WIDTH = 112
const HEIGHT = 48
const PAD = 4

/** The thumbnail as a small SVG with a text alternative; `name` is what x is called. */
export function drawThumbnail (thumb: Thumbnail, name: string): SVGSVGElement {
  const spanX = thumb.xMax - thumb.xMin || 1
  const px = (value: number): number => PAD + (value - thumb.xMin) / spanX * (WIDTH - 2 * PAD)
  const py = (rate: number): number => HEIGHT - PAD - rate * (HEIGHT - 2 * PAD)
  const svg = s('svg', { class: 'thumb', viewBox: `0 0 ${WIDTH} ${HEIGHT}`, width: WIDTH, height: HEIGHT, role: 'img', 'aria-label': `Recall success against ${name}, ${formatGridValue(thumb.xMin)} to ${formatGridValue(thumb.xMax)}` },
    s('rect', { class: 'thumb-frame', x: 0.5, y: 0.5, width: WIDTH - 1, height: HEIGHT - 1, rx: 3 }),
    s('line', { class: 'thumb-half', x1: PAD, x2: WIDTH - PAD, y1: py(0.5), y2: py(0.5) }))
  thumb.lines.forEach((line, index) => {
    const d = line.map(([x, y], i) => `${i === 0 ? 'M' : 'L'}${px(x).toFixed(1)} ${py(y).toFixed(1)}`).join(' ')
    svg.append(s('path', { class: `thumb-line thumb-line-${index}`, d }))
  })
  return svg
}
