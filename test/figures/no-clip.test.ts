/**
 * No text leaves the page, for every kind of figure at the smallest size (240 × 180 px) and at
 * both journal column widths. Two measurements: our own layout metrics (the advance widths of
 * the shipped typeface, summed without kerning, an upper bound), applied to every <text>
 * element as drawn; and resvg's, which shapes the same text with the same font files (as the
 * PNG and PDF renderings do) and reports the box of the glyph outlines.
 */
import { Resvg } from '@resvg/resvg-js'
import { describe, expect, it } from 'vitest'
import { renderFigure } from '../../src/figures/index.js'
import { textWidth } from '../../src/figures/text-metrics.js'
import { resvgOptions } from '../../src/figure-files/png.js'
import { figureKinds } from './kinds.js'
import { parseSvg } from './helpers.js'

const SIZES = [
  { name: '240 × 180 px', options: { width: 240, height: 180 } },
  { name: '85 mm', options: { column: 'single' } },
  { name: '180 mm', options: { column: 'double' } }
] as const

function viewBox (svg: string): { width: number, height: number } {
  const [, , width, height] = parseSvg(svg).documentElement!.getAttribute('viewBox')!.split(' ').map(Number) as [number, number, number, number]
  return { width, height }
}

/** Every <text> as a box from its position, anchor, size and content (ascent 0.8 em above the baseline, descent 0.25 em below). */
function textBoxes (svg: string): Array<{ text: string, left: number, right: number, top: number, bottom: number }> {
  const doc = parseSvg(svg)
  return Array.from(doc.getElementsByTagName('text')).map((el) => {
    const size = Number(el.getAttribute('font-size'))
    const text = el.textContent ?? ''
    const width = textWidth(text, size, el.getAttribute('font-weight') === '600' ? 'semibold' : 'regular')
    const x = Number(el.getAttribute('x'))
    const y = Number(el.getAttribute('y'))
    const anchor = el.getAttribute('text-anchor') ?? 'start'
    const left = anchor === 'middle' ? x - width / 2 : anchor === 'end' ? x - width : x
    return { text, left, right: left + width, top: y - 0.8 * size, bottom: y + 0.25 * size }
  })
}

/** The figure with its text only: what resvg's box then measures is the glyphs. */
function textOnly (svg: string): string {
  const root = /<svg\b[^>]*>/.exec(svg)![0]
  const texts = svg.match(/<text\b[^>]*>.*?<\/text>/g) ?? []
  return `${root}${texts.join('')}</svg>`
}

describe('text stays on the page', () => {
  const kinds = figureKinds()
  for (const size of SIZES) {
    it(`for every kind of figure at ${size.name}`, () => {
      for (const kind of kinds) {
        const svg = renderFigure(kind.results, { ...kind.options, ...size.options })
        const page = viewBox(svg)
        const boxes = textBoxes(svg)
        expect(boxes.length, kind.name).toBeGreaterThan(4)
        for (const box of boxes) {
          const where = `${kind.name}: '${box.text}'`
          expect(box.left, where).toBeGreaterThanOrEqual(0)
          expect(box.top, where).toBeGreaterThanOrEqual(0)
          expect(box.right, where).toBeLessThanOrEqual(page.width)
          expect(box.bottom, where).toBeLessThanOrEqual(page.height)
        }
        const drawn = new Resvg(textOnly(svg), resvgOptions()).getBBox()!
        // resvg works in px at 96 dpi: a figure sized in mm is scaled from its points.
        const scale = new Resvg(textOnly(svg), resvgOptions()).width / page.width
        expect(drawn.x / scale, kind.name).toBeGreaterThanOrEqual(0)
        expect(drawn.y / scale, kind.name).toBeGreaterThanOrEqual(0)
        expect((drawn.x + drawn.width) / scale, kind.name).toBeLessThanOrEqual(page.width)
        expect((drawn.y + drawn.height) / scale, kind.name).toBeLessThanOrEqual(page.height)
      }
    })
  }

  it('measures text no narrower than the renderer draws it', () => {
    // One line of mixed text alone on a wide page, its left end at 10: resvg's right end must not pass ours.
    const line = 'Recall success rate (final m ≥ 0.9) · α_c = 0.138 · N = 1000 · WMQ'
    const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="2000" height="100" viewBox="0 0 2000 100" font-family="Source Sans 3"><text x="10" y="50" font-size="20">${line}</text></svg>`
    const box = new Resvg(svg, resvgOptions()).getBBox()!
    expect(box.x + box.width).toBeLessThanOrEqual(10 + textWidth(line, 20) + 0.01)
    // And not grossly wider either: the layout would waste room.
    expect(box.x + box.width).toBeGreaterThan(10 + textWidth(line, 20) * 0.95)
  })
})
