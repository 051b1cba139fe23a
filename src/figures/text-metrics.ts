/**
 * Widths of text in the figure typeface (Source Sans 3), from its own advance widths
 * (font-widths.generated.ts, read from the TrueType files the PNG and PDF renderings embed).
 * Kerning is ignored: in this face nearly every kerning pair narrows the pair, so a width
 * summed from advances is an upper bound for the text the renderers draw. A character the
 * table does not hold counts a full em, so unknown text never gets too little room.
 */
import { FONT_ASCENT, FONT_CAP_HEIGHT, FONT_DESCENT, REGULAR_WIDTHS, SEMIBOLD_WIDTHS } from './font-widths.generated.js'

export type FontWeight = 'regular' | 'semibold'

const UNKNOWN_WIDTH = 1

function parse (table: string): Map<number, number> {
  const map = new Map<number, number>()
  for (const pair of table.split(',')) {
    const [cp, width] = pair.split(':') as [string, string]
    map.set(parseInt(cp, 36), parseInt(width, 36) / 1000)
  }
  return map
}

const WIDTHS: Record<FontWeight, Map<number, number>> = { regular: parse(REGULAR_WIDTHS), semibold: parse(SEMIBOLD_WIDTHS) }

/** Height above the baseline of capitals and figures, and depth below it of descenders, in ems. */
export const CAP_HEIGHT = FONT_CAP_HEIGHT
export const ASCENT = FONT_ASCENT
export const DESCENT = FONT_DESCENT

/** Width in user units of `text` at `fontSize`. */
export function textWidth (text: string, fontSize: number, weight: FontWeight = 'regular'): number {
  const table = WIDTHS[weight]
  let em = 0
  for (const ch of text) em += table.get(ch.codePointAt(0)!) ?? UNKNOWN_WIDTH
  return em * fontSize
}

/**
 * Greedy word wrap to at most `maxLines` lines of at most `width`; the last line ends
 * with an ellipsis when the text does not fit.
 */
export function wrapText (text: string, fontSize: number, width: number, maxLines: number, weight: FontWeight = 'regular'): string[] {
  const words = text.split(/[ \t\r\n]+/).filter((w) => w !== '')
  const lines: string[] = []
  let current = ''
  for (const word of words) {
    const candidate = current === '' ? word : `${current} ${word}`
    if (textWidth(candidate, fontSize, weight) <= width || current === '') {
      current = candidate
      continue
    }
    lines.push(current)
    current = word
  }
  if (current !== '') lines.push(current)
  if (lines.length <= maxLines) return lines.map((line) => truncate(line, fontSize, width, weight))
  const kept = lines.slice(0, maxLines)
  kept[maxLines - 1] = truncate(`${kept[maxLines - 1]!} ${lines.slice(maxLines).join(' ')}`, fontSize, width, weight)
  return kept
}

/** The text cut with an ellipsis to fit `width`. */
export function truncate (line: string, fontSize: number, width: number, weight: FontWeight = 'regular'): string {
  if (textWidth(line, fontSize, weight) <= width) return line
  let cut = [...line]
  while (cut.length > 1 && textWidth(`${cut.join('')}…`, fontSize, weight) > width) cut = cut.slice(0, -1)
  return `${cut.join('').trimEnd()}…`
}
