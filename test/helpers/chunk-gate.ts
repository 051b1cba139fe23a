/**
 * Drives the test gate in front of every chunk (src/runtime/chunk-gate.ts): tests that need
 * a sweep in progress hold its chunks here and let them through one by one, instead of
 * sizing the sweep to the machine's speed. The gate works in compute threads, sandboxed
 * processors and worker processes alike; it must be installed (its directory named in the
 * environment) before they start.
 */
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { setTimeout as sleep } from 'node:timers/promises'
import { CHUNK_GATE_VARIABLE } from '../../src/runtime/chunk-gate.js'

export interface ChunkGate {
  readonly dir: string
  /** The environment entry that installs the gate in a child process. */
  readonly env: Record<string, string>
  /** From now on, chunks wait at the gate. */
  hold: () => void
  /** Lets `count` waiting (or future) chunks through, one each. */
  release: (count?: number) => void
  /** Lets every chunk through, now and later. */
  open: () => void
  /** Chunks waiting at the gate now. */
  waiting: () => number
  /** Resolves once at least `count` chunks wait at the gate. */
  untilWaiting: (count?: number, timeoutMs?: number) => Promise<void>
  /** Labels (`s<seed>-c<chunk>-n<trials>`) of the chunks that passed the gate to run since it was installed, in order. */
  ran: () => string[]
  /** Chunks of sweeps with this seed that passed the gate to run, and the trials they held. */
  ranForSeed: (seed: number) => { chunks: number, trials: number, labels: string[] }
  /** Opens the gate, uninstalls it from this process and removes its directory. */
  remove: () => void
}

let passes = 0

/** Creates a gate and installs it in this process's environment (threads started later inherit it). */
export function installChunkGate (): ChunkGate {
  const dir = mkdtempSync(join(tmpdir(), 'memsweep-gate-'))
  const previous = process.env[CHUNK_GATE_VARIABLE]
  process.env[CHUNK_GATE_VARIABLE] = dir
  const closed = join(dir, 'closed')
  const waiting = (): number => existsSync(dir) ? readdirSync(dir).filter((name) => name.startsWith('at-')).length : 0
  return {
    dir,
    env: { [CHUNK_GATE_VARIABLE]: dir },
    hold: () => writeFileSync(closed, ''),
    release: (count = 1) => {
      for (let i = 0; i < count; i++) writeFileSync(join(dir, `pass-${process.pid}-${passes++}`), '')
    },
    open: () => rmSync(closed, { force: true }),
    waiting,
    ran: () => ranLabels(dir),
    ranForSeed: (seed) => {
      const labels = ranLabels(dir).filter((label) => label.startsWith(`s${seed}-c`))
      return { chunks: labels.length, trials: labels.reduce((sum, label) => sum + Number(/-n(\d+)$/.exec(label)?.[1] ?? NaN), 0), labels }
    },
    untilWaiting: async (count = 1, timeoutMs = 30_000) => {
      const deadline = Date.now() + timeoutMs
      while (waiting() < count) {
        if (Date.now() > deadline) throw new Error(`fewer than ${count} chunk(s) reached the gate within ${timeoutMs} ms`)
        await sleep(5)
      }
    },
    remove: () => {
      rmSync(closed, { force: true })
      if (previous === undefined) delete process.env[CHUNK_GATE_VARIABLE]
      else process.env[CHUNK_GATE_VARIABLE] = previous
      // Chunks still polling see the gate open (no `closed` file) before the directory goes.
      setTimeout(() => rmSync(dir, { recursive: true, force: true }), 100).unref()
    }
  }
}

function ranLabels (dir: string): string[] {
  const log = join(dir, 'ran.log')
  return existsSync(log) ? readFileSync(log, 'utf8').split('\n').filter((line) => line !== '') : []
}

let shared: ChunkGate | null = null

/**
 * One gate for a whole test file (for suites whose queue is created once, before any test
 * holds chunks). Installed at the first call; removed when the process exits.
 */
export function sharedChunkGate (): ChunkGate {
  if (shared === null) {
    const gate = installChunkGate()
    process.once('exit', () => rmSync(gate.dir, { recursive: true, force: true }))
    shared = gate
  }
  return shared
}
