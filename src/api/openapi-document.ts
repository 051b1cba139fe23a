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

export const transformDocument: SwaggerTransformObject = (document) => pruneUnusedSchemas(jsonSchemaTransformObject(document) as Parameters<typeof pruneUnusedSchemas>[0]) as ReturnType<SwaggerTransformObject>
