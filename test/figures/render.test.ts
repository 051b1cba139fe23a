/** The drawing is the data: every plotted point, bar and series read back from the SVG. */
import tQuantile from '@stdlib/stats-base-dists-t-quantile'
import { beforeAll, describe, expect, it } from 'vitest'
import { MARKER_SHAPES, renderFigure, SERIES_DASHES } from '../../src/figures/index.js'
import { seriesStyle } from '../../src/figures/styles.js'
import type { SweepResult } from '../../src/results/index.js'
import { axisTicks, byClass, drawnPoints, noteText, num, parseSvg, runSweep } from './helpers.js'

/** Rooms of a small flat in two network sizes, listed largest first to check the order is kept. */
const roomsSpec = {
  label: 'Rooms of a flat <small> & "large" networks',
  neurons: { values: [80, 40] },
  load: { values: [0.05, 0.1, 0.15, 0.2] },
  cue: { kind: 'flip', fraction: 0.1 },
  trials: 12,
  seed: 21
}

let rooms: SweepResult
beforeAll(() => { rooms = runSweep(roomsSpec) })

/** A linear map fitted through two ticks: value → px. */
function tickMap (ticks: Array<{ value: number, at: number }>): (v: number) => number {
  const [a, b] = [ticks[0]!, ticks[ticks.length - 1]!]
  return (v) => a.at + (v - a.value) * (b.at - a.at) / (b.value - a.value)
}

describe('plotted points', () => {
  it('are the result rows: x, success rate, Wilson interval and trials, one point per row', () => {
    const doc = parseSvg(renderFigure(rooms, { measure: 'success', x: 'load' }))
    const points = drawnPoints(doc)
    expect(points).toHaveLength(rooms.rows.length)
    for (const p of points) {
      const row = rooms.rows[p.point]!
      expect(p.x).toBe(row.values.load)
      expect(p.y).toBe(row.summary.success.rate)
      expect(p.low).toBe(row.summary.success.low)
      expect(p.high).toBe(row.summary.success.high)
      expect(p.n).toBe(12)
    }
    expect(new Set(points.map((p) => p.point)).size).toBe(rooms.rows.length)
  })

  it('split into one series per value of the other parameter, in the order the spec lists it', () => {
    const doc = parseSvg(renderFigure(rooms, { measure: 'overlap', x: 'load' }))
    const series = byClass(doc, 'series', 'g')
    expect(series.map((g) => g.getAttribute('data-label'))).toEqual(['N = 80', 'N = 40'])
    const points = drawnPoints(doc)
    for (const p of points) {
      expect(rooms.rows[p.point]!.values.neurons).toBe(p.series === 0 ? 80 : 40)
      expect(p.y).toBe(rooms.rows[p.point]!.summary.overlap.mean)
    }
    // Each series runs through its points in increasing x.
    for (const s of [0, 1]) {
      const xs = points.filter((p) => p.series === s).map((p) => p.x)
      expect(xs).toEqual([0.05, 0.1, 0.15, 0.2])
    }
  })

  it('swap roles when x and series are swapped', () => {
    const doc = parseSvg(renderFigure(rooms, { measure: 'success', x: 'neurons', series: 'load' }))
    const labels = byClass(doc, 'series', 'g').map((g) => g.getAttribute('data-label'))
    expect(labels).toEqual(['α = 0.05', 'α = 0.1', 'α = 0.15', 'α = 0.2'])
    for (const p of drawnPoints(doc)) expect(p.x).toBe(rooms.rows[p.point]!.values.neurons)
  })

  it('sit where the axes say: markers and bar ends on the tick scale', () => {
    const doc = parseSvg(renderFigure(rooms, { measure: 'overlap', x: 'load', errorBars: 'se' }))
    const toY = tickMap(axisTicks(doc, 'y-axis'))
    const toX = tickMap(axisTicks(doc, 'x-axis'))
    const shifts = new Set<number>()
    for (const p of drawnPoints(doc)) {
      expect(p.cy).toBeCloseTo(toY(p.y), 1)
      expect(p.bar!.y1).toBeCloseTo(toY(p.low!), 1)
      expect(p.bar!.y2).toBeCloseTo(toY(p.high!), 1)
      shifts.add(Math.round((p.cx - toX(p.x)) * 10) / 10)
    }
    // Series at shared x values are offset sideways by a few px, the same for all points of one series.
    expect([...shifts].every((s) => Math.abs(s) <= 7)).toBe(true)
    expect(shifts.size).toBe(2)
  })
})

