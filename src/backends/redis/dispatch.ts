/**
 * Puts a stored queued or running sweep's remaining work on the queue, from what is stored:
 * a job for every planned chunk not yet stored, a decision for every open point whose planned
 * chunks are all stored, and the assembly when nothing is left. Used on submission, on
 * resume and by the workers' repair of sweeps whose API instance died mid-submit. Job ids are
 * deterministic, so putting the same work on the queue twice adds nothing.
 */
import type { NormalisedSpec } from '../../spec/index.js'
import { trialsEnd } from '../../sweep/index.js'
import type { ChunkQueue } from './chunk-queue.js'
import type { RedisSweepStore } from './store.js'

export async function enqueueRemaining (store: RedisSweepStore, chunks: ChunkQueue, id: string, specHash: string, spec: NormalisedSpec): Promise<void> {
  const plan = await store.plan(id)
  if (plan === null) throw new Error(`Sweep ${id} has no stored plan.`)
  const done = new Set(await store.doneChunks(id))
  const open = await store.openPoints(id)
  const pending = plan.chunks.filter((chunk) => !done.has(chunk.index))
  const total = plan.chunks.length
  const run = await store.dispatchRun(id)
  if (pending.length > 0) await chunks.enqueueChunks(id, specHash, spec, pending, total, run)
  for (const point of open) {
    const planned = plan.chunks.filter((chunk) => chunk.point === point)
    if (planned.every((chunk) => done.has(chunk.index))) {
      await chunks.enqueueDecision(id, specHash, point, trialsEnd(planned), total, run)
    }
  }
  if (pending.length === 0 && open.length === 0) await chunks.enqueueAssembly(id, specHash, total, run)
  await store.markEnqueued(id)
}
