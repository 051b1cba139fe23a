/**
 * Fan-in for searches: one payload per outer grid point, placed by point, never by
 * arrival; the scaling fit (when asked for) is computed from the placed rows, so the
 * result does not depend on which worker finished first.
 */
import { canonicalJson } from '../../spec/canonical.js'
import type { ChunkResult } from '../compute-chunk.js'
import { IncompleteResultError } from '../errors.js'
import { countPoints, pointAt } from '../../spec/grid.js'
import type { NormalisedSpec } from '../../spec/types.js'
import { scalingRows } from './scaling.js'
import type { NormalisedAnalysis, ScalingRow, SearchPayload, SearchRow } from '../../spec/analysis/types.js'

// MAIN //

/**
 * The searches of an analysis spec, in grid order, and their scaling fits.
 *
 * @throws {IncompleteResultError} when a search is missing, delivered twice with different
 *   content, outside the grid, or a chunk carries no search payload.
 */
export function assembleSearches (spec: NormalisedSpec, analysis: NormalisedAnalysis, chunkResults: readonly ChunkResult[]): { searches: SearchRow[], scaling?: ScalingRow[] } {
  const points = countPoints(spec)
  const slots = new Array<SearchPayload | undefined>(points)
  const problems: string[] = []
  for (const result of [...chunkResults].sort((a, b) => a.chunk - b.chunk)) {
    if (!(Number.isSafeInteger(result.point) && result.point >= 0 && result.point < points)) {
      problems.push(`chunk ${result.chunk} names search ${result.point}, outside the grid of ${points}`)
    } else if (result.search === undefined) {
      problems.push(`chunk ${result.chunk} holds no search result`)
    } else if (slots[result.point] === undefined) {
      slots[result.point] = result.search
    } else if (canonicalJson(slots[result.point]) !== canonicalJson(result.search)) {
      problems.push(`search ${result.point} was delivered twice with different content`)
    }
  }
  for (let point = 0; point < points; point++) if (slots[point] === undefined) problems.push(`search ${point} is missing`)
  if (problems.length > 0) throw new IncompleteResultError(problems)

  const searches: SearchRow[] = (slots as SearchPayload[]).map((payload, search) => {
    const { values, params } = pointAt(spec, search)
    return {
      search,
      values,
      neurons: params.neurons,
      stepsUsed: payload.steps.length,
      trialsUsed: payload.steps.reduce((n, step) => n + step.summary.trials, 0),
      ...payload
    }
  })
  return analysis.scaling === null ? { searches } : { searches, scaling: scalingRows(spec, analysis, searches) }
}
