import erf from '@stdlib/math-base-special-erf'
import { checkLoad } from './check-input.js'
import { EngineInputError } from '../errors.js'
import { rsCriticalLoad } from './rs-critical-load.js'
import { rsRetrievalOverlap } from './rs-retrieval-overlap.js'

/**
 * The replica-symmetric retrieval state of the Hebbian network (J_ii = 0) at temperature
 * T > 0 and load α = P/N (Amit, Gutfreund & Sompolinsky, Ann. Phys. 173, 30 (1987)), for
 * Glauber dynamics with P(s_i = +1) = 1/(1 + e^{−2h_i/T}) (T_c = 1 at vanishing load):
 *
 *   m = ⟨tanh β(m + √(αr) z)⟩,   q = ⟨tanh² β(m + √(αr) z)⟩,   r = q / (1 − β(1 − q))²,
 *
 * ⟨·⟩ the average over a standard normal z, β = 1/T. At T → 0 these become the T = 0
 * equations of rsRetrievalOverlap (β(1 − q) → C); at α → 0 the Curie–Weiss m = tanh(βm).
 *
 * ## Method (derived here)
 * Parametrise by the noise width σ = √(αr). For fixed σ, G(m) = ⟨tanh β(m + σz)⟩ is odd
 * and concave on m > 0 (the Gaussian-smoothed tanh), so m = G(m) has one positive root, which
 * exists iff G'(0) = β⟨sech² βσz⟩ > 1, i.e. σ < σ_max; Newton's method from m = 1 reaches it
 * monotonically from above (the tangent of a concave function lies above it). With
 * 1 − q = ⟨sech²⟩ (no cancellation at low T) the load follows explicitly:
 *
 *   α(σ) = σ² (1 − β⟨sech²⟩)² / q,
 *
 * which is 0 at both ends of (0, σ_max) and has one maximum, the critical load α_c(T) (the
 * fold of the retrieval branch). The retrieval state at α ≤ α_c(T) is the root on the small-σ
 * side of the maximum (the stable branch, as y > y_c at T = 0). Gaussian averages: ⟨tanh⟩ =
 * erf(m/(σ√2)) − ⟨sgn(x)(1 − tanh|x|)⟩ with x = β(m + σz), and both remaining integrands decay
 * like e^{−2|x|}; composite 10-point Gauss–Legendre over |x| ≤ 22 and 10 Gaussian widths,
 * split at 0 and in panels no wider than min(1, βσ), integrates them to ~1e-15.
 * Bisection, golden section and Newton steps depend on nothing but the inputs, so results are
 * bit-reproducible.
 */

export interface FiniteTemperatureRetrieval {
  /** Overlap with the retrieved pattern (time-averaged, at equilibrium within the retrieval state). */
  m: number
  /** Edwards–Anderson order parameter q = ⟨tanh²⟩. */
  q: number
  /** Noise width σ = √(αr) of the crosstalk field. */
  sigma: number
}

export interface FiniteTemperatureCriticalLoad {
  /** α_c(T): the largest load with a retrieval solution at this temperature; 0 at T ≥ 1. */
  alphaC: number
  /** m at the fold; 0 when α_c = 0. */
  overlapAtCritical: number
}

// Gauss–Legendre nodes and weights on [−1, 1], 10 points (Abramowitz & Stegun, Table 25.4).
const GL_NODES = [0.1488743389816312, 0.4333953941292472, 0.6794095682990244, 0.8650633666889845, 0.9739065285171717]
const GL_WEIGHTS = [0.2955242247147529, 0.2692667193099963, 0.2190863625159820, 0.1494513491505806, 0.0666713443086881]
const INV_SQRT_2PI = 1 / Math.sqrt(2 * Math.PI)
/** Beyond |x| = 22 the integrands are below e^{−44} ≈ 8e-20. */
const X_RANGE = 22
/** Beyond 10 widths the Gaussian weight is below 8e-23. */
const GAUSS_RANGE = 10

interface Averages {
  /** ⟨tanh x⟩ */
  tanh: number
  /** ⟨sech² x⟩ = 1 − ⟨tanh² x⟩ */
  sech2: number
}

