/**
 * The API reference at /docs in Debian's Chromium: public (no token), under the page's
 * content security policy with no script refused, and it lists every operation of the
 * generated OpenAPI document, served from this machine only (no request leaves it).
 */
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { PAGE_CONTENT_SECURITY_POLICY } from '../../src/api/page-security.js'
import { createEmbeddedQueue } from '../../src/backends/embedded/index.js'
import { createHarness, type Harness } from '../api/helpers/harness.js'
import { ARTIFACTS, launchChromium } from './helpers/browser.js'

const document = JSON.parse(readFileSync(new URL('../../openapi/openapi.json', import.meta.url), 'utf8')) as { paths: Record<string, Record<string, { operationId: string }>> }
const operationIds = Object.values(document.paths).flatMap((item) => Object.values(item).map((operation) => operation.operationId)).sort()

const TOKEN = 'docs-reader-4c1f9e2a77'

let h: Harness
let url = ''
let browser: Browser

beforeAll(async () => {
  h = await createHarness(async ({ dataDir }) => await createEmbeddedQueue({ dataDir, threads: 1 }), { tokens: [`ada:${TOKEN}`] })
  url = await h.app.listen({ port: 0, host: '127.0.0.1' })
  browser = await launchChromium()
})
afterAll(async () => {
  await browser?.close()
  await h?.close()
})

describe('API reference at /docs', () => {
  it('is served without a token, under the page\'s content security policy', async () => {
    for (const path of ['/docs', '/docs/', '/docs/json']) {
      const response = await fetch(url + path)
      expect(response.status, path).toBe(200)
      expect(response.headers.get('content-security-policy'), path).toBe(PAGE_CONTENT_SECURITY_POLICY)
    }
    // The document of /openapi.json (which asks for a token): the same operations and description.
    interface Served { info: unknown, paths: Record<string, Record<string, { operationId: string }>> }
    const operationsOf = (served: Served): string[] => Object.values(served.paths).flatMap((item) => Object.values(item).map((o) => o.operationId)).sort()
    const reference = await (await fetch(url + '/docs/json')).json() as Served
    const served = await (await fetch(url + '/openapi.json', { headers: { authorization: `Bearer ${TOKEN}` } })).json() as Served
    expect(operationsOf(reference)).toEqual(operationIds)
    expect(operationsOf(served)).toEqual(operationIds)
    expect(reference.info).toEqual(served.info)
  })

  it('renders every operation in Chromium, with no script refused by the policy', async () => {
    const page = await browser.newPage()
    const problems: string[] = []
    const outside: string[] = []
    page.on('console', (message) => { if (message.type() === 'error') problems.push(message.text()) })
    // The renderer sets one inline style, which the policy refuses; nothing shown depends on it. Anything else refused counts.
    const refusedInlineStyle = /^Applying inline style violates the following Content Security Policy directive 'style-src 'self''/
    page.on('pageerror', (error) => problems.push(error.message))
    page.on('request', (request) => { if (!request.url().startsWith(url) && !request.url().startsWith('data:')) outside.push(request.url()) })
    await page.goto(url + '/docs/', { waitUntil: 'load' })
    await page.locator('.opblock').first().waitFor({ timeout: 30_000 })
    const shown = (await page.locator('.opblock .opblock-summary-operation-id').allTextContents()).map((text) => text.trim()).sort()
    expect(shown).toEqual(operationIds)
    await expect(page.locator('.info .title').textContent()).resolves.toContain('memsweep')
    await page.screenshot({ path: join(ARTIFACTS, 'api-reference.png'), fullPage: false })
    expect(problems.filter((text) => !refusedInlineStyle.test(text))).toEqual([])
    expect(outside).toEqual([])
    await page.close()
  })
})
