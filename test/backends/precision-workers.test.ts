/**
 * Precision targets decide on the data alone: the same spec gives the same rows, trial for
 * trial, with 1, 2 or 4 compute threads (embedded) or worker slots (Redis), and on either
 * backend. Points far below and beyond capacity take different numbers of blocks, so the
 * decisions are really exercised.
 */
import { afterAll, describe, expect, it } from 'vitest'
import { createEmbeddedQueue } from '../../src/backends/embedded/index.js'
import { createRedisQueue } from '../../src/backends/redis/index.js'
import { startWorker } from '../../src/backends/redis/worker/worker.js'
import type { SweepQueue } from '../../src/backends/port.js'
import { normaliseSpec } from '../../src/spec/index.js'
import { makeDataDir } from './embedded/helpers.js'
import { fullResult, quietLogger, REDIS_URL, redisAvailable, removePrefix, resultBytes, testPrefix, waitForTerminal } from '../integration/helpers.js'

/** Room codes in a model place-cell network at three loads; blocks of 30 up to 150 trials. */
const spec = normaliseSpec({
  label: 'room codes to a set precision',
  neurons: 100,
  load: { values: [0.03, 0.12, 0.2] },
  trials: 150,
  precision: { measure: 'success', halfWidth: 0.07, block: 30 },
  seed: 2024
})

const available = await redisAvailable()
const outputs = new Map<string, string>()
const cleanups: Array<() => Promise<void>> = []
afterAll(async () => { for (const cleanup of cleanups) await cleanup() })

async function runOn (queue: SweepQueue): Promise<string> {
  const submitted = await queue.submit({ spec, owner: null, reuse: false, reusePoints: false })
  const done = await waitForTerminal(queue, submitted.id, 120_000)
  expect(done.status).toBe('succeeded')
  const result = await fullResult(queue, submitted.id)
  // The blocks a point took depend on its data: all at the first block would test nothing.
  const trials = result.rows.map((row) => row.summary.trials)
  expect(new Set(trials).size).toBeGreaterThan(1)
  expect(result.rows.every((row) => row.precision !== undefined && (row.precision.met || row.summary.trials === spec.trials))).toBe(true)
  expect(done.progress.trialsTotal).toBe(trials.reduce((a, b) => a + b, 0))
  return resultBytes(result)
}

describe('precision targets give the same rows whatever the parallelism', () => {
  for (const threads of [1, 2, 4]) {
    it(`embedded, ${threads} compute thread(s)`, async () => {
      const data = makeDataDir()
      const queue = await createEmbeddedQueue({ dataDir: data.dir, threads })
      cleanups.push(async () => { await queue.close(); data.remove() })
      outputs.set(`embedded-${threads}`, await runOn(queue))
    })
  }

  describe.runIf(available)('Redis', () => {
    for (const [workers, slots] of [[1, 1], [1, 2], [2, 2]] as const) {
      it(`${workers} worker(s) × ${slots} slot(s)`, async () => {
        const logger = quietLogger()
        const prefix = testPrefix()
        const queue = await createRedisQueue({ url: REDIS_URL, prefix, logger })
        const started = await Promise.all(Array.from({ length: workers }, async () => await startWorker({ url: REDIS_URL, prefix, logger, concurrency: slots })))
        cleanups.push(async () => {
          await queue.close()
          for (const worker of started) await worker.close()
          await removePrefix(prefix)
        })
        outputs.set(`redis-${workers * slots}`, await runOn(queue))
      })
    }
  })

  it('every run gave the same bytes', () => {
    const values = [...outputs.values()]
    expect(values.length).toBeGreaterThanOrEqual(3)
    for (const value of values) expect(value).toBe(values[0])
  })
})
