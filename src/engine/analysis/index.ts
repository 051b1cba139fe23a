/** Analyses built on repeated trials: where a measure crosses a level, and how such crossings scale with N. */
export { runThresholdSearch, NOISE_BRACKET_FACTOR } from './threshold-search.js'
export type { ThresholdSearchSettings, StepObservation, SearchStep, StopReason, ThresholdSearchResult } from './threshold-search.js'
export { logisticCrossing, LOCAL_STEPS, type BinomialPoint } from './logistic-crossing.js'
export { localLinearCrossing, LOCAL_POINTS, type MeanPoint } from './linear-crossing.js'
export { fitFiniteSize } from './finite-size-fit.js'
export type { SizedEstimate, ScalingForm, FittedValue, FiniteSizeFit } from './finite-size-fit.js'
export type { CrossingEstimate, Direction, SearchMeasure } from './types.js'
