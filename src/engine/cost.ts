import type { PointParams } from './params.js'
import { chooseRepresentation, type Representation } from './network/build.js'

export interface PointCost {
  /** Peak bytes one runner holds for this point (network, patterns, scratch). */
  bytes: number
  /** Expected neuron visits per trial (upper bound: maxSweeps·N at T = 0 is rarely reached; we use a typical settle count). */
  neuronUpdatesPerTrial: number
  /** Arithmetic operations to build one network. */
  buildOpsPerNetwork: number
  /** Operations per neuron visit (O(P) in overlap space, O(1) amortised with dense fields). */
  opsPerVisit: number
}

/**
 * Memory and work estimate of one grid point, computed from the parameters alone so
 * oversized work can be refused before anything is allocated.
 */
export function estimatePointCost (p: PointParams): PointCost {
  const n = p.neurons
  const count = p.patterns
  const representation = chooseRepresentation(p)
  const patternBytes = n * count
  const scratchBytes = n * (4 + 4 + 1 + 1 + 1 + 8) + 8 * count
  const thermal = p.dynamics.temperature > 0
  const sweeps = thermal ? p.dynamics.maxSweeps : Math.min(p.dynamics.maxSweeps, 10)
  const neuronUpdatesPerTrial = sweeps * n
  if (representation === 'overlap-space') {
    return {
      bytes: 2 * patternBytes + scratchBytes + 4 * count,
      neuronUpdatesPerTrial,
      buildOpsPerNetwork: n * count,
      opsPerVisit: count
    }
  }
  const model = modelCost(p, representation, patternBytes + scratchBytes, neuronUpdatesPerTrial)
  if (model !== null) return model
  const asymmetric = p.dilution !== null && p.dilution.kind !== 'fixed-in-degree' && !p.dilution.symmetric
  let matrices = asymmetric ? 2 : 1
  let buildOps = n * n * count
  if (p.rule.kind === 'pseudo-inverse') buildOps += n * count * count + count * count * count
  if (p.rule.kind === 'storkey') { matrices += 1; buildOps *= 2 }
  return {
    bytes: 8 * n * n * matrices + patternBytes + scratchBytes + (p.rule.kind === 'pseudo-inverse' ? 8 * count * (n + count) : 0),
    neuronUpdatesPerTrial,
    buildOpsPerNetwork: buildOps,
    // A visit reads one field; a change (a fraction of visits) adds a column of N.
    opsPerVisit: 1 + n / Math.max(1, sweeps)
  }
}

/**
 * The representations without a coupling matrix: dense memories and the softmax network
 * hold the patterns twice (O(P) per visit or per state component), the fixed in-degree
 * network four N·K arrays (O(K) per visit at most). Null for the others.
 */
function modelCost (p: PointParams, representation: Representation, baseBytes: number, neuronUpdatesPerTrial: number): PointCost | null {
  const n = p.neurons
  const count = p.patterns
  switch (representation) {
    case 'dense-memory':
      return { bytes: baseBytes + n * count + 4 * count + 16 * n, neuronUpdatesPerTrial, buildOpsPerNetwork: 2 * n * count, opsPerVisit: p.rule.kind === 'dense-exponential' ? 2 * count : count }
    case 'softmax-continuous':
      return { bytes: baseBytes + 8 * count + 16 * n, neuronUpdatesPerTrial, buildOpsPerNetwork: n * count, opsPerVisit: 2 * count }
    case 'sparse-in-degree': {
      const k = p.dilution?.kind === 'fixed-in-degree' ? p.dilution.inDegree : n
      return { bytes: baseBytes + n * count + 16 * n * k + 12 * n, neuronUpdatesPerTrial, buildOpsPerNetwork: n * k * (count + 8), opsPerVisit: k }
    }
    default:
      return null
  }
}
