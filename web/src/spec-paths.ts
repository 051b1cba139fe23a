/**
 * Reading and writing a spec by dotted path ('cue.fraction'), the same paths the validation
 * route reports errors at, and sorting those errors to the form fields that show them.
 * Pure: no DOM.
 */
import type { FieldIssue, Spec } from './types.js'

type Json = Record<string, unknown>

const isObject = (value: unknown): value is Json => value !== null && typeof value === 'object' && !Array.isArray(value)

export function getAt (spec: Spec, path: string): unknown {
  let node: unknown = spec
  for (const key of path.split('.')) {
    if (!isObject(node)) return undefined
    node = node[key]
  }
  return node
}

/**
 * Sets the value at `path`, creating objects on the way; `undefined` removes the key, and
 * objects left empty by a removal are removed too (so "use the default" leaves no `{}`).
 */
export function setAt (spec: Spec, path: string, value: unknown): void {
  const keys = path.split('.')
  const last = keys.pop() as string
  const trail: Array<[Json, string]> = []
  let node: Json = spec
  for (const key of keys) {
    const child = node[key]
    if (!isObject(child)) {
      if (value === undefined) return
      node[key] = {}
    }
    trail.push([node, key])
    node = node[key] as Json
  }
  if (value === undefined) delete node[last]
  else node[last] = value
  if (value !== undefined) return
  for (let i = trail.length - 1; i >= 0; i--) {
    const [parent, key] = trail[i] as [Json, string]
    if (Object.keys(parent[key] as Json).length > 0) break
    delete parent[key]
  }
}

/**
 * Each issue goes to the field with the longest path that is the issue's path or one of its
 * ancestors ('load.step' → 'load'); issues no field covers stay in `others`.
 */
export function assignIssues (issues: readonly FieldIssue[], fieldPaths: readonly string[]): { byField: Map<string, string[]>, others: FieldIssue[] } {
  const byField = new Map<string, string[]>()
  const others: FieldIssue[] = []
  for (const issue of issues) {
    let best: string | null = null
    for (const path of fieldPaths) {
      if (issue.path === path || issue.path.startsWith(`${path}.`)) {
        if (best === null || path.length > best.length) best = path
      }
    }
    if (best === null) { others.push(issue); continue }
    const rest = issue.path.slice(best.length + 1)
    const message = rest === '' ? issue.message : `${rest}: ${issue.message}`
    byField.set(best, [...(byField.get(best) ?? []), message])
  }
  return { byField, others }
}

/** How a numeric parameter is given: one value, a list, or a generated range. */
export type AxisMode = 'single' | 'list' | 'step' | 'count'

export function axisModeOf (value: unknown): AxisMode {
  if (!isObject(value)) return 'single'
  if ('values' in value) return 'list'
  if ('count' in value) return 'count'
  if ('from' in value || 'to' in value || 'step' in value) return 'step'
  return 'single'
}

/** A typed number, or the text itself when it is not one, so the server names the mistake at its field. */
export function parseNumber (text: string): number | string | undefined {
  const trimmed = text.trim()
  if (trimmed === '') return undefined
  const value = Number(trimmed)
  return Number.isFinite(value) ? value : trimmed
}

/** A typed list of numbers: commas, semicolons or spaces between them. */
export function parseList (text: string): Array<number | string> {
  return text.split(/[,;\s]+/).filter((part) => part !== '').map((part) => parseNumber(part) as number | string)
}

/** The numbers an axis value already holds, to carry them into another mode. */
function knownValues (value: unknown): number[] {
  if (typeof value === 'number') return [value]
  if (!isObject(value)) return []
  if (Array.isArray(value.values)) return value.values.filter((v): v is number => typeof v === 'number')
  return [value.from, value.to].filter((v): v is number => typeof v === 'number')
}

/** The value converted to another mode, keeping what carries over (the ends of a range, the first value). */
export function convertAxis (value: unknown, mode: AxisMode): unknown {
  const known = knownValues(value)
  const first = known[0]
  const last = known[known.length - 1]
  switch (mode) {
    case 'single': return first
    case 'list': return { values: known }
    case 'step': {
      const step = isObject(value) && typeof value.step === 'number' ? value.step : undefined
      return { from: first, to: last, ...(step === undefined ? {} : { step }) }
    }
    case 'count': {
      const count = isObject(value) && typeof value.count === 'number' ? value.count : Math.max(2, known.length)
      const scale = isObject(value) && typeof value.scale === 'string' ? value.scale : undefined
      return { from: first, to: last, count, ...(scale === undefined ? {} : { scale }) }
    }
  }
}

/** Line and column (1-based) of a character offset in a text, for JSON parse errors. */
export function lineAndColumn (text: string, offset: number): { line: number, column: number } {
  const before = text.slice(0, Math.max(0, Math.min(offset, text.length)))
  const lines = before.split('\n')
  return { line: lines.length, column: (lines[lines.length - 1]?.length ?? 0) + 1 }
}

/**
 * The line (1-based) where the value at a dotted path starts in a JSON text, or null when the
 * text does not hold that path (or does not parse far enough). Used to point at errors in the
 * JSON view; a small scanner, since JSON.parse keeps no positions.
 */
export function lineOfPath (text: string, path: string): number | null {
  const wanted = path === '' ? [] : path.split('.')
  interface Frame { kind: 'object' | 'array', key: string | null, index: number, expectKey: boolean }
  const stack: Frame[] = []
  let line = 1
  const here = (): string[] => {
    const parts: string[] = []
    for (const frame of stack) parts.push(frame.kind === 'array' ? String(frame.index) : frame.key ?? '')
    return parts
  }
  const matches = (parts: string[]): boolean => parts.length === wanted.length && parts.every((p, i) => p === wanted[i])
  if (wanted.length === 0) return text.trim() === '' ? null : 1
  for (let i = 0; i < text.length; i++) {
    const c = text[i]
    if (c === '\n') { line++; continue }
    if (c === ' ' || c === '\t' || c === '\r') continue
    const top = stack[stack.length - 1]
    if (c === '"') {
      let j = i + 1
      let value = ''
      for (; j < text.length && text[j] !== '"'; j++) {
        if (text[j] === '\\') { value += text[j + 1] ?? ''; j++ } else value += text[j]
      }
      if (top !== undefined && top.kind === 'object' && top.expectKey) {
        top.key = value
        top.expectKey = false
      } else if (matches(here())) {
        return line
      }
      i = j
      continue
    }
    if (c === ':') continue
    if (c === ',') {
      if (top?.kind === 'object') top.expectKey = true
      else if (top?.kind === 'array') top.index++
      continue
    }
    if (c === '{' || c === '[') {
      if (stack.length > 0 && matches(here())) return line
      stack.push({ kind: c === '{' ? 'object' : 'array', key: null, index: 0, expectKey: c === '{' })
      continue
    }
    if (c === '}' || c === ']') { stack.pop(); continue }
    // A number, true, false or null.
    if (matches(here())) return line
    while (i + 1 < text.length && !/[\s,\]}]/.test(text[i + 1] as string)) i++
  }
  return null
}
