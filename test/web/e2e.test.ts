/**
 * The web page end to end: Debian's Chromium (playwright-core) against the real service
 * (buildApp + the embedded backend on 127.0.0.1). Submits an example and follows it to 100 %,
 * reads the figure, downloads the CSV, cancels a running sweep, shows a validation error at
 * its field, overlays two sweeps, and asks for a token that never reaches a URL or a log.
 * Screenshots go to <MEMSWEEP_TEST_ARTIFACTS>/web/ for people to look at (helpers/browser.ts).
 */
import { mkdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { SweepRecord } from '../../src/backends/port.js'
import { TERMINAL_STATUSES } from '../../src/backends/port.js'
import { ARTIFACTS, launchChromium } from './helpers/browser.js'
import { startWebServer, type WebServer } from './helpers/server.js'
import { sharedChunkGate } from '../helpers/chunk-gate.js'

/** Installed before the servers start: their compute threads wait at it while a test holds it. */
const gate = sharedChunkGate()
const SHOTS = join(ARTIFACTS, 'web')
const POLL = { timeout: 20_000, interval: 50 }
const WIDE = { width: 1280, height: 800 }
const NARROW = { width: 390, height: 844 }

const example = (name: string): Record<string, unknown> =>
  JSON.parse(readFileSync(new URL(`../../examples/${name}.json`, import.meta.url), 'utf8')) as Record<string, unknown>

async function submit (server: WebServer, spec: Record<string, unknown>, token?: string): Promise<string> {
  const response = await fetch(`${server.url}/v1/sweeps`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', ...(token === undefined ? {} : { authorization: `Bearer ${token}` }) },
    body: JSON.stringify(spec)
  })
  expect(response.status).toBe(202)
  return (await response.json() as { id: string }).id
}

/** Resolves once the sweep's record satisfies `until` (backend events, not sleeps). */
async function waitFor (server: WebServer, id: string, until: (r: SweepRecord) => boolean, timeoutMs = 30_000): Promise<SweepRecord> {
  return await new Promise((resolve, reject) => {
    const timer = setTimeout(() => { unsubscribe(); reject(new Error(`sweep ${id} did not get there in ${timeoutMs} ms`)) }, timeoutMs)
    const done = (record: SweepRecord): void => { clearTimeout(timer); unsubscribe(); resolve(record) }
    const unsubscribe = server.queue.subscribe(id, (event) => { if (until(event.sweep)) done(event.sweep) })
    server.queue.get(id).then((record) => { if (record !== null && until(record)) done(record) }, reject)
  })
}

/**
 * In-page check that the figure shows a loaded blob: image. Evaluated through the DevTools
 * protocol (page.evaluate), which the page's content-security policy rightly does not allow
 * for its own scripts; a string because the test program has no DOM types.
 */
const IMAGE_SHOWN = "(() => { const img = document.querySelector('img.figure-image'); return img !== null && img.src.startsWith('blob:') && img.complete && img.naturalWidth > 0 })()"

async function shot (page: Page, name: string, fullPage = true): Promise<void> {
  await page.screenshot({ path: join(SHOTS, `${name}.png`), fullPage })
}

/** Fails when the page is wider than the window (content cut off or a sideways scroll of the whole page). */
async function expectNoSidewaysScroll (page: Page): Promise<void> {
  const overflow = await page.evaluate<number>('document.documentElement.scrollWidth - window.innerWidth')
  expect(overflow).toBeLessThanOrEqual(1)
}

