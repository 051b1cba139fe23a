/**
 * The few pieces of SVG text the renderer writes: escaped text, attribute lists, compact
 * coordinates. Strings are built directly (no DOM), so rendering works in any process.
 */

export type Attributes = Record<string, string | number | null | undefined>

const XML_ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' }

/** Escapes text for element content and for double-quoted attribute values. */
export function escapeXml (text: string): string {
  // Control characters other than tab and newlines are not allowed anywhere in XML 1.0.
  // eslint-disable-next-line no-control-regex
  return text.replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]/g, '').replace(/[&<>"']/g, (c) => XML_ESCAPES[c]!)
}

/** A coordinate in user units, rounded to 1/100 px: enough for any screen or printer, and short. */
export function px (value: number): string {
  const rounded = Math.round(value * 100) / 100
  return String(rounded === 0 ? 0 : rounded)
}

export function attributes (attrs: Attributes): string {
  let out = ''
  for (const [name, value] of Object.entries(attrs)) {
    if (value === null || value === undefined) continue
    out += ` ${name}="${escapeXml(typeof value === 'number' ? px(value) : value)}"`
  }
  return out
}

/** An element; `children` is already-rendered markup (never raw user text: escape it first). */
export function element (tag: string, attrs: Attributes, children: string | readonly string[] = ''): string {
  const inner = typeof children === 'string' ? children : children.join('')
  return inner === '' ? `<${tag}${attributes(attrs)}/>` : `<${tag}${attributes(attrs)}>${inner}</${tag}>`
}

/** A path through points; null values break the line (a gap where a value is missing). */
export function polylinePath (points: ReadonlyArray<readonly [number, number] | null>): string {
  let d = ''
  let pen = false
  for (const p of points) {
    if (p === null) { pen = false; continue }
    d += `${pen ? 'L' : 'M'}${px(p[0])} ${px(p[1])}`
    pen = true
  }
  return d
}

/**
 * A number in its shortest round-trip form, for data attributes: parsing it back gives
 * exactly the value plotted, which is what tests compare with the result rows.
 */
export function exactNumber (value: number): string {
  return Object.is(value, -0) ? '0' : String(value)
}
