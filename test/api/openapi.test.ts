/**
 * The OpenAPI document: generated from the route schemas and committed, so it must equal
 * what the code generates now (and so must the TypeScript types generated from it); error codes agree between the registry, docs/errors.md and
 * the document; every operation documents its problems.
 */
import { spawn } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { buildOpenApiDocument, serialiseOpenApiDocument } from '../../src/api/openapi-build.js'
import { ERROR_CODES, ERRORS, problemType } from '../../src/errors.js'
import { generateApiTypes } from '../../scripts/openapi-types.js'
import { openApiDocument } from './helpers/openapi.js'

const read = (path: string): string => readFileSync(fileURLToPath(new URL(path, import.meta.url)), 'utf8')

describe('OpenAPI document', () => {
  it('is exactly what the route schemas generate (run `npm run openapi:generate` after changing a route)', async () => {
    expect(read('../../openapi/openapi.json')).toBe(serialiseOpenApiDocument(await buildOpenApiDocument()))
  })

  it('gives the web page and the CLI their types: src/api-types/openapi.d.ts is what openapi-typescript makes of it', async () => {
    expect(read('../../src/api-types/openapi.d.ts')).toBe(await generateApiTypes(read('../../openapi/openapi.json')))
  })

  it('passes redocly lint (the recommended rules, see openapi/redocly.yaml)', async () => {
    const root = fileURLToPath(new URL('../../', import.meta.url))
    const child = spawn(process.execPath, [join(root, 'node_modules/@redocly/cli/bin/cli.js'), 'lint', '--config', 'openapi/redocly.yaml', 'openapi/openapi.json'], {
      cwd: root,
      env: { ...process.env, REDOCLY_TELEMETRY: 'off', REDOCLY_SUPPRESS_UPDATE_NOTICE: 'true' }
    })
    let output = ''
    child.stdout.on('data', (chunk: Buffer) => { output += chunk.toString('utf8') })
    child.stderr.on('data', (chunk: Buffer) => { output += chunk.toString('utf8') })
    const code = await new Promise<number | null>((resolve) => child.on('close', resolve))
    expect(code, output).toBe(0)
    // Problems are reported as `[n] openapi/openapi.json:line:col`; the Node-version notice is not one.
    expect(output).not.toMatch(/^\[\d+\] openapi\//m)
    expect(output).toContain('valid')
  })

  it('is OpenAPI 3.1 with the fixed /v1 routes', () => {
    const doc = openApiDocument as unknown as { openapi: string, paths: Record<string, Record<string, { operationId: string, responses: Record<string, unknown> }>> }
    expect(doc.openapi).toBe('3.1.0')
    const operations = Object.entries(doc.paths).flatMap(([path, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${path}`)).sort()
    expect(operations).toEqual([
      'DELETE /v1/sweeps/{id}',
      'GET /healthz',
      'GET /metrics',
      'GET /openapi.json',
      'GET /readyz',
      'GET /v1/figures/overlay.pdf',
      'GET /v1/figures/overlay.png',
      'GET /v1/figures/overlay.svg',
      'GET /v1/sweeps',
      'GET /v1/sweeps/{id}',
      'GET /v1/sweeps/{id}/bundle.zip',
      'GET /v1/sweeps/{id}/events',
      'GET /v1/sweeps/{id}/figure.pdf',
      'GET /v1/sweeps/{id}/figure.png',
      'GET /v1/sweeps/{id}/figure.svg',
      'GET /v1/sweeps/{id}/results',
      'PATCH /v1/sweeps/{id}',
      'POST /v1/sweeps',
      'POST /v1/sweeps/validate',
      'POST /v1/sweeps/{id}/extend',
      'POST /v1/sweeps/{id}/resume',
      'POST /v1/theory'
    ])
  })

  it('declares problem+json 4xx answers for every operation but the two probes, and 500/503 for all', () => {
    const doc = openApiDocument as unknown as { paths: Record<string, Record<string, { responses: Record<string, { content?: Record<string, unknown> }> }>> }
    for (const [path, ops] of Object.entries(doc.paths)) {
      for (const [method, op] of Object.entries(ops)) {
        const statuses = Object.keys(op.responses)
        expect(statuses, `${method} ${path}`).toEqual(expect.arrayContaining(['500', '503']))
        if (path !== '/healthz' && path !== '/readyz') expect(statuses.some((s) => s.startsWith('4')), `${method} ${path}`).toBe(true)
        for (const status of statuses.filter((s) => Number(s) >= 400)) {
          expect(Object.keys(op.responses[status]!.content ?? {}), `${method} ${path} ${status}`).toEqual(['application/problem+json'])
        }
      }
    }
  })
})

describe('error codes', () => {
  it('agree between src/errors.ts, docs/errors.md and the OpenAPI Problem schema', () => {
    const rows = [...read('../../docs/errors.md').matchAll(/^\| `(MEMSWEEP_[A-Z_]+)` \| (\d{3}) \|/gm)].map((m) => [m[1], Number(m[2])])
    expect(rows).toEqual(ERROR_CODES.map((code) => [code, ERRORS[code].status]))
    const problem = openApiDocument.components.schemas.Problem as { properties: { code: { enum: string[] } } }
    expect(problem.properties.code.enum).toEqual([...ERROR_CODES])
  })

  it('have unique problem types and are sorted by status', () => {
    expect(new Set(ERROR_CODES.map(problemType)).size).toBe(ERROR_CODES.length)
    const statuses = ERROR_CODES.map((code) => ERRORS[code].status)
    expect(statuses).toEqual([...statuses].sort((a, b) => a - b))
    expect(problemType('MEMSWEEP_SPEC_INVALID')).toBe('urn:memsweep:problem:spec-invalid')
  })
})
