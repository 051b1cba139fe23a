import { maximiseOnGrid } from './profile-scan.js'

/** A critical value measured at one network size, with its standard error. */
export interface SizedEstimate {
  neurons: number
  value: number
  se: number
}

/**
 * `power`: x_c(N) = x_∞ + a·N^(−b), b fixed (a number) or fitted (null).
 * `linear-inverse`: x_c(N) = x_∞ + a/N (the power form with b = 1).
 */
export type ScalingForm = { form: 'power', exponent: number | null } | { form: 'linear-inverse' }

export interface FittedValue {
  value: number
  /** Standard error from the fit's covariance (null when the value was fixed, not fitted). */
  se: number | null
}

export interface FiniteSizeFit {
  form: 'power' | 'linear-inverse'
  /** x_∞, the extrapolation to N → ∞. */
  limit: FittedValue
  /** a, the amplitude of the finite-size correction. */
  amplitude: FittedValue
  /** b; se null when fixed. */
  exponent: FittedValue
  /** Correlation of x_∞ and a. */
  correlation: number
  /** Weighted residual sum of squares Σ((x_i − fit)/se_i)². */
  chiSquare: number
  /** Sizes minus fitted parameters. */
  degreesOfFreedom: number
  /** √max(1, χ²/dof) when dof > 0, else 1: the factor applied to every standard error. */
  errorScale: number
}

/** Exponents a fit may choose, on a log grid (corrections slower than N^−0.05 or faster than N^−4 are not finite-size scaling a few sizes can resolve). */
const EXPONENT_RANGE = { low: 0.05, high: 4 }

// MAIN //

/**
 * Weighted least-squares fit of critical values against network size.
 *
 * ## Method
 * Weights 1/se_i². For a fixed exponent the model is linear in (x_∞, a): solved exactly,
 * covariance (XᵀWX)⁻¹. A fitted exponent is profiled: for each b the linear fit gives χ²(b);
 * b̂ minimises it (log-spaced grid on [0.05, 4] refined by golden section), and the covariance
 * of (x_∞, a, b) is the inverse of JᵀWJ with J the model's Jacobian at the optimum
 * (Gauss–Newton, exact for the linear parameters). When the residual scatter exceeds what the
 * standard errors allow (χ²/dof > 1), every standard error is multiplied by √(χ²/dof), the
 * usual scale-factor practice for combining measurements; it is never shrunk below the
 * stated errors.
 *
 * @throws {RangeError} with fewer than 3 sizes (4 when the exponent is fitted), repeated
 *   sizes, or a non-positive standard error.
 *
 * @example
 * fitFiniteSize([{ neurons: 250, value: 0.18, se: 0.004 }, { neurons: 500, value: 0.167, se: 0.003 }, { neurons: 1000, value: 0.158, se: 0.002 }], { form: 'power', exponent: 0.5 })
 * // returns { limit: { value: ~0.138, se: … }, amplitude: …, exponent: { value: 0.5, se: null }, … }
 */
export function fitFiniteSize (points: readonly SizedEstimate[], form: ScalingForm): FiniteSizeFit {
  const fixed = form.form === 'linear-inverse' ? 1 : form.exponent
  const needed = fixed === null ? 4 : 3
  if (points.length < needed) throw new RangeError(`invalid argument. A ${fixed === null ? 'fitted-exponent' : 'fixed-exponent'} fit needs at least ${needed} sizes. Value: ${points.length}.`)
  if (new Set(points.map((p) => p.neurons)).size !== points.length) throw new RangeError('invalid argument. Each size may appear once.')
  for (const p of points) {
    if (!(p.se > 0) || !Number.isFinite(p.value) || !(p.neurons > 0)) throw new RangeError(`invalid argument. Size ${p.neurons}: value ${p.value} ± ${p.se} is not a usable estimate.`)
  }
  const exponent = fixed ?? bestExponent(points)
  const linear = linearFit(points, exponent)
  const dof = points.length - (fixed === null ? 3 : 2)
  const errorScale = dof > 0 ? Math.sqrt(Math.max(1, linear.chiSquare / dof)) : 1
  const cov = fixed === null ? gaussNewtonCovariance(points, linear.limit, linear.amplitude, exponent) : linear.covariance
  const se = (i: number) => Math.sqrt(cov[i]![i]!) * errorScale
  return {
    form: form.form,
    limit: { value: linear.limit, se: se(0) },
    amplitude: { value: linear.amplitude, se: se(1) },
    exponent: { value: exponent, se: fixed === null ? se(2) : null },
    correlation: cov[0]![1]! / Math.sqrt(cov[0]![0]! * cov[1]![1]!),
    chiSquare: linear.chiSquare,
    degreesOfFreedom: dof,
    errorScale
  }
}

function linearFit (points: readonly SizedEstimate[], exponent: number) {
  let s00 = 0
  let s01 = 0
  let s11 = 0
  let t0 = 0
  let t1 = 0
  for (const p of points) {
    const w = 1 / (p.se * p.se)
    const g = Math.pow(p.neurons, -exponent)
    s00 += w
    s01 += w * g
    s11 += w * g * g
    t0 += w * p.value
    t1 += w * g * p.value
  }
  const det = s00 * s11 - s01 * s01
  const limit = (s11 * t0 - s01 * t1) / det
  const amplitude = (s00 * t1 - s01 * t0) / det
  let chiSquare = 0
  for (const p of points) chiSquare += ((p.value - limit - amplitude * Math.pow(p.neurons, -exponent)) / p.se) ** 2
  return { limit, amplitude, chiSquare, covariance: [[s11 / det, -s01 / det], [-s01 / det, s00 / det]] }
}

function bestExponent (points: readonly SizedEstimate[]): number {
  const logLow = Math.log(EXPONENT_RANGE.low)
  const logHigh = Math.log(EXPONENT_RANGE.high)
  const scan = maximiseOnGrid((t) => -linearFit(points, Math.exp(logLow + (t + 1) / 2 * (logHigh - logLow))).chiSquare, -1, 1)
  return Math.exp(logLow + (scan.best.tau + 1) / 2 * (logHigh - logLow))
}

/** (JᵀWJ)⁻¹ for x_∞ + a·N^(−b), J = [1, N^(−b), −a·N^(−b)·ln N]. */
function gaussNewtonCovariance (points: readonly SizedEstimate[], _limit: number, amplitude: number, exponent: number): number[][] {
  const m = [[0, 0, 0], [0, 0, 0], [0, 0, 0]]
  for (const p of points) {
    const w = 1 / (p.se * p.se)
    const g = Math.pow(p.neurons, -exponent)
    const j = [1, g, -amplitude * g * Math.log(p.neurons)]
    for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) m[r]![c]! += w * j[r]! * j[c]!
  }
  return invert3(m)
}

function invert3 (m: number[][]): number[][] {
  const [a, b, c] = m[0]!
  const [d, e, f] = m[1]!
  const [g, h, k] = m[2]!
  const A = e! * k! - f! * h!
  const B = -(d! * k! - f! * g!)
  const C = d! * h! - e! * g!
  const det = a! * A + b! * B + c! * C
  return [
    [A / det, -(b! * k! - c! * h!) / det, (b! * f! - c! * e!) / det],
    [B / det, (a! * k! - c! * g!) / det, -(a! * f! - c! * d!) / det],
    [C / det, -(a! * h! - b! * g!) / det, (a! * e! - b! * d!) / det]
  ]
}
