/**
 * One vocabulary (src/results/vocabulary.ts): the glossary and the data dictionary are
 * generated from it and must match the files in docs/; every column the service writes (point,
 * trial, trajectory, search tables of sweeps with every optional measure) and every JSON field
 * of a result row is a term of it; the page and the figures call each parameter by its label.
 * Spec fields, the paths of spec errors, the CLI's parameter names and the measures' names on
 * the page and in figures are glossary terms too. Scenario: place-cell rooms.
 */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { resultTable, trajectoryTable } from '../../src/results/index.js'
import { VOCABULARY, parameterLabel, termOf } from '../../src/results/vocabulary.js'
import { dataDictionaryMarkdown, glossaryMarkdown } from '../../src/results/vocabulary-docs.js'
import { normaliseSpec, SpecValidationError, VARIED_PARAMETERS } from '../../src/spec/index.js'
import { FIGURE_MEASURES } from '../../src/figures/index.js'
import { measureShortName, parameterShortName, parameterSymbol } from '../../src/figures/labels.js'
import { MEASURES, parameterName } from '../../web/src/labels.js'
import { parseAddition } from '../../src/cli/commands/workflow.js'
import { runSweep } from '../figures/helpers.js'

const doc = (path: string): string => readFileSync(new URL(`../../${path}`, import.meta.url), 'utf8')

describe('the vocabulary', () => {
  it('generates docs/glossary.md and docs/data-dictionary.md as they are on disk (npm run vocabulary:generate)', () => {
    expect(doc('docs/glossary.md')).toBe(glossaryMarkdown())
    expect(doc('docs/data-dictionary.md')).toBe(dataDictionaryMarkdown())
  })

  it('has one name and one label per concept', () => {
    const names = VOCABULARY.map((term) => term.name)
    expect(new Set(names).size).toBe(names.length)
    const labels = VOCABULARY.filter((term) => term.group === 'parameter' || term.group === 'derived').map((term) => term.label)
    expect(new Set(labels).size).toBe(labels.length)
  })

  it('names every column of every table the service writes, and every member of a JSON row', () => {
    const warm = runSweep({ neurons: 60, load: { values: [0.05, 0.1] }, cue: { kind: 'mixture', components: 3 }, dynamics: { temperature: 0.2, maxSweeps: 8 }, measures: { stability: true, patternOverlaps: true, overlapTrajectory: true, energyTrajectory: true }, trials: 3, trialsPerNetwork: 3 })
    const search = runSweep({ seed: 5, neurons: 60, cue: { kind: 'flip', fraction: 0.05 }, dynamics: { maxSweeps: 30 }, trials: 20, analysis: { kind: 'threshold', parameter: 'load', from: 0.05, to: 0.4, maxSteps: 4 } })
    const columns = new Set([
      ...resultTable(warm, { perTrial: false }).header, ...resultTable(warm, { perTrial: true }).header, ...trajectoryTable(warm).header,
      ...resultTable(search, { perTrial: false }).header, ...resultTable(search, { perTrial: true }).header
    ])
    expect(columns.size).toBeGreaterThan(150)
    expect([...columns].filter((name) => termOf(name) === undefined)).toEqual([])
    // JSON: a row's summary members and the trial records' members are the same names.
    const summary = Object.keys(warm.rows[0]!.summary).filter((key) => !['overlapTrajectory', 'energyTrajectory', 'patternOverlaps', 'stability', 'success', 'endings'].includes(key))
    const unnamed = summary.filter((key) => VOCABULARY.every((term) => term.name !== key && !term.name.startsWith(`${key}.`)))
    expect(unnamed).toEqual([])
    const trialKeys = Object.keys(warm.trials[0]![0]!).filter((key) => !['overlapTrajectory', 'energyTrajectory', 'stability', 'endStateShares'].includes(key))
    expect(trialKeys.filter((key) => VOCABULARY.every((term) => term.name !== key && !term.name.startsWith(`${key}.`)))).toEqual([])
  })

  it('gives the page and the figures the glossary\'s label of every parameter (cue noise has one name)', () => {
    for (const { path } of VARIED_PARAMETERS) {
      expect(parameterName(path), path).toBe(parameterLabel(path))
      expect(parameterShortName(path), path).toBe(parameterLabel(path))
    }
    expect(parameterLabel('cue.fraction')).toBe('cue noise f')
  })

  it('gives the figures the glossary\'s symbol of every parameter that has one (q for the success threshold)', () => {
    for (const { path } of VARIED_PARAMETERS) {
      const symbol = termOf(path)!.symbol
      if (symbol !== '') expect(parameterSymbol(path).replace(/_\{(\w+)\}/g, '_$1'), path).toBe(symbol)
    }
    expect(parameterSymbol('successThreshold')).toBe('q')
  })
})

