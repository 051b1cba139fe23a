/**
 * One vocabulary: every name a table column, a JSON field, a page label or a figure axis
 * uses, with its symbol, unit, meaning, how it is computed and which source defines it.
 * docs/glossary.md and docs/data-dictionary.md are generated from this list
 * (scripts/gen-vocabulary-docs.ts, drift-checked by test/spec/vocabulary.test.ts), and the
 * tests check that every column the service writes and every label the page and the figures
 * show is a term here. A name with `<…>` stands for a family of columns: `<class>` an end
 * state, `<kind>` an ending, `<k>` a mixture component (0 = the target), `<stat>` one of
 * mean, sd, se, `<name>` a theory value (docs/theory.md).
 */
import { END_STATES, ENDINGS } from '../engine/index.js'

export interface Term {
  /** The name as CSV columns and JSON paths spell it (JSON: the same path under a row, `summary.` for measures). */
  name: string
  /** Words for people: what the page and the figures call it. */
  label: string
  symbol: string
  unit: string
  meaning: string
  /** Where it comes from: the spec, the engine (with the file), or a published source. */
  source: string
}

export type TermGroup = 'identity' | 'parameter' | 'derived' | 'setting' | 'point measure' | 'trial measure' | 'series' | 'search'

export const VOCABULARY: ReadonlyArray<Term & { group: TermGroup }> = [
  // identity
  t('identity', 'sweepId', 'sweep', '', '', 'The sweep\'s id on the server that ran it; empty for a local run (memsweep run).', 'the service'),
  t('identity', 'specHash', 'spec hash', '', '', 'SHA-256 of the canonical normalised spec without its label: equal hashes, equal work.', 'src/spec/canonical.ts'),
  t('identity', 'seed', 'master seed', '', '', 'The spec\'s master seed; with the rest of the spec it fixes every random draw.', 'spec `seed`'),
  t('identity', 'point', 'grid point', '', '', 'Index of the grid point (axes in canonical order, the last fastest).', 'src/spec/grid.ts'),
  t('identity', 'search', 'search', '', '', 'Index of a threshold search = its point in the grid of the other varied parameters.', 'src/spec/analysis'),
  t('identity', 'step', 'search step', '', '', 'Index of an evaluated value within a threshold search.', 'src/spec/analysis'),
  t('identity', 'trial', 'trial', '', '', 'Index of the trial within its grid point.', 'src/engine/trial.ts'),
  // model parameters
  t('parameter', 'neurons', 'network size N', 'N', 'neurons', 'Number of neurons of the network at this point.', 'spec `neurons`'),
  t('parameter', 'patterns', 'stored patterns P', 'P', 'patterns', 'Number of stored patterns at this point (round(α·N) when the spec gives a load).', 'spec `patterns` / `load`'),
  t('parameter', 'load', 'load α', 'α', 'patterns per neuron', 'The load the spec asked for, as written; P = round(α·N). Empty when the spec gives P.', 'spec `load`'),
  t('parameter', 'inDegreeLoad', 'load per input α_K', 'α_K', 'patterns per input', 'The load per input the spec asked for under a fixed in-degree; P = round(α_K·K).', 'spec `inDegreeLoad`'),
  t('parameter', 'coding', 'neuron coding', '', '', 'pm1 (−1/+1) or binary (0/1) neurons.', 'spec `coding`'),
  t('parameter', 'family.kind', 'pattern family', '', '', 'random, correlated or supplied patterns.', 'spec `family.kind`'),
  t('parameter', 'family.activity', 'pattern activity a', 'a', 'probability', 'Probability that a pattern entry is active; 0.5 is unbiased.', 'spec `family.activity`'),
  t('parameter', 'family.parents', 'parent patterns', '', 'patterns', 'Number of parent patterns of correlated patterns.', 'spec `family.parents`'),
  t('parameter', 'family.parentOverlap', 'parent overlap b', 'b', '', 'Expected overlap of a stored pattern with its parent.', 'spec `family.parentOverlap`'),
  t('parameter', 'rule.kind', 'learning rule', '', '', 'hebbian, pseudo-inverse, storkey, covariance, clipped, dense-polynomial, dense-exponential or modern-softmax. JSON `values.rule` holds the rule\'s label on a rule axis.', 'spec `rule.kind`'),
  t('parameter', 'rule.selfCoupling', 'self-coupling J_ii kept', '', '', 'Whether the diagonal couplings J_ii are kept.', 'spec `rule.selfCoupling`'),
  t('parameter', 'rule.threshold', 'threshold θ', 'θ', 'local field', 'Uniform firing threshold of the covariance rule; empty: the engine\'s activity-dependent default.', 'spec `rule.threshold`; Tsodyks & Feigel\'man 1988'),
  t('parameter', 'rule.degree', 'degree n', 'n', '', 'Degree of the dense memory F(x) = xⁿ.', 'spec `rule.degree`; Krotov & Hopfield 2016'),
  t('parameter', 'rule.beta', 'inverse temperature β', 'β', '', 'Inverse temperature of the softmax update.', 'spec `rule.beta`; Ramsauer et al. 2021'),
  t('parameter', 'dilution.kind', 'dilution', '', '', 'none, random or fixed-in-degree.', 'spec `dilution`'),
  t('parameter', 'dilution.keep', 'couplings kept c', 'c', 'fraction', 'Fraction of couplings kept under random dilution.', 'spec `dilution.keep`'),
  t('parameter', 'dilution.symmetric', 'symmetric dilution', '', '', 'Whether J_ij and J_ji are cut together.', 'spec `dilution.symmetric`'),
  t('parameter', 'dilution.inDegree', 'inputs per neuron K', 'K', 'inputs', 'Inputs of every neuron under a fixed in-degree.', 'spec `dilution.inDegree`; Derrida, Gardner & Zippelius 1987'),
  t('parameter', 'cue.kind', 'cue', '', '', 'flip, erase, random or mixture.', 'spec `cue.kind`'),
  t('parameter', 'cue.fraction', 'cue noise f', 'f', 'fraction of neurons', 'Fraction of the target\'s neurons flipped (flip cue) or erased (erase cue), exactly round(f·N) of them.', 'spec `cue.fraction`'),
  t('parameter', 'cue.fill', 'erased neurons set to', '', '', 'zero or random: what an erased neuron holds.', 'spec `cue.fill`'),
  t('parameter', 'cue.components', 'mixture components', 'k', 'patterns', 'Number of stored patterns whose sign-mixture is the cue.', 'spec `cue.components`'),
  t('parameter', 'dynamics.update', 'update scheme', '', '', 'async-random, async-sequential or sync.', 'spec `dynamics.update`'),
  t('parameter', 'dynamics.temperature', 'temperature T', 'T', '', 'Temperature of Glauber dynamics; 0 is deterministic.', 'spec `dynamics.temperature`'),
  t('parameter', 'dynamics.maxSweeps', 'sweep limit', '', 'sweeps', 'Upper bound on sweeps; at T > 0 the number of sweeps run.', 'spec `dynamics.maxSweeps`'),
  t('parameter', 'dynamics.burnIn', 'burn-in', '', 'sweeps', 'Sweeps discarded before time averages start (T > 0).', 'spec `dynamics.burnIn`'),
  t('parameter', 'successThreshold', 'success threshold', 'q', 'overlap', 'A trial succeeds when its final overlap is at least q; also the pattern level of the end states (spec format 2).', 'spec `successThreshold`; docs/end-states.md'),
  t('parameter', 'trialsPerNetwork', 'trials per network', '', 'trials', 'Consecutive trials that share one network.', 'spec `trialsPerNetwork`'),
  t('parameter', 'streams', 'random streams', '', '', 'keyed (a stream per network and trial) or canonical (one stream, docs/canonical-stream.md).', 'spec `streams`'),
  // derived
  t('derived', 'alpha', 'realised load α = P/N', 'α', 'patterns per neuron', 'P/N at this point (JSON `params.alpha`).', 'computed'),
  t('derived', 'alphaK', 'realised load per input α_K = P/K', 'α_K', 'patterns per input', 'P/K under a fixed in-degree, else empty (JSON `params.inDegreeLoad`).', 'computed'),
  // spec settings that are not model parameters (no table column; spec fields and error paths use these names)
  t('setting', 'label', 'label', '', '', 'Free text naming the sweep for people; not part of the spec hash.', 'spec `label`'),
  t('setting', 'version', 'spec format', '', '', 'Spec format version; 2 classifies end states with the success threshold as pattern level, 1 with 0.9.', 'spec `version`'),
  t('setting', 'family.data', 'supplied patterns', 'ξ', '', 'The patterns of a supplied family, data[μ][i] in the chosen coding.', 'spec `family.data`'),
  t('setting', 'measures.overlapTrajectory', 'record overlap trajectories', '', '', 'Record the target overlap after every sweep.', 'spec `measures.overlapTrajectory`'),
  t('setting', 'measures.energyTrajectory', 'record energy trajectories', '', '', 'Record the energy per neuron after every sweep.', 'spec `measures.energyTrajectory`'),
  t('setting', 'measures.stability', 'measure pattern stability', '', '', 'Measure the one-step stability of every stored pattern, once per network.', 'spec `measures.stability`'),
  t('setting', 'measures.patternOverlaps', 'measure stored-pattern overlaps', '', '', 'Measure the overlaps between the stored patterns of every network.', 'spec `measures.patternOverlaps`'),
  t('setting', 'precision.measure', 'precision measure', '', '', 'The measure whose 95 % interval a precision target narrows: success or overlap.', 'spec `precision.measure`'),
  t('setting', 'precision.halfWidth', 'target half-width', '', 'measure units', 'A point stops taking trial blocks once its 95 % interval is this narrow on each side.', 'spec `precision.halfWidth`; Wilson 1927 for success'),
  t('setting', 'precision.block', 'trial block', '', 'trials', 'Trials per block of a precision target; `trials` is the ceiling.', 'spec `precision.block`'),
  t('setting', 'analysis.kind', 'analysis', '', '', 'threshold: a search for where a measure crosses a level.', 'spec `analysis.kind`'),
  t('setting', 'analysis.from', 'searched range, low end', '', 'parameter units', 'Low end of the range a threshold search moves the parameter over.', 'spec `analysis.from`'),
  t('setting', 'analysis.to', 'searched range, high end', '', 'parameter units', 'High end of that range.', 'spec `analysis.to`'),
  t('setting', 'analysis.direction', 'direction of the measure', '', '', 'decreasing or increasing: how the measure moves as the parameter grows.', 'spec `analysis.direction`'),
  t('setting', 'analysis.maxSteps', 'most search steps', '', 'steps', 'Most parameter values evaluated per search, both ends included.', 'spec `analysis.maxSteps`'),
  t('setting', 'analysis.tolerance', 'search tolerance', '', 'parameter units', 'The search stops once the bracket around the crossing is at most this wide.', 'spec `analysis.tolerance`'),
  t('setting', 'analysis.scaling.form', 'scaling form', '', '', 'power (x_c(N) = x_∞ + a·N^(−b)) or linear-inverse (x_∞ + a/N): the finite-size fit of the crossings over N.', 'spec `analysis.scaling`'),
  t('setting', 'analysis.scaling.exponent', 'scaling exponent b', 'b', '', 'The exponent of the power form, fixed or fitted (null).', 'spec `analysis.scaling.exponent`'),
  // point measures
  t('point measure', 'trials', 'trials', '', 'trials', 'Trials run at the point (with a search: per row, all steps).', 'src/engine/aggregate.ts'),
  t('point measure', 'overlap.<stat>', 'final overlap with the cued pattern', 'm', '', 'Final overlap with the cued pattern, (1/N) Σ ξ_i s_i (T > 0: time average): mean, standard deviation and standard error over trials.', 'src/engine/measures.ts'),
  t('point measure', 'sweeps.<stat>', 'sweeps run', '', 'sweeps', 'Sweeps until the dynamics stopped.', 'src/engine/dynamics'),
  t('point measure', 'maxOtherOverlap.<stat>', 'largest overlap with another pattern', 'max|m_ν|', '', 'Largest |overlap| with a stored pattern other than the target.', 'src/engine/measures.ts'),
  t('point measure', 'energy.<stat>', 'energy per neuron', 'E/N', '', 'Energy of the final state per neuron.', 'src/engine/measures.ts'),
  t('point measure', 'success.count', 'successes', '', 'trials', 'Trials whose final overlap reached the success threshold.', 'src/engine/aggregate.ts'),
  t('point measure', 'success.rate', 'recall success rate', '', 'fraction', 'success.count / trials.', 'src/engine/aggregate.ts'),
  t('point measure', 'success.low', 'success rate, 95 % low', '', 'fraction', 'Lower end of the Wilson 95 % interval of the success rate.', 'Wilson 1927'),
  t('point measure', 'success.high', 'success rate, 95 % high', '', 'fraction', 'Upper end of the Wilson 95 % interval of the success rate.', 'Wilson 1927'),
  t('point measure', 'ending.<kind>', 'ending counts', '', 'trials', 'Trials that ended at a fixed point, in a 2-cycle, at the sweep limit, or sampled at T > 0.', 'src/engine/dynamics'),
  t('point measure', 'endStates.<class>', 'end-state counts', '', 'trials', 'Trials in each end-state class (JSON `summary.endStates`).', 'docs/end-states.md; Amit, Gutfreund & Sompolinsky 1985'),
  t('point measure', 'stability.networks', 'networks measured', '', 'networks', 'Networks whose stored patterns were tested for one-step stability.', 'src/engine/measures.ts'),
  t('point measure', 'stability.unstableFraction', 'unstable neurons in stored patterns', '', 'fraction', 'Fraction of (pattern, neuron) pairs with ξ_i h_i < 0.', 'src/engine/measures.ts'),
  t('point measure', 'stability.tieFraction', 'zero local fields', '', 'fraction', 'Fraction of (pattern, neuron) pairs with h_i = 0.', 'src/engine/measures.ts'),
  t('point measure', 'stability.fixedPatternFraction', 'stored patterns that are fixed points', '', 'fraction', 'Fraction of stored patterns with no unstable neuron.', 'src/engine/measures.ts'),
  t('point measure', 'stability.<stat>.<field>', 'stability spread', '', 'fraction', 'Standard deviation and standard error over networks of a stability fraction.', 'src/engine/aggregate.ts'),
  t('point measure', 'endStateShares.<class>', 'share of sweeps per end state', '', 'fraction', 'T > 0: fraction of measured sweeps spent in each class, mean over trials.', 'docs/end-states.md'),
  t('point measure', 'finalEndStates.<class>', 'end-state counts after the last sweep', '', 'trials', 'T > 0: class of the state after the last sweep, counted.', 'docs/end-states.md'),
  t('point measure', 'finalMaxOtherOverlap.<stat>', 'largest overlap with another pattern after the last sweep', '', '', 'T > 0: maxOtherOverlap of the last state.', 'docs/end-states.md'),
  t('point measure', 'finalEnergy.<stat>', 'energy after the last sweep', '', '', 'T > 0: energy per neuron of the last state.', 'docs/end-states.md'),
  t('point measure', 'componentOverlaps.<k>.<stat>', 'overlap with mixture component k', 'm_k', '', 'Mixture cues: overlap with component k (0 = target).', 'docs/end-states.md'),
  t('point measure', 'patternOverlaps.networks', 'networks measured', '', 'networks', 'Networks whose stored patterns were compared.', 'docs/measures.md'),
  t('point measure', 'patternOverlaps.pairs', 'pattern pairs', '', 'pairs', 'Pairs μ < ν compared per network.', 'docs/measures.md'),
  t('point measure', 'patternOverlaps.<field>.<stat>', 'stored-pattern overlaps', 'C_μν', '', 'Mean, mean |C|, rms and largest |C| of C_μν = ξ^μ·ξ^ν/N over pairs, over networks.', 'docs/measures.md'),
  t('point measure', 'patternOverlaps.expected.<field>', 'stored-pattern overlaps expected', '', '', 'What the pattern family implies for the same statistic.', 'docs/measures.md; CHECK_VALUES §12'),
  t('point measure', 'theory.<name>', 'theory value', '', '', 'A theory value that applies at the point (docs/theory.md names each, its source and domain); empty where unavailable.', 'docs/theory.md'),
  // trial measures
  t('trial measure', 'target', 'cued pattern', '', '', 'Index of the cued pattern.', 'src/engine/trial.ts'),
  t('trial measure', 'initialOverlap', 'cue overlap m₀', 'm₀', '', 'Overlap of the cue with the target.', 'src/engine/trial.ts'),
  t('trial measure', 'overlap', 'final overlap with the cued pattern', 'm', '', 'The trial\'s final overlap (T > 0: time average).', 'src/engine/measures.ts'),
  t('trial measure', 'success', 'success', '', '0/1', '1 when overlap ≥ successThreshold.', 'src/engine/aggregate.ts'),
  t('trial measure', 'maxOtherOverlap', 'largest overlap with another pattern', '', '', 'The trial\'s largest |overlap| with another pattern.', 'src/engine/measures.ts'),
  t('trial measure', 'sweeps', 'sweeps run', '', 'sweeps', 'Sweeps the trial ran.', 'src/engine/dynamics'),
  t('trial measure', 'ending', 'ending', '', '', 'fixed, cycle2, max or sampled.', 'src/engine/results.ts'),
  t('trial measure', 'energy', 'energy per neuron', 'E/N', '', 'The trial\'s final energy per neuron.', 'src/engine/measures.ts'),
  t('trial measure', 'endState', 'end state', '', '', 'The trial\'s end-state class.', 'docs/end-states.md'),
  t('trial measure', 'finalEndState', 'end state after the last sweep', '', '', 'T > 0: class of the last state.', 'docs/end-states.md'),
  t('trial measure', 'finalMaxOtherOverlap', 'largest overlap with another pattern after the last sweep', '', '', 'T > 0.', 'docs/end-states.md'),
  t('trial measure', 'finalEnergy', 'energy after the last sweep', '', '', 'T > 0.', 'docs/end-states.md'),
  t('trial measure', 'componentOverlaps.<k>', 'overlap with mixture component k', 'm_k', '', 'Mixture cues.', 'docs/end-states.md'),
  t('trial measure', 'patternOverlaps.<field>', 'stored-pattern overlaps', 'C_μν', '', 'First trial of each network.', 'docs/measures.md'),
  // series
  t('series', 'sweep', 'sweep', 't', 'sweeps', 'Sweep index of a trajectory (0 = the cue).', 'src/results/trajectory-output.ts'),
  t('series', 'running', 'trials still running', '', 'trials', 'Trials not yet stopped at this sweep.', 'src/results/trajectory-output.ts'),
  // search
  t('search', 'side', 'side of the level', '', '', 'above or below the searched level.', 'src/spec/analysis'),
  t('search', 'parameter', 'searched parameter', '', '', 'The parameter the search moves.', 'spec `analysis.parameter`'),
  t('search', 'measure', 'searched measure', '', '', 'success or overlap.', 'spec `analysis.measure`'),
  t('search', 'level', 'level', '', '', 'The level of the measure whose crossing is sought.', 'spec `analysis.level`'),
  t('search', 'estimate', 'crossing estimate', '', '', 'Where the measure crosses the level.', 'src/engine/analysis'),
  t('search', 'low', 'crossing, low end', '', '', 'Lower end of the crossing\'s interval.', 'src/engine/analysis'),
  t('search', 'high', 'crossing, high end', '', '', 'Upper end of the crossing\'s interval.', 'src/engine/analysis'),
  t('search', 'confidence', 'confidence', '', '', 'Confidence of the interval.', 'spec `analysis.confidence`'),
  t('search', 'stoppedBy', 'stopped by', '', '', 'Why the search stopped.', 'src/engine/analysis'),
  t('search', 'bracket.<end>', 'bracket', '', '', 'The last bracket of the crossing (low, high).', 'src/engine/analysis'),
  t('search', 'steps', 'steps used', '', 'steps', 'Values evaluated.', 'src/engine/analysis'),
  t('search', 'fit.<field>', 'crossing fit', '', '', 'The fit through the steps near the level: method, slope, dispersion, separated.', 'src/engine/analysis'),
  t('search', 'note', 'note', '', '', 'What the search wants the reader to know.', 'src/engine/analysis')
]

