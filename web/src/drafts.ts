/** The spec being edited on the submit page, kept for this tab so navigating away loses nothing. */
import type { Spec } from './types.js'

const KEY = 'memsweep.draft'

export function saveDraft (spec: Spec): void {
  try {
    sessionStorage.setItem(KEY, JSON.stringify(spec))
  } catch {
    // A full or refused storage only costs the draft on the next visit.
  }
}

export function loadDraft (): Spec | null {
  try {
    const text = sessionStorage.getItem(KEY)
    if (text === null) return null
    const value: unknown = JSON.parse(text)
    return value !== null && typeof value === 'object' && !Array.isArray(value) ? value as Spec : null
  } catch {
    return null
  }
}

/** A fresh master seed from the browser's cryptographic generator (0 … 2^32 − 1). */
export function freshSeed (): number {
  return crypto.getRandomValues(new Uint32Array(1))[0] ?? 1
}
