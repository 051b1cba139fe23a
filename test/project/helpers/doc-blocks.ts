/**
 * Runnable documentation: the fenced blocks of a markdown page that carry a marker comment
 *
 *   <!-- doc-test: run [statuses=409] [creates=a.svg,b.json] -->    the next ```sh block is run
 *   <!-- doc-test: output json|http|sse|text [exact=k1,k2] -->     the next block is what it prints
 *   <!-- doc-test: startup-line -->                                the next block is the server's start-up line
 *
 * and the comparison of what a block printed with what the page shows. Pages abridge with
 * `…` (or `...`) and show one run's ids, hashes and times, so JSON is compared by shape: every
 * member and element the page shows must be there with the same JSON type; values are compared
 * only for the keys named in `exact=`. Status lines and header values are compared literally,
 * with UUIDs standing for any UUID.
 */
import { parseEventStream } from '../../api/helpers/harness.js'

export type OutputFormat = 'json' | 'http' | 'sse' | 'text'

export interface RunBlock { kind: 'run', line: number, code: string, statuses: number[] | null, creates: string[] }
export interface OutputBlock { kind: 'output', line: number, format: OutputFormat, exact: Set<string>, text: string }
export interface StartupBlock { kind: 'startup-line', line: number, text: string }
export type DocBlock = RunBlock | OutputBlock | StartupBlock

const MARKER = /^<!-- doc-test: (.+?) -->$/

function option (words: string[], name: string): string | null {
  const found = words.find((w) => w.startsWith(`${name}=`))
  return found === undefined ? null : found.slice(name.length + 1)
}

/** The marked blocks of a page, in order; throws on a marker that is not followed by a fenced block. */
export function extractDocBlocks (markdown: string): DocBlock[] {
  const lines = markdown.split('\n')
  const blocks: DocBlock[] = []
  for (let i = 0; i < lines.length; i++) {
    const marker = MARKER.exec(lines[i]!.trim())
    if (marker === null) continue
    const words = marker[1]!.trim().split(/\s+/)
    let open = i + 1
    while (open < lines.length && lines[open]!.trim() === '') open++
    if (!/^```/.test(lines[open] ?? '')) throw new Error(`line ${i + 1}: '${lines[i]!}' is not followed by a fenced block`)
    let close = open + 1
    while (close < lines.length && !/^```\s*$/.test(lines[close]!)) close++
    if (close >= lines.length) throw new Error(`line ${open + 1}: the fenced block is never closed`)
    const text = lines.slice(open + 1, close).join('\n')
    const line = open + 1
    if (words[0] === 'run') {
      const statuses = option(words, 'statuses')
      const creates = option(words, 'creates')
      blocks.push({ kind: 'run', line, code: text, statuses: statuses === null ? null : statuses.split(',').map(Number), creates: creates === null ? [] : creates.split(',') })
    } else if (words[0] === 'output') {
      const format = words[1] as OutputFormat
      if (!['json', 'http', 'sse', 'text'].includes(format)) throw new Error(`line ${i + 1}: unknown output format '${words[1] ?? ''}'`)
      blocks.push({ kind: 'output', line, format, exact: new Set((option(words, 'exact') ?? '').split(',').filter((k) => k !== '')), text })
    } else if (words[0] === 'startup-line') {
      blocks.push({ kind: 'startup-line', line, text: text.trim() })
    } else {
      throw new Error(`line ${i + 1}: unknown doc-test marker '${marker[1]!}'`)
    }
    i = close
  }
  return blocks
}

/**
 * JSON as pages show it: `…` or `...` where members or elements were left out, and several
 * values one after the other (the output of several commands). Returns the values.
 */
