/** Figure options: validated field by field, strings accepted, and checked against the data. */
import { mkdir, readFile, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { beforeAll, describe, expect, it } from 'vitest'
import { FigureOptionsError, FigureOptionsSchema, parseFigureOptions, renderFigure } from '../../src/figures/index.js'
import type { SweepResult } from '../../src/results/index.js'
import { drawnPoints, parseSvg, runSweep } from './helpers.js'

function issuesOf (action: () => unknown): Array<{ path: string, message: string }> {
  try {
    action()
  } catch (error) {
    if (error instanceof FigureOptionsError) return [...error.issues]
    throw error
  }
  throw new Error('expected a FigureOptionsError')
}

describe('figure options', () => {
  it('fill defaults and accept query strings for numbers and switches', () => {
    expect(parseFigureOptions({})).toEqual({
      measure: 'success', endState: 'target', xScale: 'linear', yScale: 'linear', errorBars: 'ci', theory: true, showTitle: true, showSubtitle: true, showFootnote: true
    })
    const fromQuery = parseFigureOptions({ measure: 'overlap', width: '800', height: '500', theory: 'false', x: 'load', errorBars: 'se' })
    expect(fromQuery).toMatchObject({ measure: 'overlap', width: 800, height: 500, theory: false, x: 'load', errorBars: 'se' })
    expect(parseFigureOptions({ theory: '1' }).theory).toBe(true)
  })

  it('name every offending field', () => {
    const issues = issuesOf(() => parseFigureOptions({ measure: 'speed', width: '10', errorBars: 'range', theory: 'maybe', x: 'colour' }))
    expect(issues.map((i) => i.path).sort()).toEqual(['errorBars', 'measure', 'theory', 'width', 'x'])
    const unknown = issuesOf(() => parseFigureOptions({ measur: 'overlap' }))
    expect(unknown).toEqual([{ path: '', message: 'unknown option(s): measur' }])
  })

  it('is exported as a zod schema with the same rules (the API uses it for its query)', () => {
    expect(FigureOptionsSchema.safeParse({ xScale: 'log' }).success).toBe(true)
    expect(FigureOptionsSchema.safeParse({ xScale: 'ln' }).success).toBe(false)
    expect(FigureOptionsSchema.safeParse({ height: 5000 }).success).toBe(false)
  })
})

describe('options against the data', () => {
  let rooms: SweepResult
  beforeAll(() => {
    rooms = runSweep({ label: 'corridor rooms', neurons: 40, load: { values: [0.05, 0.1] }, cue: { kind: 'flip', fraction: { values: [0, 0.2] } }, trials: 3, seed: 12 })
  })

  it('refuse an x or series the sweep does not vary, or series equal to x', () => {
    expect(issuesOf(() => renderFigure(rooms, { x: 'neurons' }))).toEqual([{ path: 'x', message: "the sweep 'corridor rooms' does not vary 'neurons'; it varies 'load', 'cue.fraction'" }])
    expect(issuesOf(() => renderFigure(rooms, { x: 'load', series: 'dynamics.temperature' }))[0]!.path).toBe('series')
    expect(issuesOf(() => renderFigure(rooms, { x: 'load', series: 'load' }))[0]!.path).toBe('series')
  })

  it('refuse a log axis over zero and a stability measure the sweep did not record', () => {
    const log = issuesOf(() => renderFigure(rooms, { x: 'cue.fraction', xScale: 'log' }))
    expect(log).toEqual([{ path: 'xScale', message: "a log axis needs positive values, and 'cue.fraction' takes the value 0" }])
    expect(issuesOf(() => renderFigure(rooms, { measure: 'unstableFraction' }))[0]!.path).toBe('measure')
  })

  it('default x to the parameter with the most values, the later one on a tie', () => {
    expect(parseSvg(renderFigure(rooms)).documentElement!.getAttribute('data-x')).toBe('cue.fraction')
    const wide = runSweep({ neurons: { values: [30, 40, 50] }, load: { values: [0.05, 0.1] }, trials: 2, seed: 1 })
    expect(parseSvg(renderFigure(wide)).documentElement!.getAttribute('data-x')).toBe('neurons')
  })

  it('refuse a sweep that varies nothing, and an empty list of results', () => {
    const single = runSweep({ neurons: 30, patterns: 2, trials: 2, seed: 1 })
    expect(issuesOf(() => renderFigure(single))[0]!.path).toBe('x')
    expect(issuesOf(() => renderFigure([]))[0]!.message).toContain('no result')
  })
})

describe('a real example', () => {
  it('renders the basin example (fewer trials) to a file a person can open', async () => {
    const raw = JSON.parse(await readFile(new URL('../../examples/room-cue-noise.json', import.meta.url), 'utf8')) as Record<string, unknown>
    const result = runSweep({ ...raw, trials: 20 })
    const dir = join(tmpdir(), 'memsweep-figures')
    await mkdir(dir, { recursive: true })
    for (const measure of ['success', 'overlap'] as const) {
      const svg = renderFigure(result, { measure })
      await writeFile(join(dir, `room-cue-noise-${measure}.svg`), svg)
      const points = drawnPoints(parseSvg(svg))
      expect(points).toHaveLength(result.rows.length)
      expect(new Set(points.map((p) => p.series)).size).toBe(2)
    }
  })
})