/** ⟨tanh x⟩ and ⟨sech² x⟩ for x ~ N(c, s²), c = βm, s = βσ. */
function averages (m: number, sigma: number, beta: number): Averages {
  const c = beta * m
  const s = beta * sigma
  if (s === 0) {
    const t = Math.tanh(c)
    return { tanh: t, sech2: (1 - t) * (1 + t) }
  }
  const lo = Math.max(-X_RANGE, c - GAUSS_RANGE * s)
  const hi = Math.min(X_RANGE, c + GAUSS_RANGE * s)
  const sum = { odd: 0, sech2: 0 }
  if (lo < 0 && hi > 0) {
    integratePiece(lo, 0, c, s, sum)
    integratePiece(0, hi, c, s, sum)
  } else if (hi > lo) {
    integratePiece(lo, hi, c, s, sum)
  }
  return { tanh: erf(m / (sigma * Math.SQRT2)) - sum.odd, sech2: sum.sech2 }
}

/** Adds ∫ N(x; c, s²) sgn(x)(1 − tanh|x|) dx and ∫ N(x; c, s²) sech² x dx over [a, b] (not straddling 0). */
function integratePiece (a: number, b: number, c: number, s: number, sum: { odd: number, sech2: number }): void {
  const panels = Math.max(1, Math.ceil((b - a) / Math.min(1, s)))
  const half = (b - a) / panels / 2
  const sign = a + b >= 0 ? 1 : -1
  const scale = half * INV_SQRT_2PI / s
  let odd = 0
  let sech2 = 0
  for (let k = 0; k < panels; k++) {
    const mid = a + (2 * k + 1) * half
    for (let j = 0; j < GL_NODES.length; j++) {
      const offset = GL_NODES[j]! * half
      const weight = GL_WEIGHTS[j]! * scale
      for (let side = -1; side <= 1; side += 2) {
        const x = mid + side * offset
        const d = (x - c) / s
        const w = weight * Math.exp(-0.5 * d * d)
        const e = Math.exp(-2 * sign * x)
        const inv = 1 / (1 + e)
        odd += w * 2 * e * inv
        sech2 += w * 4 * e * inv * inv
      }
    }
  }
  sum.odd += sign * odd
  sum.sech2 += sech2
}

/**
 * The positive root of m = ⟨tanh β(m + σz)⟩, or 0 when there is none (σ ≥ σ_max). Newton
 * from `start` when it lies above the root (a caller's earlier root at a larger σ does),
 * else from 1.
 */
function overlapAtWidth (sigma: number, beta: number, start = 1): { m: number, sech2: number } {
  const atZero = averages(0, sigma, beta)
  if (beta * atZero.sech2 <= 1) return { m: 0, sech2: atZero.sech2 }
  let m = start
  let at = averages(m, sigma, beta)
  if (!(at.tanh - m <= 0) && start !== 1) {
    m = 1
    at = averages(m, sigma, beta)
  }
  for (let step = 0; step < 400; step++) {
    const g = at.tanh - m
    const slope = beta * at.sech2 - 1
    if (!(slope < 0) || g === 0) break
    const next = m - g / slope
    // Monotone from above: a step that does not go down has reached rounding.
    if (!(next < m) || next <= 0) break
    m = next
    at = averages(m, sigma, beta)
    if (m - next === 0 && Math.abs(g / slope) < 1e-16 * m) break
  }
  return { m, sech2: at.sech2 }
}

/** The retrieval solution at noise width σ and the load it belongs to (load 0 outside the branch). */
interface BranchPoint { load: number, m: number, sech2: number }

/** The load at which the retrieval solution has noise width σ (0 outside the branch); Newton starts at `start` (see overlapAtWidth). */
function branchAt (sigma: number, beta: number, start = 1): BranchPoint {
  if (sigma <= 0) {
    const { m, sech2 } = overlapAtWidth(0, beta, start)
    return { load: 0, m, sech2 }
  }
  const { m, sech2 } = overlapAtWidth(sigma, beta, start)
  if (m <= 0) return { load: 0, m: 0, sech2 }
  const q = 1 - sech2
  const gain = 1 - beta * sech2
  if (!(gain > 0 && q > 0)) return { load: 0, m, sech2 }
  return { load: sigma * sigma * gain * gain / q, m, sech2 }
}

/** σ_max: where the m = 0 solution stops being unstable, β⟨sech² βσz⟩ = 1. */
function maxWidth (beta: number): number {
  let hi = 1
  while (beta * averages(0, hi, beta).sech2 > 1 && hi < 1e6) hi *= 2
  let lo = 0
  for (let step = 0; step < 200 && hi - lo > 1e-15 * hi; step++) {
    const mid = (lo + hi) / 2
    if (beta * averages(0, mid, beta).sech2 > 1) lo = mid
    else hi = mid
  }
  return lo
}

interface Fold { alphaC: number, sigmaC: number, beta: number }

