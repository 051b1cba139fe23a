/**
 * The module a compute thread loads: runs one chunk of trials or assembles a finished
 * sweep. It never throws for a failure it can explain: the failure is classified here,
 * where the error's class is still known (a structured clone would keep only its message),
 * and returned as a value. A throw or an exit from this thread therefore always means the
 * thread itself broke.
 */
import { threadId } from 'node:worker_threads'
import { performance } from 'node:perf_hooks'
import { assembleResult, runChunk } from '../../spec/index.js'
import type { ChunkResult } from '../../spec/index.js'
import type { AssembleTask, ChunkTask, ChunkTaskOutcome, RunChunkTask } from './chunk-task.js'
import { classifyChunkError } from './failure.js'
import { decodeValue, encodeValue, CODEC_NAME } from './trial-codec.js'
import { compileKernelsOptimised } from '../../runtime/kernel-compilation.js'
import { explicitCollector } from '../../runtime/reclaim.js'

compileKernelsOptimised()

export default function handleChunkTask (task: ChunkTask): ChunkTaskOutcome {
  switch (task.kind) {
    case 'ping': return { kind: 'pong', threadId }
    case 'run': return runOneChunk(task)
    case 'assemble': return assembleSweep(task)
  }
}

function runOneChunk (task: RunChunkTask): ChunkTaskOutcome {
  const stop = new Int32Array(task.stopFlag)
  const started = performance.now()
  let lastReport = started
  try {
    if (Atomics.load(stop, 0) !== 0) return { kind: 'stopped' }
    const result = runChunk(task.spec, task.chunk, {
      reclaim: explicitCollector(),
      shouldStop: () => Atomics.load(stop, 0) !== 0,
      onTrial: trialsDone => {
        const now = performance.now()
        if (now - lastReport >= task.progressIntervalMs) {
          lastReport = now
          task.progressPort.postMessage({ trialsDone })
        }
      }
    })
    // Credit the planned count: a grid chunk ran exactly that many trials, a search chunk's count is its budget (progress reaches 100 % when it ends).
    return { kind: 'chunk-done', body: encodeValue(result), trials: task.chunk.count, computeMs: performance.now() - started }
  } catch (error) {
    const classified = classifyChunkError(error)
    return classified.kind === 'canceled' ? { kind: 'stopped' } : { kind: 'failed', error: classified }
  } finally {
    task.progressPort.close()
  }
}

function assembleSweep (task: AssembleTask): ChunkTaskOutcome {
  try {
    const chunkResults = task.chunks.map(body => decodeValue<ChunkResult>(CODEC_NAME, body))
    const result = assembleResult(task.spec, chunkResults, task.provenance)
    return { kind: 'assembled', body: encodeValue(result) }
  } catch (error) {
    return { kind: 'failed', error: classifyChunkError(error) }
  }
}
