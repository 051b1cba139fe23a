/**
 * Worker processes for the multi-process tests: each a real `node` process running
 * fixtures/worker-process.ts, observed through the JSON lines it prints.
 */
import { spawn, type ChildProcess } from 'node:child_process'
import { createInterface } from 'node:readline'
import { fileURLToPath } from 'node:url'
import type { WorkerActivity, WorkerProcessOptions } from '../../src/backends/redis/worker/worker.js'
import { ENGINE_PROCESS_FLAGS } from '../../src/runtime/node-flags.js'

const FIXTURE = fileURLToPath(new URL('./fixtures/worker-process.ts', import.meta.url))
const REPO_ROOT = fileURLToPath(new URL('../../', import.meta.url))

export type WorkerLine = WorkerActivity | { type: 'ready', name: string, healthPort: number | null }

export interface WorkerProcess {
  child: ChildProcess
  /** Every line printed so far. */
  lines: WorkerLine[]
  /** Resolves with the first line (past or future) that satisfies `predicate`; `index` counts lines from 0. */
  waitFor: (predicate: (line: WorkerLine, index: number) => boolean, timeoutMs?: number) => Promise<WorkerLine>
  /** Resolves when the process has exited. */
  exited: Promise<{ code: number | null, signal: NodeJS.Signals | null }>
}

export function spawnWorker (options: Omit<WorkerProcessOptions, 'logger' | 'observer'>): WorkerProcess {
  const child = spawn(process.execPath, [...ENGINE_PROCESS_FLAGS, '--import', 'tsx', FIXTURE, JSON.stringify(options)], {
    cwd: REPO_ROOT,
    stdio: ['ignore', 'pipe', 'inherit']
  })
  const lines: WorkerLine[] = []
  const waiters = new Set<{ predicate: (line: WorkerLine, index: number) => boolean, resolve: (line: WorkerLine) => void }>()
  createInterface({ input: child.stdout! }).on('line', (text) => {
    let line: WorkerLine
    try {
      line = JSON.parse(text) as WorkerLine
    } catch {
      return
    }
    lines.push(line)
    for (const waiter of [...waiters]) {
      if (waiter.predicate(line, lines.length - 1)) {
        waiters.delete(waiter)
        waiter.resolve(line)
      }
    }
  })
  const exited = new Promise<{ code: number | null, signal: NodeJS.Signals | null }>((resolve) => {
    child.once('exit', (code, signal) => resolve({ code, signal }))
  })
  const waitFor = (predicate: (line: WorkerLine, index: number) => boolean, timeoutMs = 60_000): Promise<WorkerLine> => {
    const seen = lines.find(predicate)
    if (seen !== undefined) return Promise.resolve(seen)
    return new Promise((resolve, reject) => {
      const waiter = {
        predicate,
        resolve: (line: WorkerLine) => {
          clearTimeout(timer)
          resolve(line)
        }
      }
      const timer = setTimeout(() => {
        waiters.delete(waiter)
        reject(new Error(`worker process ${child.pid}: expected line not seen within ${timeoutMs} ms (saw ${JSON.stringify(lines)})`))
      }, timeoutMs)
      waiters.add(waiter)
      exited.then(({ code, signal }) => {
        if (!waiters.has(waiter)) return
        waiters.delete(waiter)
        clearTimeout(timer)
        reject(new Error(`worker process ${child.pid} exited (code ${code}, signal ${signal}) before the expected line (saw ${JSON.stringify(lines)})`))
      }).catch(() => {})
    })
  }
  return { child, lines, waitFor, exited }
}

/** Stops a worker process: SIGTERM, then SIGKILL if it has not exited within `graceMs`. */
export async function stopWorker (worker: WorkerProcess, graceMs = 10_000): Promise<void> {
  if (worker.child.exitCode !== null || worker.child.signalCode !== null) return
  worker.child.kill('SIGTERM')
  const timer = setTimeout(() => worker.child.kill('SIGKILL'), graceMs)
  await worker.exited
  clearTimeout(timer)
}
