/**
 * Tables as a researcher reads them, through the API (embedded backend): the Arrow file by
 * format=arrow and by Accept, per point and per trial, equal to the JSON; and two CSVs of
 * sweeps that differ only in cue noise, stacked with pandas, keep their rows apart with no
 * extra work (the sweepId, specHash and cue.fraction columns tell them apart). Scenario:
 * place-cell rooms.
 */
import { mkdtemp, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { tableFromIPC } from '@uwdata/flechette'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createEmbeddedQueue } from '../../src/backends/embedded/index.js'
import { createHarness, isTerminal, type Harness } from './helpers/harness.js'
import { runPython, testPython } from '../helpers/python.js'

const ARROW = 'application/vnd.apache.arrow.file'
const spec = (fraction: number): Record<string, unknown> => ({ label: `gallery, cue noise ${fraction}`, neurons: 60, load: { values: [0.05, 0.1] }, cue: { kind: 'flip', fraction }, trials: 6, seed: 21 })

describe('tables through the API', () => {
  let h: Harness
  let dir = ''
  const ids: string[] = []
  beforeAll(async () => {
    h = await createHarness(async ({ dataDir }) => await createEmbeddedQueue({ dataDir, threads: 1 }))
    dir = await mkdtemp(join(tmpdir(), 'memsweep-tables-'))
    for (const fraction of [0.1, 0.2]) {
      const id = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: spec(fraction) })).json().id as string
      expect((await h.waitFor(id, isTerminal)).status).toBe('succeeded')
      ids.push(id)
    }
  })
  afterAll(async () => {
    await h?.close()
    if (dir !== '') await rm(dir, { recursive: true, force: true })
  })

  it('serves Arrow for ?format=arrow and for Accept, per point and per trial, equal to the JSON', async () => {
    const id = ids[0]!
    const byQuery = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?format=arrow` })
    const byAccept = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results`, headers: { accept: ARROW } })
    expect(byQuery.statusCode).toBe(200)
    expect(byQuery.headers['content-type']).toBe(ARROW)
    expect(byQuery.headers['content-disposition']).toContain(`memsweep-${id}.arrow`)
    expect(byAccept.rawPayload.equals(byQuery.rawPayload)).toBe(true)
    const json = (await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?trials=true` })).json()
    const points = tableFromIPC(byQuery.rawPayload).toArray() as Array<Record<string, unknown>>
    expect(points.map((row) => [row.sweepId, row.point, row.load, row.patterns, row['overlap.mean'], row['success.rate'], row['success.high']]))
      .toEqual(json.rows.map((row: any) => [id, row.point, row.values.load, row.params.patterns, row.summary.overlap.mean, row.summary.success.rate, row.summary.success.high]))
    const trials = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?format=arrow&trials=true` })
    expect(trials.headers['content-disposition']).toContain(`memsweep-${id}-trials.arrow`)
    const rows = tableFromIPC(trials.rawPayload).toArray() as Array<Record<string, unknown>>
    expect(rows.map((row) => [row.point, row.trial, row.overlap, row.maxOtherOverlap, row.energy, row.ending, row.endState]))
      .toEqual(json.trials.flatMap((list: any[], point: number) => list.map((t) => [point, t.trial, t.overlap, t.maxOtherOverlap, t.energy, t.ending, t.endState])))
  })

  it('keeps two stacked CSVs of sweeps differing only in cue noise apart in pandas', async (context) => {
    const python = testPython()
    if (python === null) { context.skip(); return }
    const files: string[] = []
    for (const id of ids) {
      const file = join(dir, `${id}.csv`)
      await writeFile(file, (await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?format=csv` })).body)
      files.push(file)
    }
    const code = [
      'import json, sys',
      'import pandas as pd',
      'both = pd.concat([pd.read_csv(f) for f in sys.argv[1:]], ignore_index=True)',
      'print(json.dumps({',
      '  "rows": len(both),',
      '  "sweeps": int(both["sweepId"].nunique()),',
      '  "hashes": int(both["specHash"].nunique()),',
      '  "perSweep": {k: sorted(g["cue.fraction"].unique().tolist()) for k, g in both.groupby("sweepId")},',
      '  "distinctRows": int(len(both.drop_duplicates(subset=["cue.fraction", "load"]))),',
      '  "columns": list(both.columns) == list(pd.read_csv(sys.argv[1]).columns),',
      '}))'
    ].join('\n')
    const run = await runPython(python, code, files)
    expect(run.status, run.stderr).toBe(0)
    const out = JSON.parse(run.stdout) as { rows: number, sweeps: number, hashes: number, perSweep: Record<string, number[]>, distinctRows: number, columns: boolean }
    expect(out).toEqual({ rows: 4, sweeps: 2, hashes: 2, perSweep: { [ids[0]!]: [0.1], [ids[1]!]: [0.2] }, distinctRows: 4, columns: true })
  })
})
