/** GET /v1/sweeps/{id}/figure.svg through the real app and the embedded backend. */
import { createHash } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createEmbeddedQueue } from '../../src/backends/embedded/index.js'
import { renderFigure } from '../../src/figures/index.js'
import { createHarness, isTerminal, type Harness } from '../api/helpers/harness.js'
import { expectProblem } from '../api/helpers/problems.js'
import { heldSpec } from '../api/helpers/specs.js'
import { sharedChunkGate } from '../helpers/chunk-gate.js'
import { byClass, drawnPoints, parseSvg } from './helpers.js'

const gate = sharedChunkGate()

/** Rooms along a corridor, two network sizes: a second varied parameter for the series. */
const corridor = { label: 'rooms along a corridor', neurons: { values: [48, 64] }, load: { values: [0.05, 0.1, 0.15] }, trials: 6, seed: 17 }

describe('GET /v1/sweeps/{id}/figure.svg', () => {
  let h: Harness
  let id: string
  beforeAll(async () => {
    h = await createHarness(async ({ dataDir }) => await createEmbeddedQueue({ dataDir, threads: 2 }))
    id = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: corridor })).json().id
    await h.waitFor(id, isTerminal)
  })
  afterAll(async () => { await h.close() })

  it('draws the stored result with the query\'s options: the points are the result rows', async () => {
    const res = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/figure.svg?measure=overlap&x=load&errorBars=se&width=720` })
    expect(res.statusCode).toBe(200)
    expect(res.headers['content-type']).toBe('image/svg+xml; charset=utf-8')
    expect(res.headers['content-security-policy']).toContain("default-src 'none'")
    expect(res.headers['content-disposition']).toBe(`inline; filename="memsweep-${id}-overlap.svg"`)
    const result = (await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?trials=true` })).json()
    const doc = parseSvg(res.body)
    expect(doc.documentElement!.getAttribute('width')).toBe('720')
    const points = drawnPoints(doc)
    expect(points).toHaveLength(6)
    for (const p of points) {
      const row = result.rows[p.point]
      expect(p.x).toBe(row.values.load)
      // The figure draws the stored values; the downloaded JSON writes them at its documented precision.
      expect(p.y).toBeCloseTo(row.summary.overlap.mean, 9)
      expect(p.low).toBeCloseTo(row.summary.overlap.mean - row.summary.overlap.se, 9)
    }
    // The same drawing as rendering the downloaded result locally.
    const local = drawnPoints(parseSvg(renderFigure(result, { measure: 'overlap', x: 'load', errorBars: 'se', width: 720 })))
    expect(local.map((p) => [p.point, p.cx, p.cy])).toEqual(points.map((p) => [p.point, p.cx, p.cy]))
  })

  it('answers the same figure as PNG and PDF, rendered on the rendering thread with the shipped typeface', async () => {
    const png = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/figure.png?measure=overlap&column=single&dpi=100` })
    expect(png.statusCode).toBe(200)
    expect(png.headers['content-type']).toBe('image/png')
    expect(png.headers['content-disposition']).toBe(`inline; filename="memsweep-${id}-overlap.png"`)
    expect(png.rawPayload.subarray(1, 4).toString('latin1')).toBe('PNG')
    expect(png.rawPayload.readUInt32BE(16)).toBe(Math.round(85 / 25.4 * 100))
    const pdf = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/figure.pdf?measure=overlap&column=single` })
    expect(pdf.headers['content-type']).toBe('application/pdf')
    expect(pdf.rawPayload.toString('latin1')).toMatch(/^%PDF-[\s\S]*SourceSans3-Regular/)
    const overlay = await h.request({ method: 'GET', url: `/v1/figures/overlay.pdf?sweeps=${id}&measure=success` })
    expect(overlay.headers['content-type']).toBe('application/pdf')
    const tooLarge = expectProblem(await h.request({ method: 'GET', url: `/v1/sweeps/${id}/figure.png?widthMm=500&heightMm=500&dpi=1200` }), 422, 'MEMSWEEP_FIGURE_OPTIONS_UNFIT')
    expect(tooLarge.errors[0].path).toBe('querystring.dpi')
    expect(expectProblem(await h.request({ method: 'GET', url: `/v1/sweeps/${id}/figure.svg?dpi=100` }), 400, 'MEMSWEEP_MALFORMED_REQUEST').errors[0].message).toMatch(/dpi/)
  })

  it('draws a threshold search: its crossings with their intervals', async () => {
    const search = (await h.request({
      method: 'POST',
      url: '/v1/sweeps',
      payload: {
        label: 'corridor basins',
        neurons: 80,
        load: { values: [0.05, 0.1] },
        cue: { kind: 'flip' },
        trials: 20,
        seed: 5,
        analysis: { kind: 'threshold', parameter: 'cue.fraction', measure: 'success', level: 0.5, from: 0, to: 0.5, direction: 'decreasing', maxSteps: 4, tolerance: 0.03 }
      }
    })).json()
    await h.waitFor(search.id, isTerminal)
    const res = await h.request({ method: 'GET', url: `/v1/sweeps/${search.id as string}/figure.svg` })
    expect(res.statusCode).toBe(200)
    const result = (await h.request({ method: 'GET', url: `/v1/sweeps/${search.id as string}/results` })).json()
    const points = drawnPoints(parseSvg(res.body))
    expect(points.map((p) => p.x)).toEqual([0.05, 0.1])
    for (const p of points) expect(p.y).toBeCloseTo(result.searches[p.point].estimate, 9)
  })

  it('sets a strong ETag per set of options and answers If-None-Match with 304', async () => {
    const first = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/figure.svg` })
    expect(first.headers.etag).toBe(`"${createHash('sha256').update(first.rawPayload).digest('base64url')}"`)
    const other = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/figure.svg?measure=sweeps` })
    expect(other.headers.etag).not.toBe(first.headers.etag)
    const again = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/figure.svg`, headers: { 'if-none-match': first.headers.etag as string } })
    expect(again.statusCode).toBe(304)
    expect(again.body).toBe('')
    expect(again.headers.etag).toBe(first.headers.etag)
  })

  it('answers 400 naming a malformed or unknown option, 422 naming an option that does not fit the sweep', async () => {
    const bad = expectProblem(await h.request({ method: 'GET', url: `/v1/sweeps/${id}/figure.svg?measure=speed` }), 400, 'MEMSWEEP_MALFORMED_REQUEST')
    expect(bad.errors[0].path).toBe('querystring.measure')
    const unknown = expectProblem(await h.request({ method: 'GET', url: `/v1/sweeps/${id}/figure.svg?colour=red` }), 400, 'MEMSWEEP_MALFORMED_REQUEST')
    expect(JSON.stringify(unknown.errors)).toContain('colour')
    const misfit = expectProblem(await h.request({ method: 'GET', url: `/v1/sweeps/${id}/figure.svg?x=dynamics.temperature` }), 422, 'MEMSWEEP_FIGURE_OPTIONS_UNFIT')
    expect(misfit.errors).toEqual([expect.objectContaining({ path: 'querystring.x', pointer: '/x', message: expect.stringContaining("does not vary 'dynamics.temperature'") })])
    expect(misfit.detail).toMatch(/^The figure cannot be drawn as asked: x: .*does not vary 'dynamics\.temperature'/)
  })

  it('overlays several sweeps, one series per sweep, labelled by sweep label', async () => {
    const other = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: { ...corridor, label: 'corridor, Storkey rule', neurons: 48, rule: { kind: 'storkey' } } })).json()
    await h.waitFor(other.id, isTerminal)
    const res = await h.request({ method: 'GET', url: `/v1/figures/overlay.svg?sweeps=${id},${other.id as string}&measure=success&x=load` })
    expect(res.statusCode).toBe(200)
    expect(res.headers['content-disposition']).toBe('inline; filename="memsweep-overlay-success.svg"')
    const doc = parseSvg(res.body)
    const labels = byClass(doc, 'series', 'g').map((g) => g.getAttribute('data-label'))
    expect(labels).toEqual(['rooms along a corridor · N = 48', 'rooms along a corridor · N = 64', 'corridor, Storkey rule'])
    const storkey = (await h.request({ method: 'GET', url: `/v1/sweeps/${other.id as string}/results` })).json()
    for (const p of drawnPoints(doc).filter((p) => p.sweep === 1)) expect(p.y).toBe(storkey.rows[p.point].summary.success.rate)
    const cached = await h.request({ method: 'GET', url: `/v1/figures/overlay.svg?sweeps=${id},${other.id as string}&measure=success&x=load`, headers: { 'if-none-match': res.headers.etag as string } })
    expect(cached.statusCode).toBe(304)

    const malformed = expectProblem(await h.request({ method: 'GET', url: '/v1/figures/overlay.svg?sweeps=a;b' }), 400, 'MEMSWEEP_MALFORMED_REQUEST')
    expect(malformed.errors[0].path).toBe('querystring.sweeps')
    expectProblem(await h.request({ method: 'GET', url: `/v1/figures/overlay.svg?sweeps=${id},no-such-sweep` }), 404, 'MEMSWEEP_SWEEP_NOT_FOUND')
    const unfit = expectProblem(await h.request({ method: 'GET', url: `/v1/figures/overlay.svg?sweeps=${id},${other.id as string}&x=neurons` }), 422, 'MEMSWEEP_FIGURE_OPTIONS_UNFIT')
    expect(unfit.errors[0].path).toBe('querystring.x')
  })

  it('answers 409 while the sweep runs and 404 for an unknown sweep', async () => {
    gate.hold()
    const running = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: heldSpec() })).json()
    const res = await h.request({ method: 'GET', url: `/v1/sweeps/${running.id as string}/figure.svg` })
    expect(expectProblem(res, 409, 'MEMSWEEP_RESULTS_NOT_READY').sweepId).toBe(running.id)
    expect(res.headers['retry-after']).toBe('5')
    const overlay = await h.request({ method: 'GET', url: `/v1/figures/overlay.svg?sweeps=${id},${running.id as string}` })
    expect(expectProblem(overlay, 409, 'MEMSWEEP_RESULTS_NOT_READY').sweepId).toBe(running.id)
    await h.request({ method: 'DELETE', url: `/v1/sweeps/${running.id as string}` })
    gate.open()
    await h.waitFor(running.id, isTerminal)
    const canceled = await h.request({ method: 'GET', url: `/v1/sweeps/${running.id as string}/figure.svg` })
    expectProblem(canceled, 409, 'MEMSWEEP_RESULTS_UNAVAILABLE')
    expectProblem(await h.request({ method: 'GET', url: '/v1/sweeps/no-such-sweep/figure.svg' }), 404, 'MEMSWEEP_SWEEP_NOT_FOUND')
  })
})
