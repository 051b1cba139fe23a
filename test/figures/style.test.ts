/** The house style and its options: titles on and off, type size, print sizes, names, overlay styling, where lines are named. */
import { beforeAll, describe, expect, it } from 'vitest'
import { FigureOptionsError, renderFigure } from '../../src/figures/index.js'
import { spreadApart } from '../../src/figures/draw.js'
import type { SweepResult } from '../../src/results/index.js'
import { byClass, noteText, parseSvg, runSweep } from './helpers.js'

const flat = { label: 'Rooms of a flat, two network sizes', neurons: { values: [60, 120] }, load: { values: [0.04, 0.08, 0.12] }, cue: { kind: 'flip', fraction: 0.1 }, trials: 6, seed: 41 }

let rooms: SweepResult
let storkey: SweepResult
beforeAll(() => {
  rooms = runSweep(flat)
  storkey = runSweep({ ...flat, label: 'Rooms of a flat, Storkey rule', rule: { kind: 'storkey' } })
})

const texts = (svg: string, className: string): string[] => byClass(parseSvg(svg), className).map((e) => e.textContent ?? '')

describe('titles and notes', () => {
  it('are drawn by default and each can be turned off or rewritten', () => {
    const all = renderFigure(rooms, { measure: 'success' })
    expect(texts(all, 'title')).toEqual([flat.label])
    expect(texts(all, 'subtitle').join(' ').replaceAll('\u00a0', ' ')).toContain('flip cue f = 0.1')
    expect(noteText(parseSvg(all))).toContain('Wilson')
    const bare = renderFigure(rooms, { measure: 'success', showTitle: 'false', showSubtitle: false, showFootnote: '0' })
    expect(byClass(parseSvg(bare), 'title')).toHaveLength(0)
    expect(byClass(parseSvg(bare), 'subtitle')).toHaveLength(0)
    expect(byClass(parseSvg(bare), 'note')).toHaveLength(0)
    // Without them the plot takes the room.
    const top = (svg: string): number => Math.min(...byClass(parseSvg(svg), 'tick', 'g').map((g) => Number(g.getElementsByTagName('line')[0]!.getAttribute('y1'))))
    expect(top(bare)).toBeLessThan(top(all))
    const own = renderFigure(rooms, { title: 'Capacity of the flat', subtitle: 'Two sizes', footnote: 'Simulated with memsweep.' })
    expect(texts(own, 'title')).toEqual(['Capacity of the flat'])
    expect(texts(own, 'subtitle')).toEqual(['Two sizes'])
    expect(noteText(parseSvg(own))).toBe('Simulated with memsweep.')
  })

  it('state a precision target\'s trials as a range and name the target, not the ceiling as if every point took it', () => {
    const precise = runSweep({ ...flat, neurons: 60, trials: 40, precision: { measure: 'success', halfWidth: 0.2, block: 10 } })
    const subtitle = texts(renderFigure(precise, { measure: 'success' }), 'subtitle').join(' ').replaceAll('\u00a0', ' ')
    expect(subtitle).toContain('10–40 trials per point, until success rate ± 0.2')
    expect(subtitle).not.toMatch(/· 40 trials per point/)
  })
})

describe('sizes', () => {
  it('in mm lay the figure out in points, at the journal column widths', () => {
    const single = parseSvg(renderFigure(rooms, { column: 'single' })).documentElement!
    expect(single.getAttribute('width')).toBe('85mm')
    expect(single.getAttribute('height')).toBe('64mm')
    expect(single.getAttribute('viewBox')).toBe(`0 0 ${Math.round(85 / 25.4 * 72 * 100) / 100} ${Math.round(64 / 25.4 * 72 * 100) / 100}`)
    const double = parseSvg(renderFigure(rooms, { column: 'double', heightMm: 90 })).documentElement!
    expect([double.getAttribute('width'), double.getAttribute('height')]).toEqual(['180mm', '90mm'])
    const custom = parseSvg(renderFigure(rooms, { widthMm: '120' })).documentElement!
    expect([custom.getAttribute('width'), custom.getAttribute('height')]).toEqual(['120mm', '90mm'])
  })

  it('refuse px and mm together, naming the option', () => {
    expect(() => renderFigure(rooms, { column: 'single', width: 500 })).toThrow(FigureOptionsError)
    try { renderFigure(rooms, { widthMm: 85, height: 300 }) } catch (error) { expect((error as FigureOptionsError).issues[0]!.path).toBe('height') }
  })

  it('scale every piece of type with the font size', () => {
    const sizes = (svg: string): number[] => Array.from(parseSvg(svg).getElementsByTagName('text')).map((t) => Number(t.getAttribute('font-size')))
    const small = sizes(renderFigure(rooms, { fontSize: 10 }))
    const large = sizes(renderFigure(rooms, { fontSize: '15' }))
    expect(Math.max(...small)).toBeCloseTo(13, 6)
    expect(Math.max(...large)).toBeCloseTo(19.5, 6)
    expect(Math.min(...large) / Math.min(...small)).toBeCloseTo(1.5, 6)
  })
})

