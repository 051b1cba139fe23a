/**
 * The sweep spec as users write it (JSON), as a strict zod schema: unknown fields are
 * errors, every field is described with its default so the OpenAPI document carries the
 * documentation. Cross-field rules (patterns vs load, supplied data vs coding, per-point
 * engine checks) live in normalise.ts.
 */
import { z } from 'zod'
import { type NumericDomain, scalarSchema, variedSchema } from './axis.js'
import { analysisSchema } from './analysis/schema.js'

// VARIABLES //

/**
 * Version of the spec format; bumped whenever a spec's meaning would change. Version 2: the
 * success threshold is also the pattern level of the end-state classes (version 1 keeps 0.9);
 * it adds `streams`, `inDegreeLoad`, `measures.patternOverlaps` and categorical axes of the
 * rule and its self-coupling. Version 1 specs are still accepted and keep their meaning and
 * their hash (members added in version 2 are written only when not at their default).
 */
export const SPEC_FORMAT_VERSION = 2

/** Spec format versions accepted. */
export const SPEC_FORMAT_VERSIONS = [1, 2] as const

/** Defaults filled in by normalisation, in one place so docs, schema and code agree. */
export const SPEC_DEFAULTS = {
  seed: 1,
  coding: 'pm1',
  activity: 0.5,
  selfCoupling: false,
  covarianceThreshold: null,
  dilutionSymmetric: true,
  cueFraction: 0.1,
  eraseFill: 'zero',
  mixtureComponents: 3,
  update: 'async-random',
  temperature: 0,
  maxSweeps: 100,
  burnIn: 0,
  successThreshold: 0.9,
  trials: 100,
  trialsPerNetwork: 1,
  streams: 'keyed',
  patternOverlaps: false
} as const

/** Hard ceilings of the format itself; the service's configurable limits (work.ts) are usually tighter. */
export const SPEC_CEILINGS = {
  neurons: 1_000_000,
  patterns: 1_000_000,
  maxSweeps: 1_000_000,
  trials: 10_000_000,
  trialsPerNetwork: 10_000_000,
  labelLength: 200,
  /** Grid points (product of all axis lengths). */
  points: 100_000,
  /** Values of a categorical axis (rules). */
  ruleValues: 64
} as const

/**
 * Every parameter that may be varied, in canonical order: this is the order of the grid's
 * axes (first = slowest), of `values` in rows and of the varied columns in CSV output.
 */
export const VARIED_PARAMETERS = [
  { path: 'neurons', domain: { integer: true, min: 1, max: SPEC_CEILINGS.neurons } },
  { path: 'patterns', domain: { integer: true, min: 1, max: SPEC_CEILINGS.patterns } },
  { path: 'load', domain: { integer: false, min: 0, minExclusive: true, max: SPEC_CEILINGS.patterns } },
  { path: 'inDegreeLoad', domain: { integer: false, min: 0, minExclusive: true, max: SPEC_CEILINGS.patterns } },
  { path: 'family.activity', domain: { integer: false, min: 0, minExclusive: true, max: 1, maxExclusive: true } },
  { path: 'family.parents', domain: { integer: true, min: 1, max: SPEC_CEILINGS.patterns } },
  { path: 'family.parentOverlap', domain: { integer: false, min: 0, max: 1 } },
  { path: 'rule.threshold', domain: { integer: false } },
  { path: 'rule.degree', domain: { integer: true, min: 2, max: 30 } },
  { path: 'rule.beta', domain: { integer: false, min: 0, minExclusive: true } },
  { path: 'dilution.keep', domain: { integer: false, min: 0, minExclusive: true, max: 1 } },
  { path: 'dilution.inDegree', domain: { integer: true, min: 1, max: SPEC_CEILINGS.neurons } },
  { path: 'cue.fraction', domain: { integer: false, min: 0, max: 1 } },
  { path: 'cue.components', domain: { integer: true, min: 1, max: SPEC_CEILINGS.patterns } },
  { path: 'dynamics.temperature', domain: { integer: false, min: 0 } },
  { path: 'dynamics.maxSweeps', domain: { integer: true, min: 1, max: SPEC_CEILINGS.maxSweeps } },
  { path: 'dynamics.burnIn', domain: { integer: true, min: 0, max: SPEC_CEILINGS.maxSweeps } },
  { path: 'successThreshold', domain: { integer: false, min: -1, max: 1 } },
  { path: 'trialsPerNetwork', domain: { integer: true, min: 1, max: SPEC_CEILINGS.trialsPerNetwork } }
] as const satisfies ReadonlyArray<{ path: string, domain: NumericDomain }>

