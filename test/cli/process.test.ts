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
    const child = spawn(process.execPath, ['--import', 'tsx', MAIN, 'serve', '--port', '0', '--data-dir', dataDir, '--threads', '1'], {
      env: { ...process.env, LOG_LEVEL: 'info', HOST: '', TOKENS_FILE: '', ALLOW_ANONYMOUS: '' },
      stdio: ['ignore', 'pipe', 'pipe']
    })
    try {
      // 'close' comes after standard output has been read to its end, so every log line is in.
      const exited = new Promise<number | null>((resolve) => child.on('close', (code) => resolve(code)))
      const lines: Array<{ level: number, msg: string, listening?: { address: string } }> = []
      const address = await new Promise<string>((resolve, reject) => {
        const timer = setTimeout(() => reject(new Error('serve did not start')), 30_000)
        createInterface({ input: child.stdout }).on('line', (line) => {
          const entry = JSON.parse(line)
          lines.push(entry)
          if (entry.listening !== undefined) { clearTimeout(timer); resolve(entry.listening.address) }
        })
      })
      // Standard output is a pipe, so every line is JSON; the start-up line reads as a sentence.
      const started = lines.filter((l) => /listening/i.test(l.msg))
      expect(started).toHaveLength(1)
      expect(started[0]!.msg).toBe(`memsweep listening on ${address} (embedded backend, data in ${dataDir}, authentication off: only this machine can connect)`)
      expect(address).toMatch(/^http:\/\/127\.0\.0\.1:\d+$/)
      const before = lines.length
      const health = await fetch(`${address}/healthz`)
      expect(health.status).toBe(200)
      expect((await fetch(`${address}/v1/sweeps`)).status).toBe(200)
      child.kill('SIGTERM')
      expect(await exited).toBe(0)
      // Requests are logged at debug by default: at LOG_LEVEL=info they leave no line.
      const during = lines.slice(before).filter((l) => l.msg !== 'shutting down')
      expect(during.filter((l) => /request/.test(l.msg))).toEqual([])
    } finally {
      if (child.exitCode === null) child.kill('SIGKILL')
      await rm(dataDir, { recursive: true, force: true })
    }
  })

  it('`serve` refuses an address other machines reach without tokens (exit 2, naming the remedies)', async () => {
    const dataDir = await mkdtemp(join(tmpdir(), 'memsweep-serve-'))
    try {
      const refused = spawnSync(process.execPath, ['--import', 'tsx', MAIN, 'serve', '--port', '0', '--host', '0.0.0.0', '--data-dir', join(dataDir, 'data')], {
        encoding: 'utf8',
        env: { ...process.env, TOKENS_FILE: '', ALLOW_ANONYMOUS: '' },
        timeout: 30_000
      })
      expect(refused.status).toBe(2)
      expect(refused.stderr).toContain('HOST=0.0.0.0 is reachable from other machines and TOKENS_FILE is not set')
      for (const remedy of ['TOKENS_FILE', 'HOST=127.0.0.1', 'ALLOW_ANONYMOUS=true']) expect(refused.stderr).toContain(remedy)
      expect(refused.stdout).toBe('')
    } finally {
      await rm(dataDir, { recursive: true, force: true })
    }
  })

  // `script` gives the server a terminal of its own; killing `script` hangs that terminal up, as
  // a dropped SSH session does. The server must shut down and exit, not spin (see server.ts).
  // Without the fix the server spins at full CPU here, and the test fails after 30 s.
  const hasScript = spawnSync('script', ['--version'], { encoding: 'utf8' }).status === 0
  it.runIf(hasScript)('`serve` shuts down and exits when its terminal hangs up', async () => {
    const dataDir = await mkdtemp(join(tmpdir(), 'memsweep-serve-'))
    const command = [process.execPath, '--import', 'tsx', MAIN, 'serve', '--port', '0', '--data-dir', dataDir, '--threads', '1'].map((w) => `'${w}'`).join(' ')
    const terminal = spawn('script', ['-qfc', command, '/dev/null'], {
      env: { ...process.env, LOG_LEVEL: 'info', LOG_FORMAT: 'json', HOST: '', TOKENS_FILE: '', ALLOW_ANONYMOUS: '' },
      stdio: ['ignore', 'pipe', 'pipe'],
      detached: true
    })
    let serverPid: number | undefined
    const alive = (pid: number): boolean => { try { process.kill(pid, 0); return true } catch { return false } }
    try {
      serverPid = await new Promise<number>((resolve, reject) => {
        const timer = setTimeout(() => reject(new Error('serve did not start')), 30_000)
        createInterface({ input: terminal.stdout }).on('line', (line) => {
          const match = /^\{.*"listening":/.test(line) ? JSON.parse(line.trim()) as { pid: number } : null
          if (match !== null) { clearTimeout(timer); resolve(match.pid) }
        })
      })
      expect(alive(serverPid)).toBe(true)
      terminal.kill('SIGKILL')
      // Closing takes a moment (the compute threads, the database); a spinning process never goes.
      for (let waited = 0; alive(serverPid) && waited < 30_000; waited += 100) await new Promise((resolve) => setTimeout(resolve, 100))
      expect(alive(serverPid)).toBe(false)
    } finally {
      if (terminal.exitCode === null) terminal.kill('SIGKILL')
      if (serverPid !== undefined && alive(serverPid)) process.kill(serverPid, 'SIGKILL')
      await rm(dataDir, { recursive: true, force: true })
    }
  })
})