export function parseAbridgedJson (text: string): unknown[] {
  let at = 0
  const fail = (what: string): never => { throw new Error(`${what} at offset ${at} of: ${text.slice(Math.max(0, at - 40), at + 40)}`) }
  const space = (): void => {
    for (;;) {
      while (at < text.length && /\s/.test(text[at]!)) at++
      if (text.startsWith('...', at)) at += 3
      else if (text[at] === '…') at += 1
      else return
    }
  }
  const value = (): unknown => {
    space()
    const c = text[at]
    if (c === '{') {
      at++
      const object: Record<string, unknown> = {}
      for (;;) {
        space()
        if (text[at] === ',') { at++; continue }
        if (text[at] === '}') { at++; return object }
        if (text[at] !== '"') fail('expected a member name')
        const key = string()
        space()
        if (text[at] !== ':') fail('expected ":"')
        at++
        object[key] = value()
      }
    }
    if (c === '[') {
      at++
      const array: unknown[] = []
      for (;;) {
        space()
        if (text[at] === ',') { at++; continue }
        if (text[at] === ']') { at++; return array }
        array.push(value())
      }
    }
    if (c === '"') return string()
    const literal = /^(-?\d+(?:\.\d+)?(?:[eE][+-]?\d+)?|true|false|null)/.exec(text.slice(at))
    if (literal === null) return fail('expected a JSON value')
    at += literal[0].length
    return JSON.parse(literal[0])
  }
  const string = (): string => {
    const match = /^"(?:[^"\\]|\\.)*"/.exec(text.slice(at))
    if (match === null) return fail('unterminated string')
    at += match[0].length
    return JSON.parse(match[0]) as string
  }
  const values: unknown[] = []
  space()
  while (at < text.length) {
    values.push(value())
    space()
  }
  return values
}

function kind (v: unknown): string {
  return v === null ? 'null' : Array.isArray(v) ? 'array' : typeof v
}

/**
 * Where the actual value lacks what the page shows; empty when it has it all. Below a key named
 * in `exact`, values must also be equal (and arrays of the same length).
 */
export function shapeMismatches (shown: unknown, actual: unknown, exact: ReadonlySet<string>, path = '$', strict = false): string[] {
  if (kind(shown) !== kind(actual)) return [`${path}: the page shows ${kind(shown)} ${JSON.stringify(shown)}, the service gave ${kind(actual)} ${JSON.stringify(actual)?.slice(0, 120)}`]
  if (Array.isArray(shown)) {
    const list = actual as unknown[]
    if (strict ? list.length !== shown.length : list.length < shown.length) return [`${path}: the page shows ${shown.length} elements, the service gave ${list.length}`]
    return shown.flatMap((element, i) => shapeMismatches(element, list[i], exact, `${path}[${i}]`, strict))
  }
  if (shown !== null && typeof shown === 'object') {
    const object = actual as Record<string, unknown>
    return Object.entries(shown).flatMap(([name, inner]) => name in object
      ? shapeMismatches(inner, object[name], exact, `${path}.${name}`, strict || exact.has(name))
      : [`${path}: the page shows member '${name}', the service gave none`])
  }
  if (strict && shown !== actual) return [`${path}: the page shows ${JSON.stringify(shown)}, the service gave ${JSON.stringify(actual)}`]
  return []
}

const UUID = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/gi
const anyUuid = (s: string): string => s.replace(UUID, '<uuid>')

function jsonMismatches (shownText: string, actualText: string, exact: ReadonlySet<string>): string[] {
  const shown = parseAbridgedJson(shownText)
  let actual: unknown[]
  try {
    actual = parseAbridgedJson(actualText)
  } catch (error) {
    return [`the service's output is not JSON (${(error as Error).message})`]
  }
  if (actual.length !== shown.length) return [`the page shows ${shown.length} JSON value(s), the service printed ${actual.length}`]
  return shown.flatMap((value, i) => shapeMismatches(value, actual[i], exact, shown.length === 1 ? '$' : `$${i}`))
}

