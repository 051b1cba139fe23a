/** `memsweep figure`: results files from `memsweep run` drawn as SVG, in this process. */
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { cli } from '../cli/helpers.js'
import { byClass, drawnPoints, parseSvg } from './helpers.js'

/** Two small place-cell networks recalling rooms from noisy cues. */
const spec = { label: 'rooms of a cottage', neurons: { values: [40, 60] }, load: { values: [0.05, 0.1, 0.15] }, trials: 5, seed: 14 }

let dir = ''
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'memsweep-figure-cli-'))
  await writeFile(join(dir, 'spec.json'), JSON.stringify(spec))
  await writeFile(join(dir, 'storkey.json'), JSON.stringify({ ...spec, label: 'cottage, Storkey rule', neurons: 40, rule: { kind: 'storkey' } }))
  for (const name of ['spec', 'storkey']) {
    const run = await cli(['run', join(dir, `${name}.json`), '-o', join(dir, `${name}-results.json`), '--threads', '1'])
    expect(run.code, run.stderr).toBe(0)
  }
})
afterAll(async () => { await rm(dir, { recursive: true, force: true }) })

describe('memsweep figure', () => {
  it('draws a results file with the options given as flags', async () => {
    const out = join(dir, 'overlap.svg')
    const res = await cli(['figure', join(dir, 'spec-results.json'), '-o', out, '--measure', 'overlap', '--x', 'load', '--error-bars', 'sd', '--no-theory', '--width', '700'])
    expect(res.code, res.stderr).toBe(0)
    expect(res.stderr).toContain(`Figure written to ${out}.`)
    const result = JSON.parse(await readFile(join(dir, 'spec-results.json'), 'utf8'))
    const doc = parseSvg(await readFile(out, 'utf8'))
    expect(doc.documentElement!.getAttribute('width')).toBe('700')
    expect(byClass(doc, 'theory')).toHaveLength(0)
    const points = drawnPoints(doc)
    expect(points).toHaveLength(6)
    for (const p of points) {
      const row = result.rows[p.point]
      expect(p.y).toBe(row.summary.overlap.mean)
      expect(p.high).toBeCloseTo(row.summary.overlap.mean + row.summary.overlap.sd, 12)
    }
  })

  it('overlays several files, one series per sweep and size, and writes to standard output with -o -', async () => {
    const res = await cli(['figure', join(dir, 'spec-results.json'), join(dir, 'storkey-results.json'), '-o', '-'])
    expect(res.code, res.stderr).toBe(0)
    const labels = byClass(parseSvg(res.stdout), 'series', 'g').map((g) => g.getAttribute('data-label'))
    expect(labels).toEqual(['rooms of a cottage · N = 40', 'rooms of a cottage · N = 60', 'cottage, Storkey rule'])
    const mixed = await cli(['figure', join(dir, 'spec-results.json'), '-o', '-', '--width', '400', '--column', 'double'])
    expect(mixed.code).toBe(2)
    expect(mixed.stderr).toContain('--width: give the size either in px')
  })

  it('draws at a journal column width with custom names and without the footnote', async () => {
    const res = await cli(['figure', join(dir, 'spec-results.json'), join(dir, 'storkey-results.json'), '-o', '-', '--column', 'single', '--font-size', '8',
      '--sweep-name', 'Hebbian', '--sweep-name', 'Storkey', '--hide-footnote', '--subtitle', 'Cottage rooms'])
    expect(res.code, res.stderr).toBe(0)
    const doc = parseSvg(res.stdout)
    expect(doc.documentElement!.getAttribute('width')).toBe('85mm')
    expect(byClass(doc, 'note')).toHaveLength(0)
    expect(byClass(doc, 'subtitle').map((e) => e.textContent)).toEqual(['Cottage rooms'])
    expect(byClass(doc, 'series', 'g').map((g) => g.getAttribute('data-label'))).toEqual(['Hebbian · N = 40', 'Hebbian · N = 60', 'Storkey'])
  })

  it('writes PNG and PDF by the output file\'s extension', async () => {
    const png = await cli(['figure', join(dir, 'spec-results.json'), '-o', join(dir, 'f.png'), '--column', 'single', '--dpi', '120'])
    expect(png.code, png.stderr).toBe(0)
    const bytes = await readFile(join(dir, 'f.png'))
    expect(bytes.subarray(1, 4).toString('latin1')).toBe('PNG')
    expect(bytes.readUInt32BE(16)).toBe(Math.round(85 / 25.4 * 120))
    const pdf = await cli(['figure', join(dir, 'spec-results.json'), '-o', join(dir, 'f.pdf')])
    expect(pdf.code, pdf.stderr).toBe(0)
    expect((await readFile(join(dir, 'f.pdf'))).subarray(0, 5).toString('latin1')).toBe('%PDF-')
    const bad = await cli(['figure', join(dir, 'spec-results.json'), '-o', join(dir, 'f.png'), '--dpi', '5'])
    expect(bad.code).toBe(2)
    expect(bad.stderr).toContain('--dpi')
  })

  it('exits 2 naming the flag when the options do not fit, and for files that are not results', async () => {
    const misfit = await cli(['figure', join(dir, 'spec-results.json'), '-o', join(dir, 'x.svg'), '--x', 'cue.fraction'])
    expect(misfit.code).toBe(2)
    expect(misfit.stderr).toContain("--x: the sweep 'rooms of a cottage' does not vary 'cue.fraction'")
    const bad = await cli(['figure', join(dir, 'spec-results.json'), '-o', join(dir, 'x.svg'), '--x-scale', 'ln'])
    expect(bad.code).toBe(2)
    expect(bad.stderr).toContain('--x-scale:')
    const notResult = await cli(['figure', join(dir, 'spec.json'), '-o', join(dir, 'x.svg')])
    expect(notResult.code).toBe(2)
    expect(notResult.stderr).toContain('is not a memsweep result')
  })
})
