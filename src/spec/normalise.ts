/**
 * normaliseSpec: user input → NormalisedSpec, or a SpecValidationError listing every
 * problem found. Steps: presence rules on the raw input, zod (field-level rules, axis
 * expansion checks), the normalised form, supplied-pattern checks, the grid-size ceiling,
 * then the engine's own checks on every grid point (reported once per field).
 */
import { checkPointParams, EngineInputError, type PointParams } from '../engine/index.js'
import { normaliseVaried, type AxisInput, type Varied } from './axis.js'
import { sortKeysDeep } from './canonical.js'
import { SpecValidationError, type SpecIssue } from './errors.js'
import { analysisIssues, normaliseAnalysis, pointsToCheck, searchesLoad } from './analysis/normalise.js'
import { ruleLabel, type AxisValue } from './categorical.js'
import { countPoints, gridAxes } from './grid.js'
import { issuesFromZod, uniqueIssues } from './issues.js'
import { domainOf, SPEC_CEILINGS, SweepSpecSchema, type ParsedSpec, type VariedPath } from './schema.js'
import type { ConstantRule, NormalisedCue, NormalisedFamily, NormalisedRule, NormalisedSpec } from './types.js'

/** Most issues reported about the entries of supplied patterns; the rest are counted. */
const MAX_DATA_ISSUES = 20

/**
 * Most issues a SpecValidationError lists; it counts the rest (`omitted`). Only supplied
 * data can hold more bad entries than this, and screenSuppliedData keeps those from zod.
 */
export const MAX_SPEC_ISSUES = 100

// MAIN //

/**
 * Validates a sweep spec and returns its normalised form.
 *
 * @throws {SpecValidationError} listing every offending field path with the reason.
 */
export function normaliseSpec (input: unknown): NormalisedSpec {
  const presence = presenceIssues(input)
  const screened = screenSuppliedData(input)
  if (screened !== null) {
    const rest = SweepSpecSchema.safeParse(screened.withoutData)
    fail([...presence, ...(rest.success ? [] : issuesFromZod(rest.error.issues)), ...screened.issues], screened.omitted)
  }
  const parsed = SweepSpecSchema.safeParse(input)
  if (!parsed.success) fail([...presence, ...issuesFromZod(parsed.error.issues)])
  if (presence.length > 0) fail(presence)

  const spec = buildNormalised(parsed.data)
  const supplied = [...suppliedIssues(spec, parsed.data), ...crossFieldIssues(spec), ...analysisIssues(spec), ...precisionIssues(spec)]
  if (supplied.length > 0) fail(supplied)

  const points = countPoints(spec)
  if (points > SPEC_CEILINGS.points) {
    const shape = gridAxes(spec).map((axis) => `${axis.path} ${axis.values.length}`).join(' × ')
    fail([{ path: '', message: `the grid has ${points} points (${shape}); a sweep may have at most ${SPEC_CEILINGS.points}` }])
  }
  const pointIssues = checkEveryPoint(spec, points)
  if (pointIssues.length > 0) fail(pointIssues)
  return spec
}

function fail (issues: SpecIssue[], omitted = 0): never {
  const unique = uniqueIssues(issues)
  const listed = unique.slice(0, MAX_SPEC_ISSUES)
  throw new SpecValidationError(listed, omitted + unique.length - listed.length)
}

/**
 * Supplied data may hold hundreds of thousands of entries, and zod builds an issue for each
 * bad one: a body of nothing but `{}` entries costs about half a second and megabytes of
 * issues. This pass over the raw rows only looks at types. With more bad entries or rows
 * than a SpecValidationError lists, it reports the first ones and counts the rest, and zod
 * checks the spec with stand-in data instead; otherwise it returns null and zod judges all.
 */
function screenSuppliedData (input: unknown): { issues: SpecIssue[], omitted: number, withoutData: Record<string, unknown> } | null {
  if (!isRecord(input) || !isRecord(input.family) || input.family.kind !== 'supplied' || !Array.isArray(input.family.data)) return null
  const issues: SpecIssue[] = []
  let bad = 0
  const report = (path: string, message: string) => {
    if (++bad <= MAX_SPEC_ISSUES) issues.push({ path, message })
  }
  const rows: unknown[] = input.family.data
  for (let mu = 0; mu < rows.length; mu++) {
    const row = rows[mu]
    if (!Array.isArray(row)) {
      report(`family.data.${mu}`, `expected an array (one pattern), received ${typeName(row)}`)
      continue
    }
    for (let i = 0; i < row.length; i++) {
      if (typeof row[i] !== 'number') report(`family.data.${mu}.${i}`, `expected a number, received ${typeName(row[i])}`)
    }
  }
  if (bad <= MAX_SPEC_ISSUES) return null
  return { issues, omitted: bad - issues.length, withoutData: { ...input, family: { ...input.family, data: [[1]] } } }
}

