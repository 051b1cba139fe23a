/**
 * A sweep's model in one line, as a researcher names it: size, learning rule, the load (or
 * whatever else is varied) with its range, and the trial count, e.g.
 * "N 200–800 (3) · Hebbian · α 0.02–0.24 (12) · cue 5 % flipped · 100 trials". Pure: no DOM.
 */
import { formatCount, formatGridValue } from './format.js'
import type { Spec } from './types.js'

const SYMBOLS: Record<string, string> = {
  neurons: 'N',
  patterns: 'P',
  load: 'α',
  'cue.fraction': 'cue',
  'dynamics.temperature': 'T',
  'family.activity': 'activity',
  'family.parentOverlap': 'parent overlap',
  'dilution.keep': 'kept',
  'dilution.inDegree': 'K',
  'rule.degree': 'n',
  'rule.beta': 'β',
  'rule.threshold': 'θ',
  'dynamics.maxSweeps': 'sweep limit',
  successThreshold: 'm*'
}

/** The short symbol of a parameter (N, α, T, …), or its path. */
export function axisSymbol (path: string): string {
  return SYMBOLS[path] ?? path
}

const RULES: Record<string, string> = {
  hebbian: 'Hebbian',
  storkey: 'Storkey',
  pseudoInverse: 'pseudo-inverse',
  'pseudo-inverse': 'pseudo-inverse',
  covariance: 'covariance',
  clipped: 'clipped Hebbian'
}

function ruleName (rule: unknown): string {
  if (rule === null || typeof rule !== 'object') return typeof rule === 'string' ? (RULES[rule] ?? rule) : ''
  const { kind, values } = rule as { kind?: unknown, values?: unknown }
  if (Array.isArray(values)) return values.map(ruleName).filter((name) => name !== '').join(' / ')
  if (typeof kind !== 'string') return ''
  return RULES[kind] ?? kind
}

/** One value, or a range "first–last (count)" of an axis's values. */
export function rangeText (values: readonly unknown[]): string {
  const shown = values.map((value) => formatGridValue(value as number | string | boolean, 3))
  if (shown.length <= 1) return shown[0] ?? ''
  if (values.every((value) => typeof value === 'number')) return `${shown[0] ?? ''}–${shown.at(-1) ?? ''} (${shown.length})`
  return shown.join(' / ')
}

/** Axes of a spec: every `{ values: [...] }` member by path, the rule's included. */
export function specAxes (spec: Spec): Array<{ path: string, values: unknown[] }> {
  const found: Array<{ path: string, values: unknown[] }> = []
  const visit = (node: unknown, path: string): void => {
    if (node === null || typeof node !== 'object' || Array.isArray(node)) return
    const values = (node as { values?: unknown }).values
    if (Array.isArray(values) && path !== '' && path !== 'family.data') {
      found.push({ path, values })
      return
    }
    for (const [key, child] of Object.entries(node)) visit(child, path === '' ? key : `${path}.${key}`)
  }
  visit(spec, '')
  return found
}

/** The member of a spec at a dotted path, or undefined. */
export function valueAt (spec: Spec, path: string): unknown {
  return path.split('.').reduce<unknown>((node, key) => (node !== null && typeof node === 'object' ? (node as Record<string, unknown>)[key] : undefined), spec)
}

export function modelLine (spec: Spec): string {
  const axes = specAxes(spec)
  const axis = (path: string): unknown[] | null => axes.find((entry) => entry.path === path)?.values ?? null
  const quantity = (path: string): string | null => {
    const values = axis(path)
    if (values !== null) return `${SYMBOLS[path] ?? path} ${rangeText(values)}`
    const value = valueAt(spec, path)
    return typeof value === 'number' ? `${SYMBOLS[path] ?? path} ${formatGridValue(value, 4)}` : null
  }
  const parts: string[] = []
  const size = quantity('neurons')
  if (size !== null) parts.push(size)
  const rule = ruleName(spec.rule)
  if (rule !== '') parts.push(rule)
  const load = quantity('load') ?? quantity('patterns')
  if (load !== null) parts.push(load)
  const cue = spec.cue as { kind?: unknown, fraction?: unknown } | undefined
  const cueValues = axis('cue.fraction')
  if (cueValues !== null) parts.push(`cue ${rangeText(cueValues)}${typeof cue?.kind === 'string' ? ` ${cue.kind}` : ''}`)
  else if (typeof cue?.fraction === 'number' && cue.fraction > 0) parts.push(`cue ${formatGridValue(cue.fraction * 100, 3)} % ${cue.kind === 'flip' ? 'flipped' : String(cue.kind ?? '')}`.trim())
  const temperature = axis('dynamics.temperature')
  const fixedT = valueAt(spec, 'dynamics.temperature')
  if (temperature !== null) parts.push(`T ${rangeText(temperature)}`)
  else if (typeof fixedT === 'number' && fixedT > 0) parts.push(`T ${formatGridValue(fixedT, 3)}`)
  const named = new Set(['neurons', 'load', 'patterns', 'cue.fraction', 'dynamics.temperature', 'rule'])
  for (const { path, values } of axes) {
    if (named.has(path)) continue
    parts.push(`${SYMBOLS[path] ?? path} ${rangeText(values)}`)
  }
  const precision = spec.precision as { measure?: unknown, halfWidth?: unknown, block?: unknown } | undefined | null
  if (typeof spec.trials === 'number' && precision !== undefined && precision !== null && typeof precision.halfWidth === 'number' && typeof precision.block === 'number') {
    // A precision target: `trials` is the ceiling of blocks that stop once the interval is narrow enough.
    parts.push(`${formatCount(precision.block)}–${formatCount(spec.trials)} trials to ${precision.measure === 'overlap' ? 'overlap' : 'success'} ± ${formatGridValue(precision.halfWidth, 3)}`)
  } else if (typeof spec.trials === 'number') parts.push(`${formatCount(spec.trials)} trials`)
  if (spec.analysis !== undefined && spec.analysis !== null) parts.push('threshold search')
  return parts.join(' · ')
}
