/**
 * Shared pieces of the Redis integration tests: the server to use (REDIS_TEST_URL), a fresh
 * key prefix per test and its clean-up, small specs from our invented place-cell scenario,
 * and waits that resolve on the queue's own events rather than on sleeps.
 */
import { randomUUID } from 'node:crypto'
import { Redis } from 'ioredis'
import { pino, type Logger } from 'pino'
import { TERMINAL_STATUSES } from '../../src/backends/port.js'
import type { SweepEvent, SweepQueue, SweepRecord } from '../../src/backends/port.js'
import { normaliseSpec, type NormalisedSpec } from '../../src/spec/index.js'
import { assembleResult, makeProvenance, planSweep, computeChunk } from '../../src/sweep/index.js'
import { resultToCsv, resultToJson, type SweepResult } from '../../src/results/index.js'
import { runtimeFacts } from '../../src/runtime/facts.js'

export const REDIS_URL = process.env.REDIS_TEST_URL ?? 'redis://127.0.0.1:6379'

/**
 * Whether the Redis tests can run. With MEMSWEEP_REQUIRE_REDIS=1 (CI) a missing server
 * throws, failing the test file instead of skipping it.
 */
export async function redisAvailable (): Promise<boolean> {
  const probe = new Redis(REDIS_URL, { lazyConnect: true, maxRetriesPerRequest: 0, retryStrategy: () => null, connectTimeout: 2000 })
  probe.on('error', () => {})
  try {
    await probe.connect()
    await probe.ping()
    return true
  } catch (error) {
    if (process.env.MEMSWEEP_REQUIRE_REDIS === '1') {
      throw new Error(`MEMSWEEP_REQUIRE_REDIS=1 but Redis at ${REDIS_URL} does not answer: ${String(error)}`)
    }
    return false
  } finally {
    probe.disconnect()
  }
}

export function testPrefix (): string {
  return `test-${randomUUID()}`
}

/** Deletes every key under a test prefix (BullMQ's included). */
export async function removePrefix (prefix: string, url = REDIS_URL): Promise<void> {
  const redis = new Redis(url, { maxRetriesPerRequest: 3 })
  try {
    let cursor = '0'
    do {
      const [next, keys] = await redis.scan(cursor, 'MATCH', `${prefix}:*`, 'COUNT', 1000)
      cursor = next
      if (keys.length > 0) await redis.unlink(...keys)
    } while (cursor !== '0')
  } finally {
    redis.disconnect()
  }
}

export function quietLogger (): Logger {
  return pino({ level: process.env.MEMSWEEP_TEST_LOG ?? 'silent' })
}

/** A capacity-curve fragment of a model place-cell network holding room codes: one short chunk per load. */
export function roomCodesSpec (overrides: Record<string, unknown> = {}): NormalisedSpec {
  return normaliseSpec({ label: 'room codes', neurons: 120, load: { values: [0.05, 0.1, 0.15] }, trials: 30, seed: 7, ...overrides })
}

/** Six loads of a corridor map, each a chunk of a few hundred milliseconds: enough to share between workers. */
export function corridorSpec (overrides: Record<string, unknown> = {}): NormalisedSpec {
  return normaliseSpec({
    label: 'corridor recall',
    neurons: 300,
    load: { values: [0.06, 0.08, 0.1, 0.12, 0.14, 0.16] },
    trials: 200,
    seed: 2024,
    ...overrides
  })
}

/** The same sweep computed in this process, chunk by chunk, with no queue at all. */
export function computeInProcess (spec: NormalisedSpec): SweepResult {
  const chunks = planSweep(spec).chunks.map(chunk => computeChunk(spec, chunk))
  return assembleResult(spec, chunks, makeProvenance(spec, runtimeFacts(), { wallSeconds: 0, cpuSeconds: 0 }))
}

/** A succeeded sweep's result with its trial records attached (stores keep them in the chunks). */
export async function fullResult (queue: SweepQueue, id: string): Promise<SweepResult> {
  const result = await queue.results(id)
  if (result === null) throw new Error(`sweep ${id} has no result`)
  return { ...result, trials: await queue.trials(id) ?? [] }
}

/**
 * The result's bytes, per-trial records included, with the run's timing zeroed: timing
 * describes the run, everything else must be bit-identical however the sweep was computed.
 */
export function resultBytes (result: SweepResult): string {
  const { wallSeconds: _wall, cpuSeconds: _cpu, workers: _workers, ...provenance } = result.provenance
  const normalised = { ...result, provenance: { ...provenance, wallSeconds: 0, cpuSeconds: 0 } }
  return resultToJson(normalised, { perTrial: true }) + resultToCsv(result, { perTrial: false }) + resultToCsv(result, { perTrial: true })
}

/** Resolves with the first record (the current one included) that satisfies `predicate`. */
export function waitForRecord (queue: SweepQueue, id: string, predicate: (record: SweepRecord) => boolean, timeoutMs = 60_000): Promise<SweepRecord> {
  return new Promise((resolve, reject) => {
    let settled = false
    // What the wait saw, for the message if it times out: a missed event and a stuck sweep read differently.
    let events = 0
    let lastSeen: SweepRecord | null = null
    const timer = setTimeout(() => {
      if (settled) return
      settled = true
      unsubscribe()
      const seen = lastSeen === null ? 'nothing' : `${lastSeen.status} ${JSON.stringify(lastSeen.progress)}`
      queue.get(id).then(
        (now) => `${now?.status ?? 'gone'} ${JSON.stringify(now?.progress ?? null)} ${JSON.stringify(now?.error ?? null)}`,
        (error: unknown) => `unreadable (${String(error)})`
      ).then((stored) => reject(new Error(`sweep ${id}: condition not met within ${timeoutMs} ms; ${events} event(s), last seen ${seen}; stored now ${stored}`)))
    }, timeoutMs)
    const finish = (record: SweepRecord): void => {
      lastSeen = record
      if (settled || !predicate(record)) return
      settled = true
      clearTimeout(timer)
      unsubscribe()
      resolve(record)
    }
    const unsubscribe = queue.subscribe(id, (event: SweepEvent) => { events++; finish(event.sweep) })
    queue.get(id).then(record => {
      if (record === null) throw new Error(`no sweep ${id}`)
      finish(record)
    }).catch((error: unknown) => {
      settled = true
      clearTimeout(timer)
      unsubscribe()
      reject(error instanceof Error ? error : new Error(String(error)))
    })
  })
}

export function waitForTerminal (queue: SweepQueue, id: string, timeoutMs?: number): Promise<SweepRecord> {
  return waitForRecord(queue, id, record => TERMINAL_STATUSES.has(record.status), timeoutMs)
}
