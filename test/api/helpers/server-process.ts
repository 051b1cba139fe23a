/** Runs src/server.ts as a child process, the way `npm start` runs the built one. */
import { spawn, type ChildProcess } from 'node:child_process'
import { createInterface } from 'node:readline'
import { fileURLToPath } from 'node:url'

const SERVER = fileURLToPath(new URL('../../../src/server.ts', import.meta.url))

export interface ServerProcess {
  child: ChildProcess
  url: string
  /** Resolves with the exit code (or signal name). */
  exited: Promise<number | string>
  logLines: Array<Record<string, unknown>>
}

/** `nodeFlags` go before the loader (the benchmarks pass the engine processes' flags, src/runtime/node-flags.ts). */
export async function startServerProcess (env: Record<string, string>, timeoutMs = 30_000, nodeFlags: readonly string[] = []): Promise<ServerProcess> {
  const child = spawn(process.execPath, [...nodeFlags, '--import', 'tsx', SERVER], {
    env: { ...process.env, PORT: '0', HOST: '127.0.0.1', LOG_LEVEL: 'info', ...env },
    stdio: ['ignore', 'pipe', 'pipe']
  })
  const logLines: Array<Record<string, unknown>> = []
  let stderr = ''
  child.stderr?.on('data', (chunk: Buffer) => { stderr += chunk.toString('utf8') })
  const exited = new Promise<number | string>((resolve) => {
    child.on('exit', (code, signal) => resolve(code ?? signal ?? 'unknown'))
  })
  const url = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`server did not start within ${timeoutMs} ms\n${stderr}`)), timeoutMs)
    createInterface({ input: child.stdout! }).on('line', (line) => {
      let parsed: Record<string, unknown>
      try { parsed = JSON.parse(line) } catch { return }
      logLines.push(parsed)
      const listening = parsed.listening as { address?: string } | undefined
      if (listening?.address !== undefined) { clearTimeout(timer); resolve(listening.address) }
    })
    exited.then((code) => { clearTimeout(timer); reject(new Error(`server exited with ${code} before listening\n${stderr}`)) }, reject)
  })
  return { child, url, exited, logLines }
}
