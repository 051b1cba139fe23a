/**
 * A private redis-server for tests that crash, restart or reconfigure Redis: its own
 * loopback port and its own data directory, so the shared server is never touched.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { Redis } from 'ioredis'

export function redisServerInstalled (): boolean {
  return spawnSync('redis-server', ['--version'], { stdio: 'ignore' }).status === 0
}

async function freePort (): Promise<number> {
  return await new Promise((resolve, reject) => {
    const server = createServer()
    server.once('error', reject)
    server.listen(0, '127.0.0.1', () => {
      const address = server.address()
      server.close(() => { if (address !== null && typeof address === 'object') resolve(address.port); else reject(new Error('no port')) })
    })
  })
}

export interface PrivateRedis {
  url: string
  /** Kills the server with SIGKILL: no shutdown save, the AOF is all that survives. */
  crash: () => Promise<void>
  /** Starts the server again on the same port and data directory. */
  restart: () => Promise<void>
  stop: () => Promise<void>
}

/** Starts redis-server with AOF (fsync on every write) and `noeviction`; `extraArgs` override. */
export async function startPrivateRedis (extraArgs: string[] = []): Promise<PrivateRedis> {
  const port = await freePort()
  const dir = mkdtempSync(join(tmpdir(), 'memsweep-redis-'))
  const args = [
    '--port', String(port), '--bind', '127.0.0.1', '--dir', dir, '--save', '',
    '--appendonly', 'yes', '--appendfsync', 'always', '--maxmemory-policy', 'noeviction', ...extraArgs
  ]
  const url = `redis://127.0.0.1:${port}`
  let server: ChildProcess | null = null

  const launch = async (): Promise<void> => {
    const child = spawn('redis-server', args, { stdio: 'ignore' })
    server = child
    const deadline = performance.now() + 10_000
    // Until it listens, and while it replays its AOF (LOADING), the server refuses commands.
    for (;;) {
      const probe = new Redis(url, { lazyConnect: true, retryStrategy: () => null, maxRetriesPerRequest: 0 })
      probe.on('error', () => {})
      try {
        await probe.connect()
        await probe.ping()
        return
      } catch (error) {
        if (performance.now() > deadline || child.exitCode !== null) throw new Error(`redis-server on port ${port} did not start: ${String(error)}`)
        await new Promise(resolve => setTimeout(resolve, 25))
      } finally {
        probe.disconnect()
      }
    }
  }
  const kill = async (signal: NodeJS.Signals): Promise<void> => {
    const child = server
    if (child === null || child.exitCode !== null || child.signalCode !== null) return
    const exited = new Promise(resolve => child.once('exit', resolve))
    child.kill(signal)
    await exited
  }

  try {
    await launch()
  } catch (error) {
    // Never leave a half-started server (or its directory) behind.
    await kill('SIGKILL')
    rmSync(dir, { recursive: true, force: true })
    throw error
  }
  return {
    url,
    crash: () => kill('SIGKILL'),
    restart: launch,
    stop: async () => {
      await kill('SIGKILL')
      rmSync(dir, { recursive: true, force: true })
    }
  }
}
