/**
 * Words and symbols on a figure: axis titles with their symbols, legend labels, the line
 * of model conditions under the title. Labels may hold `_{…}` for a subscript; `plainText`
 * turns that into readable plain text for <title>, <desc> and data attributes.
 */
import type { EndState } from '../engine/index.js'
import { ruleLabel, type AxisPath, type AxisValue, type NormalisedSpec, type VariedPath } from '../spec/index.js'
import type { FigureMeasure } from './options.js'

interface ParameterWords {
  /** Symbol used in legend labels (`N = 200`). */
  symbol: string
  /** Axis title with the symbol. */
  axis: string
  /** Short name for generated titles. */
  short: string
}

const PARAMETERS: Record<VariedPath, ParameterWords> = {
  neurons: { symbol: 'N', axis: 'Network size N (neurons)', short: 'network size N' },
  patterns: { symbol: 'P', axis: 'Stored patterns P', short: 'stored patterns P' },
  load: { symbol: 'α', axis: 'Load α = P/N', short: 'load α' },
  inDegreeLoad: { symbol: 'α_{K}', axis: 'Load per input α_{K} = P/K', short: 'load per input α_K' },
  'family.activity': { symbol: 'a', axis: 'Pattern activity a (fraction of active neurons)', short: 'pattern activity a' },
  'family.parents': { symbol: 'parents', axis: 'Parent patterns', short: 'parent patterns' },
  'family.parentOverlap': { symbol: 'b', axis: 'Overlap b of each pattern with its parent', short: 'parent overlap b' },
  'rule.threshold': { symbol: 'θ', axis: 'Firing threshold θ', short: 'threshold θ' },
  'rule.degree': { symbol: 'n', axis: 'Interaction degree n (F(x) = xⁿ)', short: 'degree n' },
  'rule.beta': { symbol: 'β', axis: 'Inverse temperature β of the softmax', short: 'inverse temperature β' },
  'dilution.keep': { symbol: 'c', axis: 'Fraction of couplings kept c', short: 'couplings kept c' },
  'dilution.inDegree': { symbol: 'K', axis: 'Inputs per neuron K', short: 'inputs per neuron K' },
  'cue.fraction': { symbol: 'f', axis: 'Cue noise f', short: 'cue noise f' },
  'cue.components': { symbol: 'k', axis: 'Mixture components k', short: 'mixture components' },
  'dynamics.temperature': { symbol: 'T', axis: 'Temperature T', short: 'temperature T' },
  'dynamics.maxSweeps': { symbol: 'sweep limit', axis: 'Sweep limit', short: 'sweep limit' },
  'dynamics.burnIn': { symbol: 'burn-in', axis: 'Burn-in sweeps', short: 'burn-in' },
  successThreshold: { symbol: 'q', axis: 'Success threshold q (final overlap)', short: 'success threshold' },
  trialsPerNetwork: { symbol: 'trials/network', axis: 'Trials per network', short: 'trials per network' }
}

const END_STATE_WORDS: Record<EndState, string> = {
  target: 'at the target',
  reversed: 'at the reversed target',
  otherPattern: 'at another pattern',
  symmetricMixture: 'in a symmetric mixture state',
  partialTarget: 'partly at the target (below the pattern level)',
  spurious: 'in another spurious state',
  spinGlass: 'in a spin-glass-like state (no macroscopic overlap)'
}

// MAIN //

/** Plain text of a label: subscripts written with an underscore (`α_c`). */
export function plainText (label: string): string {
  return label.replace(/_\{([^}]*)\}/g, '_$1')
}

/** A number as a label shows it: shortest exact form, with a true minus sign. */
export function formatValue (value: number): string {
  return String(value).replace('-', '−')
}

export function parameterSymbol (path: VariedPath): string {
  return PARAMETERS[path].symbol
}

/** The x axis title; the cue fraction says what the cue does when every sweep agrees on it. */
export function parameterAxisTitle (path: VariedPath, specs: readonly NormalisedSpec[]): string {
  if (path === 'cue.fraction') {
    const kinds = new Set(specs.map((s) => s.cue.kind))
    if (kinds.size === 1 && kinds.has('flip')) return 'Cue noise f (fraction of neurons flipped)'
    if (kinds.size === 1 && kinds.has('erase')) return 'Cue erasure f (fraction of neurons erased)'
  }
  return PARAMETERS[path].axis
}

export function parameterShortName (path: VariedPath): string {
  return PARAMETERS[path].short
}