function typeName (value: unknown): string {
  return value === null ? 'null' : Array.isArray(value) ? 'array' : typeof value
}

function isRecord (value: unknown): value is Record<string, unknown> {
  return value !== null && typeof value === 'object' && !Array.isArray(value)
}

/** The members that set the number of stored patterns; exactly one is given (supplied patterns: at most one). */
const PATTERN_COUNT_FIELDS = ['patterns', 'load', 'inDegreeLoad'] as const

/** Which of neurons / patterns / load must be present depends on the pattern family, so zod alone cannot say. */
function presenceIssues (input: unknown): SpecIssue[] {
  if (!isRecord(input)) return []
  const supplied = isRecord(input.family) && input.family.kind === 'supplied'
  const has = (key: string) => input[key] !== undefined
  const issues: SpecIssue[] = []
  if (!has('neurons') && !supplied) issues.push({ path: 'neurons', message: 'required (the network size N), unless the patterns are supplied' })
  const counts = PATTERN_COUNT_FIELDS.filter(has)
  if (searchesLoad(input)) {
    const message = 'the analysis searches the load: leave out patterns, load and inDegreeLoad (the range is analysis.from … analysis.to)'
    for (const key of counts) issues.push({ path: key, message })
  } else if (counts.length > 1) {
    const message = `give one of patterns (a count), load (α = P/N) and inDegreeLoad (α_K = P/K), not ${counts.join(' and ')}`
    for (const key of counts) issues.push({ path: key, message })
  } else if (counts.length === 0 && !supplied) {
    issues.push({ path: 'patterns', message: 'required: give patterns (P, a count), load (α = P/N) or, with a fixed in-degree, inDegreeLoad (α_K = P/K)' })
  }
  return issues
}

function varied (path: VariedPath, value: number | AxisInput): Varied {
  return normaliseVaried(value, domainOf(path))
}

function buildNormalised (p: ParsedSpec): NormalisedSpec {
  const f = p.family
  const family: NormalisedFamily = f.kind === 'random'
    ? { kind: 'random', activity: varied('family.activity', f.activity) }
    : f.kind === 'correlated'
      ? { kind: 'correlated', parents: varied('family.parents', f.parents), parentOverlap: varied('family.parentOverlap', f.parentOverlap) }
      : { kind: 'supplied', data: f.data.map((row) => row.map((v) => (v === 0 ? 0 : v))) }
  const rule = normaliseRule(p.rule)
  const c = p.cue
  const cue: NormalisedCue = c.kind === 'flip'
    ? { kind: 'flip', fraction: varied('cue.fraction', c.fraction) }
    : c.kind === 'erase'
      ? { kind: 'erase', fraction: varied('cue.fraction', c.fraction), fill: c.fill }
      : c.kind === 'mixture' ? { kind: 'mixture', components: varied('cue.components', c.components) } : { kind: 'random' }

  const suppliedRows = f.kind === 'supplied' ? f.data : null
  const neurons = p.neurons !== undefined ? varied('neurons', p.neurons) : (suppliedRows?.[0]?.length ?? 0)
  const spec: NormalisedSpec = {
    version: p.version,
    label: p.label,
    seed: p.seed,
    neurons,
    coding: p.coding,
    family,
    rule,
    dilution: p.dilution === null
      ? null
      : p.dilution.kind === 'fixed-in-degree'
        ? { kind: 'fixed-in-degree', inDegree: varied('dilution.inDegree', p.dilution.inDegree) }
        : { keep: varied('dilution.keep', p.dilution.keep), symmetric: p.dilution.symmetric },
    cue,
    dynamics: {
      update: p.dynamics.update,
      temperature: varied('dynamics.temperature', p.dynamics.temperature),
      maxSweeps: varied('dynamics.maxSweeps', p.dynamics.maxSweeps),
      burnIn: varied('dynamics.burnIn', p.dynamics.burnIn)
    },
    // Members added in format 2 are written only when not at their default, so a version 1
    // spec normalises exactly as before and keeps its hash.
    measures: {
      energyTrajectory: p.measures.energyTrajectory,
      overlapTrajectory: p.measures.overlapTrajectory,
      stability: p.measures.stability,
      ...(p.measures.patternOverlaps ? { patternOverlaps: true as const } : {})
    },
    successThreshold: varied('successThreshold', p.successThreshold),
    trials: p.trials,
    trialsPerNetwork: varied('trialsPerNetwork', p.trialsPerNetwork)
  }
  if (p.streams === 'canonical') spec.streams = 'canonical'
  if (p.patterns !== undefined) spec.patterns = varied('patterns', p.patterns)
  else if (p.load !== undefined) spec.load = varied('load', p.load)
  else if (p.inDegreeLoad !== undefined) spec.inDegreeLoad = varied('inDegreeLoad', p.inDegreeLoad)
  else if (suppliedRows !== null) spec.patterns = suppliedRows.length
  if (p.analysis !== undefined) spec.analysis = normaliseAnalysis(p.analysis)
  if (p.precision !== undefined) spec.precision = { ...p.precision }
  return sortKeysDeep(spec)
}

