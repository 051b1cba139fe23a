import normalQuantile from '@stdlib/stats-base-dists-normal-quantile'
import type { CrossingEstimate, Direction } from './types.js'

/** Mean of a per-trial measure observed at one value x of the searched parameter. */
export interface MeanPoint {
  x: number
  mean: number
  /** Standard error of the mean. */
  se: number
  trials: number
}

/** Points nearest the crossing that enter the local line: enough to see curvature, few enough to stay local. */
/** Fewest and most points nearest the crossing that enter the local line. */
export const LOCAL_POINTS = { least: 3, most: 6 } as const

// MAIN //

/**
 * Where a monotone mean (e.g. the mean final overlap) crosses `level`, from a weighted
 * straight line through the points nearest the crossing, with Fieller's interval.
 *
 * ## Method
 * 1. A first guess x₀ interpolates linearly between the two neighbouring points (in x) on
 *    either side of the level; without such a pair, the point whose mean is nearest.
 * 2. The LOCAL_POINTS points nearest x₀ (ties: smaller x first) are fitted by weighted
 *    least squares, mean = a + b(x − x̄), weights 1/se², x̄ the weighted mean of x, so a and b
 *    are uncorrelated with variances 1/Σw and 1/Σw(x − x̄)².
 * 3. When more than two points enter, the variances are multiplied by the Pearson χ² per
 *    degree of freedom if it exceeds 1: curvature inside the window or extra scatter then
 *    widens the interval instead of hiding in it.
 * 4. θ̂ = x̄ + (level − a)/b. Fieller's interval (Fieller, J. R. Stat. Soc. Suppl. 7, 1 (1940))
 *    is the set of θ whose predicted mean is compatible with the level,
 *    (a + b(θ − x̄) − level)² ≤ z²(Var a + (θ − x̄)² Var b), a quadratic inequality in θ.
 *    Unlike the delta method it is exact for Gaussian a and b, and it is unbounded (null
 *    ends here) when the slope is not significantly different from zero.
 *
 * A mean over trials is close to Gaussian for the trial counts a search uses (≥ ~30), so the
 * known-variance (z) form is used. A point whose trials all ended at the same value has
 * se = 0; it is given the smallest positive se among the points (1/trials when there is
 * none), so it cannot take all the weight.
 *
 * @returns null with fewer than two distinct x values, or when the fitted slope has the
 *   wrong sign for `direction` (or is zero).
 *
 * @example
 * localLinearCrossing([{ x: 0.14, mean: 0.94, se: 0.01, trials: 200 }, { x: 0.15, mean: 0.86, se: 0.015, trials: 200 }], 0.9, 'decreasing', 0.95)
 * // returns { method: 'local-linear-fieller', estimate: ~0.145, … }
 */
export function localLinearCrossing (points: readonly MeanPoint[], level: number, direction: Direction, confidence: number): CrossingEstimate | null {
  const guess = firstGuess(points, level)
  const nearest = [...points].sort((p, q) => Math.abs(p.x - guess) - Math.abs(q.x - guess) || p.x - q.x)
  const z2 = normalQuantile(1 - (1 - confidence) / 2, 0, 1) ** 2
  const positive = points.map((p) => p.se).filter((se) => se > 0)
  const smallest = positive.length > 0 ? Math.min(...positive) : null
  const weighted = nearest.map((p) => ({ ...p, se: p.se > 0 ? p.se : (smallest ?? 1 / p.trials) }))
  let fit: CrossingEstimate | null = null
  for (let size = Math.min(LOCAL_POINTS.least, nearest.length); size <= Math.min(LOCAL_POINTS.most, nearest.length); size++) {
    fit = fitWindow(weighted.slice(0, size), level, direction, z2)
    if (fit !== null && fit.low !== null) return fit
  }
  return fit
}

function fitWindow (chosen: readonly MeanPoint[], level: number, direction: Direction, z2: number): CrossingEstimate | null {
  if (new Set(chosen.map((p) => p.x)).size < 2) return null
  const weights = chosen.map((p) => 1 / (p.se * p.se))
  let sw = 0
  let swx = 0
  let swy = 0
  chosen.forEach((p, i) => { sw += weights[i]!; swx += weights[i]! * p.x; swy += weights[i]! * p.mean })
  const xBar = swx / sw
  const a = swy / sw
  let sxx = 0
  let sxy = 0
  chosen.forEach((p, i) => { sxx += weights[i]! * (p.x - xBar) ** 2; sxy += weights[i]! * (p.x - xBar) * p.mean })
  const b = sxy / sxx
  if (!(direction === 'decreasing' ? b < 0 : b > 0)) return null

  let chi2 = 0
  chosen.forEach((p, i) => { chi2 += weights[i]! * (p.mean - a - b * (p.x - xBar)) ** 2 })
  const dispersion = chosen.length > 2 ? chi2 / (chosen.length - 2) : null
  const inflate = dispersion !== null && dispersion > 1 ? dispersion : 1
  const varA = inflate / sw
  const varB = inflate / sxx

  const gap = a - level
  const quadA = b * b - z2 * varB
  const quadB = 2 * b * gap
  const quadC = gap * gap - z2 * varA
  let low: number | null = null
  let high: number | null = null
  if (quadA > 0) {
    const root = Math.sqrt(Math.max(0, quadB * quadB - 4 * quadA * quadC))
    low = xBar + (-quadB - root) / (2 * quadA)
    high = xBar + (-quadB + root) / (2 * quadA)
  }
  return { method: 'local-linear-fieller', estimate: xBar - gap / b, low, high, slope: b, separated: false, dispersion }
}

function firstGuess (points: readonly MeanPoint[], level: number): number {
  const sorted = [...points].sort((p, q) => p.x - q.x)
  for (let i = 0; i + 1 < sorted.length; i++) {
    const p = sorted[i]!
    const q = sorted[i + 1]!
    if ((p.mean - level) * (q.mean - level) <= 0 && p.mean !== q.mean) {
      return p.x + (q.x - p.x) * (level - p.mean) / (q.mean - p.mean)
    }
  }
  let nearest = sorted[0]!
  for (const p of sorted) if (Math.abs(p.mean - level) < Math.abs(nearest.mean - level)) nearest = p
  return nearest.x
}