const SCAN_POINTS = 16
const foldCache = new Map<number, Fold>()

/**
 * The maximum of α(σ) on (0, σ_max): a scan for the best of 15 interior points, then Brent's
 * minimisation (golden section with parabolic steps) on −α between its neighbours. Roots
 * are found left to right or inside a bracket, so each Newton solve starts from the root at a
 * smaller σ, which lies above its own.
 */
function foldAt (temperature: number): Fold {
  const cached = foldCache.get(temperature)
  if (cached !== undefined) return cached
  const beta = 1 / temperature
  let fold: Fold = { alphaC: 0, sigmaC: 0, beta }
  if (beta > 1) {
    const top = maxWidth(beta)
    const scan: BranchPoint[] = [branchAt(0, beta)]
    for (let k = 1; k < SCAN_POINTS; k++) scan.push(branchAt(top * k / SCAN_POINTS, beta, scan[k - 1]!.m))
    let best = 1
    for (let k = 2; k < SCAN_POINTS; k++) if (scan[k]!.load > scan[best]!.load) best = k
    const start = scan[best - 1]!.m
    const { x, value } = maximise((sigma) => branchAt(sigma, beta, start).load, top * (best - 1) / SCAN_POINTS, top * (best + 1) / SCAN_POINTS, top * best / SCAN_POINTS, scan[best]!.load)
    fold = { alphaC: value, sigmaC: x, beta }
  }
  if (foldCache.size > 256) foldCache.clear()
  foldCache.set(temperature, fold)
  return fold
}

/**
 * Brent's minimisation (Brent 1973, "Algorithms for Minimization without Derivatives",
 * ch. 5) of −f on [a, b] from an interior point x with f(x) known, to a relative tolerance
 * of 1e-9 in x (f is quadratic at its maximum, so f is then exact to rounding).
 */
function maximise (f: (x: number) => number, a: number, b: number, x: number, fx: number): { x: number, value: number } {
  const golden = (3 - Math.sqrt(5)) / 2
  let w = x
  let v = x
  let fw = fx
  let fv = fx
  let d = 0
  let e = 0
  for (let step = 0; step < 200; step++) {
    const mid = (a + b) / 2
    const tol = 1e-9 * Math.abs(x) + 1e-300
    if (Math.abs(x - mid) <= 2 * tol - (b - a) / 2) break
    let parabolic = false
    if (Math.abs(e) > tol) {
      // Parabola through (x, w, v) on −f.
      const r = (x - w) * (fv - fx)
      let q = (x - v) * (fw - fx)
      let p = (x - v) * q - (x - w) * r
      q = 2 * (q - r)
      if (q > 0) p = -p
      else q = -q
      if (Math.abs(p) < Math.abs(0.5 * q * e) && p > q * (a - x) && p < q * (b - x)) {
        e = d
        d = p / q
        const u = x + d
        if (u - a < 2 * tol || b - u < 2 * tol) d = mid >= x ? tol : -tol
        parabolic = true
      }
    }
    if (!parabolic) {
      e = (x >= mid ? a : b) - x
      d = golden * e
    }
    const u = Math.abs(d) >= tol ? x + d : x + (d > 0 ? tol : -tol)
    const fu = f(u)
    if (fu >= fx) {
      if (u >= x) a = x
      else b = x
      v = w; fv = fw; w = x; fw = fx; x = u; fx = fu
    } else {
      if (u < x) a = u
      else b = u
      if (fu >= fw || w === x) { v = w; fv = fw; w = u; fw = fu } else if (fu >= fv || v === x || v === w) { v = u; fv = fu }
    }
  }
  return { x, value: fx }
}

function checkTemperature (temperature: number): void {
  if (!(temperature >= 0 && Number.isFinite(temperature))) throw new EngineInputError('temperature', temperature, 'must be a finite temperature ≥ 0.')
}

// MAIN //

/**
 * α_c(T) of the replica-symmetric theory: the largest load with a retrieval state at
 * temperature T (the retrieval line of the T–α phase diagram, AGS 1987). T = 0 gives
 * rsCriticalLoad's 0.137906; α_c falls to 0 as T → 1 (≈ ((1 − T)/1.95)² there).
 *
 * @throws {EngineInputError} when T is negative or not finite.
 *
 * @example
 * rsCriticalLoadAt(0.5)
 * // returns ~0.0686 (T_M(0.05) = 0.542, T_M(0.08) = 0.405 in CHECK_VALUES §3)
 */
