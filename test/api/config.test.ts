import { describe, expect, it } from 'vitest'
import { availableParallelism } from 'node:os'
import { readFileSync } from 'node:fs'
import { CONFIG_VARIABLES, ConfigError, decideAccess, isLoopbackHost, loadConfig } from '../../src/config.js'
import { parseDuration } from '../../src/duration.js'

describe('loadConfig', () => {
  it('fills documented defaults from an empty environment', () => {
    const config = loadConfig({})
    expect(config).toMatchObject({
      port: 8080,
      host: '127.0.0.1',
      dataDir: './data',
      redisUrl: null,
      tokensFile: null,
      allowAnonymous: false,
      bodyLimit: 256 * 1024,
      rateLimit: { max: 600, windowSeconds: 60 },
      authFailureLimit: { max: 20, windowSeconds: 300 },
      maxActiveSweepsPerOwner: 20,
      sseHeartbeatSeconds: 15,
      trustProxy: false,
      logLevel: 'info',
      logFormat: 'auto',
      logRequests: false,
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

  it('lists every variable it reads in .env.example', () => {
    const example = readFileSync(new URL('../../.env.example', import.meta.url), 'utf8')
    const listed = new Set([...example.matchAll(/^#? ?([A-Z_]+)=/gm)].map((m) => m[1]))
    expect(CONFIG_VARIABLES.filter((name) => !listed.has(name))).toEqual([])
    expect(CONFIG_VARIABLES).toEqual(expect.arrayContaining(['HOST', 'ALLOW_ANONYMOUS', 'LOG_FORMAT', 'LOG_REQUESTS']))
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

describe('worker lifetime settings', () => {
  it('reads durations as people and batch schedulers write them', () => {
    expect(parseDuration('90s')).toBe(90_000)
    expect(parseDuration('1h30m')).toBe(5_400_000)
    expect(parseDuration('500ms')).toBe(500)
    expect(parseDuration('1.5h')).toBe(5_400_000)
    expect(parseDuration('01:55:00')).toBe(6_900_000)
    expect(parseDuration('2-00:00:00')).toBe(172_800_000)
    expect(parseDuration('45:30')).toBe(2_730_000)
    for (const bad of ['90', '1h 30m', 'soon', '00:61:00', '1:2:3', '']) expect(parseDuration(bad), bad).toBeNull()
  })

  it('has no limits by default and names a bad duration', () => {
    expect(loadConfig({}).workerLifetime).toEqual({ maxRuntimeMs: null, exitWhenIdleMs: null, shutdownGraceMs: 60_000, healthPort: null })
    expect(loadConfig({ WORKER_MAX_RUNTIME: '01:55:00', WORKER_EXIT_WHEN_IDLE: '5m', WORKER_HEALTH_PORT: '9090' }).workerLifetime)
      .toEqual({ maxRuntimeMs: 6_900_000, exitWhenIdleMs: 300_000, shutdownGraceMs: 60_000, healthPort: 9090 })
    expect(() => loadConfig({ WORKER_MAX_RUNTIME: '120' })).toThrow(/WORKER_MAX_RUNTIME: not a positive duration: "120"/)
  })
})

describe('who may connect (secure by default)', () => {
  it.each([
    ['127.0.0.1', true], ['127.8.9.10', true], ['localhost', true], ['::1', true], ['[::1]', true],
    ['0:0:0:0:0:0:0:1', true], ['::ffff:127.0.0.1', true],
    ['0.0.0.0', false], ['::', false], ['192.168.4.20', false], ['::ffff:10.1.2.3', false], ['lab-server.example', false]
  ])('%s is loopback: %s', (host, loopback) => {
    expect(isLoopbackHost(host)).toBe(loopback)
  })

  it('serves loopback without tokens, says so, and turns authentication on whenever tokens are set', () => {
    expect(decideAccess(loadConfig({}))).toEqual({ authentication: false, reason: 'only this machine can connect' })
    expect(decideAccess(loadConfig({ HOST: '::1' })).authentication).toBe(false)
    expect(decideAccess(loadConfig({ HOST: '0.0.0.0', TOKENS_FILE: '/srv/tokens.txt' }))).toEqual({ authentication: true, reason: 'tokens from /srv/tokens.txt' })
    expect(decideAccess(loadConfig({ HOST: '0.0.0.0', ALLOW_ANONYMOUS: 'true' }))).toEqual({ authentication: false, reason: 'anonymous access allowed by ALLOW_ANONYMOUS' })
  })

  it('refuses a non-loopback address, or a reverse proxy, without tokens unless ALLOW_ANONYMOUS says otherwise', () => {
    for (const env of [{ HOST: '0.0.0.0' }, { HOST: '::' }, { HOST: '10.0.0.5', ALLOW_ANONYMOUS: 'false' }, { TRUST_PROXY: 'true' }]) {
      let caught: unknown
      try { decideAccess(loadConfig(env)) } catch (error) { caught = error }
      expect(caught, JSON.stringify(env)).toBeInstanceOf(ConfigError)
      const message = (caught as ConfigError).message
      for (const remedy of ['TOKENS_FILE', 'HOST=127.0.0.1', 'ALLOW_ANONYMOUS=true']) expect(message).toContain(remedy)
    }
    expect(() => loadConfig({ ALLOW_ANONYMOUS: 'yes' })).toThrow(/ALLOW_ANONYMOUS/)
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