describe('web page in Chromium', () => {
  let browser: Browser
  let open: WebServer
  let guarded: WebServer
  let context: BrowserContext
  const pageErrors: string[] = []

  beforeAll(async () => {
    mkdirSync(SHOTS, { recursive: true })
    ;[browser, open] = await Promise.all([launchChromium(), startWebServer()])
    context = await browser.newContext({ viewport: WIDE, acceptDownloads: true, locale: 'en-GB' })
    context.on('weberror', (error) => pageErrors.push(error.error().message))
  })

  afterAll(async () => {
    await context?.close()
    await browser?.close()
    await open?.close()
    await guarded?.close()
  })

  it('submits an example, follows it live to 100 %, shows the figure and table, and downloads the CSV', async () => {
    const page = await context.newPage()
    await page.goto(`${open.url}/#/new?from=room-capacity`)
    await page.locator('#check-state[data-state="valid"]').waitFor()
    await page.fill('#f-trials-value', '60')
    // 36 points × 60 trials: the estimate follows the edit.
    await page.locator('.estimates', { hasText: '2,160' }).waitFor()
    await shot(page, 'submit-valid')
    await page.click('#submit-sweep')
    await page.waitForURL(/#\/sweeps\/[\w-]+$/)
    const id = decodeURIComponent(page.url().split('#/sweeps/')[1] ?? '')

    const bar = page.locator('.live [role="progressbar"]')
    const seen: number[] = []
    let tookShot = false
    const deadline = Date.now() + 40_000
    while (Date.now() < deadline) {
      const value = Number(await bar.getAttribute('aria-valuenow'))
      seen.push(value)
      if (value === 100) break
      if (value > 20 && !tookShot) { await shot(page, 'sweep-running', false); tookShot = true }
      await page.waitForTimeout(100)
    }
    expect(seen.at(-1)).toBe(100)
    // The bar moved while the page watched: the event stream drove it, nobody reloaded.
    expect(seen.some((v) => v < 100)).toBe(true)
    expect(await bar.getAttribute('aria-valuetext')).toContain('2,160 of 2,160 trials')
    expect(await page.locator('.page-head .status').getAttribute('data-status')).toBe('succeeded')

    // The figure from the figure route, with a text alternative taken from the SVG.
    const image = page.locator('img.figure-image')
    await expect.poll(async () => await page.evaluate<boolean>(IMAGE_SHOWN), POLL).toBe(true)
    expect(await image.getAttribute('alt')).toContain('Rooms remembered by a place-cell network')
    expect(await page.locator('.figure-status').textContent()).toBe('')
    const firstSrc = await image.getAttribute('src')
    await page.selectOption('.figure-controls select >> nth=0', 'overlap')
    await expect.poll(async () => await image.getAttribute('src'), POLL).not.toBe(firstSrc)
    await expect.poll(async () => await page.evaluate<boolean>(IMAGE_SHOWN), POLL).toBe(true)
    expect(await page.locator('.figure figcaption').textContent()).toContain('final overlap')

    expect(await page.locator('table.results tbody tr').count()).toBe(36)
    await shot(page, 'sweep-finished')

    const [download] = await Promise.all([page.waitForEvent('download'), page.click('[data-download="csv"]')])
    expect(download.suggestedFilename()).toBe(`memsweep-${id}.csv`)
    const csv = readFileSync(await download.path(), 'utf8')
    const fromApi = await (await fetch(`${open.url}/v1/sweeps/${id}/results?format=csv`)).text()
    expect(csv).toBe(fromApi)
    expect(csv.split('\r\n')[0]).toMatch(/^sweepId,specHash,seed,point,neurons,/)
    expect(csv.trimEnd().split('\r\n')).toHaveLength(37)

    await page.setViewportSize(NARROW)
    await shot(page, 'sweep-narrow')
    await expectNoSidewaysScroll(page)
    await page.close()
  })

  it('offers every model family in the form: dense memories, the softmax network, fixed in-degree dilution', async () => {
    const page = await context.newPage()
    await page.goto(`${open.url}/#/new?from=room-capacity`)
    await page.locator('#check-state[data-state="valid"]').waitFor()
    const specText = async (): Promise<Record<string, unknown>> => {
      await page.check('#edit-mode-json')
      const text = await page.locator('#spec-json').inputValue()
      await page.check('#edit-mode-form')
      return JSON.parse(text) as Record<string, unknown>
    }
    await page.selectOption('#f-rule-kind-value', 'dense-polynomial')
    await page.fill('#f-rule-degree-value', '3')
    await page.locator('#check-state[data-state="valid"]').waitFor()
    expect((await specText()).rule).toEqual({ kind: 'dense-polynomial', degree: 3 })
    // No coupling matrix, so no diagonal to keep.
    expect(await page.locator('#f-rule-selfCoupling-value').count()).toBe(0)

    await page.selectOption('#f-rule-kind-value', 'modern-softmax')
    await page.fill('#f-rule-beta-value', '8')
    await page.locator('#check-state[data-state="valid"]').waitFor()
    expect((await specText()).rule).toEqual({ kind: 'modern-softmax', beta: 8 })

    await page.selectOption('#f-rule-kind-value', 'hebbian')
    await page.check('#f-dilution-on')
    await page.selectOption('#f-dilution-kind-value', 'fixed-in-degree')
    await page.fill('#f-dilution-inDegree-value', '25')
    await page.locator('#check-state[data-state="valid"]').waitFor()
    expect((await specText()).dilution).toEqual({ kind: 'fixed-in-degree', inDegree: 25 })
    await shot(page, 'submit-model-families')
    await page.close()
  })

  it('shows each validation error at its field, in the form and in the JSON view', async () => {
    const page = await context.newPage()
    await page.goto(`${open.url}/#/new?from=room-capacity`)
    await page.locator('#check-state[data-state="valid"]').waitFor()
    await page.fill('#f-cue-fraction-value', '1.5')
    await page.fill('#f-load-step', '')
    const cueError = page.locator('[data-field="cue.fraction"] .field-error')
    const loadError = page.locator('[data-field="load"] .field-error')
    await cueError.waitFor()
    await loadError.waitFor()
    expect(await cueError.textContent()).toMatch(/<=\s*1/)
    expect(await loadError.textContent()).toMatch(/step/)
    expect(await page.locator('#f-cue-fraction-value').getAttribute('aria-invalid')).toBe('true')
    expect(await page.locator('[data-field="neurons"] .field-error').isHidden()).toBe(true)
    expect(await page.locator('#check-state').textContent()).toContain('2 problems')
    expect(await page.locator('#submit-sweep').isDisabled()).toBe(true)
    await shot(page, 'submit-errors')

    await page.check('#edit-mode-json')
    const issues = page.locator('#spec-json-issues')
    await issues.locator('li', { hasText: 'cue.fraction' }).waitFor()
    expect(await issues.textContent()).toMatch(/cue\.fraction \(line \d+\)/)
    // The line number takes you to the offending line.
    await issues.locator('li', { hasText: 'cue.fraction' }).getByRole('button', { name: /^line \d+$/ }).click()
    const selected = await page.evaluate<string>("(() => { const t = document.getElementById('spec-json'); return t.value.slice(t.selectionStart, t.selectionEnd) })()")
    expect(selected).toContain('"fraction": 1.5')
    await shot(page, 'submit-json-errors')

    await page.check('#edit-mode-form')
    await page.fill('#f-cue-fraction-value', '0.1')
    await page.fill('#f-load-step', '0.02')
    await page.locator('#check-state[data-state="valid"]').waitFor()
    expect(await cueError.isHidden()).toBe(true)
    expect(await page.locator('#submit-sweep').isEnabled()).toBe(true)

    await page.setViewportSize(NARROW)
    await shot(page, 'submit-narrow')
    await expectNoSidewaysScroll(page)
    await page.close()
  })

  it('overlays two finished sweeps on one figure; copies a spec and re-runs it with a new seed', async () => {
    const base = { neurons: 120, load: { from: 0.04, to: 0.28, step: 0.04 }, cue: { kind: 'flip', fraction: 0.05 }, dynamics: { maxSweeps: 30 }, trials: 24 }
    const hebbian = await submit(open, { ...base, label: 'Room codes, Hebbian rule', rule: { kind: 'hebbian' } })
    const storkey = await submit(open, { ...base, label: 'Room codes, Storkey rule', rule: { kind: 'storkey' } })
    await Promise.all([hebbian, storkey].map(async (id) => await waitFor(open, id, (r) => TERMINAL_STATUSES.has(r.status))))
    const page = await context.newPage()
    const overlays: string[] = []
    page.on('request', (request) => { if (request.url().includes('/v1/figures/overlay.svg')) overlays.push(request.url()) })
    await page.goto(`${open.url}/#/compare?ids=${hebbian},${storkey}`)
    await expect.poll(async () => await page.evaluate<boolean>(IMAGE_SHOWN), POLL).toBe(true)
    // The figure comes from the overlay route, one series per sweep.
    expect(new URL(overlays.at(-1) ?? 'http://x/').searchParams.get('sweeps')).toBe(`${hebbian},${storkey}`)
    const overlay = await (await fetch(overlays.at(-1) as string)).text()
    expect(overlay).toContain('Room codes, Hebbian rule')
    expect(overlay).toContain('Room codes, Storkey rule')
    expect(await page.locator('img.figure-image').getAttribute('alt')).not.toBe('')
    await shot(page, 'compare')

    // A server without the overlay route: the page draws the curves itself from the results.
    await page.route('**/v1/figures/overlay.svg*', async (route) => await route.fulfill({
      status: 404,
      contentType: 'application/problem+json',
      body: JSON.stringify({ status: 404, title: 'No such route', code: 'MEMSWEEP_ROUTE_NOT_FOUND' })
    }))
    await page.reload()
    await page.locator('.figure-status', { hasText: 'Drawn in the browser from the results.' }).waitFor()
    await expect.poll(async () => await page.evaluate<boolean>(IMAGE_SHOWN), POLL).toBe(true)
    expect(await page.locator('img.figure-image').getAttribute('alt')).toContain('2 curve(s) of recall success rate')
    await shot(page, 'compare-drawn-in-page')
    await page.unroute('**/v1/figures/overlay.svg*')

    // From a sweep's page: copy its normalised spec, then run it again with a new seed.
    await context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: open.url })
    await page.goto(`${open.url}/#/sweeps/${hebbian}`)
    await page.getByRole('button', { name: 'Copy spec' }).click()
    await page.getByText('The normalised spec is on the clipboard.').waitFor()
    const copied = JSON.parse(await page.evaluate<string>('navigator.clipboard.readText()')) as Record<string, unknown>
    const original = (await open.queue.get(hebbian))?.spec as unknown as Record<string, unknown>
    expect(copied).toEqual(original)

    await page.getByRole('button', { name: 'Re-run with a new seed' }).click()
    await page.getByRole('dialog').getByRole('button', { name: 'Submit the copy' }).click()
    await page.waitForURL((url) => url.hash.startsWith('#/sweeps/') && !url.hash.endsWith(hebbian))
    const rerun = decodeURIComponent(page.url().split('#/sweeps/')[1] ?? '')
    const record = await waitFor(open, rerun, (r) => TERMINAL_STATUSES.has(r.status))
    const spec = record.spec as unknown as Record<string, unknown>
    expect(record.status).toBe('succeeded')
    expect(spec.seed).not.toBe(original.seed)
    expect({ ...spec, seed: 0, label: '' }).toEqual({ ...original, seed: 0, label: '' })
    expect(record.label).toBe(`Room codes, Hebbian rule (seed ${String(spec.seed)})`)
    await page.close()
  })

  it('shows a threshold search: each crossing with its interval, and the evaluated steps around the level', async () => {
    const spec = { ...example('room-basin-search'), neurons: 300, trials: 30 }
    const id = await submit(open, spec)
    const record = await waitFor(open, id, (r) => TERMINAL_STATUSES.has(r.status))
    expect(record.status).toBe('succeeded')
    const page = await context.newPage()
    await page.goto(`${open.url}/#/sweeps/${id}`)
    const rows = page.locator('#search-heading + .table-wrap tbody tr')
    await rows.first().waitFor()
    expect(await rows.count()).toBe(3)
    const result = await (await fetch(`${open.url}/v1/sweeps/${id}/results`)).json() as { searches: Array<{ estimate: number | null }> }
    const shown = await rows.evaluateAll((trs) => trs.map((tr) => tr.children[2]?.textContent ?? ''))
    expect(shown).toEqual(result.searches.map((search) => search.estimate === null ? '–' : String(Number(search.estimate.toPrecision(4)))))
    const plot = page.locator('.search-figure svg.plot')
    expect(await plot.locator('g[data-curve]').count()).toBe(3)
    expect(await plot.locator('text', { hasText: 'level 0.5' }).count()).toBe(1)
    await shot(page, 'threshold-search')
    await page.close()
  })

  it('refines a sweep from its page: the figure so far while it runs, tags, an extension; the list shows model, seed, tags and curve', async () => {
    gate.hold()
    const spec = { label: 'Rooms of the west wing', neurons: 120, load: { values: [0.06, 0.1, 0.14, 0.18] }, trials: 40, seed: 5 }
    const id = await submit(open, spec)
    gate.release(2)
    await waitFor(open, id, (r) => r.progress.pointsDone >= 2)
    const page = await context.newPage()
    await page.goto(`${open.url}/#/sweeps/${id}`)
    // Drawn from the finished points, marked partial, while the rest wait at the gate.
    const badge = page.locator('.live-figure .partial-badge')
    await badge.filter({ hasText: /^partial · [23] of 4 points$/ }).waitFor()
    await expect.poll(async () => await page.evaluate<boolean>("(() => { const img = document.querySelector('.partial-figure img'); return img !== null && img.src.startsWith('blob:') && img.complete && img.naturalWidth > 0 })()"), POLL).toBe(true)
    expect(await page.locator('.partial-figure img').getAttribute('alt')).toMatch(/^Partial figure, [23] of 4 grid points/)
    await shot(page, 'sweep-partial-figure')
    gate.open()
    await page.locator('.page-head .status[data-status="succeeded"]').waitFor()
    await page.locator('img.figure-image[src^="blob:"]').waitFor()
    expect(await page.locator('.live-figure').count()).toBe(0)
    // The table: the varied parameter pinned, theory headers that say which theory, ± that says SD or SE, a column chooser.
    expect(await page.locator('table.results thead th.pinned').allTextContents()).toEqual(['load α'])
    const critical = page.locator('table.results thead th.col-theory', { hasText: 'critical load α_c (MF)' })
    expect(await critical.getAttribute('title')).toMatch(/^Mean-field theory \(the N → ∞ limit\)/)
    expect(await page.locator('table.results thead th', { hasText: 'final overlap ± SD' }).count()).toBe(1)
    const withSe = page.locator('table.results thead th[data-col="overlap-se"]')
    expect(await withSe.isHidden()).toBe(true)
    await page.locator('.column-chooser > summary').click()
    await page.getByRole('checkbox', { name: 'final overlap ± SE' }).check()
    await withSe.waitFor()
    await shot(page, 'sweep-results-table')
    // The figure as shown, sized for a journal column, as PDF; and the bundle for a paper.
    const [pdf] = await Promise.all([page.waitForEvent('download'), page.locator('button[data-download="pdf"]').click()])
    expect(pdf.suggestedFilename()).toBe(`memsweep-${id}-success.pdf`)
    expect(readFileSync(await pdf.path()).subarray(0, 5).toString('latin1')).toBe('%PDF-')
    const [bundle] = await Promise.all([page.waitForEvent('download'), page.locator('button[data-download="bundle"]').click()])
    expect(bundle.suggestedFilename()).toBe(`memsweep-${id}.zip`)
    expect(readFileSync(await bundle.path()).subarray(0, 2).toString('latin1')).toBe('PK')

    await page.locator('details.describe > summary').click()
    await page.getByLabel('Tags').fill('west-wing, draft')
    await page.getByRole('button', { name: 'Save' }).click()
    await page.locator('.sweep-subhead .tags a', { hasText: 'west-wing' }).waitFor()
    expect((await open.queue.get(id))?.tags).toEqual(['west-wing', 'draft'])

    await page.locator('details.refine > summary').click()
    await page.getByLabel('Trials per point').fill('60')
    await page.getByLabel('Add values to').selectOption('load')
    await page.getByLabel('New values').fill('0.22')
    await shot(page, 'sweep-extend-form')
    await page.getByRole('button', { name: 'Extend sweep' }).click()
    await page.waitForURL((url) => url.hash.startsWith('#/sweeps/') && !url.hash.endsWith(id))
    const child = decodeURIComponent(page.url().split('#/sweeps/')[1] ?? '')
    const extended = await waitFor(open, child, (r) => TERMINAL_STATUSES.has(r.status))
    expect(extended).toMatchObject({ status: 'succeeded', extends: id, reused: { points: 0, trials: 160 } })
    await page.locator('.sweep-subhead', { hasText: 'Extends' }).waitFor()

    await page.goto(`${open.url}/#/`)
    const entry = page.locator(`li.sweep-entry[data-id="${id}"]`)
    await entry.locator('.model-line', { hasText: 'N 120 · Hebbian · α 0.06–0.18 (4)' }).waitFor()
    expect(await entry.locator('.seed').textContent()).toBe('seed 5')
    expect(await entry.locator('.tags a').allTextContents()).toEqual(['west-wing', 'draft'])
    await entry.locator('.entry-thumb svg.thumb path.thumb-line').first().waitFor()
    await shot(page, 'list-entries')

    // Filters by tag go to the server and into the URL.
    await page.fill('#tag-filter', 'draft')
    await expect.poll(async () => new URL(page.url()).hash, POLL).toBe('#/?tag=draft')
    await expect.poll(async () => await page.locator('.sweep-list > li').evaluateAll((items) => items.map((li) => li.getAttribute('data-id')).sort()), POLL).toEqual([id, child].sort())

    // Removing a finished sweep asks first, then it is gone for good.
    await page.goto(`${open.url}/#/sweeps/${child}`)
    await page.getByRole('button', { name: 'Remove…' }).click()
    await page.getByRole('dialog', { name: 'Remove this sweep for good?' }).getByRole('button', { name: 'Remove for good' }).click()
    await page.waitForURL((url) => url.hash === '#/')
    expect(await open.queue.get(child)).toBeNull()
    await page.close()
  })

  it('cancels a running sweep from the list, only after confirmation', async () => {
    gate.hold()
    const id = await submit(open, { ...example('room-capacity'), label: 'Large capacity sweep to cancel' })
    gate.release(3)
    await waitFor(open, id, (r) => r.status === 'running' && r.progress.chunksDone >= 3)
    await gate.untilWaiting()
    const page = await context.newPage()
    await page.goto(`${open.url}/`)
    // Keyboard first: the skip link comes first and lands on the content without leaving the page.
    await page.keyboard.press('Tab')
    expect(await page.evaluate<string>('document.activeElement.className')).toBe('skip-link')
    await page.keyboard.press('Enter')
    expect(await page.evaluate<string>('document.activeElement.id')).toBe('main')
    expect(new URL(page.url()).hash).toBe('')
    const row = page.locator(`li.sweep-entry[data-id="${id}"]`)
    await row.locator('.status[data-status="running"]').waitFor()
    // Progress arrives live and says how long is left.
    await row.locator('.bar-text', { hasText: 'left' }).waitFor()
    await shot(page, 'list-running', false)

    await row.getByRole('button', { name: /^Cancel/ }).click()
    const dialog = page.getByRole('dialog', { name: 'Cancel this sweep?' })
    await dialog.waitFor()
    await shot(page, 'list-cancel-dialog', false)
    // Escape is the safe way out: nothing is canceled.
    await page.keyboard.press('Escape')
    await dialog.waitFor({ state: 'detached' })
    expect((await open.queue.get(id))?.status).toBe('running')

    await row.getByRole('button', { name: /^Cancel/ }).click()
    await dialog.getByRole('button', { name: 'Cancel sweep' }).click()
    await row.locator('.status[data-status="canceled"]').waitFor()
    const record = await waitFor(open, id, (r) => TERMINAL_STATUSES.has(r.status))
    expect(record.status).toBe('canceled')
    gate.open()
    await shot(page, 'list-after-cancel', false)

    // The status filter asks the server for one status only.
    await page.selectOption('#status-filter', 'canceled')
    await expect.poll(async () => await page.locator('.sweep-list > li').evaluateAll((rows) => rows.map((r) => r.getAttribute('data-status'))), POLL).toEqual(['canceled'])
    await page.selectOption('#status-filter', '')
    await page.locator('.sweep-list > li[data-status="succeeded"] >> nth=0').waitFor()

    await page.setViewportSize(NARROW)
    await shot(page, 'list-narrow')
    await expectNoSidewaysScroll(page)
    await page.close()
  })

  it('asks for a token on 401 and keeps it in this tab\'s session storage only, never in a URL or a log', async () => {
    const token = 'lab-token-for-ada-5f1c2e9a7b'
    guarded = await startWebServer({ tokens: [`ada:${token}`, 'grace:lab-token-for-grace-83d0a4:admin'] })
    const id = await submit(guarded, { ...example('room-temperature'), trials: 10 }, token)
    await waitFor(guarded, id, (r) => TERMINAL_STATUSES.has(r.status))

    const tab = await browser.newContext({ viewport: WIDE })
    const page = await tab.newPage()
    const urls: string[] = []
    const authorised: string[] = []
    page.on('request', (request) => {
      urls.push(request.url())
      if (request.headers().authorization !== undefined) authorised.push(new URL(request.url()).pathname)
    })
    await page.goto(`${guarded.url}/`)
    const dialog = page.getByRole('dialog', { name: 'This server needs an access token' })
    await dialog.waitFor()
    await page.fill('#token-input', 'not-a-token-anyone-has-1234')
    await page.keyboard.press('Enter')
    await dialog.getByText('did not accept').waitFor()
    await shot(page, 'token-rejected', false)
    await page.fill('#token-input', token)
    await dialog.getByRole('button', { name: 'Use token' }).click()

    const row = page.locator(`li.sweep-entry[data-id="${id}"]`)
    await row.waitFor()
    expect((await row.locator('.entry-owner').textContent())?.trim()).toBe('· ada')
    expect(await page.locator('#token-state').isVisible()).toBe(true)
    await shot(page, 'list-with-owner', false)

    // The sweep page reads everything with the token too (status, results, figure).
    await row.locator('a.entry-label').click()
    await page.locator('img.figure-image[src^="blob:"]').waitFor()

    expect(await page.evaluate<string | null>('sessionStorage.getItem("memsweep.token")')).toBe(token)
    expect(await page.evaluate<number>('localStorage.length')).toBe(0)
    expect(await tab.cookies()).toEqual([])
    expect(urls.filter((u) => u.includes(token))).toEqual([])
    expect(authorised).toEqual(expect.arrayContaining(['/v1/sweeps', `/v1/sweeps/${id}`, `/v1/sweeps/${id}/results`, `/v1/sweeps/${id}/figure.svg`]))
    expect(guarded.logs.join('')).not.toContain(token)
    expect(guarded.logs.join('')).not.toContain('not-a-token-anyone-has')

    await page.click('#forget-token')
    expect(await page.evaluate<string | null>('sessionStorage.getItem("memsweep.token")')).toBeNull()
    await dialog.waitFor()
    await tab.close()
  })

  it('raised no script errors on any page', () => {
    expect(pageErrors).toEqual([])
  })
})
