/**
 * SVG figures as PNG, drawn by resvg with the shipped typeface only (system fonts are not
 * loaded), so the same SVG gives the same pixels on every machine.
 */
import { Resvg, type ResvgRenderOptions } from '@resvg/resvg-js'
import { FIGURE_FONT_FAMILY, FIGURE_FONT_FILES } from './font-files.js'

/** Resolution of a PNG: dots per inch of a figure sized in mm; screen figures are px at 96 dpi. */
export const PNG_DPI = { min: 72, max: 1200, print: 300, screen: 192 } as const

/** Most pixels one PNG may hold (a 180 mm figure at 1200 dpi is about 10 000 px wide): refused beyond, before any is drawn. */
export const MAX_PNG_PIXELS = 64_000_000

export function resvgOptions (): ResvgRenderOptions {
  return {
    font: {
      loadSystemFonts: false,
      fontFiles: [FIGURE_FONT_FILES.regular, FIGURE_FONT_FILES.semibold, FIGURE_FONT_FILES.italic],
      defaultFontFamily: FIGURE_FONT_FAMILY,
      sansSerifFamily: FIGURE_FONT_FAMILY
    },
    shapeRendering: 2,
    textRendering: 2,
    logLevel: 'off'
  }
}

/** The pixel size of a figure's PNG at `dpi` (undefined: 300 dpi for print sizes, 2 px per px on screen). */
export function pngSize (svg: string, dpi?: number): { width: number, height: number, zoom: number } {
  const root = /<svg\b[^>]*>/.exec(svg)?.[0] ?? ''
  const attr = (name: string): string => new RegExp(`\\s${name}="([^"]*)"`).exec(root)?.[1] ?? ''
  // resvg sizes the image from the width and height attributes at 96 px per inch; the zoom scales that.
  const inches = (value: string): number => (value.endsWith('mm') ? Number(value.slice(0, -2)) / 25.4 : Number(value) / 96)
  const print = attr('width').endsWith('mm')
  const zoom = (dpi ?? (print ? PNG_DPI.print : PNG_DPI.screen)) / 96
  return { width: Math.round(inches(attr('width')) * 96 * zoom), height: Math.round(inches(attr('height')) * 96 * zoom), zoom }
}

export function svgToPng (svg: string, dpi?: number): Buffer {
  const size = pngSize(svg, dpi)
  if (size.width * size.height > MAX_PNG_PIXELS) throw new RangeError(`a ${size.width} × ${size.height} px PNG is larger than the ${MAX_PNG_PIXELS / 1e6} Mpx allowed`)
  const resvg = new Resvg(svg, { ...resvgOptions(), fitTo: { mode: 'zoom', value: size.zoom }, background: '#ffffff' })
  return resvg.render().asPng()
}
