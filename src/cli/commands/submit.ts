/**
 * `memsweep submit <spec.json> --server URL [--wait] [--output file]`: sends a spec to a
 * server, optionally follows it to the end and downloads the results. Prints the sweep id
 * on stdout; exits 0 on success, 1 when the sweep failed or was canceled, 2 when the
 * server refused the request, 3 when it could not be reached.
 */
import { setTimeout as sleep } from 'node:timers/promises'
import { ApiClient, TERMINAL, type SweepStatus } from '../api-client.js'
import { CliError, EXIT, say, type CliIo } from '../io.js'
import { createProgressReporter } from '../progress.js'
import { outputFormat, readSpecFile } from '../spec-file.js'
import { writeFileAtomically } from '../write-file.js'

export interface SubmitOptions {
  server: string
  token?: string | undefined
  wait?: boolean
  output?: string
  format?: string
  trials?: boolean
  /** Download this series (`trajectory`) instead of the rows. */
  series?: string
  reuse?: boolean
  /** Where the server POSTs a signed event when the sweep ends (docs/callbacks.md). */
  callbackUrl?: string
  idempotencyKey?: string
  /** Seconds between status reads when the event stream is unavailable. */
  pollSeconds?: number
}

export async function submit (io: CliIo, specPath: string, options: SubmitOptions): Promise<number> {
  if (options.output !== undefined) outputFormat(options.output, options.format)
  const client = new ApiClient({ server: options.server, token: options.token })
  const spec = await readSpecFile(specPath)
  const headers: Record<string, string> = { 'content-type': 'application/json' }
  if (options.idempotencyKey !== undefined) headers['idempotency-key'] = options.idempotencyKey
  const query = new URLSearchParams()
  if (options.reuse === true) query.set('reuse', 'true')
  if (options.callbackUrl !== undefined) query.set('callbackUrl', options.callbackUrl)
  const search = query.size > 0 ? `?${query.toString()}` : ''
  const submitted = await client.json<SweepStatus>(`/v1/sweeps${search}`, { method: 'POST', headers, body: JSON.stringify(spec) })
  io.stdout.write(`${submitted.id}\n`)
  say(io, `Submitted sweep ${submitted.id} (${submitted.status}) to ${options.server}.`)
  return await awaitAndDownload(io, client, submitted, options)
}

/** What to do once a sweep is accepted: nothing, or follow it and optionally download its results. */
export interface FollowOptions {
  wait?: boolean
  output?: string
  format?: string
  trials?: boolean
  series?: string
  pollSeconds?: number
}

/**
 * Follows an accepted sweep (with --wait or --output) to its end and downloads the results:
 * shared by submit, extend and resume. Returns the exit code.
 */
export async function awaitAndDownload (io: CliIo, client: ApiClient, submitted: SweepStatus, options: FollowOptions): Promise<number> {
  if (options.wait !== true && options.output === undefined) return EXIT.ok
  const format = options.output === undefined ? null : outputFormat(options.output, options.format)
  const final = await follow(io, client, submitted, (options.pollSeconds ?? 2) * 1000)
  if (final.status !== 'succeeded') {
    const why = final.status === 'failed' ? `failed (${final.error?.kind ?? 'unknown'} error): ${final.error?.message ?? ''}` : 'was canceled'
    say(io, `Sweep ${final.id} ${why}`)
    return EXIT.sweepFailed
  }
  say(io, `Sweep ${final.id} succeeded.`)
  if (options.output !== undefined && format !== null) {
    const query = new URLSearchParams({ format })
    if (options.trials === true) query.set('trials', 'true')
    if (options.series !== undefined) query.set('series', options.series)
    const response = await client.fetch(`/v1/sweeps/${encodeURIComponent(final.id)}/results?${query.toString()}`)
    await writeFileAtomically(options.output, new Uint8Array(await response.arrayBuffer()))
    say(io, `Results written to ${options.output}.`)
  }
  return EXIT.ok
}

/** How long the server may stay unreachable while waiting (a restart, a network blip) before giving up. */
const UNREACHABLE_FOR_MS = 120_000

/**
 * Follows the sweep's event stream to a terminal state. A stream the server ends early
 * (a restart) or that breaks is opened again after a pause; only a server that stays
 * unreachable for two minutes ends the wait.
 */
async function follow (io: CliIo, client: ApiClient, first: SweepStatus, pollMs: number): Promise<SweepStatus> {
  const progress = createProgressReporter(io, first.label ?? first.id)
  let latest = first
  let unreachableSince: number | null = null
  try {
    while (!TERMINAL.has(latest.status)) {
      try {
        latest = await streamUntilEnd(client, latest, (s) => progress.update(s.progress))
        unreachableSince = null
        if (!TERMINAL.has(latest.status)) await sleep(pollMs)
      } catch (error) {
        if (!(error instanceof CliError) || error.exitCode !== EXIT.unavailable) throw error
        unreachableSince ??= Date.now()
        if (Date.now() - unreachableSince > UNREACHABLE_FOR_MS) throw error
        await sleep(pollMs)
      }
    }
  } finally {
    progress.stop()
  }
  return latest
}

async function streamUntilEnd (client: ApiClient, from: SweepStatus, onStatus: (s: SweepStatus) => void): Promise<SweepStatus> {
  const response = await client.fetch(`/v1/sweeps/${encodeURIComponent(from.id)}/events`, { headers: { accept: 'text/event-stream' } })
  if (response.body === null) throw new CliError('The event stream has no body.', EXIT.unavailable)
  let latest = from
  let buffer = ''
  const decoder = new TextDecoder()
  const reader = response.body.getReader()
  try {
    for (;;) {
      const { done, value } = await reader.read()
      if (done) break
      buffer += decoder.decode(value, { stream: true })
      let cut: number
      while ((cut = buffer.indexOf('\n\n')) >= 0) {
        const block = buffer.slice(0, cut)
        buffer = buffer.slice(cut + 2)
        const data = block.split('\n').filter((line) => line.startsWith('data:')).map((line) => line.slice(5).trimStart()).join('\n')
        if (data === '') continue
        latest = JSON.parse(data) as SweepStatus
        onStatus(latest)
      }
    }
  } catch (error) {
    throw new CliError(`The event stream broke: ${(error as Error).message}`, EXIT.unavailable)
  }
  return latest
}
