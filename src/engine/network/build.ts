import type { PointParams } from '../params.js'
import type { RandomSource } from '../random/source.js'
import { generatePatterns } from '../patterns/generate.js'
import { hebbianCouplings } from '../rules/hebbian.js'
import { pseudoInverseCouplings } from '../rules/pseudo-inverse.js'
import { storkeyCouplings } from '../rules/storkey.js'
import { covarianceCouplings } from '../rules/covariance.js'
import { diluteCouplings } from '../rules/dilution.js'
import type { Network } from './network.js'
import { OverlapSpaceNetwork } from './overlap-space.js'
import { DenseNetwork } from './dense.js'

/** Which representation a point uses: overlap space whenever the rule allows it (Hebbian, fully connected, ±1 neurons). */
export function chooseRepresentation (p: PointParams): Network['representation'] {
  return p.rule.kind === 'hebbian' && p.dilution === null && p.coding === 'pm1' ? 'overlap-space' : 'dense-incremental'
}

/**
 * Draws one network (patterns, then couplings, then dilution) from `rng`, in that order.
 */
export function buildNetwork (p: PointParams, rng: RandomSource): Network {
  const n = p.neurons
  const count = p.patterns
  const patterns = generatePatterns(p, rng)
  if (chooseRepresentation(p) === 'overlap-space') {
    return new OverlapSpaceNetwork(patterns, n, count, p.rule.selfCoupling)
  }
  let couplings: Float64Array
  let fieldScale = 1
  let theta = 0
  switch (p.rule.kind) {
    case 'hebbian':
      couplings = hebbianCouplings(patterns, n, count, p.rule.selfCoupling)
      fieldScale = 1 / n
      break
    case 'pseudo-inverse':
      couplings = pseudoInverseCouplings(patterns, n, count, p.rule.selfCoupling)
      break
    case 'storkey':
      couplings = storkeyCouplings(patterns, n, count, p.rule.selfCoupling)
      break
    case 'covariance': {
      const activity = p.family.kind === 'random' ? p.family.activity : 0.5
      const built = covarianceCouplings(patterns, n, count, activity, p.rule.selfCoupling, p.rule.threshold, p.coding === 'binary')
      couplings = built.couplings
      theta = built.theta
      break
    }
  }
  if (p.dilution !== null) diluteCouplings(couplings, n, p.dilution, rng)
  const bias = new Float64Array(n)
  if (p.coding === 'binary') {
    // 0/1 neurons V = (1 + s)/2: Σ_j J_ij V_j − θ = ½(Σ_j J_ij s_j + Σ_j J_ij − 2θ), so the
    // spin dynamics run on the same couplings with bias Σ_j J_ij − 2θ and half the scale.
    for (let i = 0; i < n; i++) {
      let rowSum = 0
      for (let j = 0; j < n; j++) rowSum += couplings[i * n + j]!
      bias[i] = rowSum - 2 * theta / fieldScale
    }
    fieldScale /= 2
  } else {
    bias.fill(-theta / fieldScale)
  }
  return new DenseNetwork({
    patterns,
    neurons: n,
    patternCount: count,
    couplings,
    bias,
    fieldScale,
    symmetric: p.dilution === null || p.dilution.symmetric
  })
}
