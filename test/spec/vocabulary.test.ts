/**
 * One vocabulary (src/results/vocabulary.ts): the glossary and the data dictionary are
 * generated from it and must match the files in docs/; every column the service writes (point,
 * trial, trajectory, search tables of sweeps with every optional measure) and every JSON field
 * of a result row is a term of it; the page and the figures call each parameter by its label.
 * Scenario: place-cell rooms.
 */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { resultTable, trajectoryTable } from '../../src/results/index.js'
import { VOCABULARY, parameterLabel, termOf } from '../../src/results/vocabulary.js'
import { dataDictionaryMarkdown, glossaryMarkdown } from '../../src/results/vocabulary-docs.js'
import { VARIED_PARAMETERS } from '../../src/spec/index.js'
import { parameterShortName } from '../../src/figures/labels.js'
import { parameterName } from '../../web/src/labels.js'
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
})
