/** The `memsweep` executable as a separate process: exit codes and `serve`. */
import { spawn, spawnSync } from 'node:child_process'
import { mkdtemp, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { createInterface } from 'node:readline'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'

const MAIN = fileURLToPath(new URL('../../src/cli/main.ts', import.meta.url))
const run = (args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', MAIN, ...args], { encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } })

describe('memsweep executable', () => {
  it('prints help with the exit codes (exit 0) and refuses an unknown command (exit 2)', () => {
    const help = run(['--help'])
    expect(help.status).toBe(0)
    expect(help.stdout).toContain('Exit codes: 0 success')
    for (const command of ['serve', 'worker', 'run', 'submit']) expect(help.stdout).toContain(command)
    const unknown = run(['launch'])
    expect(unknown.status).toBe(2)
    expect(unknown.stderr).toContain("unknown command 'launch'")
  })

  it('`serve` listens until SIGTERM, then exits 0', async () => {
    const dataDir = await mkdtemp(join(tmpdir(), 'memsweep-serve-'))
    const child = spawn(process.execPath, ['--import', 'tsx', MAIN, 'serve', '--port', '0', '--host', '127.0.0.1', '--data-dir', dataDir, '--threads', '1'], {
      env: { ...process.env, LOG_LEVEL: 'info' },
      stdio: ['ignore', 'pipe', 'pipe']
    })
    try {
      const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)))
      const address = await new Promise<string>((resolve, reject) => {
        const timer = setTimeout(() => reject(new Error('serve did not start')), 30_000)
        createInterface({ input: child.stdout }).on('line', (line) => {
          try {
            const entry = JSON.parse(line)
            if (entry.msg === 'memsweep listening') { clearTimeout(timer); resolve(entry.address) }
          } catch { /* not a log line */ }
        })
      })
      const health = await fetch(`${address}/healthz`)
      expect(health.status).toBe(200)
      child.kill('SIGTERM')
      expect(await exited).toBe(0)
    } finally {
      if (child.exitCode === null) child.kill('SIGKILL')
      await rm(dataDir, { recursive: true, force: true })
    }
  })
})
