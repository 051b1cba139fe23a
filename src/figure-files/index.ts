/**
 * Figures as files: the SVG a figure is drawn as, rendered to PNG (resvg) or PDF (pdfkit with
 * svg-to-pdfkit), both with the shipped typeface. Used by the API's rendering thread and the CLI.
 */
import { svgToPdf } from './pdf.js'
import { svgToPng } from './png.js'

export { FIGURE_FONT_FAMILY, FIGURE_FONT_FILES } from './font-files.js'
export { MAX_PNG_PIXELS, PNG_DPI, pngSize, resvgOptions, svgToPng } from './png.js'
export { pdfPageSize, svgToPdf } from './pdf.js'

export type FigureFormat = 'svg' | 'png' | 'pdf'

export const FIGURE_MEDIA_TYPES: Record<FigureFormat, string> = {
  svg: 'image/svg+xml; charset=utf-8',
  png: 'image/png',
  pdf: 'application/pdf'
}

/** The figure in `format`: the SVG's own bytes, or its rendering. */
export async function figureBytes (svg: string, format: FigureFormat, options: { dpi?: number, title?: string } = {}): Promise<Buffer> {
  if (format === 'png') return svgToPng(svg, options.dpi)
  if (format === 'pdf') return await svgToPdf(svg, options.title ?? 'memsweep figure')
  return Buffer.from(svg, 'utf8')
}
