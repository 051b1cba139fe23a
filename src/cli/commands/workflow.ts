/**
 * The research workflow from the command line: `memsweep extend`, `resume` and `purge`
 * drive the server's routes of the same names (POST /v1/sweeps/{id}/extend, …/resume,
 * DELETE …?purge=true). Extend and resume follow the sweep and download results like submit.
 */
import { InvalidArgumentError } from 'commander'
import { VARIED_PARAMETERS } from '../../spec/index.js'
import { ApiClient, type SweepStatus } from '../api-client.js'
import { CliError, EXIT, say, type CliIo } from '../io.js'
import { outputFormat } from '../spec-file.js'
import { awaitAndDownload, type FollowOptions } from './submit.js'

export interface ServerOptions {
  server: string
  token?: string | undefined
}

export interface ExtendOptions extends ServerOptions, Omit<FollowOptions, 'trials'> {
  /** Trials per point of the extension (a count, unlike FollowOptions.trials). */
  trials?: number
  /** Download per-trial rows. */
  trialRows?: boolean
  /** `path=v1,v2` entries, e.g. `load=0.13,0.15`. */
  add?: string[]
  label?: string
  tag?: string[]
}

/** Parses one `--add path=v1,v2,…` (repeatable) into the extension's `add` member. */
export function parseAddition (text: string, previous: string[] = []): string[] {
  const match = /^([A-Za-z][A-Za-z0-9.]*)=(.+)$/.exec(text)
  if (match === null) throw new InvalidArgumentError('expected <parameter>=<value>,<value>…, e.g. load=0.13,0.15')
  // Parameters by their glossary names (docs/glossary.md), as in specs, CSV columns and error paths.
  if (!VARIED_PARAMETERS.some((parameter) => parameter.path === match[1])) {
    throw new InvalidArgumentError(`${match[1]!} is not a parameter that takes values; one of ${VARIED_PARAMETERS.map((parameter) => parameter.path).join(', ')} (docs/glossary.md)`)
  }
  const values = match[2]!.split(',')
  if (values.some((value) => value.trim() === '' || !Number.isFinite(Number(value)))) throw new InvalidArgumentError(`the values of ${match[1]!} must be numbers separated by commas`)
  return [...previous, text]
}

export function collect (value: string, previous: string[] = []): string[] {
  return [...previous, value]
}

export async function extend (io: CliIo, id: string, options: ExtendOptions): Promise<number> {
  if (options.output !== undefined) outputFormat(options.output, options.format)
  if (options.trials === undefined && (options.add ?? []).length === 0) throw new CliError('Give --trials, --add or both: an extension needs something to add.', EXIT.refused)
  const add: Record<string, number[]> = {}
  for (const entry of options.add ?? []) {
    const [path, list] = entry.split('=') as [string, string]
    add[path] = [...(add[path] ?? []), ...list.split(',').map(Number)]
  }
  const body = {
    ...(options.trials === undefined ? {} : { trials: options.trials }),
    ...(Object.keys(add).length === 0 ? {} : { add }),
    ...(options.label === undefined ? {} : { label: options.label }),
    ...(options.tag === undefined ? {} : { tags: options.tag })
  }
  const client = new ApiClient({ server: options.server, token: options.token })
  const created = await client.json<SweepStatus>(`/v1/sweeps/${encodeURIComponent(id)}/extend`, {
    method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body)
  })
  io.stdout.write(`${created.id}\n`)
  say(io, `Extended ${id} as sweep ${created.id} (${created.status}): ${created.reused.trials} of its ${created.progress.trialsTotal} trials taken from earlier sweeps, ${created.progress.trialsTotal - created.reused.trials} to compute.`)
  const { trials: _count, trialRows, ...follow } = options
  return await awaitAndDownload(io, client, created, { ...follow, ...(trialRows === true ? { trials: true } : {}) })
}

export async function resume (io: CliIo, id: string, options: ServerOptions & FollowOptions): Promise<number> {
  if (options.output !== undefined) outputFormat(options.output, options.format)
  const client = new ApiClient({ server: options.server, token: options.token })
  const resumed = await client.json<SweepStatus>(`/v1/sweeps/${encodeURIComponent(id)}/resume`, { method: 'POST' })
  say(io, `Resumed sweep ${id} (${resumed.status}): ${resumed.progress.chunksDone} of ${resumed.progress.chunksTotal} chunks kept, the rest to compute.`)
  return await awaitAndDownload(io, client, resumed, options)
}

export async function purge (io: CliIo, id: string, options: ServerOptions & { yes?: boolean }): Promise<number> {
  if (options.yes !== true) throw new CliError(`Purging removes sweep ${id}, its stored trials and its results for good. Run again with --yes to do it.`, EXIT.refused)
  const client = new ApiClient({ server: options.server, token: options.token })
  await client.fetch(`/v1/sweeps/${encodeURIComponent(id)}?purge=true`, { method: 'DELETE' })
  say(io, `Sweep ${id} and everything stored for it were removed.`)
  return EXIT.ok
}