function httpMismatches (shownText: string, actualText: string, exact: ReadonlySet<string>): string[] {
  const split = (text: string): { head: string[], body: string } => {
    const normalised = text.replace(/\r\n/g, '\n')
    const cut = normalised.indexOf('\n\n')
    return cut < 0 ? { head: normalised.split('\n'), body: '' } : { head: normalised.slice(0, cut).split('\n'), body: normalised.slice(cut + 2) }
  }
  const shown = split(shownText)
  const actual = split(actualText)
  const problems: string[] = []
  if (shown.head[0]?.trim() !== actual.head[0]?.trim()) problems.push(`status line: the page shows '${shown.head[0] ?? ''}', the service sent '${actual.head[0] ?? ''}'`)
  const headers = new Map(actual.head.slice(1).map((line) => [line.slice(0, line.indexOf(':')).trim().toLowerCase(), line.slice(line.indexOf(':') + 1).trim()]))
  for (const line of shown.head.slice(1)) {
    const name = line.slice(0, line.indexOf(':')).trim().toLowerCase()
    const value = line.slice(line.indexOf(':') + 1).trim()
    const sent = headers.get(name)
    if (sent === undefined) problems.push(`header '${name}': shown on the page, not sent`)
    else if (anyUuid(sent) !== anyUuid(value)) problems.push(`header '${name}': the page shows '${value}', the service sent '${sent}'`)
  }
  if (shown.body.trim() !== '') problems.push(...jsonMismatches(shown.body, actual.body, exact).map((p) => `body ${p}`))
  return problems
}

function sseMismatches (shownText: string, actualText: string, exact: ReadonlySet<string>): string[] {
  const shown = parseEventStream(shownText)
  const actual = parseEventStream(actualText)
  const problems: string[] = []
  const events = (items: typeof shown): typeof shown => items.filter((e) => e.event !== undefined)
  const shownEvents = events(shown)
  const actualEvents = events(actual)
  if (shown.some((e) => e.retry !== undefined) && !actual.some((e) => e.retry !== undefined)) problems.push('the page shows a retry: line, the service sent none')
  if (actualEvents.length === 0) return [...problems, 'the service sent no events']
  if (actualEvents[0]!.event !== shownEvents[0]?.event) problems.push(`first event: the page shows '${shownEvents[0]?.event ?? ''}', the service sent '${actualEvents[0]!.event ?? ''}'`)
  if (actualEvents.at(-1)!.event !== shownEvents.at(-1)?.event) problems.push(`last event: the page shows '${shownEvents.at(-1)?.event ?? ''}', the service sent '${actualEvents.at(-1)!.event ?? ''}'`)
  const names = new Set(shownEvents.map((e) => e.event))
  for (const e of actualEvents) if (!names.has(e.event)) problems.push(`the service sent a '${e.event ?? ''}' event the page does not show`)
  const ids = actualEvents.map((e) => Number(e.id))
  if (ids.some((id, i) => id !== i + 1)) problems.push(`event ids are not 1, 2, 3, …: ${ids.join(', ')}`)
  // Each event's data has the shape the page shows for an event of that name.
  for (const e of actualEvents) {
    const example = shownEvents.find((s) => s.event === e.event)
    if (example?.data === undefined || e.data === undefined) continue
    problems.push(...jsonMismatches(example.data, e.data, exact).map((p) => `${e.event ?? ''} event ${e.id ?? ''}: ${p}`))
  }
  return problems
}

/** Where what a block printed differs from what the page shows after it. */
export function outputMismatches (block: OutputBlock, printed: string): string[] {
  switch (block.format) {
    case 'json': return jsonMismatches(block.text, printed, block.exact)
    case 'http': return httpMismatches(block.text, printed, block.exact)
    case 'sse': return sseMismatches(block.text, printed, block.exact)
    case 'text': return block.text.trim() === printed.trim() ? [] : [`the page shows '${block.text.trim()}', the service printed '${printed.trim()}'`]
  }
}