export type VariedPath = typeof VARIED_PARAMETERS[number]['path']

/**
 * Parameters whose axis values are not numbers: the learning rule itself (each value a whole
 * rule object with its own parameters) and its self-coupling (true/false).
 */
export const CATEGORICAL_PARAMETERS = ['rule', 'rule.selfCoupling'] as const

export type CategoricalPath = typeof CATEGORICAL_PARAMETERS[number]

/** Any parameter that may be an axis. */
export type AxisPath = VariedPath | CategoricalPath

/**
 * Every axis path in canonical order (the grid's axis order, first = slowest, and the order of
 * varied columns): the numeric ones of VARIED_PARAMETERS with the categorical ones placed
 * before the rule's numeric parameters.
 */
export const AXIS_ORDER: readonly AxisPath[] = VARIED_PARAMETERS.flatMap((p): AxisPath[] => p.path === 'rule.threshold' ? [...CATEGORICAL_PARAMETERS, p.path] : [p.path])

export function isCategoricalPath (path: string): path is CategoricalPath {
  return (CATEGORICAL_PARAMETERS as readonly string[]).includes(path)
}

export function domainOf (path: VariedPath): NumericDomain {
  const entry = VARIED_PARAMETERS.find((p) => p.path === path)
  if (entry === undefined) throw new Error(`internal: unknown varied parameter ${path}`)
  return entry.domain
}

const varied = (path: VariedPath, description: string) => variedSchema(domainOf(path), description)
/** A numeric field that is always a number (inside a value of a categorical axis). */
const constant = (path: VariedPath, description: string) => scalarSchema(domainOf(path)).describe(description)

// MAIN //

const selfCouplingFlag = z.boolean().default(SPEC_DEFAULTS.selfCoupling)
  .describe('Keep the diagonal couplings J_ii. Default: false.')

const selfCouplingAxis = z.strictObject({
  values: z.array(z.boolean()).min(1).max(2).describe('true, false or both, in the order given.')
}).describe('An axis of self-coupling: { "values": [false, true] } runs every point without and with J_ii.')

const selfCoupling = z.union([z.boolean(), selfCouplingAxis], {
  error: (issue) => issue.input === undefined ? 'required' : typeof issue.input === 'object' ? undefined : 'expected true, false or an axis { "values": [false, true] }'
}).default(SPEC_DEFAULTS.selfCoupling)
  .describe('Keep the diagonal couplings J_ii: true, false, or an axis { "values": [false, true] }. Default: false.')

const randomFamily = z.strictObject({
  kind: z.literal('random'),
  activity: varied('family.activity', 'Probability that an entry is active (+1, or 1 in binary coding); 0.5 is unbiased. Default: 0.5.')
    .default(SPEC_DEFAULTS.activity)
}).describe('Independent random patterns.')

const correlatedFamily = z.strictObject({
  kind: z.literal('correlated'),
  parents: varied('family.parents', 'Number of parent patterns; stored pattern μ derives from parent μ mod parents. Required.'),
  parentOverlap: varied('family.parentOverlap', 'Expected overlap of a stored pattern with its parent (each entry re-drawn with probability 1 − parentOverlap). Required.')
}).describe('Hierarchically correlated patterns: children of a few random parents.')

const suppliedFamily = z.strictObject({
  kind: z.literal('supplied'),
  data: z.array(z.array(z.number()).min(1).max(SPEC_CEILINGS.neurons)).min(1).max(SPEC_CEILINGS.patterns)
    .describe('The patterns, data[μ][i], written in the chosen coding (pm1: −1/+1, binary: 0/1); every row has `neurons` entries. `patterns` (or `load`) may select the first P rows; default: all rows.')
}).describe('Patterns supplied by the user.')

