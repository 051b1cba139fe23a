/**
 * Canonical JSON: object keys sorted by UTF-16 code units at every level, no whitespace,
 * numbers in ECMAScript's shortest round-trip form, non-finite numbers as null (as
 * JSON.stringify writes them), undefined members left out. Equal data ⇒ equal bytes.
 */
import { createHash } from 'node:crypto'
import type { NormalisedSpec } from './types.js'

export function canonicalJson (value: unknown): string {
  return JSON.stringify(sortKeysDeep(value))
}

/** A deep copy of plain JSON data with the keys of every object in sorted order. */
export function sortKeysDeep<T> (value: T): T {
  return sortValue(value) as T
}

function sortValue (value: unknown): unknown {
  if (Array.isArray(value)) return value.map((item) => (item === undefined ? null : sortValue(item)))
  if (value === null || typeof value !== 'object') return value
  const out: Record<string, unknown> = {}
  for (const key of Object.keys(value).sort()) {
    const item = (value as Record<string, unknown>)[key]
    if (item !== undefined) out[key] = sortValue(item)
  }
  return out
}

/**
 * SHA-256 (hex) of the canonical JSON of a normalised spec without its `label`: the hash
 * names the work to be done, so two specs that differ only in their label share a hash
 * (and may share results). Everything else, including `version` and `seed`, counts.
 */
export function specHash (spec: NormalisedSpec): string {
  const { label: _label, ...work } = spec
  return createHash('sha256').update(canonicalJson(work)).digest('hex')
}

/**
 * SHA-256 (hex) of the canonical JSON of a normalised spec without its label and seed: sweeps
 * with the same key differ only in their random draws, so they are replicates of each other.
 */
export function replicateKey (spec: NormalisedSpec): string {
  const { label: _label, seed: _seed, ...work } = spec
  return createHash('sha256').update(canonicalJson(work)).digest('hex')
}