/** Every field path of the spec as the OpenAPI document describes it (axis members and array items included). */
function specFieldPaths (): string[] {
  const document = JSON.parse(doc('openapi/openapi.json')) as { components: { schemas: Record<string, unknown> } }
  const schemas = document.components.schemas
  const paths = new Set<string>()
  const walk = (schema: any, path: string, depth: number): void => {
    if (schema === undefined || schema === null || depth > 16) return
    if (typeof schema.$ref === 'string') return walk(schemas[schema.$ref.split('/').pop()], path, depth + 1)
    for (const key of ['anyOf', 'oneOf', 'allOf']) for (const member of schema[key] ?? []) walk(member, path, depth + 1)
    if (schema.items !== undefined) walk(schema.items, path, depth + 1)
    for (const [name, member] of Object.entries(schema.properties ?? {})) walk(member, path === '' ? name : `${path}.${name}`, depth + 1)
    if (schema.properties === undefined && schema.items === undefined && path !== '') paths.add(path)
  }
  walk(schemas.SweepSpecInput, '', 0)
  return [...paths]
}

/**
 * The glossary term a spec field or error path belongs to. Rules: array indices go (family.data.3.17
 * is family.data); an axis's members (from, to, step, count, scale, values) belong to its parameter;
 * a rule axis's members (rule.values.degree) to the rule's; the string shorthand `dilution` is
 * dilution.kind; and a search setting that is also a search-table column is named as the column
 * (analysis.level is `level`).
 */
function specTerm (path: string): string | undefined {
  let name = path.split('.').filter((part) => !/^\d+$/.test(part)).join('.')
  name = name.replace(/^rule\.values\./, 'rule.').replace(/^rule\.values$/, 'rule.kind')
  const axis = /^(.+)\.(from|to|step|count|scale|values)$/.exec(name)
  if (axis !== null && termOf(axis[1]!)?.group === 'parameter') name = axis[1]!
  if (name === 'dilution' || name === 'rule' || name === 'cue' || name === 'family') name = `${name}.kind`
  if (name === 'analysis' || name === 'precision' || name === 'measures') name = `${name}.${name === 'analysis' ? 'kind' : name === 'precision' ? 'measure' : 'stability'}`
  if (name === 'analysis.scaling') name = 'analysis.scaling.form'
  const column = /^analysis\.(\w+)$/.exec(name)
  if (column !== null && termOf(column[1]!)?.group === 'search') name = column[1]!
  return termOf(name) === undefined ? undefined : name
}

