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
import { countPoints, estimateWork, normaliseSpec, SpecValidationError, type NormalisedSpec } from '../../spec/index.js'
import {
  assembleStored, decidePoint, makeProvenance, planSweep, pointRecords, progressCounters, runChunk, storedTrials, systemCauseOf, systemFailure,
  userFailure, type Chunk, type StoredChunk
} from '../../sweep/index.js'
import { runtimeFacts } from '../../runtime/facts.js'
import { RESULT_SERIES, resultToCsv, resultToJson, trajectoryCsv, trajectoryJson, trajectoryUnavailable, type SweepResult } from '../../results/index.js'
import { CliError, EXIT, say, type CliIo } from '../io.js'
import { createProgressReporter, type ProgressReporter } from '../progress.js'
import { outputFormat, readSpecFile } from '../spec-file.js'
import { writeFileAtomically } from '../write-file.js'
import { compileEngineEagerly } from '../../runtime/engine-compilation.js'
import { explicitCollector } from '../../runtime/reclaim.js'

export interface RunLocalOptions {
  output: string
  format?: string
  trials?: boolean
  /** Write this series (`trajectory`) instead of the rows. */
  series?: string
  threads?: number
  signal?: AbortSignal
}

export function describeSpecProblems (error: SpecValidationError): string {
  return ['The spec is invalid:', ...error.issues.map((i) => `  ${i.path === '' ? '(spec)' : i.path}: ${i.message}`)].join('\n')
}

export async function runLocal (io: CliIo, specPath: string, options: RunLocalOptions): Promise<number> {
  const format = outputFormat(options.output, options.format)
  const series = checkSeries(options.series, options.trials)
  const threads = options.threads ?? availableParallelism()
  if (!Number.isInteger(threads) || threads < 1) throw new CliError(`--threads must be a positive integer, not ${String(options.threads)}.`, EXIT.refused)
  let spec: NormalisedSpec
  try {
    spec = normaliseSpec(await readSpecFile(specPath))
  } catch (error) {
    if (error instanceof SpecValidationError) throw new CliError(describeSpecProblems(error), EXIT.refused)
    throw error
  }
  const missing = series === null ? null : trajectoryUnavailable(spec)
  if (missing !== null) throw new CliError(`No trajectory series: ${missing}.`, EXIT.refused)
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
  await writeFileAtomically(options.output, series !== null ? seriesText(result, format) : format === 'csv' ? resultToCsv(result, { perTrial }) : resultToJson(result, { perTrial }))
  say(io, `Results written to ${options.output}.`)
  return EXIT.ok
}

async function runInProcess (spec: NormalisedSpec, progress: ProgressReporter, signal: AbortSignal | undefined): Promise<SweepResult> {
  compileEngineEagerly()
  // With precision targets the plan grows: a point whose blocks are all run is decided on,
  // exactly as the backends do, and either closed or given its next block.
  const plan = { chunks: [...planSweep(spec).chunks] as Chunk[] }
  const open = new Set(spec.precision === undefined ? [] : Array.from({ length: countPoints(spec) }, (_, point) => point))
  const stored: StoredChunk[] = []
  const done = new Set<number>()
  const started = performance.now()
  const cpuStart = process.cpuUsage()
  const show = (partial: ReadonlyMap<number, number> = new Map()): void => {
    const counters = progressCounters(plan.chunks, done, partial)
    const elapsed = (performance.now() - started) / 1000
    const left = counters.trialsDone > 0 ? elapsed * (counters.trialsTotal - counters.trialsDone) / counters.trialsDone : null
    progress.update({ ...counters, estimatedSecondsLeft: left })
  }
  show()
  for (let next = 0; next < plan.chunks.length; next++) {
    const chunk = plan.chunks[next]!
    const outcome = runChunk(spec, chunk, {
      shouldStop: () => signal?.aborted === true,
      onProgress: (trialsDone) => show(new Map([[chunk.index, trialsDone]])),
      reclaim: explicitCollector()
    })
    if (outcome.kind === 'stopped') throw new CliError('Interrupted.', EXIT.sweepFailed)
    if (outcome.kind === 'failed') {
      const failure = outcome.error.kind === 'user' ? userFailure(outcome.error.message) : systemFailure({ chunkIndex: chunk.index, chunksTotal: plan.chunks.length }, 1, systemCauseOf(outcome.error.name))
      throw new CliError(`The sweep failed (${failure.kind} error): ${failure.message}`, EXIT.sweepFailed)
    }
    stored.push({ index: chunk.index, body: outcome.body })
    done.add(chunk.index)
    const planned = plan.chunks.filter((c) => c.point === chunk.point)
    if (open.has(chunk.point) && planned.every((c) => done.has(c.index))) {
      const decision = decidePoint(spec, chunk.point, pointRecords(spec, planned, stored, chunk.point))
      if (decision.kind === 'close') open.delete(chunk.point)
      else for (const piece of decision.pieces) plan.chunks.push({ index: plan.chunks.length, point: chunk.point, ...piece })
    }
    show()
    // Lets the progress bar redraw and Ctrl-C land between chunks.
    await yieldToEventLoop()
  }
  const cpu = process.cpuUsage(cpuStart)
  const provenance = makeProvenance(spec, runtimeFacts(), {
    wallSeconds: (performance.now() - started) / 1000,
    cpuSeconds: (cpu.user + cpu.system) / 1e6,
    workers: 1
  })
  const result = assembleStored(spec, plan.chunks, stored, provenance)
  return { ...result, trials: spec.analysis === undefined ? storedTrials(spec, plan.chunks, stored) : [] }
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
    return { ...result, trials: await queue.trials(submitted.id) ?? [] }
  } finally {
    await queue.close()
    await rm(dataDir, { recursive: true, force: true })
  }
}

/** The --series option, checked before any work: a known series, and not with --trials. */
export function checkSeries (series: string | undefined, trials: boolean | undefined): 'trajectory' | null {
  if (series === undefined) return null
  if (!(RESULT_SERIES as readonly string[]).includes(series)) throw new CliError(`--series must be one of ${RESULT_SERIES.join(', ')}, not ${series}.`, EXIT.refused)
  if (trials === true) throw new CliError('--series replaces the rows, so it cannot be combined with --trials.', EXIT.refused)
  return 'trajectory'
}

function seriesText (result: SweepResult, format: 'csv' | 'json'): string {
  return format === 'csv' ? trajectoryCsv(result) : trajectoryJson(result)
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
