/**
 * `memsweep run <spec.json> -o results.csv`: runs a sweep on this machine, no server. With
 * one thread the chunks run in this process; with more, the embedded backend runs them on
 * worker threads (its database lives in a temporary directory, removed afterwards). Both
 * give byte-identical results.
 */
import { mkdtemp, rm } from 'node:fs/promises'
import { availableParallelism, tmpdir } from 'node:os'
import { join } from 'node:path'
import { setImmediate as yieldToEventLoop } from 'node:timers/promises'
import { TERMINAL_STATUSES, type SweepRecord } from '../../backends/port.js'
import {
  assembleResult, estimateWork, makeProvenance, normaliseSpec, planChunks, resultToCsv, resultToJson, runChunk,
  SpecValidationError, type ChunkResult, type NormalisedSpec, type SweepResult
} from '../../spec/index.js'
import { CliError, EXIT, say, type CliIo } from '../io.js'
import { createProgressReporter, type ProgressReporter } from '../progress.js'
import { outputFormat, readSpecFile } from '../spec-file.js'
import { writeFileAtomically } from '../write-file.js'
import { compileKernelsOptimised } from '../../runtime/kernel-compilation.js'
import { explicitCollector } from '../../runtime/reclaim.js'

export interface RunLocalOptions {
  output: string
  format?: string
  trials?: boolean
  threads?: number
  signal?: AbortSignal
}

export function describeSpecProblems (error: SpecValidationError): string {
  return ['The spec is invalid:', ...error.issues.map((i) => `  ${i.path === '' ? '(spec)' : i.path}: ${i.message}`)].join('\n')
}

export async function runLocal (io: CliIo, specPath: string, options: RunLocalOptions): Promise<number> {
  const format = outputFormat(options.output, options.format)
  const threads = options.threads ?? availableParallelism()
  if (!Number.isInteger(threads) || threads < 1) throw new CliError(`--threads must be a positive integer, not ${String(options.threads)}.`, EXIT.refused)
  let spec: NormalisedSpec
  try {
    spec = normaliseSpec(await readSpecFile(specPath))
  } catch (error) {
    if (error instanceof SpecValidationError) throw new CliError(describeSpecProblems(error), EXIT.refused)
    throw error
  }
  const work = estimateWork(spec)
  say(io, `${work.points} grid point(s) × ${work.trialsPerPoint} trials = ${work.trials} trials; about ${formatSeconds(work.cpuSeconds)} of CPU, ${formatBytes(work.peakBytes)} per thread; ${threads} thread(s).`)
  const progress = createProgressReporter(io, spec.label ?? 'sweep')
  let result: SweepResult
  try {
    result = threads === 1 ? await runInProcess(spec, progress, options.signal) : await runOnThreads(spec, threads, progress, options.signal)
  } finally {
    progress.stop()
  }
  const perTrial = options.trials === true
  await writeFileAtomically(options.output, format === 'csv' ? resultToCsv(result, { perTrial }) : resultToJson(result, { perTrial }))
  say(io, `Results written to ${options.output}.`)
  return EXIT.ok
}

async function runInProcess (spec: NormalisedSpec, progress: ProgressReporter, signal: AbortSignal | undefined): Promise<SweepResult> {
  compileKernelsOptimised()
  const chunks = planChunks(spec)
  const perPoint = new Map<number, number>()
  const pointsTotal = new Set(chunks.map((c) => c.point)).size
  const trialsTotal = chunks.reduce((sum, c) => sum + c.count, 0)
  let trialsDone = 0
  let pointsDone = 0
  const started = performance.now()
  const cpuStart = process.cpuUsage()
  const results: ChunkResult[] = []
  progress.update({ trialsDone, trialsTotal, pointsDone, pointsTotal })
  for (const chunk of chunks) {
    if (signal?.aborted === true) throw new CliError('Interrupted.', EXIT.sweepFailed)
    results.push(runChunk(spec, chunk, { shouldStop: () => signal?.aborted === true, reclaim: explicitCollector() }))
    trialsDone += chunk.count
    const pointTrials = (perPoint.get(chunk.point) ?? 0) + chunk.count
    perPoint.set(chunk.point, pointTrials)
    if (pointTrials === spec.trials) pointsDone++
    const elapsed = (performance.now() - started) / 1000
    progress.update({ trialsDone, trialsTotal, pointsDone, pointsTotal, estimatedSecondsLeft: elapsed * (trialsTotal - trialsDone) / trialsDone })
    // Lets the progress bar redraw and Ctrl-C land between chunks.
    await yieldToEventLoop()
  }
  const cpu = process.cpuUsage(cpuStart)
  return assembleResult(spec, results, makeProvenance(spec, {
    wallSeconds: (performance.now() - started) / 1000,
    cpuSeconds: (cpu.user + cpu.system) / 1e6,
    workers: 1
  }))
}

async function runOnThreads (spec: NormalisedSpec, threads: number, progress: ProgressReporter, signal: AbortSignal | undefined): Promise<SweepResult> {
  const { createEmbeddedQueue } = await import('../../backends/embedded/index.js')
  const dataDir = await mkdtemp(join(tmpdir(), 'memsweep-run-'))
  const queue = await createEmbeddedQueue({ dataDir, threads })
  try {
    const submitted = await queue.submit({ spec, owner: null })
    const final = await new Promise<SweepRecord>((resolve) => {
      let unsubscribe = (): void => {}
      const show = (record: SweepRecord): void => {
        const started = record.startedAt === null ? null : Date.parse(record.startedAt)
        const elapsed = started === null ? 0 : (Date.now() - started) / 1000
        const p = record.progress
        progress.update({ ...p, estimatedSecondsLeft: p.trialsDone > 0 ? elapsed * (p.trialsTotal - p.trialsDone) / p.trialsDone : null })
        if (TERMINAL_STATUSES.has(record.status)) { unsubscribe(); resolve(record) }
      }
      unsubscribe = queue.subscribe(submitted.id, (event) => show(event.sweep))
      signal?.addEventListener('abort', () => { queue.cancel(submitted.id).catch(() => undefined) }, { once: true })
      queue.get(submitted.id).then((record) => { if (record !== null) show(record) }, () => undefined)
    })
    if (final.status === 'canceled') throw new CliError('Interrupted.', EXIT.sweepFailed)
    if (final.status === 'failed') throw new CliError(`The sweep failed (${final.error?.kind ?? 'unknown'} error): ${final.error?.message ?? ''}`, EXIT.sweepFailed)
    const result = await queue.results(submitted.id)
    if (result === null) throw new Error('The sweep succeeded but left no result.')
    return result
  } finally {
    await queue.close()
    await rm(dataDir, { recursive: true, force: true })
  }
}

function formatSeconds (seconds: number): string {
  if (seconds < 0.1) return 'under 0.1 s'
  if (seconds < 120) return `${seconds.toFixed(1)} s`
  return `${(seconds / 60).toFixed(1)} min`
}

function formatBytes (bytes: number): string {
  if (bytes < 1024 * 1024) return `${Math.max(1, Math.ceil(bytes / 1024))} KiB`
  return `${(bytes / 1048576).toFixed(1)} MiB`
}
