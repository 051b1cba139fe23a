/**
 * Validates real responses against the committed OpenAPI document (Ajv, JSON Schema
 * 2020-12, which OpenAPI 3.1 uses): the operation is found by method and path template,
 * the response by status code, the schema by media type.
 */
import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { Ajv2020 } from 'ajv/dist/2020.js'

const DOCUMENT_ID = 'https://memsweep.invalid/openapi.json'

export const openApiDocument = JSON.parse(readFileSync(fileURLToPath(new URL('../../../openapi/openapi.json', import.meta.url)), 'utf8')) as {
  paths: Record<string, Record<string, { responses: Record<string, { content?: Record<string, { schema: unknown }>, headers?: Record<string, unknown> }> }>>
  components: { schemas: Record<string, unknown> }
}

const ajv = new Ajv2020({ strict: false, allErrors: true })
ajv.addSchema({ ...openApiDocument, $id: DOCUMENT_ID })

const pointer = (segment: string): string => segment.replaceAll('~', '~0').replaceAll('/', '~1')

/**
 * The path template of a concrete URL path (`/v1/sweeps/abc/results` → `/v1/sweeps/{id}/results`).
 * With a method, a template that has that operation wins, as in the router: DELETE
 * /v1/sweeps/validate is the cancel route with the id `validate`.
 */
export function templateOf (path: string, method?: string): string | null {
  const clean = path.split('?')[0] ?? ''
  const matching = Object.keys(openApiDocument.paths).filter((template) => {
    // An empty segment fills a parameter too (the router matches /v1/sweeps/ to /v1/sweeps/:id, and validation refuses it).
    return new RegExp('^' + template.replace(/\{[^}]+\}/g, '[^/]*') + '$').test(clean)
  })
  const withMethod = method === undefined ? undefined : matching.find((template) => openApiDocument.paths[template]?.[method.toLowerCase()] !== undefined)
  return withMethod ?? matching[0] ?? null
}

export interface CheckedResponse {
  statusCode: number
  headers: Record<string, string | string[] | number | undefined>
  body: string
}

/**
 * What a request outside the document may get: 404 from the not-found handler, or what is
 * decided before it (400 for a path that is not valid percent-encoding or a body that is not
 * JSON, 413 and 415 for a body the not-found route cannot read either, 401 and 429 on a
 * server with tokens), always as a problem document.
 */
const OUTSIDE_THE_DOCUMENT = new Set([400, 401, 404, 413, 415, 429])

/**
 * Throws unless the response is one the document declares, with a body matching its schema.
 * Unknown routes and methods must answer one of OUTSIDE_THE_DOCUMENT as problem+json.
 */
export function assertMatchesDocument (method: string, url: string, response: CheckedResponse): void {
  if (typeof response.headers['x-request-id'] !== 'string') throw new Error(`${method} ${url}: no X-Request-Id header`)
  const template = templateOf(url, method)
  const contentType = String(response.headers['content-type'] ?? '').split(';')[0]?.trim() ?? ''
  const operation = template === null ? undefined : openApiDocument.paths[template]?.[method.toLowerCase()]
  if (template === null || operation === undefined) {
    if (!OUTSIDE_THE_DOCUMENT.has(response.statusCode) || contentType !== 'application/problem+json') {
      throw new Error(`${method} ${url}: not in the document, and answered ${response.statusCode} ${contentType}`)
    }
    validate('#/components/schemas/Problem', JSON.parse(response.body), `${method} ${url}`)
    return
  }
  const declared = operation.responses[String(response.statusCode)]
  if (declared === undefined) {
    throw new Error(`${method} ${template}: status ${response.statusCode} is not declared (declared: ${Object.keys(operation.responses).join(', ')}); body ${response.body.slice(0, 300)}`)
  }
  // Headers a response sends must be documented for it (the conditional ones may be absent).
  for (const name of ['location', 'etag', 'link', 'retry-after', 'www-authenticate', 'content-disposition']) {
    if (response.headers[name] !== undefined && !Object.keys(declared.headers ?? {}).some((h) => h.toLowerCase() === name)) {
      throw new Error(`${method} ${template} ${response.statusCode}: sends ${name} but the document does not declare it`)
    }
  }
  if (declared.content === undefined) {
    if (response.body !== '') throw new Error(`${method} ${template} ${response.statusCode}: declared without a body but sent one`)
    return
  }
  if (declared.content[contentType] === undefined) {
    throw new Error(`${method} ${template} ${response.statusCode}: content type '${contentType}' not declared (${Object.keys(declared.content).join(', ')})`)
  }
  const body: unknown = contentType.endsWith('json') ? JSON.parse(response.body) : response.body
  const ref = `#/paths/${pointer(template)}/${method.toLowerCase()}/responses/${response.statusCode}/content/${pointer(contentType)}/schema`
  validate(ref, body, `${method} ${template} ${response.statusCode}`)
}

function validate (ref: string, body: unknown, where: string): void {
  const check = ajv.getSchema(`${DOCUMENT_ID}${ref}`)
  if (check === undefined) throw new Error(`${where}: no schema at ${ref}`)
  if (!check(body)) {
    throw new Error(`${where}: body does not match the document: ${ajv.errorsText(check.errors)}\n${JSON.stringify(body).slice(0, 500)}`)
  }
}

/** Throws unless `body` matches the named component schema. */
export function assertComponent (name: string, body: unknown): void {
  validate(`#/components/schemas/${name}`, body, `component ${name}`)
}