describe('error bars', () => {
  it('are ± SE, ± SD or the Student t 95 % interval of the mean, as asked', () => {
    const t = tQuantile(0.975, 11)
    for (const errorBars of ['se', 'sd', 'ci'] as const) {
      const points = drawnPoints(parseSvg(renderFigure(rooms, { measure: 'sweeps', x: 'load', errorBars })))
      for (const p of points) {
        const { mean, sd, se } = rooms.rows[p.point]!.summary.sweeps
        const half = errorBars === 'se' ? se : errorBars === 'sd' ? sd : t * se
        expect(p.y).toBe(mean)
        expect(p.low!).toBeCloseTo(mean - half, 12)
        expect(p.high!).toBeCloseTo(mean + half, 12)
      }
    }
  })

  it('for rates use the binomial spread, clipped to [0, 1], and vanish with errorBars=none', () => {
    const se = drawnPoints(parseSvg(renderFigure(rooms, { measure: 'success', errorBars: 'se' })))
    for (const p of se) {
      const half = Math.sqrt(p.y * (1 - p.y) / 12)
      expect(p.low!).toBeCloseTo(Math.max(0, p.y - half), 12)
      expect(p.high!).toBeCloseTo(Math.min(1, p.y + half), 12)
    }
    const none = parseSvg(renderFigure(rooms, { errorBars: 'none' }))
    expect(drawnPoints(none).every((p) => p.low === null && p.bar === null)).toBe(true)
    expect(byClass(none, 'error-bar')).toHaveLength(0)
  })

  it('of an end-state fraction are the Wilson interval of its count', () => {
    const points = drawnPoints(parseSvg(renderFigure(rooms, { measure: 'endState', endState: 'target' })))
    for (const p of points) {
      const row = rooms.rows[p.point]!
      expect(p.y).toBe(row.summary.endStates.target / 12)
      expect(p.low!).toBeLessThanOrEqual(p.y)
      expect(p.high!).toBeGreaterThanOrEqual(p.y)
      if (row.summary.endStates.target === 12) expect(p.high).toBe(1)
    }
  })

  it('of the stability measure come from the spread over networks (in the row, equal to the per-network records)', () => {
    const result = runSweep({ neurons: 60, load: { values: [0.1, 0.2, 0.3] }, measures: { stability: true }, dynamics: { maxSweeps: 1 }, trials: 6, seed: 5 })
    const points = drawnPoints(parseSvg(renderFigure(result, { measure: 'unstableFraction', errorBars: 'sd' })))
    expect(points).toHaveLength(3)
    for (const p of points) {
      const perNetwork = result.trials[p.point]!.map((t) => t.stability!.unstableFraction)
      const mean = perNetwork.reduce((a, b) => a + b, 0) / perNetwork.length
      const sd = Math.sqrt(perNetwork.reduce((a, v) => a + (v - mean) ** 2, 0) / (perNetwork.length - 1))
      expect(p.y).toBe(result.rows[p.point]!.summary.stability!.unstableFraction)
      expect(p.y).toBeCloseTo(mean, 14)
      expect(p.n).toBe(6)
      expect(p.high!).toBeCloseTo(Math.min(1, p.y + sd), 12)
      expect(p.low!).toBeCloseTo(Math.max(0, p.y - sd), 12)
    }
    // The row holds the spread itself, so a results file without trials draws the same bars.
    const { trials: _dropped, ...withoutTrials } = result
    const bare = drawnPoints(parseSvg(renderFigure(withoutTrials as SweepResult, { measure: 'unstableFraction', errorBars: 'sd' })))
    expect(bare.map((p) => [p.low, p.high])).toEqual(points.map((p) => [p.low, p.high]))
    // Rows of results made before the spread was kept fall back to the records, and without them show none.
    const oldRows = { ...withoutTrials, rows: result.rows.map((row) => ({ ...row, summary: { ...row.summary, stability: { ...row.summary.stability!, sd: undefined, se: undefined } } })) }
    const old = parseSvg(renderFigure(oldRows as unknown as SweepResult, { measure: 'unstableFraction' }))
    expect(drawnPoints(old).every((p) => p.low === null)).toBe(true)
    expect(noteText(old)).toContain('No error bars')
  })
})

