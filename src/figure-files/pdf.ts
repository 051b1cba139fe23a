/**
 * SVG figures as PDF: pdfkit writes the document, svg-to-pdfkit draws the SVG into it as
 * vector paths and text, with the shipped typeface embedded (subset) so the PDF shows the same
 * figure everywhere. The page is the figure's size; the document carries no creation time, so
 * the same SVG gives the same bytes.
 */
import PDFDocument from 'pdfkit'
import SVGtoPDF from 'svg-to-pdfkit'
import { FIGURE_FONT_FILES } from './font-files.js'

const PT_PER_PX = 0.75

/** The page size in pt of an SVG figure (sized in mm: its viewBox is in pt already; in px: 0.75 pt per px). */
export function pdfPageSize (svg: string): { width: number, height: number } {
  const root = /<svg\b[^>]*>/.exec(svg)?.[0] ?? ''
  const attr = (name: string): string => new RegExp(`\\s${name}="([^"]*)"`).exec(root)?.[1] ?? ''
  const [, , vbWidth, vbHeight] = attr('viewBox').split(/\s+/).map(Number) as [number, number, number, number]
  return attr('width').endsWith('mm') ? { width: vbWidth, height: vbHeight } : { width: vbWidth * PT_PER_PX, height: vbHeight * PT_PER_PX }
}

export async function svgToPdf (svg: string, title: string): Promise<Buffer> {
  const size = pdfPageSize(svg)
  const doc = new PDFDocument({
    size: [size.width, size.height],
    margin: 0,
    autoFirstPage: true,
    compress: true,
    info: { Title: title, Producer: 'memsweep', Creator: 'memsweep', CreationDate: new Date(0), ModDate: new Date(0) }
  })
  doc.registerFont('figure-regular', FIGURE_FONT_FILES.regular)
  doc.registerFont('figure-semibold', FIGURE_FONT_FILES.semibold)
  doc.registerFont('figure-italic', FIGURE_FONT_FILES.italic)
  const chunks: Buffer[] = []
  doc.on('data', (chunk: Buffer) => chunks.push(chunk))
  const done = new Promise<void>((resolve, reject) => { doc.on('end', resolve); doc.on('error', reject) })
  SVGtoPDF(doc, svg, 0, 0, {
    width: size.width,
    height: size.height,
    preserveAspectRatio: 'xMinYMin meet',
    // Every family the SVG names maps to the shipped face: the PDF never depends on the reader's fonts.
    fontCallback: (_family: string, bold: boolean, italic: boolean) => (bold ? 'figure-semibold' : italic ? 'figure-italic' : 'figure-regular')
  })
  doc.end()
  await done
  return Buffer.concat(chunks)
}
