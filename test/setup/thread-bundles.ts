/**
 * Vitest global setup: bundles every module a worker thread starts from (compute threads,
 * render threads, Redis sandbox threads, and the test fixture that wraps the compute thread)
 * once per run, and names the directory in the environment that test processes, their
 * threads and the server and CLI processes they spawn inherit (src/runtime/worker-entry.ts).
 * Without it every thread loads its modules through tsx: about a second per thread, and tsx
 * leaves some fifty cache files open per thread, which ran a long file out of descriptors.
 *
 * Bundles hold only the project's own modules (packages stay imports), written under
 * node_modules/.cache so those imports resolve from the project. Watch mode keeps loading
 * through tsx, so that an edited source reaches the threads.
 */
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { build } from 'esbuild'
import type { TestProject } from 'vitest/node'
import { THREAD_BUNDLES_VARIABLE, threadBundleName } from '../../src/runtime/worker-entry.js'

const root = new URL('../../', import.meta.url)

/** Every module a thread starts from; a new thread module must be listed here to be prebuilt. */
export const THREAD_MODULES: readonly string[] = [
  'src/backends/embedded/chunk-worker.ts',
  'src/api/render/render-thread.ts',
  'src/backends/redis/worker/sandbox.ts',
  'test/backends/embedded/fixtures/faulty-chunk-worker.ts'
]

export default async function setup (project: TestProject): Promise<(() => void) | undefined> {
  if (project.config.watch) {
    // Empty: threads load through tsx, on purpose (test/project/thread-bundles.test.ts skips its checks).
    process.env[THREAD_BUNDLES_VARIABLE] = ''
    return undefined
  }
  const cache = fileURLToPath(new URL('node_modules/.cache/memsweep-thread-bundles/', root))
  mkdirSync(cache, { recursive: true })
  const dir = mkdtempSync(join(cache, 'run-'))
  await Promise.all(THREAD_MODULES.map(async (path) => {
    const url = new URL(path, root)
    await build({
      entryPoints: [fileURLToPath(url)],
      outfile: join(dir, threadBundleName(url)),
      bundle: true,
      packages: 'external',
      platform: 'node',
      format: 'esm',
      target: 'node20',
      sourcemap: 'inline',
      logLevel: 'error'
    })
  }))
  process.env[THREAD_BUNDLES_VARIABLE] = dir
  return () => {
    delete process.env[THREAD_BUNDLES_VARIABLE]
    rmSync(dir, { recursive: true, force: true })
  }
}
