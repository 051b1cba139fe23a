/** Runs the CLI in this process with captured output, as a terminal or a pipeline would. */
import { Writable } from 'node:stream'
import { runCli } from '../../src/cli/main.js'

export interface CliRun { code: number, stdout: string, stderr: string }

function capture (): { stream: Writable, text: () => string } {
  const chunks: string[] = []
  return {
    stream: new Writable({ write (chunk: Buffer, _e, done) { chunks.push(chunk.toString('utf8')); done() } }),
    text: () => chunks.join('')
  }
}

export async function cli (argv: string[], options: { env?: Record<string, string>, isTTY?: boolean, signal?: AbortSignal } = {}): Promise<CliRun> {
  const out = capture()
  const err = capture()
  const code = await runCli(argv, {
    stdout: out.stream,
    stderr: err.stream,
    env: options.env ?? {},
    isTTY: options.isTTY ?? false,
    ...(options.signal === undefined ? {} : { signal: options.signal })
  })
  return { code, stdout: out.text(), stderr: err.text() }
}