export function legendEntry (path: AxisPath, value: AxisValue): string {
  if (path === 'rule') return ruleWords(String(value))
  if (path === 'rule.selfCoupling') return value === true ? 'J_{ii} kept' : 'J_{ii} = 0'
  return `${PARAMETERS[path].symbol} = ${formatValue(value as number)}`
}

const RULE_NAMES: Record<string, string> = {
  hebbian: 'Hebbian rule',
  'pseudo-inverse': 'pseudo-inverse rule',
  storkey: 'Storkey rule',
  covariance: 'covariance rule',
  clipped: 'clipped synapses',
  'dense-polynomial': 'dense memory F = xⁿ',
  'dense-exponential': 'dense memory F = eˣ',
  'modern-softmax': 'softmax network'
}

/** A rule axis label (`dense-polynomial(degree=3)`) in words: `dense memory F = xⁿ (degree=3)`. */
function ruleWords (label: string): string {
  const open = label.indexOf('(')
  const kind = open < 0 ? label : label.slice(0, open)
  return `${RULE_NAMES[kind] ?? kind}${open < 0 ? '' : ` ${label.slice(open).replace('selfCoupling=true', 'J_{ii} kept')}`}`
}

/** The y axis title. */
export function measureAxisTitle (measure: FigureMeasure, specs: readonly NormalisedSpec[], endState: EndState): string {
  switch (measure) {
    case 'success': {
      const thresholds = new Set(specs.map((s) => (typeof s.successThreshold === 'number' ? s.successThreshold : NaN)))
      const [only] = [...thresholds]
      return thresholds.size === 1 && only !== undefined && Number.isFinite(only)
        ? `Recall success rate (final m ≥ ${formatValue(only)})`
        : 'Recall success rate (final m ≥ q)'
    }
    case 'overlap':
      return anyWarm(specs)
        ? 'Overlap m with the target'
        : 'Final overlap m with the target'
    case 'sweeps':
      return specs.every((s) => s.dynamics.update === 'sync') ? 'Parallel steps run' : 'Sweeps run'
    case 'maxOtherOverlap':
      return 'Largest overlap |m_{ν}| with another pattern'
    case 'energy':
      return 'Energy per neuron E/N'
    case 'endState':
      return `Fraction ending ${END_STATE_WORDS[endState]}`
    case 'unstableFraction':
      return 'Fraction of unstable neurons in stored patterns'
    case 'fixedPatternFraction':
      return 'Stored patterns that are fixed points (fraction)'
    case 'patternOverlapMeanAbs':
      return 'Mean |C_{μν}| between stored patterns'
    case 'patternOverlapMaxAbs':
      return 'Largest |C_{μν}| between stored patterns'
  }
}

export function measureShortName (measure: FigureMeasure, endState: EndState): string {
  switch (measure) {
    case 'success': return 'Recall success rate'
    case 'overlap': return 'Final overlap with the cued pattern'
    case 'sweeps': return 'Sweeps run'
    case 'maxOtherOverlap': return 'Largest overlap with another pattern'
    case 'energy': return 'Energy per neuron'
    case 'endState': return `Trials ending ${END_STATE_WORDS[endState]}`
    case 'unstableFraction': return 'Unstable neurons in stored patterns'
    case 'fixedPatternFraction': return 'Stored patterns that are fixed points'
    case 'patternOverlapMeanAbs': return 'Mean overlap between stored patterns'
    case 'patternOverlapMaxAbs': return 'Largest overlap between stored patterns'
  }
}

/** Whether any sweep runs at a temperature above zero (its overlaps are time averages). */
export function anyWarm (specs: readonly NormalisedSpec[]): boolean {
  return specs.some((s) => {
    const t = s.dynamics.temperature
    return typeof t === 'number' ? t > 0 : t.values.some((v) => v > 0)
  })
}

/**
 * The model as a list of short phrases (Hebbian, flip cue f = 0.05, T = 0, …), leaving out
 * the parameters the figure varies; for a caption-like line under the title.
 */
