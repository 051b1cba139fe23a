/**
 * Shared pieces of the embedded backend tests: throw-away data directories, small specs,
 * and waits that resolve on the queue's own events rather than on timers.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { createEmbeddedQueue, type EmbeddedQueueOptions } from '../../../src/backends/embedded/index.js'
import { TERMINAL_STATUSES } from '../../../src/backends/port.js'
import type { SweepEvent, SweepQueue, SweepRecord } from '../../../src/backends/port.js'
import { normaliseSpec, type NormalisedSpec } from '../../../src/spec/index.js'
import { resultToCsv, resultToJson, type SweepResult } from '../../../src/results/index.js'

export function makeDataDir (): { dir: string, remove: () => void } {
  const dir = mkdtempSync(join(tmpdir(), 'memsweep-embedded-'))
  return { dir, remove: () => rmSync(dir, { recursive: true, force: true }) }
}

export function openQueue (dataDir: string, options: Partial<EmbeddedQueueOptions> = {}): Promise<SweepQueue> {
  return createEmbeddedQueue({ dataDir, threads: 2, ...options })
}

/**
 * A capacity-curve fragment of a model place-cell network holding room codes: a few loads,
 * each point one quick chunk (tens of milliseconds).
 */
export function roomCodesSpec (overrides: Record<string, unknown> = {}): NormalisedSpec {
  return normaliseSpec({ label: 'room codes', neurons: 120, load: { values: [0.05, 0.1, 0.15] }, trials: 40, seed: 7, ...overrides })
}

/** Several points whose chunks take a few hundred milliseconds each: long enough to interrupt. */
export function corridorSweepSpec (overrides: Record<string, unknown> = {}): NormalisedSpec {
  return normaliseSpec({
    label: 'corridor recall',
    neurons: 400,
    load: { values: [0.05, 0.07, 0.09, 0.11, 0.13, 0.15, 0.17, 0.19] },
    trials: 600,
    seed: 2024,
    ...overrides
  })
}

/** One chunk of several seconds: a sweep that is surely still running a moment after it starts. */
export function longChunkSpec (overrides: Record<string, unknown> = {}): NormalisedSpec {
  // Long enough that cancels and closes land while it runs, even with the engine's fast paths.
  return normaliseSpec({ label: 'hippocampal archive', neurons: 500, load: 0.1, trials: 40000, seed: 99, ...overrides })
}

/** Resolves with the first record (current state included) that satisfies `predicate`. */
export function waitForRecord (queue: SweepQueue, id: string, predicate: (record: SweepRecord) => boolean): Promise<SweepRecord> {
  return new Promise((resolve, reject) => {
    let settled = false
    const finish = (record: SweepRecord): void => {
      if (settled || !predicate(record)) return
      settled = true
      unsubscribe()
      resolve(record)
    }
    const unsubscribe = queue.subscribe(id, (event: SweepEvent) => finish(event.sweep))
    queue.get(id).then(record => {
      if (record === null) throw new Error(`no sweep ${id}`)
      finish(record)
    }).catch((error: unknown) => {
      unsubscribe()
      reject(error instanceof Error ? error : new Error(String(error)))
    })
  })
}

export function waitForTerminal (queue: SweepQueue, id: string): Promise<SweepRecord> {
  return waitForRecord(queue, id, record => TERMINAL_STATUSES.has(record.status))
}

/** Resolves once `check` returns true, polling at a short interval (for state no event announces). */
export async function pollUntil (check: () => Promise<boolean>, timeoutMs: number, everyMs = 10): Promise<void> {
  const deadline = performance.now() + timeoutMs
  while (!(await check())) {
    if (performance.now() > deadline) throw new Error(`condition not met within ${timeoutMs} ms`)
    await new Promise(resolve => setTimeout(resolve, everyMs))
  }
}

/** A succeeded sweep's result with its trial records attached (stores keep them in the chunks). */
export async function fullResult (queue: SweepQueue, id: string): Promise<SweepResult> {
  const result = await queue.results(id)
  if (result === null) throw new Error(`sweep ${id} has no result`)
  return { ...result, trials: await queue.trials(id) ?? [] }
}

/** The result's published bytes (JSON without run timing, both CSV forms). */
export function resultBytes (result: SweepResult): { json: string, pointCsv: string, trialCsv: string } {
  return {
    json: resultToJson(result, { perTrial: true }),
    pointCsv: resultToCsv(result, { perTrial: false }),
    trialCsv: resultToCsv(result, { perTrial: true })
  }
}
