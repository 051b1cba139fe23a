import { checkCount } from './check-input.js'
import { EngineInputError } from '../errors.js'

/**
 * Elementary bound on the error of one update of the modern Hopfield network
 * f(ξ) = X softmax(β Xᵀξ) towards pattern x_i:
 *
 *   ‖f(ξ) − x_i‖ ≤ 2M · min(1, (P − 1) e^{−βΔ̃}),   Δ̃ = x_iᵀξ − max_{j≠i} x_jᵀξ,
 *
 * M = max_j ‖x_j‖, P patterns. Derived (CHECK_VALUES §6 [D]): f(ξ) − x_i = Σ_{j≠i} p_j (x_j − x_i)
 * with ‖x_j − x_i‖ ≤ 2M and p_j ≤ e^{β(x_jᵀξ − x_iᵀξ)} ≤ e^{−βΔ̃}, the estimate behind the
 * one-update retrieval result of Ramsauer et al. (ICLR 2021).
 *
 * @throws {EngineInputError} when β ≤ 0, P < 1 or M < 0.
 */
export function softmaxErrorBound (gap: number, patterns: number, beta: number, maxNorm = 1): number {
  checkSoftmax(patterns, beta, maxNorm)
  return 2 * maxNorm * Math.min(1, (patterns - 1) * Math.exp(-beta * gap))
}

/**
 * Separation a pattern needs for retrieval in one update with exponentially small error
 * (Ramsauer et al., ICLR 2021, arXiv:2008.02217; condition recalled from memory):
 *
 *   Δ_i = x_iᵀx_i − max_{j≠i} x_iᵀx_j ≥ 2/(βP) + β⁻¹ ln(2(P − 1) P β M²).
 *
 * With unit patterns (M = 1), P = 200: 0.461 at β = 32, 1.67 at β = 8.
 *
 * @throws {EngineInputError} when β ≤ 0, P < 2 or M ≤ 0.
 */
export function softmaxSeparationThreshold (patterns: number, beta: number, maxNorm = 1): number {
  checkSoftmax(patterns, beta, maxNorm)
  checkCount('patterns', patterns, 2)
  return 2 / (beta * patterns) + Math.log(2 * (patterns - 1) * patterns * beta * maxNorm * maxNorm) / beta
}

function checkSoftmax (patterns: number, beta: number, maxNorm: number): void {
  checkCount('patterns', patterns, 1)
  if (!(beta > 0 && Number.isFinite(beta))) throw new EngineInputError('beta', beta, 'must be a finite inverse temperature > 0.')
  if (!(maxNorm >= 0 && Number.isFinite(maxNorm))) throw new EngineInputError('maxNorm', maxNorm, 'must be a finite norm ≥ 0.')
}
