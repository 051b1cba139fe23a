/**
 * Approximate advance widths of text in a sans-serif face, in ems. There is no font engine
 * on a server, so the layout (margins, legend box, title wrapping) uses these estimates;
 * they are deliberately a little generous so text never overruns the space kept for it.
 */

const NARROW = new Set('il.,:;!|\'`Iıj')
const SEMI_NARROW = new Set('rtf-/"*()[]{} ')
const WIDE = new Set('mwMW@%')

/** Widths close to DejaVu Sans, the widest face the font list is likely to resolve to. */
function charWidth (ch: string): number {
  if (NARROW.has(ch)) return 0.29
  if (SEMI_NARROW.has(ch)) return 0.41
  if (WIDE.has(ch)) return 0.94
  if (ch >= '0' && ch <= '9') return 0.64
  if (ch >= 'A' && ch <= 'Z') return 0.73
  // Greek, maths symbols and the rest: about an average lower-case letter.
  return 0.62
}

/** Estimated width in px of `text` at `fontSize` px. */
export function textWidth (text: string, fontSize: number): number {
  let em = 0
  for (const ch of text) em += charWidth(ch)
  return em * fontSize
}

/**
 * Greedy word wrap to at most `maxLines` lines of at most `width` px; the last line ends
 * with an ellipsis when the text does not fit.
 */
export function wrapText (text: string, fontSize: number, width: number, maxLines: number): string[] {
  const words = text.split(/[ \t\r\n]+/).filter((w) => w !== '')
  const lines: string[] = []
  let current = ''
  for (const word of words) {
    const candidate = current === '' ? word : `${current} ${word}`
    if (textWidth(candidate, fontSize) <= width || current === '') {
      current = candidate
      continue
    }
    lines.push(current)
    current = word
  }
  if (current !== '') lines.push(current)
  if (lines.length <= maxLines) return lines.map((line) => truncate(line, fontSize, width))
  const kept = lines.slice(0, maxLines)
  kept[maxLines - 1] = truncate(`${kept[maxLines - 1]!} ${lines.slice(maxLines).join(' ')}`, fontSize, width)
  return kept
}

function truncate (line: string, fontSize: number, width: number): string {
  if (textWidth(line, fontSize) <= width) return line
  let cut = line
  while (cut.length > 1 && textWidth(`${cut}…`, fontSize) > width) cut = cut.slice(0, -1)
  return `${cut.trimEnd()}…`
}