describe('axes', () => {
  it('on a log x scale place ticks by their logarithm', () => {
    const result = runSweep({ neurons: { values: [25, 50, 100, 200] }, patterns: 3, trials: 4, seed: 2 })
    const doc = parseSvg(renderFigure(result, { x: 'neurons', xScale: 'log' }))
    expect(byClass(doc, 'x-axis')[0]!.getAttribute('data-scale')).toBe('log')
    const points = drawnPoints(doc).sort((a, b) => a.x - b.x)
    const steps = points.slice(1).map((p, i) => p.cx - points[i]!.cx)
    // Each doubling of N is the same distance on the page.
    for (const step of steps) expect(step).toBeCloseTo(steps[0]!, 1)
    const ticks = axisTicks(doc, 'x-axis')
    expect(ticks.map((t) => t.value)).toEqual([50, 100, 200])
    expect(ticks[1]!.at - ticks[0]!.at).toBeCloseTo(ticks[2]!.at - ticks[1]!.at, 1)
  })

  it('have nice linear ticks (1, 2 or 5 × a power of ten apart) covering every point', () => {
    const doc = parseSvg(renderFigure(rooms, { measure: 'sweeps' }))
    for (const axis of ['x-axis', 'y-axis'] as const) {
      const values = axisTicks(doc, axis).map((t) => t.value)
      expect(values.length).toBeGreaterThanOrEqual(3)
      const step = values[1]! - values[0]!
      const mantissa = step / 10 ** Math.floor(Math.log10(step) + 1e-9)
      expect([1, 2, 5].some((m) => Math.abs(mantissa - m) < 1e-6)).toBe(true)
    }
    const [lo, hi] = [Math.min(...axisTicks(doc, 'x-axis').map((t) => t.value)), Math.max(...axisTicks(doc, 'x-axis').map((t) => t.value))]
    expect(lo).toBeLessThanOrEqual(0.05)
    expect(hi).toBeGreaterThanOrEqual(0.2)
  })

  it('name the parameter and the measure with their symbols', () => {
    const doc = parseSvg(renderFigure(rooms, { measure: 'success', x: 'load' }))
    expect(byClass(doc, 'x-title')[0]!.textContent).toBe('Load α = P/N')
    expect(byClass(doc, 'y-title')[0]!.textContent).toBe('Recall success rate (final m ≥ 0.9)')
  })
})

describe('legend and styles', () => {
  it('has one entry per series with the marker and dash of that series', () => {
    const doc = parseSvg(renderFigure(rooms, { measure: 'success', x: 'neurons', series: 'load', theory: false }))
    const series = byClass(doc, 'series', 'g')
    const entries = byClass(doc, 'legend-entry', 'g').filter((e) => e.getAttribute('data-series') !== null)
    expect(entries.map((e) => e.textContent)).toEqual(series.map((s) => s.getAttribute('data-label')))
    for (const [i, entry] of entries.entries()) {
      expect(entry.getAttribute('data-marker')).toBe(series[i]!.getAttribute('data-marker'))
      expect(entry.getAttribute('data-dash')).toBe(series[i]!.getAttribute('data-dash'))
    }
    const looks = series.map((s) => `${s.getAttribute('data-marker')}/${s.getAttribute('data-filled')}/${s.getAttribute('data-dash')}`)
    expect(new Set(looks).size).toBe(4)
    expect(new Set(series.map((s) => s.getAttribute('data-marker'))).size).toBe(4)
  })

  it('gives the first 16 series distinct markers (shape × filled/open) and the first 8 distinct dashes', () => {
    const markers = Array.from({ length: 16 }, (_, i) => seriesStyle(i)).map((s) => `${s.shape}/${String(s.filled)}`)
    expect(new Set(markers).size).toBe(16)
    expect(new Set(Array.from({ length: 8 }, (_, i) => seriesStyle(i).dash)).size).toBe(8)
    expect(MARKER_SHAPES).toHaveLength(8)
    expect(SERIES_DASHES).toHaveLength(8)
  })

  it('is left out for a single series without theory', () => {
    const result = runSweep({ neurons: 40, load: { values: [0.05, 0.1] }, rule: { kind: 'storkey' }, trials: 4, seed: 3 })
    const doc = parseSvg(renderFigure(result))
    expect(byClass(doc, 'legend')).toHaveLength(0)
    expect(byClass(doc, 'series', 'g')[0]!.getAttribute('data-label')).toBe('Simulation')
  })
})

describe('overlaid sweeps', () => {
  it('draw one series per sweep, labelled by the sweep label, with each sweep\'s own rows', () => {
    const other = runSweep({ ...roomsSpec, label: 'Storkey rooms', neurons: 40, rule: { kind: 'storkey' } })
    const doc = parseSvg(renderFigure([rooms, other], { measure: 'success', x: 'load' }))
    const labels = byClass(doc, 'series', 'g').map((g) => g.getAttribute('data-label'))
    // The sweep label shortened at a word boundary, then the parameter values.
    expect(labels).toEqual(['Rooms of a flat <small> &… · N = 80', 'Rooms of a flat <small> &… · N = 40', 'Storkey rooms'])
    const points = drawnPoints(doc)
    expect(points).toHaveLength(rooms.rows.length + other.rows.length)
    for (const p of points) {
      const row = (p.sweep === 0 ? rooms : other).rows[p.point]!
      expect(p.y).toBe(row.summary.success.rate)
      expect(p.x).toBe(row.values.load)
    }
    expect(points.filter((p) => p.sweep === 1).every((p) => p.series === 2)).toBe(true)
  })
})