function normaliseRule (r: ParsedSpec['rule']): NormalisedRule {
  if ('values' in r) return { values: r.values.map((entry) => ({ ...entry }) as ConstantRule) }
  const coupling = (flag: boolean | { values: boolean[] }): boolean | { values: boolean[] } => typeof flag === 'boolean' ? flag : { values: [...flag.values] }
  switch (r.kind) {
    case 'covariance': return { kind: 'covariance', selfCoupling: coupling(r.selfCoupling), threshold: r.threshold === null ? null : varied('rule.threshold', r.threshold) }
    case 'dense-polynomial': return { kind: r.kind, degree: varied('rule.degree', r.degree) }
    case 'dense-exponential': return { kind: r.kind }
    case 'modern-softmax': return { kind: r.kind, beta: varied('rule.beta', r.beta) }
    default: return { kind: r.kind, selfCoupling: coupling(r.selfCoupling) }
  }
}

/** Precision targets run blocks of a grid point's trials: not with a threshold search, and a block fits within the ceiling. */
function precisionIssues (spec: NormalisedSpec): SpecIssue[] {
  if (spec.precision === undefined) return []
  if (spec.analysis !== undefined) return [{ path: 'precision', message: 'a threshold search sets its own trials per step: precision targets apply to grid sweeps only' }]
  if (spec.streams === 'canonical') return [{ path: 'precision', message: 'the canonical stream draws every trial of every point in one fixed order, so trials cannot be added point by point: precision targets need keyed streams' }]
  if (spec.precision.block > spec.trials) return [{ path: 'precision.block', message: `a block of ${spec.precision.block} trials does not fit the ceiling of ${spec.trials} trials per point (trials)` }]
  return []
}

/** Rules of a rule axis and flags of a self-coupling axis are distinct; inDegreeLoad needs K; canonical streams run grids. */
function crossFieldIssues (spec: NormalisedSpec): SpecIssue[] {
  const issues: SpecIssue[] = []
  const rule = spec.rule
  if ('values' in rule) {
    const labels = rule.values.map(ruleLabel)
    const repeated = labels.find((label, i) => labels.indexOf(label) !== i)
    if (repeated !== undefined) issues.push({ path: 'rule.values', message: `the rules of an axis must be distinct; ${repeated} appears more than once` })
  } else if ('selfCoupling' in rule && typeof rule.selfCoupling === 'object') {
    const flags = rule.selfCoupling.values
    if (new Set(flags).size !== flags.length) issues.push({ path: 'rule.selfCoupling.values', message: 'axis values must be distinct' })
  }
  if (spec.inDegreeLoad !== undefined && (spec.dilution === null || !('inDegree' in spec.dilution))) {
    issues.push({ path: 'inDegreeLoad', message: 'the load per input P/K needs a fixed in-degree dilution ({ "kind": "fixed-in-degree", "inDegree": K }); use load for P/N' })
  }
  if (spec.streams === 'canonical' && spec.analysis !== undefined) {
    issues.push({ path: 'streams', message: 'canonical streams run grid sweeps only; a threshold search draws each step from a stream of its own' })
  }
  return issues
}

/** Supplied patterns: one length for every row, matching `neurons`; entries in the coding; enough rows for `patterns`. */
function suppliedIssues (spec: NormalisedSpec, parsed: ParsedSpec): SpecIssue[] {
  if (spec.family.kind !== 'supplied') return []
  const data = spec.family.data
  const issues: SpecIssue[] = []
  const width = data[0]!.length
  if (parsed.neurons !== undefined) {
    if (typeof spec.neurons !== 'number') {
      issues.push({ path: 'neurons', message: 'with supplied patterns the network size is their length and cannot vary' })
    } else if (spec.neurons !== width) {
      issues.push({ path: 'neurons', message: `is ${spec.neurons} but the supplied patterns have ${width} entries` })
    }
  }
  const allowed = spec.coding === 'binary' ? [0, 1] : [-1, 1]
  let reported = 0
  let unreported = 0
  const report = (issue: SpecIssue) => {
    if (reported < MAX_DATA_ISSUES) { issues.push(issue); reported++ } else unreported++
  }
  for (let mu = 0; mu < data.length; mu++) {
    const row = data[mu]!
    if (row.length !== width) {
      report({ path: `family.data.${mu}`, message: `has ${row.length} entries but pattern 0 has ${width}; every pattern needs the same length` })
      continue
    }
    for (let i = 0; i < row.length; i++) {
      if (!allowed.includes(row[i]!)) {
        report({ path: `family.data.${mu}.${i}`, message: `${row[i]} is not a ${spec.coding} value (allowed: ${allowed.join(', ')})` })
      }
    }
  }
  if (unreported > 0) issues.push({ path: 'family.data', message: `${unreported} more entries or rows are invalid (only the first ${MAX_DATA_ISSUES} are listed)` })
  if (spec.patterns !== undefined) {
    const counts = typeof spec.patterns === 'number' ? [spec.patterns] : spec.patterns.values
    const tooMany = counts.filter((n) => n > data.length)
    if (tooMany.length > 0) issues.push({ path: 'patterns', message: `${tooMany[0]} patterns requested but only ${data.length} are supplied` })
  }
  return issues
}

