/**
 * The lab's web page: the built files of web/ (scripts/build-web.mjs writes them to
 * dist/web), served at `/` and `/assets/*` without a token, since the page itself asks for
 * one when the API answers 401.
 *
 * The files are few and fixed once built, so they are read into memory when the app starts:
 * requests never touch the file system, and only names found in the build are ever served.
 */
import { createHash } from 'node:crypto'
import { readdir, readFile } from 'node:fs/promises'
import { extname, join, relative, sep } from 'node:path'
import { fileURLToPath } from 'node:url'
import type { FastifyPluginAsync, FastifyReply } from 'fastify'
import { PAGE_CONTENT_SECURITY_POLICY } from '../page-security.js'

/** dist/web from the repository root: the same three levels up from src/api/routes and from dist/api/routes. */
export const DEFAULT_WEB_ROOT = fileURLToPath(new URL('../../../dist/web/', import.meta.url))

export interface WebRoutesOptions {
  /** Folder of the built page; null serves nothing at all (no routes). */
  root: string | null
}

interface WebFile { body: Buffer, type: string, etag: string }

const MEDIA_TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.json': 'application/json; charset=utf-8',
  '.map': 'application/json; charset=utf-8',
  '.txt': 'text/plain; charset=utf-8'
}

const NOT_BUILT_PAGE = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>memsweep: page not built</title></head>
<body><h1>The web page has not been built</h1>
<p>The API works (see <a href="openapi.json">openapi.json</a>), but the page's files are missing.
Run <code>npm run build</code> (or <code>npm start</code>, which builds first) and restart the server.</p>
</body></html>
`

async function listFiles (root: string): Promise<string[]> {
  const entries = await readdir(root, { recursive: true, withFileTypes: true })
  return entries.filter((e) => e.isFile()).map((e) => join(e.parentPath, e.name))
}

/** The built files by URL path ('index.html', 'assets/main.js', …), or null when there is no build. */
async function loadBuild (root: string): Promise<Map<string, WebFile> | null> {
  let paths: string[]
  try {
    paths = await listFiles(root)
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null
    throw error
  }
  const files = new Map<string, WebFile>()
  for (const path of paths) {
    const type = MEDIA_TYPES[extname(path)]
    if (type === undefined) continue
    const body = await readFile(path)
    const etag = `"${createHash('sha256').update(body).digest('base64url').slice(0, 27)}"`
    files.set(relative(root, path).split(sep).join('/'), { body, type, etag })
  }
  return files.has('index.html') ? files : null
}

function sendFile (reply: FastifyReply, file: WebFile, ifNoneMatch: string | undefined): FastifyReply {
  reply
    .header('etag', file.etag)
    // Revalidated on every load (a 304 is cheap), so a rebuilt page is never mixed with stale modules.
    .header('cache-control', 'no-cache')
    .header('x-content-type-options', 'nosniff')
  if (ifNoneMatch !== undefined && ifNoneMatch.split(',').some((t) => t.trim() === file.etag)) {
    return reply.code(304).send()
  }
  return reply.type(file.type).send(file.body)
}

export const webRoutes: FastifyPluginAsync<WebRoutesOptions> = async (app, { root }) => {
  if (root === null) return
  const files = await loadBuild(root)
  if (files === null) app.log.warn({ root }, 'the web page is not built (npm run build); / explains how to build it')

  const routeOptions = { config: { public: true, rateLimit: false }, schema: { hide: true } } as const

  app.get('/', routeOptions, async (request, reply) => {
    reply
      .header('content-security-policy', PAGE_CONTENT_SECURITY_POLICY)
      .header('referrer-policy', 'no-referrer')
      .header('x-frame-options', 'DENY')
    const page = files?.get('index.html')
    if (page === undefined) {
      return reply.code(503).header('cache-control', 'no-store').type(MEDIA_TYPES['.html'] as string).send(NOT_BUILT_PAGE)
    }
    return sendFile(reply, page, request.headers['if-none-match'])
  })

  app.get<{ Params: { '*': string } }>('/assets/*', routeOptions, async (request, reply) => {
    const file = files?.get(`assets/${request.params['*']}`)
    if (file === undefined) return reply.callNotFound()
    return sendFile(reply, file, request.headers['if-none-match'])
  })
}
