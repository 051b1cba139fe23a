import { readdirSync, readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { checkLimits, DEFAULT_LIMITS, normaliseSpec } from '../../src/spec/index.js'

const dir = new URL('../../examples/', import.meta.url)
const files = readdirSync(dir).filter((name) => name.endsWith('.json')).sort()

describe('examples/', () => {
  it('holds the documented examples', () => {
    expect(files).toEqual(expect.arrayContaining([
      'room-capacity.json', 'room-cue-noise.json', 'room-temperature.json',
      'room-capacity-search.json', 'room-basin-search.json', 'room-capacity-scaling.json',
      // One sweep per model family (src/spec/README.md, Model families).
      'room-clipped-synapses.json', 'room-dense-polynomial.json', 'room-dense-exponential.json',
      'room-softmax-sharpness.json', 'room-sparse-inputs.json', 'room-sparse-codes.json'
    ]))
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
