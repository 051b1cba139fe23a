/** `memsweep run`: a sweep on this machine, straight to a file. */
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { normaliseSpec, specHash } from '../../src/spec/index.js'
import { cli } from './helpers.js'
import { C_REFERENCE, CANONICAL_WORKLOADS } from '../api/contract/measures.js'
import { csvRecords } from '../helpers/tables.js'

/** Place-cell population codes of the rooms of a flat, recalled from noisy cues. */
const spec = { label: 'rooms of a flat', neurons: 120, load: { values: [0.05, 0.1, 0.15] }, cue: { kind: 'flip', fraction: 0.15 }, trials: 30, seed: 8 }

let dir = ''
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'memsweep-cli-'))
  await writeFile(join(dir, 'spec.json'), JSON.stringify(spec))
})
afterAll(async () => { await rm(dir, { recursive: true, force: true }) })

describe('memsweep run', () => {
  it('writes the same CSV in this process (1 thread) as on worker threads (2)', async () => {
    const one = await cli(['run', join(dir, 'spec.json'), '-o', join(dir, 'one.csv'), '--threads', '1'])
    expect(one.code, one.stderr).toBe(0)
    const two = await cli(['run', join(dir, 'spec.json'), '-o', join(dir, 'two.csv'), '--threads', '2'])
    expect(two.code, two.stderr).toBe(0)
    const [a, b] = [await readFile(join(dir, 'one.csv'), 'utf8'), await readFile(join(dir, 'two.csv'), 'utf8')]
    expect(b).toBe(a)
    expect(a.trimEnd().split('\r\n')).toHaveLength(4)
    // Plain progress lines (not a terminal), ending at 100 %.
    expect(one.stderr).toMatch(/rooms of a flat: 100% \(90\/90 trials, 3\/3 points\)/)
    expect(one.stderr).toContain('3 grid point(s) × 30 trials = 90 trials')
  })

  it('runs precision targets block by block in this process exactly as on worker threads', async () => {
    const precise = { ...spec, load: { values: [0.03, 0.2] }, trials: 120, precision: { measure: 'success', halfWidth: 0.08, block: 30 } }
    await writeFile(join(dir, 'precise.json'), JSON.stringify(precise))
    const one = await cli(['run', join(dir, 'precise.json'), '-o', join(dir, 'precise-1.json'), '--threads', '1'])
    expect(one.code, one.stderr).toBe(0)
    const two = await cli(['run', join(dir, 'precise.json'), '-o', join(dir, 'precise-2.json'), '--threads', '2'])
    expect(two.code, two.stderr).toBe(0)
    const [a, b] = [JSON.parse(await readFile(join(dir, 'precise-1.json'), 'utf8')), JSON.parse(await readFile(join(dir, 'precise-2.json'), 'utf8'))]
    expect(JSON.stringify(a.rows)).toBe(JSON.stringify(b.rows))
    // The easy point stops after its first block; the one beyond capacity takes more.
    expect(a.rows[0].summary.trials).toBe(30)
    expect(a.rows[0].precision).toMatchObject({ measure: 'success', target: 0.08, met: true })
    expect(a.rows[1].summary.trials).toBeGreaterThan(30)
  })

  it('writes JSON, per-trial rows on request, from the file name', async () => {
    const res = await cli(['run', join(dir, 'spec.json'), '-o', join(dir, 'trials.json'), '--threads', '1', '--trials'])
    expect(res.code).toBe(0)
    const json = JSON.parse(await readFile(join(dir, 'trials.json'), 'utf8'))
    expect(json.rows).toHaveLength(3)
    expect(json.trials[2]).toHaveLength(30)
    expect(json.specHash).toBe(specHash(normaliseSpec(spec)))
  })

  it('exits 2 naming each invalid field, and for an unreadable spec or output name', async () => {
    await writeFile(join(dir, 'bad.json'), JSON.stringify({ neurons: 0, patterns: 3, cue: { kind: 'blur' } }))
    const bad = await cli(['run', join(dir, 'bad.json'), '-o', join(dir, 'bad.csv')])
    expect(bad.code).toBe(2)
    expect(bad.stderr).toContain('The spec is invalid')
    expect(bad.stderr).toMatch(/neurons: /)
    expect(bad.stderr).toMatch(/cue/)
    const missing = await cli(['run', join(dir, 'missing.json'), '-o', join(dir, 'x.csv')])
    expect(missing.code).toBe(2)
    const badName = await cli(['run', join(dir, 'spec.json'), '-o', join(dir, 'out.xlsx')])
    expect(badName.code).toBe(2)
    expect(badName.stderr).toContain('.csv or .json')
    const noOutput = await cli(['run', join(dir, 'spec.json')])
    expect(noOutput.code).toBe(2)
    expect(noOutput.stderr).toContain('--output')
  })

  it('stops between chunks when interrupted and exits 1 without writing a file', async () => {
    const interrupt = new AbortController()
    interrupt.abort()
    const res = await cli(['run', join(dir, 'spec.json'), '-o', join(dir, 'never.csv'), '--threads', '1'], { signal: interrupt.signal })
    expect(res.code).toBe(1)
    await expect(readFile(join(dir, 'never.csv'))).rejects.toThrow()
  })
})

