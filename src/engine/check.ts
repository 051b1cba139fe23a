import type { PointParams } from './params.js'
import { EngineInputError } from './errors.js'
import { checkModel } from './models/check-model.js'

/** Largest network the engine accepts; the service sets tighter limits from memory estimates. */
export const MAX_NEURONS = 1_000_000

/**
 * Cheap domain checks of a resolved point, so a bad value fails with the field named
 * instead of producing nonsense. Validation proper happens once, in the spec layer.
 *
 * @throws {EngineInputError} naming the first offending field and its value.
 */
export function checkPointParams (p: PointParams): void {
  integerIn('neurons', p.neurons, 1, MAX_NEURONS)
  integerIn('patterns', p.patterns, 1, Number.MAX_SAFE_INTEGER)
  if (p.family.kind === 'random') {
    const a = p.family.activity
    if (!(a > 0 && a < 1)) throw new EngineInputError('family.activity', a, 'activity must lie strictly between 0 and 1.')
  } else if (p.family.kind === 'correlated') {
    integerIn('family.parents', p.family.parents, 1, p.patterns)
    const q = p.family.parentOverlap
    if (!(q >= 0 && q <= 1)) throw new EngineInputError('family.parentOverlap', q, 'the parent overlap must lie in [0, 1].')
  } else {
    const data = p.family.data
    if (data.length !== p.patterns) throw new EngineInputError('family.data', data.length, `expected ${p.patterns} supplied patterns.`)
    for (let mu = 0; mu < data.length; mu++) {
      const row = data[mu]!
      if (row.length !== p.neurons) throw new EngineInputError(`family.data.${mu}`, row.length, `each supplied pattern needs exactly ${p.neurons} entries (the network size).`)
      for (let i = 0; i < row.length; i++) {
        const v = row[i]
        const ok = p.coding === 'binary' ? (v === 0 || v === 1) : (v === 1 || v === -1)
        if (!ok) throw new EngineInputError(`family.data.${mu}.${i}`, v, p.coding === 'binary' ? 'binary patterns hold 0 or 1.' : 'pm1 patterns hold -1 or +1.')
      }
    }
  }
  if (p.rule.kind === 'pseudo-inverse' && p.patterns >= p.neurons) {
    throw new EngineInputError('patterns', p.patterns, `the pseudo-inverse rule stores at most N − 1 = ${p.neurons - 1} linearly independent patterns.`)
  }
  if (p.rule.kind === 'covariance' && p.rule.threshold !== null && !Number.isFinite(p.rule.threshold)) {
    throw new EngineInputError('rule.threshold', p.rule.threshold, 'the threshold must be a finite number.')
  }
  checkModel(p)
  const cue = p.cue
  if ((cue.kind === 'flip' || cue.kind === 'erase') && !(cue.fraction >= 0 && cue.fraction <= 1)) {
    throw new EngineInputError('cue.fraction', cue.fraction, 'the cue fraction must lie in [0, 1].')
  }
  if (cue.kind === 'mixture') integerIn('cue.components', cue.components, 1, p.patterns)
  const t = p.dynamics.temperature
  if (!(t >= 0) || !Number.isFinite(t)) throw new EngineInputError('dynamics.temperature', t, 'the temperature must be a finite number ≥ 0.')
  integerIn('dynamics.maxSweeps', p.dynamics.maxSweeps, 1, 1_000_000)
  integerIn('dynamics.burnIn', p.dynamics.burnIn, 0, p.dynamics.maxSweeps - (t > 0 ? 1 : 0))
  if (!(p.successThreshold >= -1 && p.successThreshold <= 1)) {
    throw new EngineInputError('successThreshold', p.successThreshold, 'the success threshold is an overlap in [−1, 1].')
  }
  if (p.patternLevel !== undefined && !(p.patternLevel >= -1 && p.patternLevel <= 1)) {
    throw new EngineInputError('patternLevel', p.patternLevel, 'the pattern level of the end states is an overlap in [−1, 1].')
  }
  integerIn('trialsPerNetwork', p.trialsPerNetwork, 1, Number.MAX_SAFE_INTEGER)
}

function integerIn (field: string, value: number, min: number, max: number): void {
  if (!Number.isInteger(value) || value < min || value > max) {
    throw new EngineInputError(field, value, `expected an integer in [${min}, ${max}].`)
  }
}