const PLACEHOLDERS: Record<string, string> = {
  '<stat>': '(mean|sd|se)',
  '<class>': `(${END_STATES.join('|')})`,
  '<kind>': `(${ENDINGS.join('|')})`,
  '<k>': '\\d+',
  '<name>': '[A-Za-z0-9]+',
  '<field>': '[A-Za-z]+',
  '<end>': '(low|high)'
}

const MATCHERS = VOCABULARY.map((term) => ({
  term,
  pattern: new RegExp(`^${term.name.replace(/[.]/g, '\\.').replace(/<[a-z]+>/g, (p) => PLACEHOLDERS[p] ?? p)}$`)
}))

// MAIN //

/** The term a column or field name belongs to, or undefined when it is not in the vocabulary. */
export function termOf (name: string): (Term & { group: TermGroup }) | undefined {
  return MATCHERS.find((m) => m.pattern.test(name))?.term
}

/** The label of a parameter (for pages and figures), by its spec path. */
export function parameterLabel (path: string): string {
  const term = VOCABULARY.find((entry) => entry.name === path)
  if (term === undefined) throw new Error(`internal: ${path} is not in the vocabulary`)
  return term.label
}

function t (group: TermGroup, name: string, label: string, symbol: string, unit: string, meaning: string, source: string): Term & { group: TermGroup } {
  return { group, name, label, symbol, unit, meaning, source }
}
