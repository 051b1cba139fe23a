import type { PointParams } from '../params.js'
import type { PointTheory } from './availability.js'
import { evaluateModel, type TheoryModel } from './domain.js'
import { HEBBIAN_THEORY, PSEUDO_INVERSE_THEORY } from './hebbian-theory.js'
import { CLIPPED_THEORY, DENSE_EXPONENTIAL_THEORY, DENSE_POLYNOMIAL_THEORY, DILUTED_THEORY, SOFTMAX_THEORY } from './model-theory.js'

/** Every model with a theory, each with its values and their domains. */
export const THEORY_MODELS: readonly TheoryModel[] = [
  HEBBIAN_THEORY, PSEUDO_INVERSE_THEORY, CLIPPED_THEORY, DILUTED_THEORY, DENSE_POLYNOMIAL_THEORY, DENSE_EXPONENTIAL_THEORY, SOFTMAX_THEORY
]

/**
 * The theory at one grid point, for reporting beside the simulated results: the values that
 * hold there (`values`) and, for each other value of the point's model, why it does not
 * (`unavailable`, a reason code of availability.ts). Never throws: a value that cannot be
 * computed is reported as unavailable. Models without a theory (Storkey, covariance) give
 * two empty maps. Every value, its domain and its source: docs/theory.md.
 */
export function theoryForPoint (p: PointParams): PointTheory {
  const model = THEORY_MODELS.find((m) => m.concerns(p))
  return model === undefined ? { values: {}, unavailable: {} } : evaluateModel(model, p)
}
