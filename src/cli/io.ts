/** What a CLI command talks to; injected so commands run the same in tests as in a terminal. */
import type { Writable } from 'node:stream'

export interface CliIo {
  stdout: Writable
  stderr: Writable
  env: Record<string, string | undefined>
  /** Whether stderr is a terminal (progress bars) or a log/pipe (plain progress lines). */
  isTTY: boolean
  /** Aborted on Ctrl-C: a local run stops between trials. */
  signal?: AbortSignal
}

/** Exit codes, documented in `memsweep --help`, so pipeline schedulers can branch on them. */
export const EXIT = {
  ok: 0,
  /** The sweep failed or was canceled. */
  sweepFailed: 1,
  /** Bad usage or a request the server refused (4xx): fixing the input is needed. */
  refused: 2,
  /** The server could not be reached or failed (5xx): retrying later may help. */
  unavailable: 3
} as const

export class CliError extends Error {
  constructor (message: string, readonly exitCode: number) {
    super(message)
    this.name = 'CliError'
  }
}

export function say (io: CliIo, line: string): void {
  io.stderr.write(line + '\n')
}
