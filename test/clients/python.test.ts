/**
 * The Python package in clients/python against live servers: its pytest suite runs once
 * against the embedded backend (with a second, rate-limited app on the same backend for the
 * retry test) and once against the Redis backend (a key prefix of its own, one worker in
 * this process), leaving out there the tests marked backend_agnostic; one compute thread
 * each, as the sweeps are tiny. The suite runs in the shared test environment of
 * scripts/ensure-python-venv.sh. Then a fresh virtual environment installs the package from
 * the repository, offline, and runs the README's notebook example. The servers run in this
 * process, so Python runs as a child process that never blocks it.
 */
import { existsSync, readFileSync } from 'node:fs'
import { cp, mkdtemp, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import type { FastifyInstance } from 'fastify'
import { pino } from 'pino'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { buildApp } from '../../src/api/app.js'
import { createEmbeddedQueue } from '../../src/backends/embedded/index.js'
import { createRedisQueue } from '../../src/backends/redis/index.js'
import { startWorker } from '../../src/backends/redis/worker/worker.js'
import { loadConfig } from '../../src/config.js'
import { createHarness, type Harness } from '../api/helpers/harness.js'
import { installChunkGate, type ChunkGate } from '../helpers/chunk-gate.js'
import { withOverrides } from '../helpers/queue-overrides.js'
import { quietLogger, REDIS_URL, redisAvailable, removePrefix, testPrefix } from '../integration/helpers.js'
import { runCommand, TEST_VENV, type PythonRun } from '../helpers/python.js'

const ROOT = fileURLToPath(new URL('../../', import.meta.url))
const PACKAGE = join(ROOT, 'clients/python')
const VENV_PYTHON = join(TEST_VENV, 'bin/python')
const TOKEN = 'python-notebook-5b2c9e71d0'
const ADMIN_TOKEN = 'python-admin-7f1e2d9c4b'
const TOKENS = [`ada:${TOKEN}`, `root:${ADMIN_TOKEN}:admin`]

type Run = PythonRun

async function run (command: string, args: string[], options: { cwd?: string, env?: Record<string, string> } = {}): Promise<Run> {
  return await runCommand(command, args, { cwd: options.cwd ?? ROOT, ...(options.env === undefined ? {} : { env: options.env }) })
}

async function pytest (env: Record<string, string>, selection: string[] = []): Promise<Run> {
  return await run(VENV_PYTHON, ['-m', 'pytest', '-q', '-p', 'no:cacheprovider', ...selection, 'clients/python/tests'], {
    env: { PYTHONPATH: join(PACKAGE, 'src'), PYTHONDONTWRITEBYTECODE: '1', MEMSWEEP_TEST_TOKEN: TOKEN, MEMSWEEP_TEST_ADMIN_TOKEN: ADMIN_TOKEN, ...env }
  })
}

/** The README's notebook example: the first python block after its marker. */
function readmeExample (): string {
  const readme = readFileSync(join(ROOT, 'README.md'), 'utf8')
  const block = /<!-- python-example[^>]*-->\s*```python\n([\s\S]*?)```/.exec(readme)
  if (block === null) throw new Error('README.md has no python-example block')
  return block[1]!
}

let gate: ChunkGate
const redisReady = await redisAvailable()

beforeAll(() => {
  if (!existsSync(VENV_PYTHON)) throw new Error(`no Python test environment at ${TEST_VENV}: run scripts/prepare-tests.sh`)
  // Before any backend starts its threads or workers, so they all see the gate.
  gate = installChunkGate()
})
afterAll(() => gate?.remove())

describe('Python package against the embedded backend', () => {
  let h: Harness
  let throttled: FastifyInstance
  let url = ''
  let throttledUrl = ''

  beforeAll(async () => {
    h = await createHarness(async ({ dataDir }) => await createEmbeddedQueue({ dataDir, threads: 1 }), { tokens: TOKENS })
    url = await h.app.listen({ port: 0, host: '127.0.0.1' })
    // The same backend behind a second app that allows two requests a second.
    const config = loadConfig({ DATA_DIR: h.dataDir, TOKENS_FILE: join(h.dataDir, 'tokens.txt'), RATE_LIMIT_MAX: '2', RATE_LIMIT_WINDOW: '1', LOG_LEVEL: 'silent' })
    throttled = buildApp({ config, queue: h.queue, logger: pino({ level: 'silent' }) })
    throttledUrl = await throttled.listen({ port: 0, host: '127.0.0.1' })
  })
  afterAll(async () => {
    await throttled?.close()
    await h?.close()
  })

  it('passes the pytest suite', async () => {
    const result = await pytest({ MEMSWEEP_TEST_SERVER: url, MEMSWEEP_TEST_BACKEND: 'embedded', MEMSWEEP_TEST_CHUNK_GATE: gate.dir, MEMSWEEP_TEST_THROTTLED_SERVER: throttledUrl })
    expect(result.status, result.stdout + result.stderr).toBe(0)
    expect(result.stdout).toMatch(/\d+ passed/)
    expect(result.stdout).not.toMatch(/skipped/)
  })

  it('installs from the repository into a fresh virtual environment and runs the README example', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'memsweep-fresh-venv-'))
    try {
      // Offline: the build backend and requests come from the system's packages (no index here).
      const created = await run('/usr/bin/python3', ['-m', 'venv', '--system-site-packages', '--without-pip', join(dir, 'venv')])
      expect(created.status, created.stderr).toBe(0)
      const python = join(dir, 'venv/bin/python')
      // A copy of the package's folder, so the build's files (egg-info, build/) never land in the work tree.
      const source = join(dir, 'memsweep-client')
      await cp(PACKAGE, source, { recursive: true, filter: (path) => !/(__pycache__|\.egg-info|\/build)$/.test(path) })
      const installed = await run(python, ['-m', 'pip', 'install', '--no-index', '--no-build-isolation', '--no-compile', '--disable-pip-version-check', '--quiet', source], { cwd: dir })
      expect(installed.status, installed.stdout + installed.stderr).toBe(0)
      const example = readmeExample().replace('http://127.0.0.1:8080', url).replace('token="…"', `token=${JSON.stringify(TOKEN)}`)
      const lines = example.trimEnd().split('\n')
      expect(lines).toHaveLength(5)
      // As a notebook does: run the cell, show its last expression.
      const notebook = [
        'import memsweep_client, sys',
        `exec(${JSON.stringify(lines.slice(0, -1).join('\n'))})`,
        `frame = eval(${JSON.stringify(lines.at(-1))})`,
        'print(memsweep_client.__file__)',
        'print(len(frame), list(frame.columns[:3]), frame["load"].dtype, frame["success.rate"].dtype)'
      ].join('\n')
      const ran = await run(python, ['-c', notebook], { cwd: dir })
      expect(ran.status, ran.stderr).toBe(0)
      const [file, summary] = ran.stdout.trim().split('\n')
      expect(file).toContain(join(dir, 'venv'))
      expect(summary).toBe("4 ['sweepId', 'label', 'specHash'] float64 float64")
    } finally {
      await rm(dir, { recursive: true, force: true })
    }
  })
})