const family = z.discriminatedUnion('kind', [randomFamily, correlatedFamily, suppliedFamily])
  .prefault({ kind: 'random' })
  .describe('How the stored patterns are drawn. Default: { "kind": "random", "activity": 0.5 }.')

/**
 * The learning rules, with numeric fields built by `number` (an axis-capable field at the top
 * level, a plain number inside a value of a rule axis) and the self-coupling flag given.
 */
function ruleVariants<N extends z.ZodType, C extends z.ZodType> (number: (path: VariedPath, description: string) => N, coupling: C) {
  const plainRule = (kind: 'hebbian' | 'pseudo-inverse' | 'storkey' | 'clipped', description: string) =>
    z.strictObject({ kind: z.literal(kind), selfCoupling: coupling }).describe(description)
  return z.discriminatedUnion('kind', [
    plainRule('hebbian', 'Hebbian outer-product rule (Hopfield 1982).'),
    plainRule('pseudo-inverse', 'Projection (pseudo-inverse) rule (Personnaz, Guyon & Dreyfus 1985).'),
    plainRule('storkey', 'Storkey (1997) incremental rule.'),
    z.strictObject({
      kind: z.literal('covariance'),
      selfCoupling: coupling,
      threshold: number('rule.threshold', 'Uniform firing threshold θ in units of the local field; null uses the engine\'s activity-dependent default. Default: null.')
        .nullable().default(SPEC_DEFAULTS.covarianceThreshold)
    }).describe('Covariance rule for biased (sparse) patterns (Tsodyks & Feigel\'man 1988).'),
    plainRule('clipped', 'Clipped Hebbian synapses J_ij = (√P/N) sign(Σ_μ ξ_i^μ ξ_j^μ), zero when the sum is 0 (Sompolinsky 1986).'),
    z.strictObject({
      kind: z.literal('dense-polynomial'),
      degree: number('rule.degree', 'Degree n of the interaction F(x) = xⁿ, an integer in [2, 30]; n = 2 runs the Hebbian network. Required.')
    }).describe('Dense associative memory with energy −Σ_μ (ξ^μ·σ)ⁿ (Krotov & Hopfield 2016); ±1 neurons, no dilution.'),
    z.strictObject({ kind: z.literal('dense-exponential') })
      .describe('Dense associative memory with energy −Σ_μ exp(ξ^μ·σ) (Demircigil et al. 2017); ±1 neurons, no dilution, temperature 0.'),
    z.strictObject({
      kind: z.literal('modern-softmax'),
      beta: number('rule.beta', 'Inverse temperature β > 0 of the softmax update; the patterns have unit length. Required.')
    }).describe('Modern continuous Hopfield network ξ ← X softmax(β Xᵀξ) (Ramsauer et al. 2021): continuous state, parallel updates (dynamics.update does not apply), temperature 0.')
  ])
}

const ruleAxis = z.strictObject({
  values: z.array(ruleVariants(constant, selfCouplingFlag)).min(1).max(SPEC_CEILINGS.ruleValues)
    .describe('The rules to compare, each a rule object as above with plain numbers for its parameters (no axes inside), distinct, in the order given.')
}).describe('An axis of learning rules: every point runs once with each rule, e.g. { "values": [{ "kind": "hebbian" }, { "kind": "storkey" }, { "kind": "pseudo-inverse" }] }.')

const rule = z.union([ruleVariants(varied, selfCoupling), ruleAxis]).prefault({ kind: 'hebbian' })
  .describe('Learning rule that turns the patterns into couplings, or an axis of rules ({ "values": [rule, …] }). Default: { "kind": "hebbian", "selfCoupling": false }.')

const randomDilution = z.strictObject({
  kind: z.literal('random').optional()
    .describe('Optional; random is the only dilution without a kind (the normalised form leaves it out).'),
  keep: varied('dilution.keep', 'Fraction of couplings kept, in (0, 1]. Required.'),
  symmetric: z.boolean().default(SPEC_DEFAULTS.dilutionSymmetric)
    .describe('Cut J_ij and J_ji together (true) or independently (false). Default: true.')
}).describe('Each coupling kept with probability keep, survivors divided by keep.')

