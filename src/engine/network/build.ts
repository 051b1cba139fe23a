import type { PointParams } from '../params.js'
import { EngineInputError } from '../errors.js'
import type { RandomSource } from '../random/source.js'
import { generatePatterns } from '../patterns/generate.js'
import { hebbianCouplings } from '../rules/hebbian.js'
import { pseudoInverseCouplings } from '../rules/pseudo-inverse.js'
import { storkeyCouplings } from '../rules/storkey.js'
import { covarianceCouplings } from '../rules/covariance.js'
import { diluteCouplings } from '../rules/dilution.js'
import { clippedCouplings } from '../rules/clipped.js'
import { inDegreeCouplings } from '../rules/in-degree-couplings.js'
import type { Network } from './network.js'
import { OverlapSpaceNetwork } from './overlap-space.js'
import { DenseNetwork } from './dense.js'
import { DenseMemoryNetwork } from './dense-memory.js'
import { SparseInDegreeNetwork } from './sparse-in-degree.js'

/** How a point's model is held: a Network representation, or the continuous state of the modern softmax network (models/softmax). */
export type Representation = Network['representation'] | 'softmax-continuous'

/**
 * Which representation a point uses: overlap space whenever the rule allows it (Hebbian, fully
 * connected, ±1 neurons); adjacency lists for a fixed in-degree; the dense memories and the
 * softmax network have their own; a coupling matrix otherwise.
 */
export function chooseRepresentation (p: PointParams): Representation {
  if (p.rule.kind === 'modern-softmax') return 'softmax-continuous'
  if (p.rule.kind === 'dense-polynomial' || p.rule.kind === 'dense-exponential') return 'dense-memory'
  if (p.dilution?.kind === 'fixed-in-degree') return 'sparse-in-degree'
  return p.rule.kind === 'hebbian' && p.dilution === null && p.coding === 'pm1' ? 'overlap-space' : 'dense-incremental'
}

/**
 * Draws one network (patterns, then couplings, then dilution) from `rng`, in that order.
 *
 * @throws {EngineInputError} for the modern softmax rule, which has no spin network
 * (models/softmax runs it).
 */
export function buildNetwork (p: PointParams, rng: RandomSource): Network {
  const n = p.neurons
  const count = p.patterns
  const rule = p.rule
  if (rule.kind === 'modern-softmax') throw new EngineInputError('rule.kind', rule.kind, 'the modern softmax network has a continuous state, not a spin network.')
  const patterns = generatePatterns(p, rng)
  if (rule.kind === 'dense-polynomial') return new DenseMemoryNetwork(patterns, n, count, { kind: 'polynomial', degree: rule.degree })
  if (rule.kind === 'dense-exponential') return new DenseMemoryNetwork(patterns, n, count, { kind: 'exponential' })
  if (p.dilution?.kind === 'fixed-in-degree') {
    const k = p.dilution.inDegree
    const clipped = rule.kind === 'clipped'
    return new SparseInDegreeNetwork(patterns, n, count, inDegreeCouplings(patterns, n, count, k, clipped, rng), clipped ? Math.sqrt(count) / k : 1 / k)
  }
  if (rule.kind === 'hebbian' && chooseRepresentation(p) === 'overlap-space') {
    return new OverlapSpaceNetwork(patterns, n, count, rule.selfCoupling, onlyWholeAsync(p), p.dynamics.temperature > 0)
  }
  let couplings: Float64Array
  let fieldScale = 1
  let theta = 0
  switch (rule.kind) {
    case 'hebbian':
      couplings = hebbianCouplings(patterns, n, count, rule.selfCoupling)
      fieldScale = 1 / n
      break
    case 'pseudo-inverse':
      couplings = pseudoInverseCouplings(patterns, n, count, rule.selfCoupling)
      break
    case 'storkey':
      couplings = storkeyCouplings(patterns, n, count, rule.selfCoupling)
      break
    case 'covariance': {
      const activity = p.family.kind === 'random' ? p.family.activity : 0.5
      const built = covarianceCouplings(patterns, n, count, activity, rule.selfCoupling, rule.threshold, p.coding === 'binary')
      couplings = built.couplings
      theta = built.theta
      break
    }
    case 'clipped': {
      const built = clippedCouplings(patterns, n, count, rule.selfCoupling)
      couplings = built.couplings
      fieldScale = built.fieldScale
      break
    }
  }
  if (p.dilution !== null) diluteCouplings(couplings, n, p.dilution, rng)
  return denseNetworkFrom(p, patterns, couplings, fieldScale, theta, p.dilution === null || p.dilution.symmetric)
}

/**
 * Draws the next network of point `p` into the memory of `previous`, a network of the same
 * point no longer needed, and returns true; or returns false, drawing nothing, when its
 * representation cannot be redrawn in place (then build a new one). The draws and the network
 * are exactly those of `buildNetwork(p, rng)`; only no memory is allocated. A capacity curve
 * builds a network per trial, and fresh pattern-sized arrays every trial are mostly the cost of
 * the operating system zeroing new pages until the collector catches up.
 */
export function redrawNetwork (previous: Network, p: PointParams, rng: RandomSource): boolean {
  if (!(previous instanceof OverlapSpaceNetwork) || p.rule.kind !== 'hebbian' || !canRedrawNetwork(p)) return false
  if (!previous.hasShape(p.neurons, p.patterns, p.rule.selfCoupling, onlyWholeAsync(p))) return false
  generatePatterns(p, rng, previous.patterns)
  previous.reloadPatterns()
  return true
}

/** Whether the networks of point `p` can be redrawn in place (`redrawNetwork`): Hebbian networks in overlap space. */
export function canRedrawNetwork (p: PointParams): boolean {
  return p.rule.kind === 'hebbian' && chooseRepresentation(p) === 'overlap-space'
}

/** The point's network runs whole zero-temperature asynchronous trials and nothing else (no trajectories). */
function onlyWholeAsync (p: PointParams): boolean {
  const { dynamics, measures } = p
  return dynamics.temperature === 0 && dynamics.update !== 'sync' && !measures.overlapTrajectory && !measures.energyTrajectory
}

/**
 * The coupling-matrix network of a point from couplings already drawn (raw units: physical
 * J = raw · fieldScale) and a uniform threshold θ (physical units), for the point's coding.
 * `buildNetwork` ends here; a threshold scan may reuse one matrix for several θ, since the
 * couplings are only read.
 */
export function denseNetworkFrom (p: PointParams, patterns: Int8Array, couplings: Float64Array, rawScale: number, theta: number, symmetric: boolean): DenseNetwork {
  const n = p.neurons
  let fieldScale = rawScale
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
  return new DenseNetwork({ patterns, neurons: n, patternCount: p.patterns, couplings, bias, fieldScale, symmetric })
}
