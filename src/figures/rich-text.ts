/** Labels with `_{…}` subscripts as SVG text content. */
import { escapeXml, px } from './svg.js'
import { plainText } from './labels.js'
import { textWidth } from './text-metrics.js'

/** Width of a space, in ems. */
const SPACE = 0.32

/**
 * Text content for a <text> element of `fontSize` px: subscripts become lowered, smaller
 * tspans. Renderers drop spaces at the edges of a tspan, so those become a dx shift.
 */
export function richText (label: string, fontSize: number): string {
  const parts = label.split(/_\{([^}]*)\}/)
  if (parts.length === 1) return escapeXml(label)
  const drop = fontSize * 0.3
  let out = ''
  let carried = 0
  let lowered = false
  parts.forEach((part, i) => {
    const subscript = i % 2 === 1
    const size = subscript ? fontSize * 0.75 : fontSize
    const leading = part.length - part.trimStart().length
    const trailing = part.trimStart().length - part.trim().length
    const text = part.trim()
    const shift = (carried + leading) * SPACE * fontSize
    carried = trailing
    if (text === '') { carried += leading; return }
    if (i === 0) { out += escapeXml(part.trimEnd()); return }
    const dy = subscript === lowered ? 0 : subscript ? drop : -drop
    lowered = subscript
    out += `<tspan${dy === 0 ? '' : ` dy="${px(dy)}"`}${shift > 0 ? ` dx="${px(shift)}"` : ''}${subscript ? ` font-size="${px(size)}"` : ''}>${escapeXml(text)}</tspan>`
  })
  return out
}

/** Estimated width of a label with subscripts (they are narrower). */
export function richTextWidth (label: string, fontSize: number): number {
  const parts = label.split(/_\{([^}]*)\}/)
  let width = 0
  parts.forEach((part, i) => { width += textWidth(part, i % 2 === 0 ? fontSize : fontSize * 0.75) })
  return width
}

export { plainText }
