/** CSV and JSON of the format-2 measures: column groups, the long-format trajectory series. */
import { describe, expect, it } from 'vitest'
import { END_STATES } from '../../src/engine/index.js'
import { resultToCsv, resultToJson, roundMeasure, trajectoryCsv, trajectoryJson } from '../../src/results/index.js'
import { runSweep } from '../figures/helpers.js'

const header = (csv: string): string[] => csv.split('\r\n')[0]!.split(',')
const lines = (csv: string): string[][] => csv.trimEnd().split('\r\n').map((line) => line.split(','))

describe('CSV columns of the measures that apply to some sweeps', () => {
  it('T > 0: end-state shares, the final snapshots, and their per-trial columns; none at T = 0', () => {
    const warm = runSweep({ neurons: 80, patterns: 4, dynamics: { temperature: 0.5, maxSweeps: 12, burnIn: 4 }, trials: 5, seed: 3 })
    const columns = header(resultToCsv(warm, { perTrial: false }))
    for (const state of END_STATES) {
      expect(columns).toContain(`endStateShares.${state}`)
      expect(columns).toContain(`finalEndStates.${state}`)
    }
    expect(columns).toEqual(expect.arrayContaining(['finalMaxOtherOverlap.mean', 'finalEnergy.se']))
    const [head, ...rows] = lines(resultToCsv(warm, { perTrial: false }))
    const shares = END_STATES.map((state) => Number(rows[0]![head!.indexOf(`endStateShares.${state}`)]))
    expect(shares.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12)
    const trialColumns = header(resultToCsv(warm, { perTrial: true }))
    expect(trialColumns).toEqual(expect.arrayContaining(['finalEndState', 'finalMaxOtherOverlap', 'finalEnergy', 'endStateShares.spinGlass']))
    const cold = runSweep({ neurons: 80, patterns: 4, trials: 3, seed: 3 })
    expect(header(resultToCsv(cold, { perTrial: false })).some((c) => c.startsWith('endStateShare') || c.startsWith('final'))).toBe(false)
    expect(header(resultToCsv(cold, { perTrial: false }))).toEqual(expect.arrayContaining(END_STATES.map((s) => `endStates.${s}`)))
  })

  it('mixture cues: one column group per component; stored-pattern overlaps with their expectations; stability spread', () => {
    const result = runSweep({
      neurons: 120,
      patterns: 6,
      cue: { kind: 'mixture', components: 3 },
      measures: { stability: true, patternOverlaps: true },
      trials: 4,
      seed: 4
    })
    const csv = resultToCsv(result, { perTrial: false })
    const columns = header(csv)
    expect(columns).toEqual(expect.arrayContaining([
      'componentOverlaps.0.mean', 'componentOverlaps.2.se', 'stability.se.unstableFraction', 'stability.sd.fixedPatternFraction',
      'patternOverlaps.networks', 'patternOverlaps.pairs', 'patternOverlaps.maxAbs.mean', 'patternOverlaps.expected.rms'
    ]))
    expect(columns).not.toContain('componentOverlaps.3.mean')
    const [head, row] = lines(csv)
    expect(Number(row![head!.indexOf('patternOverlaps.pairs')])).toBe(15)
    expect(Number(row![head!.indexOf('patternOverlaps.expected.rms')])).toBe(roundMeasure(1 / Math.sqrt(120)))
    expect(Number(row![head!.indexOf('componentOverlaps.0.mean')])).toBe(roundMeasure(result.rows[0]!.summary.overlap.mean))
    const trials = header(resultToCsv(result, { perTrial: true }))
    expect(trials).toEqual(expect.arrayContaining(['componentOverlaps.0', 'componentOverlaps.2', 'patternOverlaps.rms']))
    // JSON keeps the same numbers under the row's summary.
    const json = JSON.parse(resultToJson(result, { perTrial: false }))
    expect(json.rows[0].summary.patternOverlaps.pairs).toBe(15)
    expect(json.rows[0].summary.componentOverlaps).toHaveLength(3)
  })
})

describe('the trajectory series', () => {
  it('is long format: one row per point and sweep, held after a trial stops, energy empty at sweep 0', () => {
    const result = runSweep({
      neurons: 100,
      load: { values: [0.05, 0.15] },
      cue: { kind: 'flip', fraction: 0.25 },
      measures: { overlapTrajectory: true, energyTrajectory: true },
      trials: 6,
      seed: 5
    })
    const table = lines(trajectoryCsv(result))
    const head = table[0]!
    expect(head.slice(0, 4)).toEqual(['sweepId', 'specHash', 'seed', 'point'])
    expect(head.slice(head.indexOf('alphaK') + 1)).toEqual(['sweep', 'running', 'overlap.mean', 'overlap.sd', 'overlap.se', 'energy.mean', 'energy.sd', 'energy.se'])
    const col = (name: string): number => head.indexOf(name)
    const body = table.slice(1)
    for (const row of result.rows) {
      const band = row.summary.overlapTrajectory!
      const mine = body.filter((cells) => Number(cells[col('point')]) === row.point)
      expect(mine.map((cells) => Number(cells[col('sweep')]))).toEqual(band.mean.map((_, k) => k))
      expect(mine.map((cells) => Number(cells[col('overlap.mean')]))).toEqual(band.mean.map(roundMeasure))
      expect(mine.map((cells) => Number(cells[col('running')]))).toEqual(band.running)
      expect(mine.every((cells) => cells[col('load')] === String(row.values.load))).toBe(true)
      expect(mine[0]![col('energy.mean')]).toBe('')
      expect(Number(mine[1]![col('energy.mean')])).toBe(roundMeasure(row.summary.energyTrajectory!.mean[0]!))
    }
    const json = JSON.parse(trajectoryJson(result))
    expect(json.points).toHaveLength(2)
    expect(json.points[1].overlap.mean).toEqual(result.rows[1]!.summary.overlapTrajectory!.mean.map(roundMeasure))
    expect(json.points[1].values).toEqual({ load: 0.15 })
  })
})
