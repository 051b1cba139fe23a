/** Summary statistics of trial outcomes. */
export { meanWithError } from './mean-with-error.js'
export { wilsonInterval, type RateInterval } from './wilson-interval.js'
