/**
 * Theory overlays appear exactly where the model matches the theory's assumptions, and their
 * numbers are the engine's theory functions (whose values are checked against their published
 * sources in test/engine/theory). Small sweeps: only the overlays are under test here.
 */
import { describe, expect, it } from 'vitest'
import {
  crosstalkErrorGaussian, curieWeissOverlap, firstParallelStep, rsCriticalLoad, rsRetrievalOverlap
} from '../../src/engine/index.js'
import { renderFigure } from '../../src/figures/index.js'
import { richTextWidth } from '../../src/figures/rich-text.js'
import type { Document, Element } from '@xmldom/xmldom'
import { byClass, parseSvg, runSweep } from './helpers.js'

const hebbianRooms = { neurons: 60, load: { values: [0.05, 0.1, 0.15, 0.2] }, cue: { kind: 'flip', fraction: 0.1 }, trials: 3, seed: 31 }

function overlays (doc: Document): Element[] {
  return byClass(doc, 'theory', 'g')
}

function curvePoints (group: Element): Array<Array<[number, number]>> {
  return Array.from(group.getElementsByTagName('path')).map((path) => {
    const xs = path.getAttribute('data-xs')!.split(' ').map(Number)
    const ys = path.getAttribute('data-ys')!.split(' ').map(Number)
    return xs.map((x, i) => [x, ys[i]!] as [number, number])
  })
}

