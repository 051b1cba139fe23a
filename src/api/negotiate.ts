/** Choosing a representation from an Accept header (RFC 9110 §12.5.1), for the few types we serve. */

interface Range { type: string, subtype: string, q: number }

function parseAccept (header: string): Range[] {
  const ranges: Range[] = []
  for (const part of header.split(',')) {
    const [media = '', ...params] = part.trim().split(';')
    const [type = '', subtype = ''] = media.trim().toLowerCase().split('/')
    if (type === '' || subtype === '') continue
    let q = 1
    for (const param of params) {
      const [name, value] = param.trim().split('=')
      if (name?.trim().toLowerCase() === 'q') {
        const parsed = Number(value)
        q = Number.isFinite(parsed) ? Math.min(1, Math.max(0, parsed)) : 0
      }
    }
    ranges.push({ type, subtype, q })
  }
  return ranges
}

/** The q-value the header gives a media type: the most specific matching range wins. */
function qualityOf (ranges: Range[], media: string): number {
  const [type, subtype] = media.split('/')
  let best = -1
  let specificity = -1
  for (const r of ranges) {
    const level = r.type === type && r.subtype === subtype ? 2 : r.type === type && r.subtype === '*' ? 1 : r.type === '*' && r.subtype === '*' ? 0 : -1
    if (level > specificity) { specificity = level; best = r.q }
  }
  return specificity < 0 ? 0 : best
}

/**
 * The best of `offered` (in order of preference on ties) for an Accept header, or null when
 * none is acceptable. A missing or empty header accepts anything.
 */
export function negotiate<T extends string> (accept: string | undefined, offered: readonly T[]): T | null {
  if (accept === undefined || accept.trim() === '') return offered[0] ?? null
  const ranges = parseAccept(accept)
  if (ranges.length === 0) return offered[0] ?? null
  let chosen: T | null = null
  let chosenQ = 0
  for (const media of offered) {
    const q = qualityOf(ranges, media)
    if (q > chosenQ) { chosen = media; chosenQ = q }
  }
  return chosen
}
