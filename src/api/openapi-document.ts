/**
 * Post-processing of the generated OpenAPI document. fastify-type-provider-zod emits every
 * registered schema twice (as read in requests and as written in responses); only the
 * variants some operation actually references are kept, so the document lists no dead
 * components.
 */
import type { SwaggerTransformObject } from '@fastify/swagger'
import { jsonSchemaTransformObject } from 'fastify-type-provider-zod'

const REF = '#/components/schemas/'

function collectRefs (node: unknown, into: Set<string>): void {
  if (Array.isArray(node)) { for (const item of node) collectRefs(item, into); return }
  if (node === null || typeof node !== 'object') return
  for (const [key, value] of Object.entries(node)) {
    if (key === '$ref' && typeof value === 'string' && value.startsWith(REF)) into.add(value.slice(REF.length))
    else collectRefs(value, into)
  }
}

export function pruneUnusedSchemas<T extends { paths?: unknown, components?: { schemas?: Record<string, unknown> } }> (document: T): T {
  const schemas = document.components?.schemas
  if (schemas === undefined) return document
  const used = new Set<string>()
  collectRefs(document.paths, used)
  const pending = [...used]
  while (pending.length > 0) {
    const name = pending.pop() as string
    const found = new Set<string>()
    collectRefs(schemas[name], found)
    for (const ref of found) if (!used.has(ref)) { used.add(ref); pending.push(ref) }
  }
  const kept = Object.fromEntries(Object.keys(schemas).sort().filter((name) => used.has(name)).map((name) => [name, schemas[name]]))
  return { ...document, components: { ...document.components, schemas: kept } }
}

interface HeaderObject { description: string, schema: { type: 'string' | 'integer' } }
type Operation = { operationId?: string, responses?: Record<string, { headers?: Record<string, HeaderObject> }> }

const text = (description: string): HeaderObject => ({ description, schema: { type: 'string' } })
const seconds = (description: string): HeaderObject => ({ description, schema: { type: 'integer' } })

const FIGURE_HEADERS: Record<string, Record<string, HeaderObject>> = {
  200: {
    ETag: text('Strong validator: the sha256 of the bytes (base64url), one per set of options.'),
    'Content-Disposition': text('inline; filename="memsweep-<id>-<measure>.<svg, png or pdf>" (overlays: memsweep-overlay-<measure>.<format>).'),
    'Content-Security-Policy': text('default-src \'none\': the figure runs and loads nothing.')
  },
  304: { ETag: text('The current validator.') },
  409: {
    'Retry-After': seconds('While a sweep runs: suggested seconds before asking again.'),
    Link: text('While a sweep runs: `<…>; rel="monitor"`, the status to follow.')
  }
}

/** Response headers clients rely on, which route schemas cannot express. */
const SUBMISSION_HEADERS: Record<string, Record<string, HeaderObject>> = {
  200: {
    Location: text('Path of the sweep\'s status.'),
    'Content-Location': text('The same path: the body is that sweep\'s (final) status.')
  },
  202: { Location: text('Path of the new sweep\'s status.'), 'Retry-After': seconds('Suggested seconds before the first status poll.') }
}

const OPERATION_HEADERS: Record<string, Record<string, Record<string, HeaderObject>>> = {
  submitSweep: SUBMISSION_HEADERS,
  extendSweep: SUBMISSION_HEADERS,
  resumeSweep: { 202: { Location: text('Path of the sweep\'s status.'), 'Retry-After': seconds('Suggested seconds before the next status poll.') } },
  getSweep: { 200: { ETag: text('Weak validator of the sweep\'s state; send it in If-None-Match to get 304 until the sweep changes.') }, 304: { ETag: text('The current validator.') } },
  listSweeps: { 200: { Link: text('`<…>; rel="next"` URL of the next page; absent on the last page.') } },
  getSweepResults: {
    200: {
      ETag: text('Strong validator: the sha256 of the bytes (base64url), one per representation.'),
      Vary: text('Accept.'),
      'Content-Disposition': text('CSV only: attachment; filename="memsweep-<id>.csv".'),
      'Memsweep-Partial': text('Partial results only (?partial=true on a sweep that has not succeeded): `<points done>/<points>`; such answers carry Cache-Control: no-store and no ETag.'),
      'Cache-Control': text('A finished result never changes: private, immutable. Partial results: no-store.')
    },
    304: { ETag: text('The current validator.'), Vary: text('Accept.') },
    409: {
      'Retry-After': seconds('While the sweep runs: suggested seconds before asking again.'),
      Link: text('While the sweep runs: `<…>; rel="monitor"`, the status to follow.')
    }
  },
  getSweepFigure: FIGURE_HEADERS,
  getOverlayFigure: FIGURE_HEADERS,
  getSweepFigurePng: FIGURE_HEADERS,
  getOverlayFigurePng: FIGURE_HEADERS,
  getSweepFigurePdf: FIGURE_HEADERS,
  getOverlayFigurePdf: FIGURE_HEADERS,
  getSweepBundle: {
    200: {
      ETag: text('Strong validator: the sha256 of the bytes (base64url); it changes when the sweep\'s label, tags or notes (in the README and provenance) do.'),
      'Content-Disposition': text('attachment; filename="memsweep-<id>.zip".'),
      'Cache-Control': text('private, no-cache: revalidate with If-None-Match (an annotation edit changes the bundle).')
    },
    304: { ETag: text('The current validator.') },
    409: FIGURE_HEADERS[409]!
  }
}

/** Headers any answer may carry, by status. */
const STATUS_HEADERS: Record<string, Record<string, HeaderObject>> = {
  401: { 'WWW-Authenticate': text('Bearer challenge.') },
  429: { 'Retry-After': seconds('Seconds until the limit resets (or until a sweep may have finished).') },
  503: { 'Retry-After': seconds('Seconds before trying again.') }
}

const REQUEST_ID: Record<string, HeaderObject> = { 'X-Request-Id': text('The request id (the client\'s, when it sent a plain one); also in problem documents and in the server log.') }

export function addResponseHeaders<T extends { paths?: unknown }> (document: T): T {
  const paths = document.paths as Record<string, Record<string, Operation>> | undefined
  for (const operations of Object.values(paths ?? {})) {
    for (const operation of Object.values(operations)) {
      for (const [status, response] of Object.entries(operation.responses ?? {})) {
        const headers = { ...REQUEST_ID, ...STATUS_HEADERS[status], ...OPERATION_HEADERS[operation.operationId ?? '']?.[status] }
        response.headers = { ...response.headers, ...headers }
      }
    }
  }
  return document
}

export const transformDocument: SwaggerTransformObject = (document) =>
  addResponseHeaders(pruneUnusedSchemas(jsonSchemaTransformObject(document) as Parameters<typeof pruneUnusedSchemas>[0])) as ReturnType<SwaggerTransformObject>