describe('the vocabulary outside the tables', () => {
  it('names every field of the spec', () => {
    const paths = specFieldPaths()
    expect(paths.length).toBeGreaterThan(100)
    expect(paths.filter((path) => specTerm(path) === undefined)).toEqual([])
  })

  it('names every field an invalid spec is refused for (the paths of 422 problems)', () => {
    const base = { label: 'rooms', neurons: 200, load: 0.1, trials: 10 }
    const invalid: unknown[] = [
      {}, { ...base, neurons: -3 }, { ...base, load: { from: 0.1, to: 0.2, step: 0 } }, { ...base, patterns: 5 },
      { ...base, cue: { kind: 'flip', fraction: 1.5 } }, { ...base, cue: { kind: 'mixture', components: 0 } }, { ...base, cue: { kind: 'erase', fraction: 0.1, fill: 'maybe' } },
      { ...base, dynamics: { update: 'sideways', temperature: -1, maxSweeps: 0, burnIn: -2 } }, { ...base, rule: { kind: 'dense-polynomial', degree: 0.5 } },
      { ...base, rule: { kind: 'modern-softmax', beta: -1 } }, { ...base, rule: { kind: 'covariance', threshold: 'x' } }, { ...base, rule: { values: [{ kind: 'hebbian' }, { kind: 'nonsense' }] } },
      { ...base, dilution: { kind: 'random', keep: 2, symmetric: 'yes' } }, { ...base, dilution: { kind: 'fixed-in-degree', inDegree: 0 } }, { ...base, inDegreeLoad: 0.1 },
      { ...base, family: { kind: 'correlated', parents: 0, parentOverlap: 3 } }, { ...base, family: { kind: 'random', activity: 1.2 } }, { ...base, family: { kind: 'supplied', data: [[1, 2]] } },
      { ...base, coding: 'ternary', successThreshold: 2, trialsPerNetwork: 0, streams: 'river', seed: -1, version: 9 },
      { ...base, measures: { stability: 'yes', overlapTrajectory: 1, energyTrajectory: null, patternOverlaps: 'no' } },
      { ...base, precision: { measure: 'energy', halfWidth: -1, block: 0 } }, { ...base, trials: 100, precision: { measure: 'success', halfWidth: 0.05, block: 1000 } },
      { ...base, load: undefined, analysis: { kind: 'threshold', parameter: 'load', from: 0.3, to: 0.1, level: 2, direction: 'up', maxSteps: 1, tolerance: -1, confidence: 2, measure: 'x', scaling: { form: 'cubic' } } },
      { ...base, load: undefined, neurons: { values: [100, 200, 400] }, analysis: { kind: 'threshold', parameter: 'load', from: 0.05, to: 0.3, scaling: { form: 'power', exponent: 9 } } },
      { ...base, label: 7, extra: true }
    ]
    const paths = new Set<string>()
    for (const input of invalid) {
      try {
        normaliseSpec(input)
      } catch (error) {
        if (!(error instanceof SpecValidationError)) throw error
        for (const issue of error.issues) if (issue.path !== '') paths.add(issue.path)
        continue
      }
      throw new Error(`expected a refusal: ${JSON.stringify(input)}`)
    }
    expect(paths.size).toBeGreaterThan(40)
    // An unknown field is refused under its own (unknown) name: that name is the user's, not ours.
    expect([...paths].filter((path) => path !== 'extra' && specTerm(path) === undefined)).toEqual([])
  })

  it('takes the glossary\'s parameter names on the command line (memsweep extend --add)', () => {
    expect(parseAddition('load=0.13,0.15')).toEqual(['load=0.13,0.15'])
    expect(parseAddition('cue.fraction=0.2')).toEqual(['cue.fraction=0.2'])
    expect(() => parseAddition('cueNoise=0.2')).toThrow(/not a parameter.*cue\.fraction.*docs\/glossary\.md/)
    for (const { path } of VARIED_PARAMETERS) expect(termOf(path)?.group, path).toBe('parameter')
  })

  it('calls every measure by its glossary label on the page and in figures', () => {
    const termOfMeasure: Record<string, string | null> = {
      success: 'success.rate',
      overlap: 'overlap.mean',
      sweeps: 'sweeps.mean',
      maxOtherOverlap: 'maxOtherOverlap.mean',
      energy: 'energy.mean',
      unstableFraction: 'stability.unstableFraction',
      fixedPatternFraction: 'stability.fixedPatternFraction',
      // Named per end-state class ("Trials ending in the cued pattern"), see docs/end-states.md.
      endState: null,
      // One term covers the four statistics of the stored-pattern overlaps; figures name the statistic.
      patternOverlapMeanAbs: null,
      patternOverlapMaxAbs: null
    }
    expect(Object.keys(termOfMeasure).sort()).toEqual([...FIGURE_MEASURES].sort())
    for (const measure of FIGURE_MEASURES) {
      const name = termOfMeasure[measure]
      if (name === null || name === undefined) continue
      const label = termOf(name)!.label
      expect(measureShortName(measure, 'target').toLowerCase(), measure).toBe(label)
      const onPage = MEASURES.find((entry) => entry.value === measure)
      if (onPage !== undefined) expect(onPage.name, measure).toBe(label)
    }
  })
})