const inDegreeDilution = z.strictObject({
  kind: z.literal('fixed-in-degree'),
  inDegree: varied('dilution.inDegree', 'K, the inputs of every neuron (distinct other neurons, drawn independently per neuron), in [1, N − 1]; the load that matters is P/K (give it as `inDegreeLoad` to hold it fixed while K varies). Required.')
}).describe('Extremely diluted asymmetric network (Derrida, Gardner & Zippelius 1987): hebbian or clipped rule, ±1 neurons, no self-coupling; held as adjacency lists.')

const dilution = z.discriminatedUnion('kind', [randomDilution, inDegreeDilution]).nullable().default(null)
  .describe('Dilution of the couplings. Default: null (fully connected).')

const cueFraction = (description: string) =>
  varied('cue.fraction', `${description} Default: ${SPEC_DEFAULTS.cueFraction}.`).default(SPEC_DEFAULTS.cueFraction)

const cue = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('flip'), fraction: cueFraction('Fraction of neurons flipped (exactly round(fraction·N) distinct ones).') })
    .describe('The target pattern with some bits flipped.'),
  z.strictObject({
    kind: z.literal('erase'),
    fraction: cueFraction('Fraction of neurons erased (exactly round(fraction·N) distinct ones).'),
    fill: z.enum(['zero', 'random']).default(SPEC_DEFAULTS.eraseFill)
      .describe('Erased neurons are set to 0 (neutral) or to fresh random values. Default: zero.')
  }).describe('The target pattern with part of it erased.'),
  z.strictObject({ kind: z.literal('random') }).describe('A uniformly random state, unrelated to any pattern.'),
  z.strictObject({
    kind: z.literal('mixture'),
    components: varied('cue.components', `Number of consecutive stored patterns, from the target on, whose sign-mixture is the cue. Default: ${SPEC_DEFAULTS.mixtureComponents}.`)
      .default(SPEC_DEFAULTS.mixtureComponents)
  }).describe('A mixture of several stored patterns.')
]).prefault({ kind: 'flip' })
  .describe(`Initial state of each trial. Default: { "kind": "flip", "fraction": ${SPEC_DEFAULTS.cueFraction} }.`)

const dynamics = z.strictObject({
  update: z.enum(['async-random', 'async-sequential', 'sync']).default(SPEC_DEFAULTS.update)
    .describe('async-random: one neuron at a time, fresh random order each sweep; async-sequential: index order; sync: all at once. Default: async-random.'),
  temperature: varied('dynamics.temperature', 'Temperature T ≥ 0; 0 is deterministic, T > 0 is Glauber dynamics. Default: 0.')
    .default(SPEC_DEFAULTS.temperature),
  maxSweeps: varied('dynamics.maxSweeps', `Upper bound on sweeps (sync: steps); at T > 0 the number of sweeps run. Default: ${SPEC_DEFAULTS.maxSweeps}.`)
    .default(SPEC_DEFAULTS.maxSweeps),
  burnIn: varied('dynamics.burnIn', 'T > 0: sweeps discarded before time averages start. Default: 0.')
    .default(SPEC_DEFAULTS.burnIn)
}).prefault({}).describe('Retrieval dynamics.')

const measures = z.strictObject({
  overlapTrajectory: z.boolean().default(false).describe('Record the target overlap after every sweep. Default: false.'),
  energyTrajectory: z.boolean().default(false).describe('Record the energy per neuron after every sweep. Default: false.'),
  stability: z.boolean().default(false).describe('Measure the one-step stability of every stored pattern, once per network. Default: false.'),
  patternOverlaps: z.boolean().default(SPEC_DEFAULTS.patternOverlaps).describe('Measure the overlaps between the stored patterns of every network (mean, mean |C|, rms, largest |C| over all pairs, beside what the pattern family implies); costs O(N·P²/2) per network. Default: false.')
}).prefault({}).describe('Optional extra measurements.')

