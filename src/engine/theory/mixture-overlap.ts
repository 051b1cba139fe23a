import { EngineInputError } from '../errors.js'
import { bisect } from './bisect.js'

/**
 * Overlap of the symmetric n-pattern mixture state sign(ξ¹ + … + ξⁿ) with each of its
 * components, at T = 0 and vanishing load (Amit, Gutfreund & Sompolinsky, PRA 32, 1007
 * (1985)):
 *
 *   m_n = E|ξ¹ + … + ξⁿ| / n = C(n − 1, (n − 1)/2) / 2^{n−1}   (n odd)
 *
 * giving 1, 1/2, 3/8, 5/16, 35/128 for n = 1, 3, 5, 7, 9, and ≈ √(2/(πn)) for large n.
 *
 * ## Method
 * The central binomial ratio as the product Π_{k=1}^{(n−1)/2} (2k − 1)/(2k), which
 * neither overflows nor needs the gamma function.
 *
 * @throws {EngineInputError} when n is not a positive odd integer: even mixtures have ties
 *   in the sign and are unstable at every temperature.
 *
 * @example
 * mixtureOverlap(5)
 * // returns 0.375
 */
export function mixtureOverlap (n: number): number {
  if (!(Number.isInteger(n) && n >= 1 && n % 2 === 1)) {
    throw new EngineInputError('components', n, 'must be a positive odd integer.')
  }
  let m = 1
  for (let k = 1; 2 * k < n; k++) m *= (2 * k - 1) / (2 * k)
  return m
}

/**
 * Overlap of the symmetric n-pattern mixture state with each component at temperature T
 * and vanishing load: the positive root of the mean-field equation of Amit, Gutfreund &
 * Sompolinsky, PRA 32, 1007 (1985), with all n overlaps equal to m,
 *
 *   m = ⟨ξ¹ tanh(β m (ξ¹ + … + ξⁿ))⟩ = ⟨S tanh(β m S)⟩ / n,   S = ξ¹ + … + ξⁿ,
 *
 * averaged over the 2ⁿ sign patterns (S = n − 2j with binomial weight C(n, j)/2ⁿ). T = 0
 * gives mixtureOverlap(n). The root exists for every T < 1 (it bifurcates from the
 * paramagnet at T = 1); the state is stable only below T_n (T_3 ≈ 0.46, AGS 1985).
 *
 * ## Method
 * F(m)/m = ⟨S tanh(βmS)/(βmS) · βS²⟩/n falls with m, so F(m) = m has one positive root,
 * between 0 and F's ceiling mixtureOverlap(n); bisection there.
 *
 * ## Special cases
 * - T ≥ 1 gives 0 (only the paramagnet).
 *
 * @throws {EngineInputError} when n is not a positive odd integer or T is negative or NaN.
 *
 * @example
 * mixtureOverlapAt(3, 0.4)
 * // returns ~0.4522
 */
export function mixtureOverlapAt (n: number, temperature: number): number {
  const ceiling = mixtureOverlap(n)
  if (!(temperature >= 0)) throw new EngineInputError('temperature', temperature, 'must be ≥ 0.')
  if (temperature === 0) return ceiling
  if (temperature >= 1) return 0
  const weights: number[] = []
  let binomial = 1
  for (let j = 0; j <= n; j++) {
    weights.push(binomial / 2 ** n)
    binomial = binomial * (n - j) / (j + 1)
  }
  const excess = (m: number): number => {
    let sum = 0
    for (let j = 0; j <= n; j++) {
      const s = n - 2 * j
      sum += weights[j]! * s * Math.tanh(m * s / temperature)
    }
    return sum / n - m
  }
  const lo = 1e-300
  if (!(excess(lo) > 0)) return 0
  return bisect(excess, lo, ceiling)
}
