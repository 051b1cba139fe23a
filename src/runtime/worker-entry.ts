/**
 * Where a thread's module lives and how to start it. Compiled (dist/), the entry is plain
 * JavaScript beside its caller. From source (vitest, tsx, `npm run memsweep`) the thread
 * starts from thread-from-source.mjs, which loads the TypeScript module named in its argv
 * through tsx's scoped API: a worker thread does not inherit the loader hooks of the thread
 * that started it, and Node 20 threads ignore an `--import tsx` flag for the modules they
 * import later (an entry that loads its code with a dynamic import, as the compute thread's
 * does, would not find it).
 *
 * A run from source may also name a directory of prebuilt thread bundles (the test suite
 * writes them once per run, test/setup/thread-bundles.ts): a thread started from a bundle is
 * ready in milliseconds instead of a second of loading through tsx, and does not leave tsx's
 * open cache files behind (about fifty per thread, which ran a long test out of descriptors).
 */
import { existsSync } from 'node:fs'
import { join, relative } from 'node:path'
import { fileURLToPath, pathToFileURL } from 'node:url'

export interface WorkerEntry {
  /** file: URL of the module whose default export handles a task. */
  filename: string
  /** Node flags for the thread. */
  execArgv: string[]
  /** Appended to the thread's process.argv (from source: the TypeScript module to load). */
  argv: string[]
}

/** Names the directory of prebuilt thread bundles (runs from source only; unset, threads load through tsx). */
export const THREAD_BUNDLES_VARIABLE = 'MEMSWEEP_THREAD_BUNDLES'

const PROJECT_ROOT = fileURLToPath(new URL('../../', import.meta.url))

/** A module beside the calling module (pass its `import.meta.url`), in the form the caller runs in: `.ts` from source, `.js` compiled. */
export function siblingWorkerEntry (callerUrl: string, basename: string): WorkerEntry {
  const fromSource = callerUrl.endsWith('.ts')
  return workerEntryFor(new URL(`./${basename}${fromSource ? '.ts' : '.js'}`, callerUrl))
}

/** Any worker module (tests use fixtures that wrap the real one). */
export function workerEntryFor (url: URL): WorkerEntry {
  if (!url.pathname.endsWith('.ts')) return { filename: url.href, execArgv: [], argv: [] }
  const bundle = prebuiltThreadBundle(url)
  if (bundle !== null) return { filename: bundle.href, execArgv: [], argv: [] }
  return { filename: new URL('./thread-from-source.mjs', import.meta.url).href, execArgv: [], argv: [url.href] }
}

/** The prebuilt bundle of a TypeScript thread module, when the environment names a directory that holds one. */
export function prebuiltThreadBundle (url: URL): URL | null {
  const dir = process.env[THREAD_BUNDLES_VARIABLE]
  if (dir === undefined || dir === '') return null
  const file = join(dir, threadBundleName(url))
  return existsSync(file) ? pathToFileURL(file) : null
}

/** The bundle file name of a thread module: its path in the project, flattened (`src/a/b.ts` → `src__a__b.mjs`). */
export function threadBundleName (url: URL): string {
  return relative(PROJECT_ROOT, fileURLToPath(url)).split(/[\\/]/).join('__').replace(/\.ts$/, '.mjs')
}
