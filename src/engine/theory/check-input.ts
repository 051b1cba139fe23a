import { EngineInputError } from '../errors.js'

/** A load α = P/N: finite and ≥ 0. */
export function checkLoad (field: string, alpha: number): void {
  if (!(Number.isFinite(alpha) && alpha >= 0)) throw new EngineInputError(field, alpha, 'must be a finite load ≥ 0.')
}

/** A count (neurons, patterns, mixture components): an integer ≥ min. */
export function checkCount (field: string, value: number, min: number): void {
  if (!(Number.isInteger(value) && value >= min)) throw new EngineInputError(field, value, `must be an integer ≥ ${min}.`)
}

/** An overlap with a pattern: a number in [−1, 1]. */
export function checkOverlap (field: string, m: number): void {
  if (!(m >= -1 && m <= 1)) throw new EngineInputError(field, m, 'must be an overlap in [-1, 1].')
}
