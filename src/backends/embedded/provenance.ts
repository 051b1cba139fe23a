/**
 * Provenance of a result assembled by the embedded backend: the spec layer's description
 * of the code, plus this backend's timing.
 */
import { makeProvenance, type NormalisedSpec, type Provenance } from '../../spec/index.js'

export function embeddedProvenance (spec: NormalisedSpec, timing: { startedMs: number, finishedMs: number, computeMs: number, threads: number }): Provenance {
  return makeProvenance(spec, {
    // From the first dispatch to assembly, including any time the service was down.
    wallSeconds: Math.max(0, timing.finishedMs - timing.startedMs) / 1000,
    // Busy time of the compute threads over the stored chunks: their CPU time, near enough,
    // as the work is CPU-bound (Node 20 has no per-thread CPU clock).
    cpuSeconds: timing.computeMs / 1000,
    workers: timing.threads
  })
}
