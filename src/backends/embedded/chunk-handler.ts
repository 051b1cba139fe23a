/**
 * What a compute thread does with a task (loaded by chunk-worker.ts): runs one chunk
 * (through the lifecycle's one runner) or assembles a finished sweep. It never throws for a
 * failure it can explain; a throw or an exit from this thread therefore always means the
 * thread itself broke.
 */
import { threadId } from 'node:worker_threads'
import { assembleStored, classifyChunkError, decidePoint, encodeValue, makeProvenance, pointRecords, runChunk } from '../../sweep/index.js'
import type { AssembleTask, ChunkTask, ChunkTaskOutcome, DecideTask, RunChunkTask } from './chunk-task.js'
import { runtimeFacts } from '../../runtime/facts.js'
import { explicitCollector } from '../../runtime/reclaim.js'

export default function handleChunkTask (task: ChunkTask): ChunkTaskOutcome {
  switch (task.kind) {
    case 'ping': return { kind: 'pong', threadId }
    case 'run': return runOneChunk(task)
    case 'assemble': return assembleSweep(task)
    case 'decide': return decide(task)
  }
}

function decide (task: DecideTask): ChunkTaskOutcome {
  try {
    return { kind: 'decided', decision: decidePoint(task.spec, task.point, pointRecords(task.spec, task.plan, task.chunks, task.point)) }
  } catch (error) {
    return { kind: 'failed', error: classifyChunkError(error) }
  }
}

function runOneChunk (task: RunChunkTask): ChunkTaskOutcome {
  const stop = new Int32Array(task.stopFlag)
  try {
    return runChunk(task.spec, task.chunk, {
      shouldStop: () => Atomics.load(stop, 0) !== 0,
      progressIntervalMs: task.progressIntervalMs,
      onProgress: (trialsDone) => task.progressPort.postMessage({ trialsDone }),
      reclaim: explicitCollector()
    })
  } finally {
    task.progressPort.close()
  }
}

function assembleSweep (task: AssembleTask): ChunkTaskOutcome {
  try {
    const provenance = makeProvenance(task.spec, runtimeFacts(), task.timing)
    return { kind: 'assembled', body: encodeValue(assembleStored(task.spec, task.plan, task.chunks, provenance)) }
  } catch (error) {
    return { kind: 'failed', error: classifyChunkError(error) }
  }
}
