/**
 * The page a figure is drawn on: its size in user units, what one unit is (a px on screen, a
 * pt for a size in mm), and the body type size. Everything else in the layout is measured
 * from these, so a figure at 85 mm keeps the proportions of the same figure on screen.
 */
import { FigureOptionsError } from './errors.js'
import { FIGURE_COLUMNS, FIGURE_FONT, FIGURE_SIZE, type FigureOptions } from './options.js'

export interface FigureFrame {
  /** Size in user units (the viewBox). */
  width: number
  height: number
  unit: 'px' | 'pt'
  /** The width and height attributes of the <svg> element ("640", "85mm"). */
  widthAttr: string
  heightAttr: string
  /** Body type size in user units. */
  fontSize: number
}

const PT_PER_MM = 72 / 25.4

export function figureFrame (options: FigureOptions): FigureFrame {
  const print = options.column !== undefined || options.widthMm !== undefined || options.heightMm !== undefined
  if (!print) {
    const width = options.width ?? FIGURE_SIZE.width
    const height = options.height ?? FIGURE_SIZE.height
    return { width, height, unit: 'px', widthAttr: String(width), heightAttr: String(height), fontSize: options.fontSize ?? FIGURE_FONT.screen }
  }
  if (options.width !== undefined || options.height !== undefined) {
    const path = options.width !== undefined ? 'width' : 'height'
    throw new FigureOptionsError([{ path, message: 'give the size either in px (width, height) or in mm (column, widthMm, heightMm), not both' }])
  }
  const column = options.column === undefined ? null : FIGURE_COLUMNS[options.column]
  const widthMm = options.widthMm ?? column?.widthMm ?? FIGURE_COLUMNS.single.widthMm
  const heightMm = options.heightMm ?? (column !== null && options.widthMm === undefined ? column.heightMm : round(widthMm * 0.75))
  const width = round(widthMm * PT_PER_MM)
  const height = round(heightMm * PT_PER_MM)
  return { width, height, unit: 'pt', widthAttr: `${round(widthMm)}mm`, heightAttr: `${round(heightMm)}mm`, fontSize: options.fontSize ?? FIGURE_FONT.print }
}

function round (v: number): number {
  return Math.round(v * 100) / 100
}