export const SweepSpecSchema = z.strictObject({
  version: z.literal(SPEC_FORMAT_VERSIONS, { error: `expected a spec format version: ${SPEC_FORMAT_VERSIONS.join(' or ')}` }).default(SPEC_FORMAT_VERSION)
    .describe(`Spec format version: ${SPEC_FORMAT_VERSIONS.join(' or ')}. Version 1 classifies end states with the pattern level 0.9 whatever the success threshold; version 2 uses the success threshold. Default: ${SPEC_FORMAT_VERSION}.`),
  label: z.string().max(SPEC_CEILINGS.labelLength).nullable().default(null)
    .describe('Free text to recognise the sweep by; not part of the work, so not part of the spec hash. Default: null.'),
  seed: z.int().min(0).default(SPEC_DEFAULTS.seed)
    .describe('Master seed; with the rest of the spec it fixes every random draw. Default: 1.'),
  neurons: varied('neurons', 'N, the number of neurons. Required unless the patterns are supplied (then it is their length).').optional(),
  patterns: varied('patterns', 'P, the number of stored patterns. Give exactly one of patterns and load (supplied patterns: at most one; default all rows).').optional(),
  load: varied('load', 'Load α = P/N; each point stores P = round(α·N) patterns. Give exactly one of patterns, load and inDegreeLoad.').optional(),
  inDegreeLoad: varied('inDegreeLoad', 'Load per input α_K = P/K under a fixed in-degree dilution: each point stores P = round(α_K·K) patterns, so an axis of K holds P/K fixed. Give exactly one of patterns, load and inDegreeLoad.').optional(),
  coding: z.enum(['pm1', 'binary']).default(SPEC_DEFAULTS.coding)
    .describe('Neuron values: pm1 (−1/+1) or binary (0/1). Default: pm1.'),
  family,
  rule,
  dilution,
  cue,
  dynamics,
  measures,
  successThreshold: varied('successThreshold', `A trial succeeds when its final target overlap is at least this. Default: ${SPEC_DEFAULTS.successThreshold}.`)
    .default(SPEC_DEFAULTS.successThreshold),
  trials: z.int().min(1).max(SPEC_CEILINGS.trials).default(SPEC_DEFAULTS.trials)
    .describe(`Trials (recall attempts) per grid point; with an analysis, per evaluated value of the searched parameter. Default: ${SPEC_DEFAULTS.trials}.`),
  trialsPerNetwork: varied('trialsPerNetwork', 'Consecutive trials that share one network (pattern set and couplings); 1 draws a new network for every trial. Default: 1.')
    .default(SPEC_DEFAULTS.trialsPerNetwork),
  streams: z.enum(['keyed', 'canonical']).default(SPEC_DEFAULTS.streams)
    .describe('Random streams. keyed: a stream per network and per trial, keyed by the seed and the point\'s parameters (any trial re-runs alone; chunks run in parallel). canonical: one xoshiro256** stream seeded from `seed` through SplitMix64, drawn through the points in grid order and their trials in order, exactly as the shared benchmark\'s reference programs draw (docs/canonical-stream.md); the sweep runs as one sequential chunk. Default: keyed.'),
  analysis: analysisSchema(VARIED_PARAMETERS).optional(),
  precision: z.strictObject({
    measure: z.enum(['success', 'overlap'])
      .describe('The measure whose 95 % interval must be narrow enough: success (the recall success rate, Wilson interval) or overlap (the mean final overlap, mean ± 1.96·se).'),
    halfWidth: z.number().gt(0).lt(1)
      .describe('Target half-width of that 95 % interval: a point stops taking trial blocks once its interval is this narrow.'),
    block: z.int().min(10).max(SPEC_CEILINGS.trials)
      .describe('Trials per block: every point runs this many, then more blocks of the same size until it meets the target or reaches `trials` (the ceiling).')
  }).optional()
    .describe('Precision targets: instead of a fixed number of trials per point, blocks of trials until each point\'s 95 % interval is narrow enough, at most `trials`. Results say per point how many trials it took and whether it met the target. Absent: every point runs `trials` trials.')
}).meta({
  id: 'SweepSpec',
  title: 'Sweep spec',
  description: 'A sweep: a network model, a cue and dynamics, and the parameters to vary. Any numeric parameter may be a number or an axis ({ values } | { from, to, step } | { from, to, count, scale }); several axes form a grid (Cartesian product, axes in canonical order, first slowest).'
})

/** A spec as a client may write it. */
export type SweepSpecInput = z.input<typeof SweepSpecSchema>
/** A spec after zod parsing (defaults filled, axes not yet expanded). */
export type ParsedSpec = z.output<typeof SweepSpecSchema>
