/** The model parameters a result row states beside its varied values. */
import type { PointParams } from '../engine/index.js'
import type { ResultRow } from './types.js'

/**
 * N, P and the load per neuron α = P/N; under a fixed in-degree K also the load per input
 * P/K (`inDegreeLoad`), so a row says which load is which.
 */
export function rowParams (p: PointParams): ResultRow['params'] {
  const params: ResultRow['params'] = { alpha: p.patterns / p.neurons, neurons: p.neurons, patterns: p.patterns }
  if (p.dilution?.kind === 'fixed-in-degree') params.inDegreeLoad = p.patterns / p.dilution.inDegree
  return params
}
