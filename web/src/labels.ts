/** Names of parameters and measures as the page shows them. Pure: no DOM. */

/** The glossary's labels (docs/glossary.md, src/results/vocabulary.ts; a test keeps them equal). */
const PARAMETERS: Record<string, string> = {
  neurons: 'network size N',
  patterns: 'stored patterns P',
  load: 'load α',
  inDegreeLoad: 'load per input α_K',
  'family.activity': 'pattern activity a',
  'family.parents': 'parent patterns',
  'family.parentOverlap': 'parent overlap b',
  'rule.threshold': 'threshold θ',
  'rule.degree': 'degree n',
  'rule.beta': 'inverse temperature β',
  'dilution.keep': 'couplings kept c',
  'dilution.inDegree': 'inputs per neuron K',
  'cue.fraction': 'cue noise f',
  'cue.components': 'mixture components',
  'dynamics.temperature': 'temperature T',
  'dynamics.maxSweeps': 'sweep limit',
  'dynamics.burnIn': 'burn-in',
  successThreshold: 'success threshold',
  trialsPerNetwork: 'trials per network'
}

/** A readable name for a varied parameter's path; unknown paths are shown as they are. */
export function parameterName (path: string): string {
  return PARAMETERS[path] ?? path
}

export interface MeasureInfo {
  value: string
  /** For menus. */
  short: string
  /** For axis titles and captions. */
  name: string
  /** Only offered when the spec measured one-step stability. */
  needsStability?: boolean
}

export const MEASURES: readonly MeasureInfo[] = [
  { value: 'success', short: 'success rate', name: 'recall success rate' },
  { value: 'overlap', short: 'final overlap', name: 'final overlap with the cued pattern' },
  { value: 'sweeps', short: 'sweeps run', name: 'sweeps run' },
  { value: 'maxOtherOverlap', short: 'largest other overlap', name: 'largest overlap with another pattern' },
  { value: 'energy', short: 'energy per neuron', name: 'energy per neuron' },
  { value: 'endState', short: 'ended at the cue', name: 'fraction ending in the cued pattern' },
  { value: 'unstableFraction', short: 'unstable neurons', name: 'unstable neurons in stored patterns', needsStability: true },
  { value: 'fixedPatternFraction', short: 'fixed stored patterns', name: 'stored patterns that are fixed points', needsStability: true }
]

export function measureName (value: string): string {
  return MEASURES.find((m) => m.value === value)?.name ?? value
}

/** The label of a re-run: the original label with its seed, replacing an earlier seed note. */
export function rerunLabel (label: string | null, seed: number): string {
  const base = (label ?? 'Untitled sweep').replace(/( · seed \d+| \(seed \d+\))$/, '')
  const suffix = ` (seed ${seed})`
  return base.slice(0, 200 - suffix.length) + suffix
}