describe.runIf(redisReady)('Python package against the Redis backend', () => {
  let h: Harness
  let url = ''

  beforeAll(async () => {
    h = await createHarness(async () => {
      const logger = quietLogger()
      const prefix = testPrefix()
      const queue = await createRedisQueue({ url: REDIS_URL, prefix, logger })
      const worker = await startWorker({ url: REDIS_URL, prefix, logger, concurrency: 1 })
      return withOverrides(queue, {
        close: async () => {
          await queue.close()
          await worker.close()
          await removePrefix(prefix)
        }
      })
    }, { tokens: TOKENS })
    url = await h.app.listen({ port: 0, host: '127.0.0.1' })
  })
  afterAll(async () => await h?.close())

  it('passes the pytest suite', async () => {
    // What does not depend on the backend (the route map, the command line, retries) ran against the embedded one.
    const result = await pytest({ MEMSWEEP_TEST_SERVER: url, MEMSWEEP_TEST_BACKEND: 'redis', MEMSWEEP_TEST_CHUNK_GATE: gate.dir }, ['-m', 'not backend_agnostic'])
    expect(result.status, result.stdout + result.stderr).toBe(0)
    expect(result.stdout).toMatch(/\d+ passed, \d+ deselected/)
    expect(result.stdout).not.toMatch(/skipped/)
  })
})
