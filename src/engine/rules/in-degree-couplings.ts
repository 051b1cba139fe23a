import type { RandomSource } from '../random/source.js'
import { clip } from './clipped.js'

/** Inputs of every neuron (row i = inputs[i·K … i·K + K − 1], ascending) and their raw couplings. */
export interface InDegreeCouplings {
  inDegree: number
  inputs: Int32Array
  weights: Int32Array
}

/**
 * Extremely diluted asymmetric couplings (Derrida, Gardner & Zippelius, Europhys. Lett. 4,
 * 167 (1987); citation recalled from memory): every neuron i receives K inputs from distinct
 * neurons j ≠ i, drawn uniformly and independently for each i, with raw couplings
 * T_ij = Σ_μ ξ_i^μ ξ_j^μ on those connections (clipped: sign(T_ij), sign(0) = 0). Physical
 * J_ij = T_ij / K (clipped: √P/K · sign), so the load is α = P/K.
 *
 * ## Method
 * Row i draws its inputs by a partial Fisher–Yates pass over the N − 1 other neurons:
 * for k < K, swap slot k with slot k + below(N − 1 − k), where slot v stands for neuron
 * v (v < i) or v + 1 (v ≥ i). The swaps are undone afterwards, so each row costs O(K)
 * and every K-subset is equally likely. Rows are then sorted (reading order only).
 */
export function inDegreeCouplings (patterns: Int8Array, n: number, p: number, inDegree: number, clipped: boolean, rng: RandomSource): InDegreeCouplings {
  const k = inDegree
  const inputs = new Int32Array(n * k)
  const weights = new Int32Array(n * k)
  const slots = new Int32Array(n - 1)
  for (let v = 0; v < n - 1; v++) slots[v] = v
  const drawn = new Int32Array(k)
  const byNeuron = new Int8Array(n * p)
  for (let mu = 0; mu < p; mu++) {
    for (let i = 0; i < n; i++) byNeuron[i * p + mu] = patterns[mu * n + i]!
  }
  for (let i = 0; i < n; i++) {
    for (let s = 0; s < k; s++) {
      const pick = s + rng.below(n - 1 - s)
      drawn[s] = pick
      const v = slots[pick]!
      slots[pick] = slots[s]!
      slots[s] = v
    }
    const row = inputs.subarray(i * k, i * k + k)
    for (let s = 0; s < k; s++) row[s] = slots[s]! < i ? slots[s]! : slots[s]! + 1
    for (let s = k - 1; s >= 0; s--) {
      const pick = drawn[s]!
      const v = slots[pick]!
      slots[pick] = slots[s]!
      slots[s] = v
    }
    row.sort()
    for (let s = 0; s < k; s++) {
      const a = i * p
      const b = row[s]! * p
      let sum = 0
      for (let mu = 0; mu < p; mu++) sum += byNeuron[a + mu]! * byNeuron[b + mu]!
      weights[i * k + s] = clipped ? clip(sum) : sum
    }
  }
  return { inDegree: k, inputs, weights }
}