interface PointProblem {
  message: string
  count: number
  first: Record<string, AxisValue>
}

/**
 * Runs the engine's checks on every grid point and reports each offending field once,
 * with how many points it affects and the first of them.
 */
function checkEveryPoint (spec: NormalisedSpec, points: number): SpecIssue[] {
  const problems = new Map<string, PointProblem>()
  const note = (path: string, message: string, values: Record<string, AxisValue>) => {
    const known = problems.get(path)
    if (known === undefined) problems.set(path, { message, count: 1, first: values })
    else known.count++
  }
  const checkedSuppliedCounts = new Set<number>()
  const searched = spec.analysis?.parameter
  for (let index = 0; index < points; index++) {
    for (const { values, params, end } of pointsToCheck(spec, index)) {
      // A search's ends are checked in place of the searched field: problems there belong to analysis.from / analysis.to.
      const pathOf = (field: string) => (end !== undefined && field === searched ? `analysis.${end}` : field)
      if (params.patterns < 1 && (spec.load !== undefined || searched === 'load')) {
        note(pathOf('load'), `load × neurons rounds to ${params.patterns} patterns; at least 1 is needed`, values)
        continue
      }
      if (params.patterns < 1 && (spec.inDegreeLoad !== undefined || searched === 'inDegreeLoad')) {
        note(pathOf('inDegreeLoad'), `inDegreeLoad × inDegree rounds to ${params.patterns} patterns; at least 1 is needed`, values)
        continue
      }
      if (params.family.kind === 'supplied' && params.patterns > params.family.data.length) {
        note('load', `round(load × neurons) = ${params.patterns} patterns, but only ${params.family.data.length} are supplied`, values)
        continue
      }
      try {
        checkPointParams(lightForCheck(params, checkedSuppliedCounts))
      } catch (error) {
        if (!(error instanceof EngineInputError)) throw error
        note(pathOf(specPathOf(error.field, spec)), reasonOf(error), values)
      }
    }
  }
  return [...problems].map(([path, problem]) => ({
    path,
    message: points > 1
      ? `${problem.message} (at ${problem.count} of ${points} grid points; first at ${describeValues(problem.first)})`
      : problem.message
  }))
}

/**
 * The engine checks supplied data entry by entry. suppliedIssues has already checked every
 * entry, so only the first point of each pattern count needs the full check; the others are
 * checked with an equivalent stand-in family so a large grid over big data stays cheap.
 * (The engine's other checks do not look at the family.)
 */
function lightForCheck (params: PointParams, checkedCounts: Set<number>): PointParams {
  if (params.family.kind !== 'supplied' || !checkedCounts.has(params.patterns)) {
    if (params.family.kind === 'supplied') checkedCounts.add(params.patterns)
    return params
  }
  return { ...params, family: { kind: 'random', activity: 0.5 } }
}

/**
 * Engine field paths are point paths; a point's `patterns` comes from `load` (or
 * `inDegreeLoad`) when the spec gives one, and a rule parameter belongs to the rule axis when
 * the rule is one.
 */
function specPathOf (field: string, spec: NormalisedSpec): string {
  if (field === 'patterns' && (spec.load !== undefined || spec.analysis?.parameter === 'load')) return 'load'
  if (field === 'patterns' && (spec.inDegreeLoad !== undefined || spec.analysis?.parameter === 'inDegreeLoad')) return 'inDegreeLoad'
  if ((field === 'rule' || field.startsWith('rule.')) && 'values' in spec.rule) return 'rule'
  return field
}

function reasonOf (error: EngineInputError): string {
  const prefix = `invalid argument. ${error.field}: `
  return error.message.startsWith(prefix) ? error.message.slice(prefix.length) : error.message
}

function describeValues (values: Record<string, AxisValue>): string {
  const parts = Object.entries(values).map(([k, v]) => `${k}=${v}`)
  return parts.length > 0 ? parts.join(', ') : 'the only point'
}
