/** The part of svg-to-pdfkit (no types of its own) that pdf.ts uses. */
declare module 'svg-to-pdfkit' {
  interface SvgToPdfOptions {
    width?: number
    height?: number
    preserveAspectRatio?: string
    fontCallback?: (family: string, bold: boolean, italic: boolean, options: { fauxBold: boolean, fauxItalic: boolean }) => string
    assumePt?: boolean
  }
  export default function SVGtoPDF (doc: PDFKit.PDFDocument, svg: string, x: number, y: number, options?: SvgToPdfOptions): void
}
