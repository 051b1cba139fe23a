/**
 * The spec of an extension: a finished (or stopped) sweep's spec with more trials per point
 * and/or more values on any varied parameter. The result is an ordinary spec: submitting it
 * fresh gives the same rows as extending, which is what makes reusing the parent's trials
 * exact (every trial's stream is keyed by the point's parameters, the seed and its index).
 */
import { SpecValidationError, type SpecIssue } from './errors.js'
import { variedAt } from './grid.js'
import { normaliseSpec } from './normalise.js'
import { VARIED_PARAMETERS } from './schema.js'
import type { NormalisedSpec } from './types.js'

export interface SpecExtension {
  /** Trials per point (at least the parent's). */
  trials?: number
  /** Values to add, by varied path: a constant becomes an axis holding it and the new values. */
  add?: Record<string, readonly number[]>
  /** The new sweep's label; by default the parent's. */
  label?: string | null
}

/**
 * Added values join an axis in its own order: ascending or descending axes stay sorted, any
 * other keeps its order with the new values appended. Values already present are not repeated.
 *
 * @throws {SpecValidationError} naming each field (`trials`, `add.<path>`) that cannot extend this spec.
 */
export function extendSpec (parent: NormalisedSpec, extension: SpecExtension): NormalisedSpec {
  const issues: SpecIssue[] = []
  if (parent.analysis !== undefined) issues.push({ path: '', message: 'a threshold search cannot be extended: run a new search with the range or trials you need' })
  const trials = extension.trials ?? parent.trials
  if (!Number.isSafeInteger(trials) || trials < parent.trials) issues.push({ path: 'trials', message: `must be at least the extended sweep's ${parent.trials} trials per point (got ${String(extension.trials)})` })
  const input = JSON.parse(JSON.stringify(parent)) as Record<string, unknown>
  input.trials = trials
  if (extension.label !== undefined) input.label = extension.label
  const varied = new Set<string>(VARIED_PARAMETERS.map((p) => p.path))
  for (const [path, added] of Object.entries(extension.add ?? {})) {
    if (!varied.has(path)) {
      issues.push({ path: `add.${path}`, message: 'is not a parameter that can be varied' })
      continue
    }
    const current = variedAt(parent, path as typeof VARIED_PARAMETERS[number]['path'])
    if (current === undefined || current === null) {
      issues.push({ path: `add.${path}`, message: 'is not set in this sweep\'s spec, so it has no axis to extend' })
      continue
    }
    if (!Array.isArray(added) || added.length === 0 || !added.every((v) => typeof v === 'number' && Number.isFinite(v))) {
      issues.push({ path: `add.${path}`, message: 'must be a non-empty list of numbers' })
      continue
    }
    setAt(input, path, { values: mergeValues(typeof current === 'number' ? [current] : current.values, added) })
  }
  if (issues.length > 0) throw new SpecValidationError(issues)
  return normaliseSpec(input)
}

function mergeValues (existing: readonly number[], added: readonly number[]): number[] {
  const fresh = added.filter((v, i) => !existing.includes(v) && added.indexOf(v) === i)
  const ascending = existing.every((v, i) => i === 0 || v > existing[i - 1]!)
  const descending = existing.length > 1 && existing.every((v, i) => i === 0 || v < existing[i - 1]!)
  const merged = [...existing, ...fresh]
  if (ascending) return merged.sort((a, b) => a - b)
  if (descending) return merged.sort((a, b) => b - a)
  return merged
}

function setAt (target: Record<string, unknown>, path: string, value: unknown): void {
  const keys = path.split('.')
  let node = target
  for (const key of keys.slice(0, -1)) node = node[key] as Record<string, unknown>
  node[keys.at(-1)!] = value
}
