/** Figures of threshold searches: crossings with their intervals, and finite-size scaling fits with the extrapolated band. */
import { describe, expect, it } from 'vitest'
import { FigureOptionsError, renderFigure } from '../../src/figures/index.js'
import { byClass, drawnPoints, parseSvg } from './helpers.js'
import { figureKinds } from './kinds.js'

const kind = (name: string) => figureKinds().find((k) => k.name === name)!.results[0]!

describe('threshold search figures', () => {
  it('draw each crossing with its interval against the other varied parameter', () => {
    const result = kind('threshold-crossings')
    const doc = parseSvg(renderFigure(result))
    expect(doc.documentElement!.getAttribute('data-x')).toBe('load')
    const points = drawnPoints(doc)
    expect(points).toHaveLength(result.searches!.filter((s) => s.estimate !== null).length)
    for (const p of points) {
      const search = result.searches![p.point]!
      expect(p.x).toBe(search.values.load)
      expect(p.y).toBe(search.estimate)
      expect(p.low).toBe(search.low)
      expect(p.high).toBe(search.high)
    }
    expect(byClass(doc, 'y-title')[0]!.textContent).toContain('at the crossing (success rate = 0.5)')
  })

  it('draw a scaling fit: crossings against N on a log axis, the fitted curve, x_∞ with its interval as a band, the references', () => {
    const result = kind('scaling-fit')
    const row = result.scaling![0]!
    const fit = row.fit!
    const doc = parseSvg(renderFigure(result))
    expect(doc.documentElement!.getAttribute('data-x-scale')).toBe('log')
    expect(drawnPoints(doc).map((p) => [p.x, p.y])).toEqual([...row.sizes].sort((a, b) => a.neurons - b.neurons).map((s) => [s.neurons, s.estimate]))
    const curve = byClass(doc, 'theory', 'g').find((g) => g.getAttribute('data-theory') === 'scalingFit')!
    const path = curve.getElementsByTagName('path')[0]!
    const xs = path.getAttribute('data-xs')!.split(' ').map(Number)
    const ys = path.getAttribute('data-ys')!.split(' ').map(Number)
    xs.forEach((n, i) => expect(ys[i]).toBeCloseTo(fit.limit.value + fit.amplitude.value * n ** -fit.exponent.value, 12))
    const band = byClass(doc, 'band')[0]!
    expect([Number(band.getAttribute('data-low')), Number(band.getAttribute('data-high'))]).toEqual([fit.limitInterval.low, fit.limitInterval.high])
    const references = byClass(doc, 'theory', 'g').filter((g) => g.getAttribute('data-kind') === 'reference').map((g) => Number(g.getAttribute('data-y')))
    expect(references).toEqual(row.references.map((r) => r.value))
    // The same search drawn as crossings instead: against N, no fit.
    const crossings = parseSvg(renderFigure(result, { analysis: 'crossings' }))
    expect(byClass(crossings, 'band')).toHaveLength(0)
    expect(drawnPoints(crossings)).toHaveLength(3)
  })

  it('refuse what does not fit: a scaling view of a search without a fit, overlays of searches, the analysis option on a grid sweep', () => {
    const crossings = kind('threshold-crossings')
    const issue = (action: () => unknown): string => {
      try { action() } catch (error) { return (error as FigureOptionsError).issues[0]!.path }
      throw new Error('expected a refusal')
    }
    expect(issue(() => renderFigure(crossings, { analysis: 'scaling' }))).toBe('analysis')
    expect(issue(() => renderFigure([crossings, crossings]))).toBe('')
    expect(() => renderFigure(figureKinds()[0]!.results, { analysis: 'crossings' })).toThrow(FigureOptionsError)
  })
})
