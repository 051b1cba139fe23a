/**
 * Secure by default, as `npm start` runs it (startServer): loopback without tokens starts;
 * an address other machines reach needs TOKENS_FILE or an explicit ALLOW_ANONYMOUS=true, and
 * the start-up line says which. Started for real on port 0 with a temporary DATA_DIR.
 */
import { existsSync } from 'node:fs'
import { mkdtemp, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { Writable } from 'node:stream'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { ConfigError } from '../../src/config.js'
import { createLogger } from '../../src/logger.js'
import { startServer, type ListeningReport } from '../../src/server.js'
import { REDIS_URL, redisAvailable, removePrefix, testPrefix } from '../integration/helpers.js'

const redis = await redisAvailable()

interface LogLine { level: number, msg: string, listening?: ListeningReport }

function capture (): { logger: ReturnType<typeof createLogger>, lines: LogLine[] } {
  const lines: LogLine[] = []
  const destination = new Writable({
    write (chunk: Buffer, _encoding, done) {
      for (const line of chunk.toString('utf8').split('\n')) if (line.trim() !== '') lines.push(JSON.parse(line))
      done()
    }
  })
  return { logger: createLogger({ level: 'info', destination }), lines }
}

describe('secure by default', () => {
  let dir: string
  beforeEach(async () => { dir = await mkdtemp(join(tmpdir(), 'memsweep-access-')) })
  afterEach(async () => { await rm(dir, { recursive: true, force: true }) })

  /** Starts, reads the start-up line and the answer of an anonymous request, and stops. */
  async function startAndProbe (env: Record<string, string>): Promise<{ line: LogLine, anonymous: number }> {
    const { logger, lines } = capture()
    const server = await startServer({ PORT: '0', WORKER_THREADS: '1', DATA_DIR: join(dir, 'data'), ...env }, logger)
    try {
      const started = lines.filter((l) => l.listening !== undefined)
      expect(started).toHaveLength(1)
      const port = new URL(server.address).port
      const host = env.HOST === '::1' ? '[::1]' : '127.0.0.1'
      const anonymous = (await fetch(`http://${host}:${port}/v1/sweeps`)).status
      return { line: started[0]!, anonymous }
    } finally {
      await server.close()
    }
  }

  it('listens on 127.0.0.1 by default, without tokens, and says why that is safe', async () => {
    const { line, anonymous } = await startAndProbe({})
    expect(line.listening!.address).toMatch(/^http:\/\/127\.0\.0\.1:\d+$/)
    expect(line.msg).toBe(`memsweep listening on ${line.listening!.address} (embedded backend, data in ${join(dir, 'data')}, authentication off: only this machine can connect)`)
    expect(anonymous).toBe(200)
  })

  it('counts the IPv6 loopback ::1 as loopback', async () => {
    const { line, anonymous } = await startAndProbe({ HOST: '::1' })
    expect(line.listening!.address).toMatch(/^http:\/\/\[::1\]:\d+$/)
    expect(line.listening!.authentication).toBe(false)
    expect(anonymous).toBe(200)
  })

  it('refuses 0.0.0.0 without tokens before it opens anything, naming the remedies', async () => {
    const { logger, lines } = capture()
    const dataDir = join(dir, 'never-created')
    const refusal = startServer({ PORT: '0', HOST: '0.0.0.0', WORKER_THREADS: '1', DATA_DIR: dataDir }, logger)
    await expect(refusal).rejects.toBeInstanceOf(ConfigError)
    await expect(refusal).rejects.toThrow(/HOST=0\.0\.0\.0 is reachable from other machines and TOKENS_FILE is not set/)
    expect(existsSync(dataDir)).toBe(false)
    expect(lines.filter((l) => l.listening !== undefined)).toEqual([])
  })

  it('serves 0.0.0.0 anonymously with ALLOW_ANONYMOUS=true, and says so', async () => {
    const { line, anonymous } = await startAndProbe({ HOST: '0.0.0.0', ALLOW_ANONYMOUS: 'true' })
    expect(line.msg).toMatch(/^memsweep listening on http:\/\/0\.0\.0\.0:\d+ \(embedded backend, data in .*, authentication off: anonymous access allowed by ALLOW_ANONYMOUS\)$/)
    expect(anonymous).toBe(200)
  })

  it('serves 0.0.0.0 with tokens: authentication on, anonymous requests get 401', async () => {
    const tokens = join(dir, 'tokens.txt')
    await writeFile(tokens, 'alice:alice-laptop-7f3a9c2e1b\n')
    const { line, anonymous } = await startAndProbe({ HOST: '0.0.0.0', TOKENS_FILE: tokens })
    expect(line.msg).toContain(`authentication on: tokens from ${tokens})`)
    expect(line.listening).toMatchObject({ backend: 'embedded', authentication: true, redis: null })
    expect(anonymous).toBe(401)
  })

  it.runIf(redis)('names the Redis backend by its URL, never its password, instead of a data folder', async () => {
    const prefix = testPrefix()
    try {
      const { line } = await startAndProbe({ REDIS_URL, REDIS_PREFIX: prefix })
      const shown = new URL(REDIS_URL)
      if (shown.password !== '') shown.password = '***'
      expect(line.msg).toBe(`memsweep listening on ${line.listening!.address} (Redis backend at ${shown.toString()}, authentication off: only this machine can connect)`)
      expect(line.listening).toMatchObject({ backend: 'redis', dataDir: null })
    } finally {
      await removePrefix(prefix)
    }
  })
})
