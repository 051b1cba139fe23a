/**
 * Serving the built page: `/` and `/assets/*` from memory, public even when tokens are on,
 * revalidated by ETag, a strict content-security policy, a helpful answer when no build
 * exists, and nothing of it in the OpenAPI document.
 */
import { mkdtemp, readdir, readFile, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import type { FastifyInstance } from 'fastify'
import { pino } from 'pino'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { buildApp } from '../../src/api/app.js'
import type { SweepQueue } from '../../src/backends/port.js'
import { loadConfig } from '../../src/config.js'
import { parseTokens } from '../../src/api/tokens.js'
import { buildWebOnce } from './helpers/server.js'

/** The page's routes never reach the backend: any call would be a bug. */
function untouchableQueue (): SweepQueue {
  const refuse = (): never => { throw new Error('the web routes must not use the queue') }
  // Every app starts its completion callbacks when ready: the one call that is not a web route's.
  return new Proxy({ kind: 'embedded', close: async () => {}, startCallbacks: () => {} } as unknown as SweepQueue, {
    get: (target, property) => Reflect.get(target, property) ?? refuse
  })
}

const TOKEN = 'web-route-test-token-0123456789'

function appWith (webRoot: string | null, tokens: boolean): FastifyInstance {
  return buildApp({
    config: loadConfig({ LOG_LEVEL: 'silent' }),
    queue: untouchableQueue(),
    logger: pino({ level: 'silent' }),
    tokens: tokens ? parseTokens(`ada:${TOKEN}`) : null,
    webRoot
  })
}

describe('web page route', () => {
  let app: FastifyInstance
  let empty: string

  beforeAll(async () => {
    app = appWith(await buildWebOnce(), true)
    await app.ready()
    empty = await mkdtemp(join(tmpdir(), 'memsweep-web-none-'))
  })
  afterAll(async () => {
    await app.close()
    await rm(empty, { recursive: true, force: true })
  })

  it('serves the page at / without a token, with a policy that only allows its own scripts and styles', async () => {
    const response = await app.inject({ url: '/' })
    expect(response.statusCode).toBe(200)
    expect(response.headers['content-type']).toBe('text/html; charset=utf-8')
    expect(response.body).toContain('<script type="module" src="assets/main.js">')
    const policy = String(response.headers['content-security-policy'])
    expect(policy).toContain("script-src 'self'")
    expect(policy).toContain("default-src 'none'")
    expect(policy).toContain("frame-ancestors 'none'")
    expect(policy).not.toContain('unsafe-inline')
    expect(response.headers['referrer-policy']).toBe('no-referrer')
  })

  it('serves every asset the page loads, with its media type, without a token', async () => {
    const page = (await app.inject({ url: '/' })).body
    const referenced = [...page.matchAll(/(?:src|href)="(assets\/[^"]+)"/g)].map((m) => m[1] as string)
    expect(referenced).toEqual(expect.arrayContaining(['assets/main.js', 'assets/style.css', 'assets/icon.svg']))
    const types: Record<string, string> = { js: 'text/javascript; charset=utf-8', css: 'text/css; charset=utf-8', svg: 'image/svg+xml', json: 'application/json; charset=utf-8' }
    for (const path of [...referenced, 'assets/pages/submit.js', 'assets/examples.json']) {
      const response = await app.inject({ url: `/${path}` })
      expect(response.statusCode, path).toBe(200)
      expect(response.headers['content-type'], path).toBe(types[path.split('.').pop() as string])
      expect(response.headers['x-content-type-options'], path).toBe('nosniff')
    }
  })

  it('ships every example spec of examples/ for the submit page, as written', async () => {
    const examples = (await app.inject({ url: '/assets/examples.json' })).json<Array<{ name: string, spec: Record<string, unknown> }>>()
    const folder = fileURLToPath(new URL('../../examples/', import.meta.url))
    const files = (await readdir(folder)).filter((name) => name.endsWith('.json')).sort()
    expect(files.length).toBeGreaterThan(0)
    expect(examples.map((e) => `${e.name}.json`)).toEqual(files)
    for (const example of examples) {
      expect(example.spec, example.name).toEqual(JSON.parse(await readFile(join(folder, `${example.name}.json`), 'utf8')))
    }
  })

  it('answers 304 to a matching If-None-Match, so reloads cost no bytes', async () => {
    const first = await app.inject({ url: '/assets/main.js' })
    const etag = String(first.headers.etag)
    expect(etag).toMatch(/^"[\w-]+"$/)
    expect(first.headers['cache-control']).toBe('no-cache')
    const again = await app.inject({ url: '/assets/main.js', headers: { 'if-none-match': etag } })
    expect(again.statusCode).toBe(304)
    expect(again.body).toBe('')
  })

  it('answers 404 problem documents for files that are not in the build', async () => {
    for (const url of ['/assets/nope.js', '/assets/', '/assets/pages']) {
      const response = await app.inject({ url })
      expect(response.statusCode, url).toBe(404)
      expect(response.headers['content-type'], url).toContain('application/problem+json')
    }
  })

  it('never serves a file outside the build, however the path is spelled', async () => {
    for (const url of ['/assets/..%2f..%2fpackage.json', '/assets/%2e%2e/%2e%2e/package.json', '/assets/../../package.json', '/assets/..\\..\\package.json']) {
      const response = await app.inject({ url })
      expect(response.statusCode, url).not.toBe(200)
      expect(response.body, url).not.toContain('devDependencies')
    }
  })

  it('still guards the API with tokens', async () => {
    expect((await app.inject({ url: '/v1/sweeps' })).statusCode).toBe(401)
  })

  it('leaves the page out of the OpenAPI document', async () => {
    const document = (await app.inject({ url: '/openapi.json', headers: { authorization: `Bearer ${TOKEN}` } })).json<{ paths: Record<string, unknown> }>()
    expect(Object.keys(document.paths).filter((path) => !path.startsWith('/v1/') && !['/healthz', '/readyz', '/metrics', '/openapi.json'].includes(path))).toEqual([])
  })

  it('explains how to build the page when there is no build', async () => {
    const bare = appWith(empty, false)
    try {
      const response = await bare.inject({ url: '/' })
      expect(response.statusCode).toBe(503)
      expect(response.headers['content-type']).toBe('text/html; charset=utf-8')
      expect(response.body).toContain('npm run build')
      expect((await bare.inject({ url: '/assets/main.js' })).statusCode).toBe(404)
    } finally {
      await bare.close()
    }
  })

  it('registers nothing when told to leave the page out', async () => {
    const bare = appWith(null, false)
    try {
      const response = await bare.inject({ url: '/' })
      expect(response.statusCode).toBe(404)
      expect(response.json<{ code: string }>().code).toBe('MEMSWEEP_ROUTE_NOT_FOUND')
    } finally {
      await bare.close()
    }
  })
})