export function rsCriticalLoadAt (temperature: number): FiniteTemperatureCriticalLoad {
  checkTemperature(temperature)
  if (temperature === 0) {
    const { alphaC, overlapAtCritical } = rsCriticalLoad()
    return { alphaC, overlapAtCritical }
  }
  const fold = foldAt(temperature)
  if (fold.alphaC <= 0) return { alphaC: 0, overlapAtCritical: 0 }
  return { alphaC: fold.alphaC, overlapAtCritical: branchAt(fold.sigmaC, fold.beta).m }
}

/**
 * The retrieval solution at load α and temperature T, or null when the RS equations have
 * none there (α > α_c(T), equivalently T > T_M(α)). At α = 0 the Curie–Weiss solution.
 *
 * @throws {EngineInputError} when α or T is negative or not finite.
 *
 * @example
 * rsRetrievalAt(0.05, 0.4)?.m
 * // returns ~0.9662 (CHECK_VALUES §3)
 */
export function rsRetrievalAt (alpha: number, temperature: number): FiniteTemperatureRetrieval | null {
  checkLoad('alpha', alpha)
  checkTemperature(temperature)
  if (temperature === 0) {
    const m = rsRetrievalOverlap(alpha)
    return alpha === 0 || m > 0 ? { m, q: 1, sigma: alpha === 0 ? 0 : NaN } : null
  }
  const fold = foldAt(temperature)
  if (fold.alphaC <= 0 || alpha > fold.alphaC) return null
  const beta = fold.beta
  let sigma: number
  if (alpha === 0) {
    sigma = 0
  } else if (alpha === fold.alphaC) {
    sigma = fold.sigmaC
  } else {
    // α(σ) rises from 0 at σ = 0 to α_c at σ_c on the retrieval side: bisection to 1e-13,
    // each Newton solve starting from the root at the bracket's low end (which lies above).
    let lo = 0
    let hi = fold.sigmaC
    let mLo = branchAt(0, beta).m
    while (hi - lo > 1e-13 * hi) {
      const mid = (lo + hi) / 2
      const at = branchAt(mid, beta, mLo)
      if (at.load < alpha) {
        lo = mid
        mLo = at.m
      } else {
        hi = mid
      }
    }
    sigma = (lo + hi) / 2
  }
  const { m, sech2 } = overlapAtWidth(sigma, beta)
  return { m, q: 1 - sech2, sigma }
}

/**
 * T_M(α): the highest temperature at which the RS retrieval state exists at load α (the
 * same line as α_c(T), read the other way): 1 at α = 0, 0 at α ≥ α_c(0) = 0.137906 (null
 * above, where no temperature allows retrieval). Near α = 0, T_M ≈ 1 − 1.95√α.
 *
 * ## Method
 * α_c(T) decreases with T: regula falsi (Illinois) on α_c(T) − α over T ∈ [0, 1], to 1e-10.
 *
 * @throws {EngineInputError} when α is negative or not finite.
 *
 * @example
 * rsRetrievalTemperature(0.1)
 * // returns ~0.315 (CHECK_VALUES §3)
 */
export function rsRetrievalTemperature (alpha: number): number | null {
  checkLoad('alpha', alpha)
  const cached = retrievalTemperatureCache.get(alpha)
  if (cached !== undefined) return cached
  const value = solveRetrievalTemperature(alpha)
  if (retrievalTemperatureCache.size > 256) retrievalTemperatureCache.clear()
  retrievalTemperatureCache.set(alpha, value)
  return value
}

/** T_M by load: grids repeat loads across temperatures (the value depends on α alone). */
const retrievalTemperatureCache = new Map<number, number | null>()

function solveRetrievalTemperature (alpha: number): number | null {
  if (alpha === 0) return 1
  const alphaC0 = rsCriticalLoad().alphaC
  if (alpha > alphaC0) return null
  if (alpha === alphaC0) return 0
  let lo = 0
  let hi = 1
  let fLo = alphaC0 - alpha
  let fHi = -alpha
  let side = 0
  for (let step = 0; step < 200 && hi - lo > 1e-10; step++) {
    const t = (lo * fHi - hi * fLo) / (fHi - fLo)
    const mid = t > lo && t < hi ? t : (lo + hi) / 2
    const f = rsCriticalLoadAt(mid).alphaC - alpha
    if (f === 0) return mid
    if (f > 0) {
      lo = mid
      fLo = f
      if (side === 1) fHi /= 2
      side = 1
    } else {
      hi = mid
      fHi = f
      if (side === -1) fLo /= 2
      side = -1
    }
  }
  return (lo + hi) / 2
}
