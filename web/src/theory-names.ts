/**
 * Readable names for the theory values a result carries (docs/theory.md lists them with their
 * sources), and which kind of theory each is: a mean-field (N → ∞) prediction, an exact value
 * at the point's finite N, or a plain definition. Pure: no DOM.
 */

export type TheoryKind = 'mean-field' | 'exact finite-N' | 'definition'

const NAMES: Record<string, string> = {
  loadAlpha: 'load P/N',
  criticalLoad: 'critical load α_c',
  retrievalOverlapRS: 'retrieval overlap m (replica-symmetric)',
  retrievalTemperature: 'retrieval temperature T_M',
  spinGlassTemperature: 'spin-glass temperature T_g',
  curieWeissOverlap: 'Curie–Weiss overlap',
  firstStepOverlap: 'overlap after one step',
  mixtureOverlap: 'symmetric mixture overlap',
  crosstalkErrorGaussian: 'bit error, Gaussian crosstalk',
  crosstalkErrorExact: 'bit error',
  crosstalkTieExact: 'zero-field probability',
  denseCapacity: 'dense-memory capacity',
  exponentialCapacityExponent: 'capacity exponent',
  softmaxSeparationThreshold: 'softmax separation threshold',
  dilutedLoad: 'load per input P/K',
  exponentialLoad: 'load log P / N'
}

const DEFINITIONS = new Set(['loadAlpha', 'dilutedLoad', 'exponentialLoad'])

/** Which theory a value comes from. */
export function theoryKind (name: string): TheoryKind {
  if (DEFINITIONS.has(name)) return 'definition'
  return /Exact/.test(name) ? 'exact finite-N' : 'mean-field'
}

/** "criticalLoad" → "critical load α_c"; unknown names are split at their capitals. */
export function theoryName (name: string): string {
  const ties = /TiesRandom$/.test(name) ? ', ties random' : /TiesKeep$/.test(name) ? ', ties kept' : ''
  const base = name.replace(/Ties(Random|Keep)$/, '')
  let prefix = ''
  let core = base
  for (const family of ['clipped', 'diluted', 'dense']) {
    if (core.startsWith(family) && core.length > family.length && NAMES[core] === undefined) {
      prefix = `${family} `
      core = core.slice(family.length, family.length + 1).toLowerCase() + core.slice(family.length + 1)
    }
  }
  const known = NAMES[core] ?? NAMES[core.replace(/Exact$/, '')]
  const words = known ?? core.replace(/Exact$/, '').replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase()
  return `${prefix}${words}${ties}`
}

/** The tooltip of a theory column: the kind of theory, and where it is described. */
export function theoryTooltip (name: string): string {
  const kind = theoryKind(name)
  const what = kind === 'mean-field'
    ? 'Mean-field theory (the N → ∞ limit), not corrected for this N'
    : kind === 'exact finite-N'
      ? 'Exact at this point\'s finite N (no large-N approximation)'
      : 'A definition computed from the point\'s parameters, not a prediction'
  return `${what}. ${name} in docs/theory.md names its source and domain.`
}
