import type { PointParams } from '../params.js'
import { EngineInputError } from '../errors.js'

/** Largest polynomial degree: N^n stays far inside the double range for every N ≤ 10⁶. */
export const MAX_DENSE_DEGREE = 30

/**
 * Domain checks of the model families beyond the coupling-matrix rules: clipped synapses,
 * the dense associative memories, the modern softmax network and the fixed in-degree
 * dilution. Each names the offending field.
 *
 * @throws {EngineInputError} naming the first offending field and its value.
 */
export function checkModel (p: PointParams): void {
  const rule = p.rule
  const dense = rule.kind === 'dense-polynomial' || rule.kind === 'dense-exponential'
  if (dense || rule.kind === 'modern-softmax') {
    const name = rule.kind === 'modern-softmax' ? 'the modern softmax network' : 'a dense associative memory'
    if (p.coding !== 'pm1') throw new EngineInputError('coding', p.coding, `${name} works on ±1 patterns; use coding pm1.`)
    if (p.dilution !== null) throw new EngineInputError('dilution', p.dilution, `${name} has no couplings to dilute; use dilution null.`)
  }
  if (rule.kind === 'dense-polynomial' && !(Number.isInteger(rule.degree) && rule.degree >= 2 && rule.degree <= MAX_DENSE_DEGREE)) {
    throw new EngineInputError('rule.degree', rule.degree, `the degree n of F(x) = xⁿ must be an integer in [2, ${MAX_DENSE_DEGREE}].`)
  }
  if (rule.kind === 'modern-softmax' && !(rule.beta > 0 && Number.isFinite(rule.beta))) {
    throw new EngineInputError('rule.beta', rule.beta, 'the inverse temperature β must be a finite number > 0.')
  }
  if ((rule.kind === 'dense-exponential' || rule.kind === 'modern-softmax') && p.dynamics.temperature !== 0) {
    const why = rule.kind === 'modern-softmax' ? 'the softmax network is deterministic (β sets its sharpness)' : 'the exponential memory runs at zero temperature only'
    throw new EngineInputError('dynamics.temperature', p.dynamics.temperature, `${why}; use temperature 0.`)
  }
  const d = p.dilution
  if (d === null) return
  if (d.kind === 'fixed-in-degree') {
    if (!Number.isInteger(d.inDegree) || d.inDegree < 1 || d.inDegree > p.neurons - 1) {
      throw new EngineInputError('dilution.inDegree', d.inDegree, `the in-degree K must be an integer in [1, N − 1] = [1, ${p.neurons - 1}].`)
    }
    if (rule.kind !== 'hebbian' && rule.kind !== 'clipped') {
      throw new EngineInputError('dilution.kind', d.kind, `a fixed in-degree dilution needs the hebbian or clipped rule (rule kind is ${rule.kind}).`)
    }
    if (rule.selfCoupling) throw new EngineInputError('rule.selfCoupling', true, 'a neuron with a fixed in-degree draws its inputs from the other neurons; use selfCoupling false.')
    if (p.coding !== 'pm1') throw new EngineInputError('coding', p.coding, 'a fixed in-degree dilution works on ±1 neurons; use coding pm1.')
  } else if (!(d.keep > 0 && d.keep <= 1)) {
    throw new EngineInputError('dilution.keep', d.keep, 'the fraction of couplings kept must lie in (0, 1].')
  }
}
