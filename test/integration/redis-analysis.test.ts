/**
 * A threshold search through the Redis backend and a real worker: search chunks travel as
 * BullMQ jobs and their payloads are stored in Redis, yet the result is byte-identical to an
 * in-process run, and progress lands exactly on the search budget.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import type { SweepQueue } from '../../src/backends/port.js'
import { createRedisQueue } from '../../src/backends/redis/index.js'
import { normaliseSpec } from '../../src/spec/index.js'
import { startWorker } from '../../src/backends/redis/worker/worker.js'
import { computeInProcess, quietLogger, REDIS_URL, redisAvailable, removePrefix, resultBytes, testPrefix, waitForTerminal } from './helpers.js'

const available = await redisAvailable()

describe.runIf(available)('Redis backend: threshold searches', () => {
  const logger = quietLogger()
  let prefix: string
  let queue: SweepQueue
  const closers: Array<() => Promise<void>> = []

  beforeEach(async () => {
    prefix = testPrefix()
    queue = await createRedisQueue({ url: REDIS_URL, prefix, logger })
    closers.push(() => queue.close())
  })

  afterEach(async () => {
    for (const close of closers.splice(0).reverse()) await close()
    await removePrefix(prefix)
  })

  it('runs three load searches with a scaling fit to the same bytes as an in-process run', async () => {
    const spec = normaliseSpec({
      label: 'searches over Redis',
      seed: 21,
      neurons: { values: [80, 120, 160] },
      cue: { kind: 'flip', fraction: 0 },
      dynamics: { maxSweeps: 40 },
      trials: 40,
      analysis: { kind: 'threshold', parameter: 'load', from: 0.05, to: 0.4, maxSteps: 8, scaling: { form: 'power', exponent: 0.5 } }
    })
    const submitted = await queue.submit({ spec, owner: null })
    expect(submitted.progress).toMatchObject({ pointsTotal: 3, trialsTotal: 3 * 8 * 40, chunksTotal: 3 })
    const started = await startWorker({ url: REDIS_URL, prefix, logger, concurrency: 2 })
    closers.push(() => started.close())
    const done = await waitForTerminal(queue, submitted.id)
    expect(done.status).toBe('succeeded')
    expect(done.progress).toEqual({ pointsDone: 3, pointsTotal: 3, trialsDone: 960, trialsTotal: 960, chunksDone: 3, chunksTotal: 3 })
    const result = await queue.results(submitted.id)
    expect(result!.searches).toHaveLength(3)
    expect(result!.scaling).toHaveLength(1)
    expect(resultBytes(result!)).toBe(resultBytes(computeInProcess(spec)))
  })
})
