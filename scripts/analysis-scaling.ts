/**
 * `npm run analysis:scaling [-- --sizes 250,500,1000,2000,4000 --trials 400 --seed 1]`:
 * the finite-size scaling of the Hebbian capacity, run on this machine's cores through the
 * embedded backend (temporary database, removed afterwards). Runs
 * examples/room-capacity-scaling.json (or --spec FILE) with the sizes, trials and seed given,
 * prints every search and the scaling fit of the spec, then refits the same searches with
 * the other forms (fitted exponent, b = 1/2, 1/N) so the dependence of x_∞ on the assumed
 * form is in plain view. Too slow for the test suite (about 10–20 s at N ≤ 2000 on 2 cores,
 * a minute more with N = 4000); test/spec/analysis-science.test.ts runs a cheaper version.
 */
import { mkdtemp, readFile, rm } from 'node:fs/promises'
import { availableParallelism, tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { Command } from 'commander'
import { createEmbeddedQueue } from '../src/backends/embedded/index.js'
import { TERMINAL_STATUSES, type SweepRecord } from '../src/backends/port.js'
import { scalingRows } from '../src/sweep/analysis/scaling.js'
import { normaliseSpec, type NormalisedScaling, type ScalingRow } from '../src/spec/index.js'

const program = new Command()
  .option('--spec <file>', 'spec to run', fileURLToPath(new URL('../examples/room-capacity-scaling.json', import.meta.url)))
  .option('--sizes <list>', 'network sizes, comma separated (default: the spec\'s)')
  .option('--trials <n>', 'trials per step (default: the spec\'s)')
  .option('--seed <n>', 'master seed (default: the spec\'s)')
  .option('--threads <n>', 'compute threads', String(availableParallelism()))
  .parse()
const options = program.opts<{ spec: string, sizes?: string, trials?: string, seed?: string, threads: string }>()

const input = JSON.parse(await readFile(options.spec, 'utf8')) as Record<string, unknown>
if (options.sizes !== undefined) input.neurons = { values: options.sizes.split(',').map(Number) }
if (options.trials !== undefined) input.trials = Number(options.trials)
if (options.seed !== undefined) input.seed = Number(options.seed)
const spec = normaliseSpec(input)
const analysis = spec.analysis
if (analysis === undefined || analysis.scaling === null) throw new Error('the spec needs an analysis with a scaling fit')

const dataDir = await mkdtemp(join(tmpdir(), 'memsweep-scaling-'))
const queue = await createEmbeddedQueue({ dataDir, threads: Number(options.threads) })
const started = Date.now()
try {
  const submitted = await queue.submit({ spec, owner: null })
  const finished = await new Promise<SweepRecord>((resolve) => {
    const check = (record: SweepRecord | null) => { if (record !== null && TERMINAL_STATUSES.has(record.status)) resolve(record) }
    queue.subscribe(submitted.id, (event) => check(event.sweep))
    queue.get(submitted.id).then(check, () => {})
  })
  if (finished.status !== 'succeeded') throw new Error(`the sweep ended ${finished.status}: ${finished.error?.message ?? ''}`)
  const result = await queue.results(submitted.id)
  const seconds = (Date.now() - started) / 1000
  console.log(`${spec.label ?? ''}\nseed ${spec.seed}, ${spec.trials} trials per step, ${options.threads} thread(s), ${seconds.toFixed(1)} s wall\n`)
  console.log('N      estimate   95 % interval          steps  stopped by')
  for (const s of result!.searches!) {
    console.log(`${String(s.neurons).padEnd(6)} ${fmt(s.estimate)}   [${fmt(s.low)}, ${fmt(s.high)}]   ${String(s.stepsUsed).padStart(5)}  ${s.stoppedBy}`)
  }
  const forms: Array<[string, NormalisedScaling]> = [
    ['power, exponent fitted', { form: 'power', exponent: null }],
    ['power, exponent 1/2', { form: 'power', exponent: 0.5 }],
    ['linear in 1/N', { form: 'linear-inverse' }]
  ]
  for (const [name, scaling] of forms) {
    const enough = result!.searches!.length >= (scaling.form === 'power' && scaling.exponent === null ? 4 : 3)
    if (!enough) continue
    for (const row of scalingRows(spec, { ...analysis, scaling }, result!.searches!)) printFit(name, row)
  }
} finally {
  await queue.close()
  await rm(dataDir, { recursive: true, force: true })
}

function fmt (x: number | null | undefined, digits = 4): string {
  return x === null || x === undefined ? '  —   ' : x.toFixed(digits)
}

function printFit (name: string, row: ScalingRow): void {
  console.log(`\n${name}${Object.keys(row.values).length > 0 ? ` at ${JSON.stringify(row.values)}` : ''}:`)
  const fit = row.fit
  if (fit === null) { console.log(`  no fit: ${row.note ?? ''}`); return }
  console.log(`  x_∞ = ${fmt(fit.limit.value)} ± ${fmt(fit.limit.se)}  (95 %: [${fmt(fit.limitInterval.low)}, ${fmt(fit.limitInterval.high)}])`)
  console.log(`  a = ${fmt(fit.amplitude.value, 3)} ± ${fmt(fit.amplitude.se, 3)}, b = ${fmt(fit.exponent.value, 3)}${fit.exponent.se === null ? ' (fixed)' : ` ± ${fmt(fit.exponent.se, 3)}`}`)
  console.log(`  χ² = ${fit.chiSquare.toFixed(2)} on ${fit.degreesOfFreedom} dof, error scale ${fit.errorScale.toFixed(2)}`)
  for (const ref of row.references) {
    console.log(`  vs ${ref.value.toFixed(4)}${ref.uncertainty === null ? '' : ` ± ${ref.uncertainty}`} (${ref.source}): ${ref.deviation === null ? '—' : ref.deviation.toFixed(2)} combined SE`)
  }
}
