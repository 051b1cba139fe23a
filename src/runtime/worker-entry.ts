/**
 * Where a thread's module lives and how to start it. Compiled (dist/), the entry is plain
 * JavaScript beside its caller. From source (vitest, tsx, `npm run dev`) it is the
 * TypeScript file, and the thread needs tsx's loader: a worker thread does not inherit the
 * loader hooks of the thread that started it.
 */
import { createRequire } from 'node:module'
import { pathToFileURL } from 'node:url'

export interface WorkerEntry {
  /** file: URL of the module whose default export handles a task. */
  filename: string
  /** Node flags for the thread. */
  execArgv: string[]
}

/** A module beside the calling module (pass its `import.meta.url`), in the form the caller runs in: `.ts` from source, `.js` compiled. */
export function siblingWorkerEntry (callerUrl: string, basename: string): WorkerEntry {
  const fromSource = callerUrl.endsWith('.ts')
  return workerEntryFor(new URL(`./${basename}${fromSource ? '.ts' : '.js'}`, callerUrl))
}

/** Any worker module (tests use fixtures that wrap the real one). */
export function workerEntryFor (url: URL): WorkerEntry {
  if (!url.pathname.endsWith('.ts')) return { filename: url.href, execArgv: [] }
  // Resolved from here rather than from the working directory, so it works from any cwd.
  const tsxLoader = pathToFileURL(createRequire(import.meta.url).resolve('tsx')).href
  return { filename: url.href, execArgv: ['--import', tsxLoader] }
}
