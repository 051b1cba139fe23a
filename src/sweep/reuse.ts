/**
 * Which stored trials another sweep may take. A trial's record is a function of the engine,
 * the master seed, the point's parameters and the trial's index only (streams are keyed by
 * the point's model parameters: compute-chunk.ts), so a chunk stored for a point with the
 * same reuse key holds exactly the records a fresh run would compute. The key digests every
 * parameter, output-only ones included (they shape the records without changing the draws).
 */
import { createHash } from 'node:crypto'
import { ENGINE_VERSION } from '../engine/index.js'
import { canonicalJson, countPoints, pointAt, type NormalisedSpec } from '../spec/index.js'

/**
 * Per grid point, its reuse key; none for a threshold search (its steps are not grid points)
 * or a sweep on the canonical stream (its trials depend on every point drawn before them).
 */
export function reuseKeysOf (spec: NormalisedSpec): string[] {
  if (spec.analysis !== undefined || spec.streams === 'canonical') return []
  return Array.from({ length: countPoints(spec) }, (_, point) => {
    const digest = createHash('sha256').update(canonicalJson(pointAt(spec, point).params)).digest('base64url')
    return `${ENGINE_VERSION}:${spec.seed}:${digest}`
  })
}
