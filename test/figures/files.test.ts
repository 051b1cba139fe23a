/** PNG and PDF renderings of the same SVG, with the shipped typeface: sizes, determinism, embedded font, ink where the SVG draws. */
import { inflateSync } from 'node:zlib'
import { beforeAll, describe, expect, it } from 'vitest'
import { renderFigure } from '../../src/figures/index.js'
import { figureBytes, pngSize, svgToPdf, svgToPng } from '../../src/figure-files/index.js'
import type { SweepResult } from '../../src/results/index.js'
import { runSweep } from './helpers.js'

let rooms: SweepResult
beforeAll(() => {
  rooms = runSweep({ label: 'Rooms of a studio', neurons: { values: [40, 80] }, load: { values: [0.05, 0.1, 0.15] }, cue: { kind: 'flip', fraction: 0.1 }, trials: 4, seed: 51 })
})

/** Width, height and the unfiltered RGBA rows of a PNG as resvg writes it (8-bit RGBA, no interlace). */
function decodePng (png: Buffer): { width: number, height: number, pixel: (x: number, y: number) => [number, number, number] } {
  expect(png.subarray(0, 8).toString('hex')).toBe('89504e470d0a1a0a')
  const width = png.readUInt32BE(16)
  const height = png.readUInt32BE(20)
  const data: Buffer[] = []
  for (let at = 8; at < png.length;) {
    const length = png.readUInt32BE(at)
    if (png.toString('latin1', at + 4, at + 8) === 'IDAT') data.push(png.subarray(at + 8, at + 8 + length))
    at += 12 + length
  }
  const raw = inflateSync(Buffer.concat(data))
  const stride = width * 4 + 1
  const rows = Buffer.alloc(height * width * 4)
  for (let y = 0; y < height; y++) {
    const filter = raw[y * stride]!
    for (let i = 0; i < width * 4; i++) {
      const x = raw[y * stride + 1 + i]!
      const a = i >= 4 ? rows[y * width * 4 + i - 4]! : 0
      const b = y > 0 ? rows[(y - 1) * width * 4 + i]! : 0
      const c = i >= 4 && y > 0 ? rows[(y - 1) * width * 4 + i - 4]! : 0
      const p = a + b - c
      const paeth = Math.abs(p - a) <= Math.abs(p - b) && Math.abs(p - a) <= Math.abs(p - c) ? a : Math.abs(p - b) <= Math.abs(p - c) ? b : c
      const predictor = [0, a, b, (a + b) >> 1, paeth][filter]!
      rows[y * width * 4 + i] = (x + predictor) & 0xff
    }
  }
  return { width, height, pixel: (x, y) => [rows[(y * width + x) * 4]!, rows[(y * width + x) * 4 + 1]!, rows[(y * width + x) * 4 + 2]!] }
}

describe('PNG', () => {
  it('has the size the dpi gives, the same bytes every time, and ink where the SVG puts the title', () => {
    const svg = renderFigure(rooms, { column: 'single' })
    const png = svgToPng(svg, 150)
    const image = decodePng(png)
    expect(image.width).toBe(Math.round(85 / 25.4 * 150))
    expect(pngSize(svg, 150)).toMatchObject({ width: image.width, height: image.height })
    expect(svgToPng(svg, 150).equals(png)).toBe(true)
    // The title's first letters are dark; the top-left corner is paper.
    expect(image.pixel(1, 1)).toEqual([255, 255, 255])
    let dark = 0
    for (let x = 0; x < image.width / 3; x++) for (let y = 0; y < image.height / 10; y++) if (image.pixel(x, y)[0] < 100) dark++
    expect(dark).toBeGreaterThan(50)
    // Screen sizes default to two pixels per px.
    expect(decodePng(svgToPng(renderFigure(rooms, { width: 300, height: 200 }))).width).toBe(600)
  })
})

describe('PDF', () => {
  it('is one page of the figure\'s size with the typeface embedded, the same bytes every time', async () => {
    const svg = renderFigure(rooms, { column: 'double' })
    const pdf = await svgToPdf(svg, 'Rooms of a studio')
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-')
    const text = pdf.toString('latin1')
    const [w, h] = [180 / 25.4 * 72, 112 / 25.4 * 72]
    const box = /\/MediaBox \[0 0 ([\d.]+) ([\d.]+)\]/.exec(text)!
    expect(Number(box[1])).toBeCloseTo(w, 1)
    expect(Number(box[2])).toBeCloseTo(h, 1)
    expect(text).toMatch(/\/BaseFont \/[A-Z]{6}\+SourceSans3-Regular/)
    expect(text).toMatch(/\/BaseFont \/[A-Z]{6}\+SourceSans3-Semibold/)
    expect(text).toContain('/FontFile2')
    expect(text).not.toMatch(/\/BaseFont \/(Helvetica|Times)/)
    expect((await svgToPdf(svg, 'Rooms of a studio')).equals(pdf)).toBe(true)
    expect((await figureBytes(svg, 'pdf')).subarray(0, 5).toString('latin1')).toBe('%PDF-')
    // A screen figure: 0.75 pt per px.
    const screen = (await svgToPdf(renderFigure(rooms, { width: 640, height: 440 }), 'x')).toString('latin1')
    expect(/\/MediaBox \[0 0 ([\d.]+) ([\d.]+)\]/.exec(screen)!.slice(1).map(Number)).toEqual([480, 330])
  })
})
