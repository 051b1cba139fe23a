import type { RandomDilution } from '../params.js'
import type { RandomSource } from '../random/source.js'

/**
 * Random dilution: each coupling is kept with probability `keep` (symmetric: J_ij and J_ji
 * together; asymmetric: independently), then survivors are divided by `keep` so the
 * signal stays of order one. Diagonal entries are left as they are.
 */
export function diluteCouplings (couplings: Float64Array, n: number, dilution: RandomDilution, rng: RandomSource): void {
  const scale = 1 / dilution.keep
  for (let i = 0; i < n; i++) {
    for (let j = dilution.symmetric ? i + 1 : 0; j < n; j++) {
      if (i === j) continue
      const keep = rng.uniform() < dilution.keep
      const value = keep ? couplings[i * n + j]! * scale : 0
      couplings[i * n + j] = value
      if (dilution.symmetric) couplings[j * n + i] = keep ? couplings[j * n + i]! * scale : 0
    }
  }
}
