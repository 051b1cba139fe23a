import { readdirSync, readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { checkLimits, DEFAULT_LIMITS, normaliseSpec } from '../../src/spec/index.js'
import { renderFigure } from '../../src/figures/index.js'
import { byClass, parseSvg, runSweep } from '../figures/helpers.js'

const dir = new URL('../../examples/', import.meta.url)
const files = readdirSync(dir).filter((name) => name.endsWith('.json')).sort()

describe('examples/', () => {
  it('holds the documented examples', () => {
    expect(files).toEqual(expect.arrayContaining([
      'room-capacity.json', 'room-cue-noise.json', 'room-temperature.json',
      'room-capacity-search.json', 'room-basin-search.json', 'room-capacity-scaling.json',
      // One sweep per model family (src/spec/README.md, Model families).
      'room-clipped-synapses.json', 'room-dense-polynomial.json', 'room-dense-exponential.json',
      'room-softmax-sharpness.json', 'room-sparse-inputs.json', 'room-sparse-codes.json',
      // The T–α example: the simulated retrieval boundary beside the replica-symmetric line.
      'room-noise-boundary.json'
    ]))
  })

  it('room-noise-boundary.json: recall fails where the replica-symmetric retrieval line T_M(α) says, and its figure draws that line', () => {
    // Amit, Gutfreund & Sompolinsky, Ann. Phys. 173, 30 (1987): the retrieval state exists
    // below T_M(α); CHECK_VALUES §3 gives T_M = 0.717, 0.542, 0.405 at α = 0.02, 0.05, 0.08 [C].
    // The example at a fifth of its trials (8 per point): the temperature where the success
    // rate crosses ½ (linear between grid points) lies within one grid step (0.1) of T_M;
    // at N = 400 the boundary is smeared and shifted by finite size, a few hundredths here.
    const example = JSON.parse(readFileSync(new URL('room-noise-boundary.json', dir), 'utf8'))
    const result = runSweep({ ...example, trials: 8 })
    const published: Record<number, number> = { 0.02: 0.717, 0.05: 0.542, 0.08: 0.405 }
    for (const load of [0.02, 0.05, 0.08, 0.11]) {
      const rows = result.rows.filter((row) => row.values.load === load)
      const line = rows[0]!.theory.retrievalTemperature!
      // The published values are printed to three digits.
      if (published[load] !== undefined) expect(Math.abs(line - published[load])).toBeLessThan(1e-3)
      const k = rows.findIndex((row) => row.summary.success.rate < 0.5)
      expect(k).toBeGreaterThan(0)
      const [a, b] = [rows[k - 1]!, rows[k]!]
      const [ta, tb] = [a.values['dynamics.temperature'] as number, b.values['dynamics.temperature'] as number]
      const crossing = ta + (tb - ta) * (a.summary.success.rate - 0.5) / (a.summary.success.rate - b.summary.success.rate)
      expect(Math.abs(crossing - line)).toBeLessThan(0.1)
    }
    const doc = parseSvg(renderFigure(result, { measure: 'success', x: 'dynamics.temperature' }))
    const lines = byClass(doc, 'theory').filter((el) => el.getAttribute('data-theory') === 'retrievalTemperature')
    expect(lines.length).toBeGreaterThanOrEqual(4)
  })

  it.each(files)('%s normalises, fits the default limits and is a quick demo', (name) => {
    const spec = normaliseSpec(JSON.parse(readFileSync(new URL(name, dir), 'utf8')))
    expect(spec.label).toBeTruthy()
    const work = checkLimits(spec, DEFAULT_LIMITS)
    if (spec.analysis !== undefined) {
      // A search's estimate is an upper bound: every step at the costlier end of the range and
      // the whole step budget. Measured on 2 cores (examples/README.md) the analysis examples
      // take 3–20 s, 20–40 times below this bound; the bound keeps them from growing unnoticed.
      expect(work.cpuSeconds).toBeLessThan(600)
      return
    }
    expect(work.points).toBeGreaterThan(1)
    // Examples must finish within 30 s on 2 cores; the cost model can be ~3× off for some
    // workloads, so the estimate stays well under the 60 CPU-seconds that would allow.
    expect(work.cpuSeconds).toBeLessThan(15)
  })
})
