import { expect } from 'vitest'

interface ProblemLike { statusCode: number, headers: Record<string, unknown>, json: () => any }

/** Asserts an RFC 9457 answer with this status and code, and returns its body. */
export function expectProblem (response: ProblemLike, status: number, code: string): any {
  expect(response.statusCode, JSON.stringify(response.json())).toBe(status)
  expect(String(response.headers['content-type'])).toMatch(/^application\/problem\+json/)
  const body = response.json()
  expect(body).toMatchObject({ status, code, type: expect.stringMatching(/^urn:memsweep:problem:/) })
  expect(typeof body.title).toBe('string')
  expect(typeof body.detail).toBe('string')
  expect(body.requestId).toBe(response.headers['x-request-id'])
  return body
}
