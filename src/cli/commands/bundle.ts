/**
 * `memsweep bundle ID`: downloads a succeeded sweep's supplementary-material zip
 * (GET /v1/sweeps/{id}/bundle.zip: spec, results, figure, provenance and a README that
 * says how to reproduce the numbers) to a file, or to standard output with `-o -`.
 */
import { ApiClient } from '../api-client.js'
import { say, EXIT, type CliIo } from '../io.js'
import { writeFileAtomically } from '../write-file.js'
import type { ServerOptions } from './workflow.js'

export interface BundleOptions extends ServerOptions {
  /** File to write; `-` for standard output. Default: memsweep-<id>.zip in the current folder. */
  output?: string
}

export async function bundle (io: CliIo, id: string, options: BundleOptions): Promise<number> {
  const client = new ApiClient({ server: options.server, token: options.token })
  const response = await client.fetch(`/v1/sweeps/${encodeURIComponent(id)}/bundle.zip`, { headers: { accept: 'application/zip' } })
  const bytes = new Uint8Array(await response.arrayBuffer())
  if (options.output === '-') {
    await new Promise<void>((resolve, reject) => io.stdout.write(bytes, (error) => { if (error == null) resolve(); else reject(error) }))
    return EXIT.ok
  }
  const output = options.output ?? `memsweep-${id}.zip`
  await writeFileAtomically(output, bytes)
  say(io, `Bundle of sweep ${id} written to ${output} (${(bytes.length / 1024).toFixed(1)} KiB): unzip it and read README.md.`)
  return EXIT.ok
}
