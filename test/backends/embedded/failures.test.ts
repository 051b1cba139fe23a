import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { SweepQueue } from '../../../src/backends/port.js'
import { classifyChunkError } from '../../../src/sweep/failure.js'
import { workerEntryFor } from '../../../src/runtime/worker-entry.js'
import { EngineInputError } from '../../../src/engine/index.js'
import { SpecValidationError, WorkLimitError } from '../../../src/spec/index.js'
import { ChunkCanceledError, IncompleteResultError } from '../../../src/sweep/index.js'
import { makeDataDir, openQueue, roomCodesSpec, waitForTerminal } from './helpers.js'

describe('chunk error classification', () => {
  it('blames the user for errors the spec caused and the system for everything else', () => {
    expect(classifyChunkError(new EngineInputError('neurons', -3, 'must be positive.')).kind).toBe('user')
    expect(classifyChunkError(new SpecValidationError([{ path: 'trials', message: 'too many' }])).kind).toBe('user')
    expect(classifyChunkError(new WorkLimitError('maxNeurons', 10, 5)).kind).toBe('user')
    expect(classifyChunkError(new RangeError('Invalid array length')).kind).toBe('user')
    expect(classifyChunkError(new TypeError('invalid argument. coding: unknown value.')).kind).toBe('user')
    expect(classifyChunkError(new TypeError("Cannot read properties of undefined (reading 'x')")).kind).toBe('system')
    expect(classifyChunkError(new IncompleteResultError(['trial 3 missing'])).kind).toBe('system')
    expect(classifyChunkError(new Error('SQLITE_FULL')).kind).toBe('system')
    expect(classifyChunkError('a string').kind).toBe('system')
    expect(classifyChunkError(new ChunkCanceledError(2, 5)).kind).toBe('canceled')
  })

  it('keeps only the first line of a message, never a stack', () => {
    const error = new Error('first line\n    at somewhere (/srv/app.js:1:1)')
    expect(classifyChunkError(error).message).toBe('first line')
  })
})

// Each fault gets its own seed: a sweep with another's parameters and seed would take its trials instead of computing them.
describe('embedded queue: failures inside chunks', () => {
  const data = makeDataDir()
  let queue: SweepQueue

  beforeAll(async () => {
    queue = await openQueue(data.dir, {
      threads: 1,
      tuning: { maxAttempts: 3 },
      workerEntry: workerEntryFor(new URL('./fixtures/faulty-chunk-worker.ts', import.meta.url))
    })
  })
  afterAll(async () => {
    await queue.close()
    data.remove()
  })

  it('fails the sweep as the user\'s error, with the engine\'s message, without retrying', async () => {
    const sweep = await queue.submit({ spec: roomCodesSpec({ label: 'fault:user', seed: 41 }), owner: null })
    const failed = await waitForTerminal(queue, sweep.id)
    expect(failed.status).toBe('failed')
    expect(failed.error?.kind).toBe('user')
    expect(failed.error?.message).toMatch(/^invalid argument\. cue\.fraction: must lie in \[0, 1\]\. Value: 1\.5\.$/)
    expect(await queue.results(sweep.id)).toBeNull()
  })

  it('retries a chunk whose thread died once, and succeeds', async () => {
    const sweep = await queue.submit({ spec: roomCodesSpec({ label: 'fault:crash-once', seed: 42 }), owner: null })
    const finished = await waitForTerminal(queue, sweep.id)
    expect(finished.status).toBe('succeeded')
    expect(finished.progress.trialsDone).toBe(finished.progress.trialsTotal)
  })

  it('fails as the system\'s error after three thread deaths, saying so without internals', async () => {
    const sweep = await queue.submit({ spec: roomCodesSpec({ label: 'fault:crash-always', seed: 43 }), owner: null })
    const failed = await waitForTerminal(queue, sweep.id)
    expect(failed.status).toBe('failed')
    expect(failed.error?.kind).toBe('system')
    expect(failed.error?.message).toMatch(/^Chunk 1 of 3 failed 3 times .*compute thread stopped unexpectedly/)
    expect(failed.error?.message).not.toMatch(/exited|code|\n/)
  })

  it('treats a programming error as the system\'s, and hides its text and stack', async () => {
    const sweep = await queue.submit({ spec: roomCodesSpec({ label: 'fault:internal', seed: 44 }), owner: null })
    const failed = await waitForTerminal(queue, sweep.id)
    expect(failed.error?.kind).toBe('system')
    expect(failed.error?.message).toMatch(/an internal error/)
    expect(failed.error?.message).not.toMatch(/couplings|secretInternals|\/srv/)
  })

  it('keeps serving other sweeps after all that', async () => {
    const sweep = await queue.submit({ spec: roomCodesSpec({ seed: 8 }), owner: null })
    expect((await waitForTerminal(queue, sweep.id)).status).toBe('succeeded')
    expect(await queue.stats()).toMatchObject({ failed: 3, succeeded: 2, chunksActive: 0 })
  })
})
