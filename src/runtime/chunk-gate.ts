/**
 * A gate for tests, in front of every chunk: tests that need a sweep in progress (to cancel
 * it, kill its process, restart its server or watch its live events) hold chunks here
 * instead of sizing a sweep to the machine's speed. Inert unless MEMSWEEP_TEST_CHUNK_GATE
 * names a directory; production never sets it.
 *
 * The gate is a directory, so it works alike in compute threads, sandboxed processors and
 * worker processes on one machine:
 *   closed       present: chunks wait at the gate (absent: they pass)
 *   pass-*       each file lets one waiting chunk through (claimed by deleting it)
 *   at-*         one file per chunk waiting now, named after the chunk (removed when it passes or stops)
 *   ran.log      one line per chunk that passed to run, its label (so tests count the chunks computed)
 * test/helpers/chunk-gate.ts drives it.
 */
import { appendFileSync, existsSync, readdirSync, rmSync, unlinkSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { threadId } from 'node:worker_threads'

/** Environment variable naming the gate directory. */
export const CHUNK_GATE_VARIABLE = 'MEMSWEEP_TEST_CHUNK_GATE'

const POLL_MS = 5
const sleeper = new Int32Array(new SharedArrayBuffer(4))

/**
 * Waits at the gate, if one is set, until the chunk may pass. Returns false when
 * `shouldStop` turned true while waiting (the chunk must not run).
 */
export function passChunkGate (label: string, shouldStop: () => boolean): boolean {
  const dir = process.env[CHUNK_GATE_VARIABLE]
  if (dir === undefined || dir === '') return true
  if (!existsSync(join(dir, 'closed'))) return ran(dir, label)
  const marker = join(dir, `at-${label}-${process.pid}-${threadId}`)
  writeFileSync(marker, '')
  try {
    for (;;) {
      if (!existsSync(join(dir, 'closed')) || claimPass(dir)) return ran(dir, label)
      if (shouldStop()) return false
      Atomics.wait(sleeper, 0, 0, POLL_MS)
    }
  } finally {
    rmSync(marker, { force: true })
  }
}

/** Appends the label to ran.log: one short append per line, so lines from several processes never interleave. */
function ran (dir: string, label: string): true {
  try {
    appendFileSync(join(dir, 'ran.log'), `${label}\n`)
  } catch {
    // The test removed the gate meanwhile: nobody counts any more.
  }
  return true
}

function claimPass (dir: string): boolean {
  for (const name of readdirSync(dir)) {
    if (!name.startsWith('pass-')) continue
    try {
      unlinkSync(join(dir, name))
      return true
    } catch {
      // Another chunk claimed it first.
    }
  }
  return false
}
