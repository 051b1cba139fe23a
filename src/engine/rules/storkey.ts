/**
 * Storkey (1997) incremental learning rule, physical couplings (scale 1):
 *   w_ij ← w_ij + (1/N)[ξ_i ξ_j − ξ_i h_ji − h_ij ξ_j],   h_ij = Σ_{k≠i,j} w_ik ξ_k,
 * applied pattern by pattern to every pair including i = j; the diagonal is removed after
 * learning unless `selfCoupling`. Capacity N/√(2 ln N) (Storkey, ICANN'97, LNCS 1327).
 *
 * ## Method
 * With f_i = Σ_k w_ik ξ_k computed once per pattern, h_ij = f_i − w_ii ξ_i − w_ij ξ_j
 * (i ≠ j) and h_ii = f_i − w_ii ξ_i, so each pattern costs O(N²).
 */
export function storkeyCouplings (patterns: Int8Array, n: number, p: number, selfCoupling: boolean): Float64Array {
  const w = new Float64Array(n * n)
  const f = new Float64Array(n)
  const hNext = new Float64Array(n * n)
  for (let mu = 0; mu < p; mu++) {
    const base = mu * n
    for (let i = 0; i < n; i++) {
      let sum = 0
      const row = i * n
      for (let k = 0; k < n; k++) sum += w[row + k]! * patterns[base + k]!
      f[i] = sum
    }
    // Every increment uses the weights before this pattern, so compute them all first.
    for (let i = 0; i < n; i++) {
      const xi = patterns[base + i]!
      const row = i * n
      const hiiOffset = f[i]! - w[row + i]! * xi
      for (let j = 0; j < n; j++) {
        const xj = patterns[base + j]!
        let hij: number
        let hji: number
        if (i === j) {
          hij = hiiOffset
          hji = hiiOffset
        } else {
          hij = hiiOffset - w[row + j]! * xj
          hji = f[j]! - w[j * n + j]! * xj - w[j * n + i]! * xi
        }
        hNext[row + j] = (xi * xj - xi * hji - hij * xj) / n
      }
    }
    for (let k = 0; k < n * n; k++) w[k] = w[k]! + hNext[k]!
  }
  if (!selfCoupling) for (let i = 0; i < n; i++) w[i * n + i] = 0
  return w
}
