/**
 * The Arrow export read back by an independent implementation of the format (flechette, not the
 * apache-arrow package that wrote it): the same columns, in the same order, with the same
 * values as the CSV, typed by column, and the JSON's numbers. Scenario: place-cell rooms.
 */
import { tableFromIPC } from '@uwdata/flechette'
import { describe, expect, it } from 'vitest'
import { columnType, resultTable, resultToJson } from '../../src/results/index.js'
import { resultToArrow, trajectoryArrow } from '../../src/results/arrow-output.js'
import { runSweep } from '../figures/helpers.js'

type Value = number | string | boolean | null

function read (bytes: Uint8Array): { names: string[], rows: Array<Record<string, Value>>, metadata: Map<string, string> | null } {
  const table = tableFromIPC(bytes)
  return { names: table.schema.fields.map((field) => field.name), rows: table.toArray() as Array<Record<string, Value>>, metadata: table.schema.metadata ?? null }
}

/** A table cell as the Arrow file should hold it. */
function expected (name: string, cell: unknown): Value {
  if (cell === undefined || cell === null || cell === '') return null
  return cell as Value
}

describe('Arrow export', () => {
  const result = runSweep({ label: 'atrium, warm', neurons: 50, load: { values: [0.04, 0.1] }, cue: { kind: 'flip', fraction: 0.2 }, dynamics: { temperature: 0.2, maxSweeps: 12 }, measures: { stability: true, overlapTrajectory: true }, trials: 5, seed: 3 })

  for (const perTrial of [false, true]) {
    it(`holds the CSV's table ${perTrial ? 'per trial' : 'per point'}, typed by column`, () => {
      const table = resultTable(result, { perTrial, sweepId: 'sw_atrium' })
      const back = read(resultToArrow(result, { perTrial, sweepId: 'sw_atrium' }))
      expect(back.names).toEqual(table.header)
      expect(back.rows).toHaveLength(perTrial ? 10 : 2)
      back.rows.forEach((row, r) => {
        table.header.forEach((name, k) => { expect(row[name], `${name} row ${r}`).toEqual(expected(name, table.rows[r]![k])) })
      })
      expect(back.metadata?.get('memsweep.specHash')).toBe(result.specHash)
      const kinds = new Set(table.header.map(columnType))
      expect(kinds).toEqual(new Set(['int', 'float', 'string', 'bool']))
    })
  }

  it('agrees with the JSON number for number', () => {
    const json = JSON.parse(resultToJson(result, { perTrial: true })) as { rows: Array<{ point: number, params: { alpha: number }, summary: { overlap: { mean: number, se: number }, success: { count: number, low: number } } }>, trials: Array<Array<{ overlap: number, sweeps: number, endState: string }>> }
    const points = read(resultToArrow(result, { perTrial: false })).rows
    points.forEach((row, i) => {
      const mine = json.rows[i]!
      expect([row.point, row.alpha, row['overlap.mean'], row['overlap.se'], row['success.count'], row['success.low']])
        .toEqual([mine.point, mine.params.alpha, mine.summary.overlap.mean, mine.summary.overlap.se, mine.summary.success.count, mine.summary.success.low])
      expect(row['cue.fraction']).toBe(0.2)
      expect(row['rule.selfCoupling']).toBe(false)
      expect(row['rule.degree']).toBeNull()
    })
    const trials = read(resultToArrow(result, { perTrial: true })).rows
    expect(trials.map((row) => [row.overlap, row.sweeps, row.endState])).toEqual(json.trials.flat().map((t) => [t.overlap, t.sweeps, t.endState]))
  })

  it('gives the trajectory series the same columns as its CSV', () => {
    const back = read(trajectoryArrow(result, 'sw_atrium'))
    expect(back.names.slice(0, 4)).toEqual(['sweepId', 'specHash', 'seed', 'point'])
    expect(back.rows[0]!.sweepId).toBe('sw_atrium')
    expect(back.metadata?.get('memsweep.series')).toBe('trajectory')
  })
})
