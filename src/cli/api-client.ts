/** The few HTTP calls the CLI makes to a memsweep server, with errors turned into exit codes. */
import type { components } from '../api-types/openapi.js'
import { CliError, EXIT } from './io.js'

export interface ApiClientOptions {
  server: string
  token?: string | undefined
}

/** A sweep's status as the server sends it (generated from openapi/openapi.json). */
export type SweepStatus = components['schemas']['Sweep']

export const TERMINAL: ReadonlySet<SweepStatus['status']> = new Set(['succeeded', 'failed', 'canceled'])

/** A problem document; a proxy in front of the server may send less than the server's full one. */
type Problem = Partial<components['schemas']['Problem']>

export class ApiClient {
  readonly #base: string
  readonly #headers: Record<string, string>

  constructor (options: ApiClientOptions) {
    this.#base = options.server.replace(/\/+$/, '')
    this.#headers = options.token === undefined ? {} : { authorization: `Bearer ${options.token}` }
  }

  url (path: string): string {
    return `${this.#base}${path}`
  }

  async fetch (path: string, init: RequestInit & { headers?: Record<string, string> } = {}): Promise<Response> {
    let response: Response
    try {
      response = await fetch(this.url(path), { ...init, headers: { ...this.#headers, ...init.headers } })
    } catch (error) {
      throw new CliError(`Cannot reach ${this.#base}: ${(error as Error).cause instanceof Error ? ((error as Error).cause as Error).message : (error as Error).message}`, EXIT.unavailable)
    }
    if (response.ok || response.status === 304) return response
    throw await problemError(response)
  }

  async json<T> (path: string, init: RequestInit & { headers?: Record<string, string> } = {}): Promise<T> {
    return await (await this.fetch(path, init)).json() as T
  }
}

async function problemError (response: Response): Promise<CliError> {
  let problem: Problem = {}
  try { problem = await response.json() as Problem } catch { /* not a problem document */ }
  const lines = [`The server answered ${response.status}${problem.code === undefined ? '' : ` ${problem.code}`}: ${problem.detail ?? problem.title ?? response.statusText}`]
  for (const issue of problem.errors ?? []) lines.push(`  ${issue.path === '' ? '(spec)' : issue.path}: ${issue.message}`)
  return new CliError(lines.join('\n'), response.status >= 500 ? EXIT.unavailable : EXIT.refused)
}