export function modelConditions (spec: NormalisedSpec, shown: ReadonlySet<string>): string[] {
  const out: string[] = []
  const constant = (path: VariedPath, v: unknown): v is number => typeof v === 'number' && !shown.has(path)
  if (constant('neurons', spec.neurons)) out.push(`N = ${formatValue(spec.neurons)}`)
  if (spec.patterns !== undefined && constant('patterns', spec.patterns)) out.push(`P = ${formatValue(spec.patterns)}`)
  if (spec.load !== undefined && constant('load', spec.load)) out.push(`α = ${formatValue(spec.load)}`)
  if (spec.inDegreeLoad !== undefined && constant('inDegreeLoad', spec.inDegreeLoad)) out.push(`α_{K} = P/K = ${formatValue(spec.inDegreeLoad)}`)
  if (spec.coding === 'binary') out.push('0/1 neurons')
  const f = spec.family
  if (f.kind === 'random') out.push(constant('family.activity', f.activity) && f.activity !== 0.5 ? `random patterns (a = ${formatValue(f.activity)})` : 'random patterns')
  else if (f.kind === 'correlated') {
    const parts = [constant('family.parents', f.parents) ? `${formatValue(f.parents)} parents` : null, constant('family.parentOverlap', f.parentOverlap) ? `b = ${formatValue(f.parentOverlap)}` : null].filter((p) => p !== null)
    out.push(parts.length > 0 ? `correlated patterns (${parts.join(', ')})` : 'correlated patterns')
  } else out.push('supplied patterns')
  const r = spec.rule
  if ('values' in r) {
    if (!shown.has('rule')) out.push(r.values.length === 1 ? ruleWords(ruleLabel(r.values[0]!)) : `${r.values.length} rules`)
    return out.concat(dynamicsConditions(spec, constant))
  }
  const ruleName = RULE_NAMES[r.kind]!
  const threshold = r.kind === 'covariance' && r.threshold !== null && constant('rule.threshold', r.threshold) ? ` (θ = ${formatValue(r.threshold)})` : ''
  const option = r.kind === 'dense-polynomial' && constant('rule.degree', r.degree)
    ? ` (n = ${formatValue(r.degree)})`
    : r.kind === 'modern-softmax' && constant('rule.beta', r.beta) ? ` (β = ${formatValue(r.beta)})` : ''
  out.push(`${ruleName}${threshold}${option}${'selfCoupling' in r && r.selfCoupling === true ? ', J_{ii} kept' : ''}`)
  return out.concat(dynamicsConditions(spec, constant))
}

/** The conditions after the rule: dilution, cue, dynamics, trials. */
function dynamicsConditions (spec: NormalisedSpec, constant: (path: VariedPath, v: unknown) => v is number): string[] {
  const out: string[] = []
  if (spec.dilution !== null && 'inDegree' in spec.dilution) {
    out.push(constant('dilution.inDegree', spec.dilution.inDegree) ? `K = ${formatValue(spec.dilution.inDegree)} inputs per neuron (asymmetric)` : 'fixed in-degree (asymmetric)')
  } else if (spec.dilution !== null) {
    out.push(constant('dilution.keep', spec.dilution.keep)
      ? `c = ${formatValue(spec.dilution.keep)} of couplings kept${spec.dilution.symmetric ? '' : ' (asymmetric)'}`
      : `diluted couplings${spec.dilution.symmetric ? '' : ' (asymmetric)'}`)
  }
  const c = spec.cue
  if (c.kind === 'flip' || c.kind === 'erase') {
    const name = c.kind === 'flip' ? 'flip cue' : `erase cue (${c.fill} fill)`
    out.push(constant('cue.fraction', c.fraction) ? `${name} f = ${formatValue(c.fraction)}` : name)
  } else if (c.kind === 'mixture') out.push(constant('cue.components', c.components) ? `mixture cue of ${formatValue(c.components)}` : 'mixture cue')
  else out.push('random cue')
  const d = spec.dynamics
  out.push(`${d.update} updates`)
  if (constant('dynamics.temperature', d.temperature)) out.push(`T = ${formatValue(d.temperature)}`)
  if (constant('dynamics.maxSweeps', d.maxSweeps)) out.push(`≤ ${formatValue(d.maxSweeps)} ${d.update === 'sync' ? 'step' : 'sweep'}${d.maxSweeps === 1 ? '' : 's'}`)
  if (constant('dynamics.burnIn', d.burnIn) && d.burnIn > 0) out.push(`burn-in ${formatValue(d.burnIn)}`)
  const perNetwork = constant('trialsPerNetwork', spec.trialsPerNetwork) && spec.trialsPerNetwork > 1 ? ` (${formatValue(spec.trialsPerNetwork)} per network)` : ''
  // With a precision target, `trials` is a ceiling: points take blocks until their interval is narrow enough.
  const precision = spec.precision
  out.push(precision === undefined
    ? `${spec.trials} trials per point${perNetwork}`
    : `${formatValue(precision.block)}–${spec.trials} trials per point${perNetwork}, until ${precision.measure === 'success' ? 'success rate' : 'overlap'} ± ${formatValue(precision.halfWidth)}`)
  return out
}