describe('theory overlays', () => {
  it('draw the replica-symmetric overlap densely over load up to α_c (where its solution ends), with α_c as a reference line', () => {
    const doc = parseSvg(renderFigure(runSweep(hebbianRooms), { measure: 'overlap', x: 'load' }))
    const curve = overlays(doc).find((g) => g.getAttribute('data-theory') === 'retrievalOverlapRS')!
    expect(curve.getAttribute('data-kind')).toBe('curve')
    const segments = curvePoints(curve)
    const { alphaC } = rsCriticalLoad()
    // Past α_c the theory has no retrieval state: no line along m = 0 there.
    expect(segments).toHaveLength(1)
    expect(segments[0]![0]![0]).toBe(0.05)
    expect(segments[0]!.at(-1)![0]).toBe(alphaC)
    expect(segments[0]!.length).toBeGreaterThan(100)
    for (const [x, y] of segments.flat()) {
      expect(x).toBeLessThanOrEqual(alphaC)
      expect(y).toBe(rsRetrievalOverlap(x))
      expect(y).toBeGreaterThan(0.9)
    }
    const reference = overlays(doc).find((g) => g.getAttribute('data-theory') === 'criticalLoad')!
    expect(Number(reference.getAttribute('data-at'))).toBe(alphaC)
    expect(byClass(doc, 'annotation')[0]!.getAttribute('data-label')).toBe('α_c = 0.138')
    // The reference line is named by its annotation, so the legend does not repeat it.
    const legend = byClass(doc, 'legend-entry', 'g').map((e) => e.getAttribute('data-theory')).filter((t) => t !== null)
    expect(legend).toEqual(['retrievalOverlapRS'])
  })

  it('are absent where the theory does not hold: Storkey rule, 0/1 neurons, measures without theory, or when turned off', () => {
    const storkey = parseSvg(renderFigure(runSweep({ ...hebbianRooms, rule: { kind: 'storkey' } }), { measure: 'overlap' }))
    expect(overlays(storkey)).toHaveLength(0)
    const binary = parseSvg(renderFigure(runSweep({ ...hebbianRooms, coding: 'binary' }), { measure: 'overlap' }))
    expect(overlays(binary)).toHaveLength(0)
    const hebbian = runSweep(hebbianRooms)
    for (const measure of ['sweeps', 'energy', 'maxOtherOverlap'] as const) {
      expect(overlays(parseSvg(renderFigure(hebbian, { measure })))).toHaveLength(0)
    }
    const off = parseSvg(renderFigure(hebbian, { measure: 'overlap', theory: 'false' }))
    expect(overlays(off)).toHaveLength(0)
    expect(byClass(off, 'legend')).toHaveLength(0)
  })

  it('draw the critical load only when it lies within the simulated loads', () => {
    const low = runSweep({ ...hebbianRooms, load: { values: [0.05, 0.1] } })
    const doc = parseSvg(renderFigure(low, { measure: 'success' }))
    expect(overlays(doc).map((g) => g.getAttribute('data-theory'))).toEqual([])
  })

  it('name the series a theory holds for when it holds for only some of them', () => {
    const result = runSweep({ ...hebbianRooms, neurons: 40, dilution: { keep: { values: [1, 0.5] } } })
    const doc = parseSvg(renderFigure(result, { measure: 'success', x: 'load' }))
    const reference = overlays(doc).find((g) => g.getAttribute('data-theory') === 'criticalLoad')!
    expect(reference.getAttribute('data-series')).toBe('0')
    expect(reference.getAttribute('data-label')).toBe('Critical load α_c (replica-symmetric), c = 1')
  })

  it('join the rows\' own values when x is not the variable of the closed form', () => {
    const result = runSweep({ neurons: { values: [40, 80, 120] }, load: 0.1, trials: 3, seed: 4 })
    const doc = parseSvg(renderFigure(result, { measure: 'overlap', x: 'neurons' }))
    const line = overlays(doc).find((g) => g.getAttribute('data-theory') === 'retrievalOverlapRS')!
    expect(line.getAttribute('data-kind')).toBe('per-point')
    expect(curvePoints(line)).toEqual([result.rows.map((row) => [row.values.neurons, row.theory.retrievalOverlapRS])])
  })

  it('give the stability measure the Gaussian curve and, per network size, the exact finite-N values', () => {
    const result = runSweep({ neurons: { values: [40, 80] }, load: { values: [0.1, 0.2, 0.3] }, measures: { stability: true }, dynamics: { maxSweeps: 1 }, trials: 2, seed: 6 })
    const doc = parseSvg(renderFigure(result, { measure: 'unstableFraction' }))
    const gaussian = overlays(doc).filter((g) => g.getAttribute('data-theory') === 'crosstalkErrorGaussian')
    // Both sizes share the N → ∞ curve: drawn once.
    expect(gaussian).toHaveLength(1)
    expect(gaussian[0]!.getAttribute('data-series')).toBe('0 1')
    for (const [x, y] of curvePoints(gaussian[0]!).flat()) expect(y).toBe(crosstalkErrorGaussian(x))
    const exact = overlays(doc).filter((g) => g.getAttribute('data-theory') === 'crosstalkErrorExact')
    expect(exact.map((g) => g.getAttribute('data-label'))).toEqual(['Crosstalk error, exact at this N, N = 40', 'Crosstalk error, exact at this N, N = 80'])
    for (const [s, g] of exact.entries()) {
      const rows = result.rows.filter((row) => row.values.neurons === (s === 0 ? 40 : 80))
      expect(curvePoints(g)).toEqual([rows.map((row) => [row.values.load, row.theory.crosstalkErrorExact])])
    }
  })

  it('draw the Curie–Weiss overlap over temperature at vanishing load', () => {
    const result = runSweep({ neurons: 200, patterns: 1, dynamics: { temperature: { values: [0, 0.5, 1.5] }, maxSweeps: 6, burnIn: 2 }, trials: 2, seed: 7 })
    const doc = parseSvg(renderFigure(result, { measure: 'overlap' }))
    const curve = overlays(doc).find((g) => g.getAttribute('data-theory') === 'curieWeissOverlap')!
    expect(curve.getAttribute('data-kind')).toBe('curve')
    const points = curvePoints(curve).flat()
    expect(points[0]).toEqual([0, 1])
    for (const [x, y] of points) expect(y).toBe(curieWeissOverlap(x))
    expect(points.some(([x, y]) => x === 1 && y === 0)).toBe(true)
    // Not at a load where the α → 0 result does not apply; there the finite-load RS theory
    // holds, but T = 0.5 and 1 are both above T_M(0.1) = 0.315: no retrieval state, so no line.
    const loaded = runSweep({ neurons: 100, patterns: 10, dynamics: { temperature: { values: [0.5, 1] }, maxSweeps: 4 }, trials: 2, seed: 7 })
    expect(loaded.rows.map((row) => row.theory.retrievalOverlapRS)).toEqual([0, 0])
    expect(overlays(parseSvg(renderFigure(loaded, { measure: 'overlap' }))).map((g) => g.getAttribute('data-theory'))).toEqual([])
  })

  it('give the first parallel step only for sweeps that stop after one step', () => {
    const oneStep = { neurons: 100, patterns: 10, cue: { kind: 'flip', fraction: { values: [0.1, 0.2, 0.3] } }, dynamics: { update: 'sync', maxSweeps: 1 }, trials: 3, seed: 8 }
    const doc = parseSvg(renderFigure(runSweep(oneStep), { measure: 'overlap' }))
    const kinds = Object.fromEntries(overlays(doc).map((g) => [g.getAttribute('data-theory'), g.getAttribute('data-kind')]))
    expect(kinds).toEqual({ firstStepOverlap: 'curve', firstStepOverlapExactTiesKeep: 'per-point' })
    const curve = overlays(doc).find((g) => g.getAttribute('data-theory') === 'firstStepOverlap')!
    for (const [f, y] of curvePoints(curve).flat()) expect(y).toBe(firstParallelStep(1 - 2 * f, 0.1))
    const longer = parseSvg(renderFigure(runSweep({ ...oneStep, dynamics: { update: 'sync', maxSweeps: 20 } }), { measure: 'overlap' }))
    expect(overlays(longer).map((g) => g.getAttribute('data-theory'))).not.toContain('firstStepOverlap')
    expect(overlays(longer).map((g) => g.getAttribute('data-theory'))).not.toContain('firstStepOverlapExactTiesKeep')
  })

  it('follow a log x axis with samples evenly spaced in log x', () => {
    const result = runSweep({ ...hebbianRooms, load: { values: [0.01, 0.03, 0.1] } })
    const doc = parseSvg(renderFigure(result, { measure: 'overlap', xScale: 'log' }))
    const [segment] = curvePoints(overlays(doc).find((g) => g.getAttribute('data-theory') === 'retrievalOverlapRS')!)
    const ratios = segment!.slice(2, -1).map(([x], i) => x / segment![i + 1]![0])
    for (const r of ratios) expect(r).toBeCloseTo(ratios[0]!, 9)
  })

  it('mark the retrieval temperature T_M(α) on a temperature axis, one line per load, with annotations that never overlap', () => {
    // The replica-symmetric retrieval line of AGS 1987 (values checked in test/engine/theory).
    const result = runSweep({
      neurons: 100,
      load: { values: [0.03, 0.05, 0.07] },
      cue: { kind: 'flip', fraction: 0 },
      dynamics: { temperature: { values: [0.1, 0.4, 0.7] }, maxSweeps: 4, burnIn: 1 },
      trials: 2,
      seed: 8
    })
    const doc = parseSvg(renderFigure(result, { measure: 'success', x: 'dynamics.temperature' }))
    const lines = overlays(doc).filter((g) => g.getAttribute('data-theory') === 'retrievalTemperature')
    expect(lines).toHaveLength(3)
    const expected = result.rows.filter((row) => row.values['dynamics.temperature'] === 0.4).map((row) => row.theory.retrievalTemperature)
    expect(lines.map((g) => g.getAttribute('data-series'))).toEqual(['0', '1', '2'])
    expect(new Set(expected).size).toBe(3)
    // Three lines about 0.1 apart on a 0.6-wide axis: named in full when they fit, by value when not, never one over another.
    const annotations = byClass(doc, 'annotation').map((a) => {
      const width = richTextWidth(a.getAttribute('data-label')!, Number(a.getAttribute('font-size')))
      return { left: Number(a.getAttribute('x')) - width / 2, right: Number(a.getAttribute('x')) + width / 2, text: a.getAttribute('data-label')! }
    })
    expect(annotations.length).toBeGreaterThan(0)
    for (const a of annotations) expect(a.text).toMatch(/^(T_M = )?0\.\d+$/)
    const narrow = byClass(parseSvg(renderFigure(result, { measure: 'success', x: 'dynamics.temperature', width: 320, height: 240 })), 'annotation')
    expect(narrow.every((a) => /^0\.\d+$/.test(a.getAttribute('data-label')!))).toBe(true)
    for (let i = 1; i < annotations.length; i++) expect(annotations[i]!.left).toBeGreaterThan(annotations[i - 1]!.right)
    // On a load axis the same sweep gets no temperature line.
    expect(overlays(parseSvg(renderFigure(result, { measure: 'success', x: 'load' }))).some((g) => g.getAttribute('data-theory') === 'retrievalTemperature')).toBe(false)
  })

  it('join the finite-temperature RS overlaps per point on a load axis at T > 0 (the dense curve is the T = 0 branch)', () => {
    const warm = runSweep({ neurons: 100, load: { values: [0.03, 0.06, 0.09] }, dynamics: { temperature: 0.3, maxSweeps: 4, burnIn: 1 }, trials: 2, seed: 12 })
    const rs = overlays(parseSvg(renderFigure(warm, { measure: 'overlap' }))).find((g) => g.getAttribute('data-theory') === 'retrievalOverlapRS')!
    expect(rs.getAttribute('data-kind')).toBe('per-point')
    expect(curvePoints(rs).flat().map(([, y]) => y)).toEqual(warm.rows.map((row) => row.theory.retrievalOverlapRS))
  })
})
