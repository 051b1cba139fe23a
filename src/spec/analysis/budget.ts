/** How many trials a threshold search may run: part of the contract, since limits and estimates count it. */
import type { NormalisedSpec } from '../types.js'
import type { NormalisedAnalysis } from './types.js'

/** Trials a search may run at most: its budget, and its chunk's `count`. */
export function searchTrialBudget (spec: NormalisedSpec, analysis: NormalisedAnalysis): number {
  return analysis.maxSteps * spec.trials
}
