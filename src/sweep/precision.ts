/**
 * Precision targets: a grid point takes blocks of trials until the 95 % interval of the
 * chosen measure is narrow enough or the ceiling is reached. The decision after each block
 * reads only the point's trials so far, in trial order, so it (and with it every result) is
 * the same whatever the number of workers, their order or their speed.
 */
import { aggregatePoint, type PointSummary, type TrialRecord } from '../engine/index.js'
import { pointAt, type NormalisedPrecision, type NormalisedSpec } from '../spec/index.js'
import { pointPieces } from './plan.js'

/** z of a two-sided 95 % interval for the mean final overlap (the success rate uses Wilson's interval). */
const Z95 = 1.959963984540054

export type PointDecision =
  | { kind: 'close', halfWidth: number, met: boolean }
  | { kind: 'extend', fromTrial: number, pieces: Array<{ firstTrial: number, count: number }> }

/** Half-width of the 95 % interval of the target measure, from a point's summary. */
export function precisionHalfWidth (summary: PointSummary, measure: NormalisedPrecision['measure']): number {
  if (measure === 'success') return (summary.success.high - summary.success.low) / 2
  return Z95 * summary.overlap.se
}

/**
 * After a point's trials 0 … n − 1 are all stored: close it (target met, or the ceiling
 * reached) or give it the next block.
 *
 * @throws {RangeError} for a spec without precision targets.
 */
export function decidePoint (spec: NormalisedSpec, point: number, records: readonly TrialRecord[]): PointDecision {
  const precision = spec.precision
  if (precision === undefined) throw new RangeError('invalid argument. The spec has no precision targets.')
  const { params } = pointAt(spec, point)
  const halfWidth = precisionHalfWidth(aggregatePoint(params, records), precision.measure)
  const met = halfWidth <= precision.halfWidth
  const done = records.length
  if (met || done >= spec.trials) return { kind: 'close', halfWidth, met }
  return { kind: 'extend', fromTrial: done, pieces: pointPieces(spec, point, done, Math.min(done + precision.block, spec.trials)) }
}

/** What a result row says of a point's precision target. */
export function precisionOutcome (spec: NormalisedSpec, summary: PointSummary): { measure: NormalisedPrecision['measure'], target: number, halfWidth: number, met: boolean } | undefined {
  const precision = spec.precision
  if (precision === undefined) return undefined
  const halfWidth = precisionHalfWidth(summary, precision.measure)
  return { measure: precision.measure, target: precision.halfWidth, halfWidth, met: halfWidth <= precision.halfWidth }
}
