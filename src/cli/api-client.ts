/** The few HTTP calls the CLI makes to a memsweep server, with errors turned into exit codes. */
import { CliError, EXIT } from './io.js'

export interface ApiClientOptions {
  server: string
  token?: string | undefined
}

export interface SweepStatus {
  id: string
  status: 'queued' | 'running' | 'succeeded' | 'failed' | 'canceled'
  label: string | null
  progress: { trialsDone: number, trialsTotal: number, pointsDone: number, pointsTotal: number, estimatedSecondsLeft: number | null }
  error: { kind: 'user' | 'system', message: string } | null
}

export const TERMINAL = new Set(['succeeded', 'failed', 'canceled'])

interface Problem { title?: string, detail?: string, code?: string, errors?: Array<{ path: string, message: string }> }

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
