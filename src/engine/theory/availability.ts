/**
 * Why a theory value is missing at a grid point. A result carries, per point, the theory
 * values that hold there (`theory`) and, for every other value of the same model, one of
 * these codes (`theoryUnavailable`). The codes are stable: clients may switch on them.
 */

/** Every reason code, with the sentence the docs and the OpenAPI document give for it. */
export const UNAVAILABLE_REASONS = {
  'model-outside-domain': 'The theory assumes another model: learning-rule variant, self-coupling, neuron coding, pattern statistics or connectivity.',
  'size-outside-domain': 'The network is too small for the theory (for example fewer than two patterns where the value compares patterns).',
  'load-outside-domain': 'The load is outside the range where the theory holds (for example a vanishing-load result at a load that changes it).',
  'temperature-outside-domain': 'The temperature is outside the range where the theory holds (for example a T = 0 result at T > 0).',
  'dynamics-outside-domain': 'The update scheme is not the one the theory describes (for example a parallel-step result under asynchronous updates).',
  'cue-outside-domain': 'The cue is not the kind the theory starts from (for example a flip-cue result for a mixture cue).',
  'no-retrieval-solution': 'The theory holds here, and says there is no retrieval state (the load or temperature is past the retrieval boundary).',
  'not-converged': 'The numerical solution did not reach its accuracy target; the value is left out rather than reported inaccurate.',
  'evaluation-failed': 'Evaluating the value raised an error (a defect: please report the spec). The value is left out so that the sweep still completes.'
} as const

export type UnavailableReason = keyof typeof UNAVAILABLE_REASONS

/** The reason codes, in the order above. */
export const UNAVAILABLE_REASON_CODES = Object.keys(UNAVAILABLE_REASONS) as UnavailableReason[]

/** What a theory evaluation gives: the value, or why there is none. */
export type TheoryOutcome = number | UnavailableReason

/** The theory at one grid point. */
export interface PointTheory {
  /** Values that hold at this point, by name (finite numbers only). */
  values: Record<string, number>
  /** The model's other theory values, by name: why each is missing here. */
  unavailable: Record<string, UnavailableReason>
}

export function isUnavailableReason (value: unknown): value is UnavailableReason {
  return typeof value === 'string' && Object.hasOwn(UNAVAILABLE_REASONS, value)
}