describe('naming the lines', () => {
  it('writes the names at the line ends when they all end at the right and do not collide', () => {
    const svg = renderFigure(rooms, { measure: 'success', theory: false })
    const doc = parseSvg(svg)
    expect(doc.documentElement!.getAttribute('data-legend')).toBe('direct')
    const labels = byClass(doc, 'legend-entry', 'g')
    expect(labels.map((e) => e.textContent)).toEqual(['N = 60', 'N = 120'])
    // Each name sits beside the last point of its series, within a line and a half of it.
    const points = byClass(doc, 'point', 'g')
    for (const label of labels) {
      const series = label.getAttribute('data-series')
      const last = points.filter((p) => p.getAttribute('data-series') === series).at(-1)!
      const text = label.getElementsByTagName('text')[0]!
      expect(Number(text.getAttribute('x'))).toBeGreaterThan(Number(last.getAttribute('data-cx')))
      expect(Math.abs(Number(text.getAttribute('y')) - Number(last.getAttribute('data-cy')))).toBeLessThan(30)
    }
  })

  it('falls back to a frameless legend outside the plot when a line ends short of the right edge', () => {
    // The replica-symmetric curve ends at α_c, inside the range.
    const wide = runSweep({ ...flat, load: { values: [0.05, 0.1, 0.15, 0.2] } })
    const doc = parseSvg(renderFigure(wide, { measure: 'overlap' }))
    expect(['side', 'below']).toContain(doc.documentElement!.getAttribute('data-legend'))
    const legend = byClass(doc, 'legend', 'g')[0]!
    // No frame: the only rectangles are square markers.
    for (const rect of Array.from(legend.getElementsByTagName('rect'))) expect(Number(rect.getAttribute('width'))).toBeLessThan(12)
    const plotRight = Math.max(...byClass(doc, 'point', 'g').map((p) => Number(p.getAttribute('data-cx'))))
    for (const text of Array.from(legend.getElementsByTagName('text'))) expect(Number(text.getAttribute('x'))).toBeGreaterThan(plotRight)
  })

  it('spreads names apart in order, as little as needed, or gives up when they cannot fit', () => {
    expect(spreadApart([50, 52, 100], 10, 0, 200)).toEqual([46, 56, 100])
    expect(spreadApart([0, 0], 10, 0, 200)).toEqual([0, 10])
    expect(spreadApart([5, 5, 5], 10, 0, 15)).toBeNull()
  })

  it('takes custom series names, in the order drawn', () => {
    const doc = parseSvg(renderFigure(rooms, { seriesNames: 'small network|', theory: false }))
    expect(byClass(doc, 'series', 'g').map((g) => g.getAttribute('data-label'))).toEqual(['small network', 'N = 120'])
    expect(() => renderFigure(rooms, { seriesNames: 'a|b|c' })).toThrow(/seriesNames|3 names for 2 series/)
  })
})

describe('overlays', () => {
  it('colour by sweep and mark by parameter value, the same value the same marker in every sweep', () => {
    const doc = parseSvg(renderFigure([rooms, storkey], { measure: 'success' }))
    const series = byClass(doc, 'series', 'g').map((g) => ({ label: g.getAttribute('data-label')!, colour: g.getAttribute('data-colour'), marker: g.getAttribute('data-marker') }))
    expect(series.map((s) => s.label)).toEqual([
      'Rooms of a flat, two… · N = 60', 'Rooms of a flat, two… · N = 120', 'Rooms of a flat, Storkey… · N = 60', 'Rooms of a flat, Storkey… · N = 120'
    ])
    expect(series[0]!.colour).toBe(series[1]!.colour)
    expect(series[2]!.colour).toBe(series[3]!.colour)
    expect(series[0]!.colour).not.toBe(series[2]!.colour)
    expect(series[0]!.marker).toBe(series[2]!.marker)
    expect(series[1]!.marker).toBe(series[3]!.marker)
    expect(series[0]!.marker).not.toBe(series[1]!.marker)
  })

  it('name each sweep as asked, keeping the parameter values', () => {
    const doc = parseSvg(renderFigure([rooms, storkey], { measure: 'success', sweepNames: 'Hebbian|Storkey' }))
    expect(byClass(doc, 'series', 'g').map((g) => g.getAttribute('data-label'))).toEqual(['Hebbian · N = 60', 'Hebbian · N = 120', 'Storkey · N = 60', 'Storkey · N = 120'])
  })
})