describe('memsweep run, format-2 options', () => {
  it('reproduces the benchmark reference workloads on the canonical stream, in this process and on threads', async () => {
    // The C reference program's outputs for seed 1 (shared bench RESULTS.md; measured
    // regression references, not published values), as in test/api/contract/measures.ts.
    await writeFile(join(dir, 'w1.json'), JSON.stringify(CANONICAL_WORKLOADS.W1))
    await writeFile(join(dir, 'w2.json'), JSON.stringify(CANONICAL_WORKLOADS.W2))
    const w1 = await cli(['run', join(dir, 'w1.json'), '-o', join(dir, 'w1.json.out.json'), '--threads', '1'])
    expect(w1.code, w1.stderr).toBe(0)
    const [row] = JSON.parse(await readFile(join(dir, 'w1.json.out.json'), 'utf8')).rows
    expect(row.summary.overlap.mean.toFixed(6)).toBe(C_REFERENCE.W1.meanOverlap)
    expect(row.summary.sweeps.mean).toBe(C_REFERENCE.W1.meanSweeps)
    for (const threads of ['1', '2']) {
      const w2 = await cli(['run', join(dir, 'w2.json'), '-o', join(dir, `w2-${threads}.json`), '--threads', threads])
      expect(w2.code, w2.stderr).toBe(0)
      const rows = JSON.parse(await readFile(join(dir, `w2-${threads}.json`), 'utf8')).rows
      expect(rows.map((r: { summary: { success: { rate: number } } }) => r.summary.success.rate)).toEqual(C_REFERENCE.W2.success)
    }
  })

  it('writes the trajectory series with --series trajectory, and refuses it up front for a sweep without trajectories', async () => {
    await writeFile(join(dir, 'traj.json'), JSON.stringify({ ...spec, measures: { overlapTrajectory: true }, trials: 6 }))
    const res = await cli(['run', join(dir, 'traj.json'), '-o', join(dir, 'traj.csv'), '--threads', '1', '--series', 'trajectory'])
    expect(res.code, res.stderr).toBe(0)
    const lines = (await readFile(join(dir, 'traj.csv'), 'utf8')).trimEnd().split('\r\n')
    expect(lines[0]).toMatch(/^sweepId,specHash,seed,point,.*,alpha,alphaK,sweep,running,overlap\.mean,overlap\.sd,overlap\.se$/)
    expect(csvRecords(lines.join('\r\n'))[0]).toMatchObject({ sweepId: '', point: '0', load: '0.05', neurons: '120', patterns: '6', alpha: '0.05', sweep: '0', running: '6', 'overlap.mean': '0.7' })
    const none = await cli(['run', join(dir, 'spec.json'), '-o', join(dir, 'none.csv'), '--series', 'trajectory'])
    expect(none.code).toBe(2)
    expect(none.stderr).toMatch(/No trajectory series: .*measures\.overlapTrajectory/)
    expect(none.stderr).not.toContain('grid point(s)')
    const both = await cli(['run', join(dir, 'traj.json'), '-o', join(dir, 'both.csv'), '--series', 'trajectory', '--trials'])
    expect(both.code).toBe(2)
    const unknown = await cli(['run', join(dir, 'traj.json'), '-o', join(dir, 'u.csv'), '--series', 'energy'])
    expect(unknown.code).toBe(2)
    expect(unknown.stderr).toContain('--series must be one of trajectory')
  })
})
