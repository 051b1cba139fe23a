/**
 * Setting the searched parameter on a grid point's resolved parameters, and the value a
 * request for x actually runs: a load becomes a whole number of patterns and a cue fraction
 * a whole number of neurons, so the search records (and fits) the value it really ran.
 */
import type { PointParams } from '../../engine/index.js'
import { roundToSignificant } from '../axis.js'
import { patternsForLoad } from '../grid.js'

// MAIN //

/**
 * The value run when the search asks for `x` at this point (non-decreasing in x). Other
 * parameters are rounded to 12 significant digits, as axis values are, so bisection
 * midpoints read 0.6 rather than 0.6000000000000001.
 */
export function realisedValue (parameter: string, params: PointParams, x: number): number {
  if (parameter === 'load') return patternsForLoad(x, params.neurons) / params.neurons
  if (parameter === 'inDegreeLoad') return patternsForLoad(x, inDegreeOf(params)) / inDegreeOf(params)
  if (parameter === 'cue.fraction') return Math.round(x * params.neurons) / params.neurons
  return roundToSignificant(x)
}

/**
 * The point's parameters with the searched one set to `x`. PointParams mirror the spec's
 * paths (family.activity, dilution.keep, cue.fraction, …), so any searchable path is set
 * by walking it, copying only the objects on the way; `load` and `inDegreeLoad` set the
 * pattern count.
 *
 * @throws {Error} when the point has no field at `parameter` (validation rules that out).
 */
export function withParameter (params: PointParams, parameter: string, x: number): PointParams {
  if (parameter === 'load') return { ...params, patterns: patternsForLoad(x, params.neurons) }
  if (parameter === 'inDegreeLoad') return { ...params, patterns: patternsForLoad(x, inDegreeOf(params)) }
  const keys = parameter.split('.')
  const copy: Record<string, unknown> = { ...params }
  let node = copy
  for (let i = 0; i < keys.length - 1; i++) {
    const child = node[keys[i]!]
    if (child === null || typeof child !== 'object') throw new Error(`internal: the point has no field ${parameter}`)
    const cloned = { ...(child as Record<string, unknown>) }
    node[keys[i]!] = cloned
    node = cloned
  }
  const last = keys[keys.length - 1]!
  if (typeof node[last] !== 'number' && node[last] !== null) throw new Error(`internal: the point has no numeric field ${parameter}`)
  node[last] = x
  return copy as unknown as PointParams
}

/** K of a fixed in-degree dilution (validation makes sure an inDegreeLoad point has one). */
function inDegreeOf (params: PointParams): number {
  if (params.dilution?.kind !== 'fixed-in-degree') throw new Error('internal: inDegreeLoad needs a fixed in-degree dilution')
  return params.dilution.inDegree
}
