/** Shared types of the threshold search and its fits. */

/** How the measure moves as the searched parameter grows. */
export type Direction = 'decreasing' | 'increasing'

/** Which per-trial outcome the search follows: the success rate, or the mean final overlap. */
export type SearchMeasure = 'success' | 'overlap'

/** Where a measure crosses its level, with a confidence interval (null ends: not bounded by the data). */
export interface CrossingEstimate {
  /** `logistic-profile`: binomial likelihood, profile interval. `local-linear-fieller`: weighted line near the crossing, Fieller interval. */
  method: 'logistic-profile' | 'local-linear-fieller'
  estimate: number
  low: number | null
  high: number | null
  /** Slope of the fitted curve at the crossing: logit units (success) or overlap units (overlap) per unit of the parameter. */
  slope: number
  /** True when the success counts were perfectly separated around the level (a step within the resolution of the data). */
  separated: boolean
  /**
   * Scatter of the points about the fit relative to their stated variance (Pearson χ² per
   * degree of freedom) in the final fit's window; about 1 when the model fits, null with too
   * few points. Both intervals widen by it when it exceeds 1 (see each method).
   */
  dispersion: number | null
}
