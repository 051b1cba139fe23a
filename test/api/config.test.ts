import { describe, expect, it } from 'vitest'
import { availableParallelism } from 'node:os'
import { ConfigError, loadConfig } from '../../src/config.js'

describe('loadConfig', () => {
  it('fills documented defaults from an empty environment', () => {
    const config = loadConfig({})
    expect(config).toMatchObject({
      port: 8080,
      host: '0.0.0.0',
      dataDir: './data',
      redisUrl: null,
      tokensFile: null,
      bodyLimit: 256 * 1024,
      rateLimit: { max: 600, windowSeconds: 60 },
      authFailureLimit: { max: 20, windowSeconds: 300 },
      maxActiveSweepsPerOwner: 20,
      sseHeartbeatSeconds: 15,
      trustProxy: false,
      logLevel: 'info',
      limits: {}
    })
    expect(config.workerThreads).toBe(availableParallelism())
    expect(Object.isFrozen(config)).toBe(true)
    expect(Object.isFrozen(config.rateLimit)).toBe(true)
  })

  it('treats empty variables as unset and converts work limits to the spec layer\'s names', () => {
    const config = loadConfig({ PORT: '', REDIS_URL: 'redis://127.0.0.1:6379', MAX_NEURONS: '5000', MAX_GRID_POINTS: '100', MAX_TRIALS: '1000', MAX_MEMORY_MB: '64', MAX_CPU_SECONDS: '600', TRUST_PROXY: 'true' })
    expect(config.port).toBe(8080)
    expect(config.redisUrl).toBe('redis://127.0.0.1:6379')
    expect(config.trustProxy).toBe(true)
    expect(config.limits).toEqual({ maxNeurons: 5000, maxPoints: 100, maxTrials: 1000, maxBytes: 64 * 1024 * 1024, maxCpuSeconds: 600 })
  })

  it('reports every bad variable at once', () => {
    let caught: unknown
    try {
      loadConfig({ PORT: 'eighty', LOG_LEVEL: 'loud', REDIS_URL: 'http://example.org', WORKER_THREADS: '0' })
    } catch (error) {
      caught = error
    }
    expect(caught).toBeInstanceOf(ConfigError)
    const issues = (caught as ConfigError).issues.join('\n')
    for (const name of ['PORT', 'LOG_LEVEL', 'REDIS_URL', 'WORKER_THREADS']) expect(issues).toContain(name)
  })
})

describe('.env file', () => {
  it('fills unset variables from the file; the real environment wins', async () => {
    const { mkdtemp, writeFile, rm } = await import('node:fs/promises')
    const { join } = await import('node:path')
    const { tmpdir } = await import('node:os')
    const { withDotEnv } = await import('../../src/server.js')
    const dir = await mkdtemp(join(tmpdir(), 'memsweep-env-'))
    const file = join(dir, '.env')
    await writeFile(file, '# comment\nPORT=9090\nLOG_LEVEL=debug\nDATA_DIR="/srv/memsweep data"\n')
    try {
      const env = withDotEnv({ LOG_LEVEL: 'warn' }, file)
      expect(loadConfig(env)).toMatchObject({ port: 9090, logLevel: 'warn', dataDir: '/srv/memsweep data' })
      expect(withDotEnv({ PORT: '1' }, join(dir, 'missing.env'))).toEqual({ PORT: '1' })
    } finally {
      await rm(dir, { recursive: true, force: true })
    }
  })
})
