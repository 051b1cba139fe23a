/**
 * Finite-size scaling of search results: the crossings found at several network sizes,
 * fitted against N and extrapolated to N → ∞, beside the published values they can be
 * compared with.
 */
import normalQuantile from '@stdlib/stats-base-dists-normal-quantile'
import { fitFiniteSize } from '../../engine/analysis/index.js'
import { rsCriticalLoad, type PointParams } from '../../engine/index.js'
import { canonicalJson } from '../../spec/canonical.js'
import { pointAt } from '../../spec/grid.js'
import type { NormalisedSpec } from '../../spec/types.js'
import type { NormalisedAnalysis, ScalingReference, ScalingRow, SearchRow } from '../../spec/analysis/types.js'

/** Finite-size simulation estimate of the Hebbian capacity and its quoted uncertainty. */
export const SIMULATED_CAPACITY = {
  value: 0.145,
  uncertainty: 0.009,
  source: 'Finite-size simulations of the Hebbian network, as quoted by Steffan & Kühn, Z. Phys. B 95, 249 (1994)'
} as const

export const RS_CAPACITY_SOURCE = 'Replica-symmetric theory at T = 0: Amit, Gutfreund & Sompolinsky, Phys. Rev. Lett. 55, 1530 (1985); Ann. Phys. 173, 30 (1987)'

// MAIN //

/**
 * One fit per combination of the varied parameters other than `neurons` (usually a single
 * fit), in grid order. A search enters its fit when its interval is bounded on both sides;
 * its standard error is the interval's width over 2z (z the two-sided normal quantile of
 * the analysis' confidence), which is exact for a symmetric Gaussian interval and a fair
 * summary of the slightly asymmetric profile-likelihood ones.
 */
export function scalingRows (spec: NormalisedSpec, analysis: NormalisedAnalysis, searches: readonly SearchRow[]): ScalingRow[] {
  const scaling = analysis.scaling
  if (scaling === null) return []
  const z = normalQuantile(1 - (1 - analysis.confidence) / 2, 0, 1)
  const groups = new Map<string, { values: SearchRow['values'], members: SearchRow[] }>()
  for (const row of searches) {
    const { neurons: _neurons, ...others } = row.values
    const key = canonicalJson(others)
    const group = groups.get(key) ?? { values: others, members: [] }
    group.members.push(row)
    groups.set(key, group)
  }
  const needed = scaling.form === 'power' && scaling.exponent === null ? 4 : 3
  return [...groups.values()].map(({ values, members }) => {
    const sizes: ScalingRow['sizes'] = []
    const excluded: ScalingRow['excluded'] = []
    for (const row of members) {
      if (row.estimate === null) excluded.push({ search: row.search, neurons: row.neurons, reason: 'no estimate (see the search\'s note)' })
      else if (row.low === null || row.high === null || !(row.high > row.low)) excluded.push({ search: row.search, neurons: row.neurons, reason: 'interval not bounded on both sides' })
      else sizes.push({ search: row.search, neurons: row.neurons, estimate: row.estimate, se: (row.high - row.low) / (2 * z) })
    }
    const base = { values, form: scaling.form, sizes, excluded }
    if (sizes.length < needed) {
      return { ...base, fit: null, references: [], note: `Only ${sizes.length} of ${members.length} sizes have a bounded estimate; the fit needs ${needed}.` }
    }
    const form = scaling.form === 'power' ? { form: 'power' as const, exponent: scaling.exponent } : { form: 'linear-inverse' as const }
    const fitted = fitFiniteSize(sizes.map((s) => ({ neurons: s.neurons, value: s.estimate, se: s.se })), form)
    const limitSe = fitted.limit.se ?? 0
    const fit = { ...fitted, limitInterval: { low: fitted.limit.value - z * limitSe, high: fitted.limit.value + z * limitSe, confidence: analysis.confidence } }
    const params = pointAt(spec, members[0]!.search).params
    const references = analysis.parameter === 'load' && isStandardHebbian(params) ? capacityReferences(fitted.limit.value, limitSe) : []
    return { ...base, fit, references, note: null }
  })
}

/** The model the published capacity values describe: Hebbian, J_ii = 0, unbiased ±1 patterns, full connectivity, T = 0. */
function isStandardHebbian (p: PointParams): boolean {
  return p.rule.kind === 'hebbian' && !p.rule.selfCoupling && p.coding === 'pm1' &&
    p.family.kind === 'random' && p.family.activity === 0.5 && p.dilution === null && p.dynamics.temperature === 0
}

function capacityReferences (limit: number, se: number): ScalingReference[] {
  const deviation = (value: number, uncertainty: number) => {
    const combined = Math.sqrt(se * se + uncertainty * uncertainty)
    return combined > 0 ? (limit - value) / combined : null
  }
  const rs = rsCriticalLoad().alphaC
  return [
    { name: 'rs-theory', value: rs, uncertainty: null, source: RS_CAPACITY_SOURCE, deviation: deviation(rs, 0) },
    { name: 'finite-size-simulations', value: SIMULATED_CAPACITY.value, uncertainty: SIMULATED_CAPACITY.uncertainty, source: SIMULATED_CAPACITY.source, deviation: deviation(SIMULATED_CAPACITY.value, SIMULATED_CAPACITY.uncertainty) }
  ]
}
