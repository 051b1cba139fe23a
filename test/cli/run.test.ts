/** `memsweep run`: a sweep on this machine, straight to a file. */
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { normaliseSpec, specHash } from '../../src/spec/index.js'
import { cli } from './helpers.js'

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
