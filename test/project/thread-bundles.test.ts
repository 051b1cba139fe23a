/**
 * Threads of a test run start from the bundles built by test/setup/thread-bundles.ts, never
 * through tsx (slow, and it leaks open files per thread), and every thread module of the
 * source is among the bundled ones.
 */
import { readdirSync, readFileSync, readlinkSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { createEmbeddedQueue } from '../../src/backends/embedded/index.js'
import { THREAD_BUNDLES_VARIABLE, workerEntryFor } from '../../src/runtime/worker-entry.js'
import { THREAD_MODULES } from '../setup/thread-bundles.js'
import { makeDataDir } from '../backends/embedded/helpers.js'

const root = new URL('../../', import.meta.url)

function sourceFiles (dir: URL): string[] {
  return readdirSync(dir, { recursive: true, encoding: 'utf8' }).filter((name) => name.endsWith('.ts')).map((name) => fileURLToPath(new URL(name, dir)))
}

const openDescriptors = (): number => readdirSync('/proc/self/fd').filter((fd) => {
  try { return readlinkSync(`/proc/self/fd/${fd}`) !== '' } catch { return false }
}).length

// Empty in watch mode only (threads load through tsx there, so that edits reach them).
const watching = process.env[THREAD_BUNDLES_VARIABLE] === ''

describe('prebuilt thread bundles', () => {
  it.skipIf(watching)('are named in the environment and used for every thread module', () => {
    expect(process.env[THREAD_BUNDLES_VARIABLE]).toBeTruthy()
    for (const path of THREAD_MODULES) {
      const entry = workerEntryFor(new URL(path, root))
      expect(entry.filename, path).toMatch(/\.mjs$/)
      expect(entry.execArgv, path).toEqual([])
    }
  })

  it('cover every module the source starts a thread from', () => {
    const started = new Set<string>()
    for (const file of sourceFiles(new URL('src/', root))) {
      const text = readFileSync(file, 'utf8')
      for (const match of text.matchAll(/siblingWorkerEntry\(import\.meta\.url, '([\w-]+)'\)/g)) {
        started.add(fileURLToPath(new URL(`./${match[1]}.ts`, `file://${file}`)).slice(fileURLToPath(root).length))
      }
    }
    started.add('src/backends/redis/worker/sandbox.ts')
    expect(started.size).toBeGreaterThanOrEqual(3)
    for (const path of started) expect(THREAD_MODULES, path).toContain(path)
  })

  it.runIf(process.platform === 'linux' && !watching)('leave no open files behind when a backend with threads closes', { timeout: 60_000 }, async () => {
    const cycle = async (): Promise<void> => {
      const data = makeDataDir()
      const queue = await createEmbeddedQueue({ dataDir: data.dir, threads: 2 })
      await queue.close()
      data.remove()
    }
    await cycle()
    const before = openDescriptors()
    for (let i = 0; i < 3; i++) await cycle()
    // Through tsx each cycle left about a hundred; a few may come and go with the runtime.
    expect(openDescriptors() - before).toBeLessThan(10)
  })
})