describe('the document', () => {
  it('is accessible: role img, labelled by its title and description', () => {
    const doc = parseSvg(renderFigure(rooms, { measure: 'success' }))
    const svg = doc.documentElement!
    expect(svg.getAttribute('role')).toBe('img')
    const [titleId, descId] = svg.getAttribute('aria-labelledby')!.split(' ')
    const title = doc.getElementsByTagName('title')[0]!
    const desc = doc.getElementsByTagName('desc')[0]!
    expect(title.getAttribute('id')).toBe(titleId)
    expect(desc.getAttribute('id')).toBe(descId)
    // Markup-like characters in a label are text, not markup.
    expect(title.textContent).toBe(roomsSpec.label)
    expect(desc.textContent).toContain('2 series (N = 80; N = 40)')
    expect(desc.textContent).toContain('95 % Wilson score intervals'.replace(' %', '\u00a0%'))
  })

  it('is self-contained and the same bytes for the same input', () => {
    const svg = renderFigure(rooms, { measure: 'overlap' })
    expect(svg).toBe(renderFigure(rooms, { measure: 'overlap' }))
    expect(svg).not.toMatch(/<script|<style|@import|href=|url\((?!#)/)
    expect(svg.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true)
  })

  it('leaves out rows without a value and says so', () => {
    const copy = structuredClone(rooms)
    copy.rows[1]!.summary.overlap.mean = NaN
    const doc = parseSvg(renderFigure(copy, { measure: 'overlap' }))
    expect(drawnPoints(doc).map((p) => p.point)).not.toContain(1)
    expect(drawnPoints(doc)).toHaveLength(rooms.rows.length - 1)
    expect(noteText(doc)).toContain('1 point(s) without a value left out')
  })

  it('takes its size from the options', () => {
    const doc = parseSvg(renderFigure(rooms, { width: 900, height: 500 }))
    expect(num(doc.documentElement!, 'width')).toBe(900)
    expect(doc.documentElement!.getAttribute('viewBox')).toBe('0 0 900 500')
  })
})

describe('categorical axes', () => {
  it('split series by the rule and by the self-coupling, labelled in words', () => {
    const result = runSweep({
      neurons: 60,
      load: { values: [0.05, 0.1, 0.15] },
      rule: { values: [{ kind: 'hebbian' }, { kind: 'storkey' }, { kind: 'pseudo-inverse', selfCoupling: true }] },
      trials: 4,
      seed: 9
    })
    const doc = parseSvg(renderFigure(result, { measure: 'success', theory: false }))
    const series = byClass(doc, 'series', 'g')
    expect(series.map((s) => s.getAttribute('data-label'))).toEqual(['Hebbian rule', 'Storkey rule', 'pseudo-inverse rule (J_ii kept)'])
    for (const [i, s] of series.entries()) {
      const rows = result.rows.filter((row) => row.values.rule === ['hebbian', 'storkey', 'pseudo-inverse(selfCoupling=true)'][i])
      expect(drawnPoints(doc).filter((p) => p.series === i).map((p) => p.point)).toEqual(rows.map((row) => row.point))
      expect(s.getAttribute('data-label')).not.toBe('Simulation')
    }
    const coupling = runSweep({ neurons: 60, load: { values: [0.05, 0.1] }, rule: { kind: 'hebbian', selfCoupling: { values: [false, true] } }, trials: 4, seed: 9 })
    const labels = byClass(parseSvg(renderFigure(coupling, { theory: false, series: 'rule.selfCoupling' })), 'series', 'g').map((s) => s.getAttribute('data-label'))
    expect(labels).toEqual(['J_ii = 0', 'J_ii kept'])
  })

  it('draw the overlaps between stored patterns as a measure, when the sweep measured them', () => {
    const result = runSweep({ neurons: 100, patterns: { values: [4, 8, 16] }, measures: { patternOverlaps: true }, trials: 6, seed: 10 })
    const points = drawnPoints(parseSvg(renderFigure(result, { measure: 'patternOverlapMaxAbs', errorBars: 'se' })))
    expect(points.map((p) => p.y)).toEqual(result.rows.map((row) => row.summary.patternOverlaps!.maxAbs.mean))
    expect(points.map((p) => p.n)).toEqual([6, 6, 6])
    expect(points[0]!.high! - points[0]!.y).toBeCloseTo(result.rows[0]!.summary.patternOverlaps!.maxAbs.se, 12)
    const plain = runSweep({ neurons: 100, patterns: { values: [4, 8] }, trials: 2, seed: 10 })
    expect(() => renderFigure(plain, { measure: 'patternOverlapMeanAbs' })).toThrow(/measures\.patternOverlaps/)
  })
})
