/**
 * The page's only way to the server: every call goes through `call`, which adds the token,
 * asks for one on a 401 and turns problem documents (RFC 9457) into `ApiProblem`s.
 * Paths are relative ('v1/sweeps'), so the page also works behind a proxy under a prefix.
 */
import { EventStreamParser } from './event-stream.js'
import { askForToken, currentToken, forgetToken } from './token.js'
import type { Annotation, Extension, Problem, SweepDetail, SweepList, SweepStatus, SweepStatusName, Validation } from './types.js'

export type { Annotation, Extension } from './types.js'

export class ApiProblem extends Error {
  constructor (readonly status: number, readonly problem: Problem) {
    super(problem.detail ?? problem.title ?? `HTTP ${status}`)
    this.name = 'ApiProblem'
  }
}

function url (path: string): string {
  return new URL(path, document.baseURI).href
}

async function readProblem (response: Response): Promise<Problem> {
  const type = response.headers.get('content-type') ?? ''
  if (type.includes('json')) {
    try {
      return await response.json() as Problem
    } catch {
      // Fall through to a generic problem.
    }
  }
  return { status: response.status, title: response.statusText, detail: `The server answered ${response.status} ${response.statusText}.` }
}

export interface CallOptions extends Omit<RequestInit, 'body'> {
  json?: unknown
}

/**
 * Sends a request; resolves with the response when it is 2xx or 304, throws ApiProblem
 * otherwise. On 401 it asks for a token once and retries with it.
 */
export async function call (path: string, options: CallOptions = {}): Promise<Response> {
  const { json, headers, ...rest } = options
  let rejected = false
  for (;;) {
    const merged = new Headers(headers)
    const token = currentToken()
    if (token !== null) merged.set('authorization', `Bearer ${token}`)
    if (json !== undefined) merged.set('content-type', 'application/json')
    const response = await fetch(url(path), { ...rest, headers: merged, ...(json === undefined ? {} : { body: JSON.stringify(json) }) })
    if (response.ok || response.status === 304) return response
    if (response.status === 401) {
      // A token the server refuses is of no further use: it is dropped, not kept around.
      if (token !== null) forgetToken()
      const fresh = await askForToken(rejected || token !== null)
      rejected = true
      if (fresh !== null) continue
    }
    throw new ApiProblem(response.status, await readProblem(response))
  }
}

export async function getJson<T> (path: string, init: CallOptions = {}): Promise<T> {
  const response = await call(path, { ...init, headers: { accept: 'application/json' } })
  return await response.json() as T
}

export function sweepPath (id: string): string {
  return `v1/sweeps/${encodeURIComponent(id)}`
}

export interface ListFilter {
  status?: SweepStatusName | null
  tag?: string | null
  q?: string | null
  replicatesOf?: string | null
}

export async function listSweeps (query: ListFilter & { cursor?: string | null, limit?: number }, signal?: AbortSignal): Promise<SweepList> {
  const params = new URLSearchParams({ limit: String(query.limit ?? 25) })
  if (query.status !== undefined && query.status !== null) params.set('status', query.status)
  for (const key of ['tag', 'q', 'replicatesOf'] as const) {
    const value = query[key]
    if (value !== undefined && value !== null && value !== '') params.set(key, value)
  }
  if (query.cursor !== undefined && query.cursor !== null) params.set('cursor', query.cursor)
  return await getJson<SweepList>(`v1/sweeps?${params.toString()}`, signal === undefined ? {} : { signal })
}

export async function getSweep (id: string, signal?: AbortSignal): Promise<SweepDetail> {
  return await getJson<SweepDetail>(sweepPath(id), signal === undefined ? {} : { signal })
}

export async function cancelSweep (id: string): Promise<SweepDetail> {
  const response = await call(sweepPath(id), { method: 'DELETE' })
  return await response.json() as SweepDetail
}

export async function resumeSweep (id: string): Promise<SweepDetail> {
  const response = await call(`${sweepPath(id)}/resume`, { method: 'POST' })
  return await response.json() as SweepDetail
}

/** Removes a finished sweep with everything stored for it (owner only, irreversible). */
export async function purgeSweep (id: string): Promise<void> {
  await call(`${sweepPath(id)}?purge=true`, { method: 'DELETE' })
}

/** A new sweep with more trials and/or more axis values; its parent's stored trials are reused. */
export async function extendSweep (id: string, extension: Extension): Promise<SweepDetail> {
  const response = await call(`${sweepPath(id)}/extend`, { method: 'POST', json: extension })
  return await response.json() as SweepDetail
}

export async function annotateSweep (id: string, patch: Annotation): Promise<SweepDetail> {
  const response = await call(sweepPath(id), { method: 'PATCH', json: patch })
  return await response.json() as SweepDetail
}

export async function submitSweep (spec: unknown, options: { reuse: boolean, idempotencyKey: string }): Promise<SweepDetail> {
  const response = await call(`v1/sweeps${options.reuse ? '?reuse=true' : ''}`, {
    method: 'POST',
    json: spec,
    headers: { 'idempotency-key': options.idempotencyKey }
  })
  return await response.json() as SweepDetail
}

export async function validateSpec (spec: unknown, signal: AbortSignal): Promise<Validation> {
  const response = await call('v1/sweeps/validate', { method: 'POST', json: spec, signal })
  return await response.json() as Validation
}

export const TERMINAL: ReadonlySet<SweepStatusName> = new Set(['succeeded', 'failed', 'canceled'])

/**
 * Follows one sweep's event stream until it reaches a final state or `signal` aborts,
 * reconnecting after drops (each reconnection starts with a fresh snapshot).
 */
export async function followSweep (id: string, onStatus: (status: SweepStatus) => void, signal: AbortSignal): Promise<void> {
  let wait = 1000
  while (!signal.aborted) {
    let finished = false
    try {
      const response = await call(`${sweepPath(id)}/events`, { headers: { accept: 'text/event-stream' }, signal, cache: 'no-store' })
      const body = response.body
      if (body === null) throw new Error('the event stream has no body')
      const parser = new EventStreamParser()
      const reader = body.pipeThrough(new TextDecoderStream()).getReader()
      for (;;) {
        const { done, value } = await reader.read()
        if (done) break
        for (const event of parser.push(value)) {
          const status = JSON.parse(event.data) as SweepStatus
          onStatus(status)
          if (TERMINAL.has(status.status)) finished = true
        }
        wait = parser.retry ?? 3000
      }
    } catch (error) {
      if (signal.aborted) return
      // A 404 (deleted, or not ours) will not get better by retrying.
      if (error instanceof ApiProblem && error.status !== 429 && error.status < 500) throw error
    }
    if (finished) return
    await new Promise<void>((resolve) => {
      const timer = setTimeout(resolve, wait)
      signal.addEventListener('abort', () => { clearTimeout(timer); resolve() }, { once: true })
    })
    wait = Math.min(wait * 2, 30_000)
  }
}

/** Fetches an authorised download and hands it to the browser as a file. */
export async function download (path: string, fileName: string, accept: string): Promise<void> {
  const response = await call(path, { headers: { accept } })
  const blob = await response.blob()
  const href = URL.createObjectURL(blob)
  const link = document.createElement('a')
  link.href = href
  link.download = fileName
  document.body.append(link)
  link.click()
  link.remove()
  setTimeout(() => URL.revokeObjectURL(href), 10_000)
}
