/**
 * Which stored trials another sweep may take. A trial's record is a function of the engine,
 * the master seed, the point's model parameters and the trial's index only (streams are keyed
 * by the point's parameters: compute-chunk.ts), so a chunk stored for a point with the same
 * reuse key holds exactly the records a fresh run would compute.
 */
import { ENGINE_VERSION } from '../engine/index.js'
import { countPoints, pointAt, type NormalisedSpec } from '../spec/index.js'
import { pointStreamKey } from './compute-chunk.js'

/** Per grid point, its reuse key; none for a threshold search (its steps are not grid points). */
export function reuseKeysOf (spec: NormalisedSpec): string[] {
  if (spec.analysis !== undefined) return []
  return Array.from({ length: countPoints(spec) }, (_, point) => `${ENGINE_VERSION}:${spec.seed}:${pointStreamKey(pointAt(spec, point).params)}`)
}
