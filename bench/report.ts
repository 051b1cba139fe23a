import { median, type Run } from './measure.js'
import type { MemoryMeasurement } from './memory.js'
import type { EstimateMeasurement } from './estimate-error.js'
import type { HealthzReport } from './healthz.js'

/** Everything the report needs besides the runs. */
export interface Context {
  date: string
  cpu: string
  cores: number
  memoryGiB: number
  node: string
  v8: string
  gcc: string
  python: string
  loadBefore: string
  loadAfter: string
  reps: Record<string, number>
  notes: string[]
  seconds: number
}

const WORKLOADS: Record<string, string> = {
  W1: 'W1 recall (N=1000, P=100, 200 trials, async)',
  W2: 'W2 capacity (N=500, 12 loads × 50 trials, new patterns every trial, async)',
  W3: 'W3 big (N=4000, P=400, 20 trials, async)',
  W4: 'W4 sync (N=1000, P=100, 200 trials, synchronous)'
}

/** The time a workload is judged by: the whole curve for W2, the dynamics (sim_s) otherwise. */
export function timeOf (r: Run): number {
  return r.workload === 'W2' ? (r.total_s as number) : (r.sim_s as number)
}

interface Group { key: string, impl: string, variant: string, runs: Run[], time: number }

function groups (runs: Run[], workload: string): Group[] {
  const map = new Map<string, Run[]>()
  for (const r of runs) {
    if (r.workload !== workload) continue
    const key = `${r.label}|${r.variant}`
    map.set(key, [...(map.get(key) ?? []), r])
  }
  return [...map.entries()].map(([key, rs]) => ({ key, impl: rs[0]!.label, variant: rs[0]!.variant, runs: rs, time: median(rs.map(timeOf)) }))
}

const ms = (s: number): string => s >= 1 ? `${s.toFixed(3)} s` : `${(s * 1000).toFixed(1)} ms`
const rate = (x: number): string => x >= 1e6 ? `${(x / 1e6).toFixed(2)} M` : x >= 1e3 ? `${(x / 1e3).toFixed(1)} k` : x.toFixed(1)
const mib = (kb: number): string => Number.isFinite(kb) ? `${(kb / 1024).toFixed(1)} MiB` : '-'
const ratio = (x: number): string => Number.isFinite(x) ? `${x.toFixed(x >= 10 ? 1 : 2)}×` : '-'

function find (gs: Group[], impl: string, variant: string): Group | undefined {
  return gs.find((g) => g.impl === impl && g.variant === variant)
}

/** The incremental-field numpy peer (the sync one for W4) and, for W4, the batched one. */
function numpyRef (gs: Group[], workload: string): { inc?: Group, batch?: Group } {
  return workload === 'W4' ? { inc: find(gs, 'numpy', 'sync'), batch: find(gs, 'numpy', 'syncbatch') } : { inc: find(gs, 'numpy', 'inc') }
}

function bestC (gs: Group[]): Group | undefined {
  return gs.filter((g) => g.impl === 'c').sort((a, b) => a.time - b.time)[0]
}

function workloadTable (runs: Run[], workload: string): string[] {
  const gs = groups(runs, workload)
  const { inc, batch } = numpyRef(gs, workload)
  const c = bestC(gs)
  const incName = workload === 'W4' ? 'numpy sync' : 'numpy inc'
  const head = `| impl | variant / fast path | runs | median time | min..max | trials/s | neuron-updates/s | peak RSS (median) | × vs ${incName} |${batch !== undefined ? ' × vs numpy syncbatch |' : ''} time ÷ best C | warm in-process median (÷ best C) |`
  const lines = [`### ${WORKLOADS[workload]}`, '', head, `|${'---|'.repeat(head.split('|').length - 2)}`]
  for (const g of gs) {
    const times = g.runs.map(timeOf)
    const trials = workload === 'W2' ? 600 : (g.runs[0]!.trials as number)
    const updates = g.runs[0]!.updates as number
    const fast = typeof g.runs[0]!.fast_path === 'string' ? ` (${String(g.runs[0]!.fast_path)})` : ''
    const warmTimes = g.runs.map((r) => r.warm_s).filter((x): x is number => typeof x === 'number')
    const warm = warmTimes.length > 0 ? median(warmTimes) : Number.NaN
    const warmCell = Number.isFinite(warm) ? `${ms(warm)}${c ? ` (${ratio(warm / c.time)})` : ''}` : '-'
    lines.push(`| ${g.impl} | ${g.variant}${fast} | ${g.runs.length} | ${ms(g.time)} | ${ms(Math.min(...times))}..${ms(Math.max(...times))} | ${rate(trials / g.time)} | ${rate(updates / g.time)} | ${mib(median(g.runs.map((r) => r.maxrss_kb)))} | ${inc ? ratio(inc.time / g.time) : '-'} |${batch !== undefined ? ` ${ratio(batch.time / g.time)} |` : ''} ${c ? ratio(g.time / c.time) : '-'} | ${warmCell} |`)
  }
  return [...lines, '']
}

/**
 * W1–W4 single-thread time ÷ the best C variant's, at most: the performance issue raised it
 * from 2× to 1.0× once the engine was within 2×.
 */
const TIME_VS_C_TARGET = 1.0

function headline (runs: Run[]): string[] {
  const lines = [
    `| workload | memsweep (median) | numpy inc / sync | × numpy (target ≥ 10×) | numpy syncbatch | × batched (target ≥ 3×) | best C | ÷ best C (target ≤ ${ratio(TIME_VS_C_TARGET)}) | beats numpy inc | fastest runs: memsweep ÷ C | memsweep warm, in-process (÷ best C) |`,
    '|---|---|---|---|---|---|---|---|---|---|---|'
  ]
  for (const w of ['W1', 'W2', 'W3', 'W4']) {
    const gs = groups(runs, w)
    const ours = find(gs, 'memsweep', 'fast')
    if (ours === undefined) continue
    const { inc, batch } = numpyRef(gs, w)
    const c = bestC(gs)
    const vsInc = inc ? inc.time / ours.time : Number.NaN
    const vsBatch = batch ? batch.time / ours.time : Number.NaN
    const vsC = c ? ours.time / c.time : Number.NaN
    const mark = (ok: boolean): string => ok ? 'met' : 'missed'
    const warmTimes = ours.runs.map((r) => r.warm_s).filter((x): x is number => typeof x === 'number')
    const warm = warmTimes.length > 0 ? median(warmTimes) : Number.NaN
    const warmCell = Number.isFinite(warm) ? `${ms(warm)}${c ? ` (${ratio(warm / c.time)})` : ''}` : '-'
    const fastest = (g: Group): number => Math.min(...g.runs.map(timeOf))
    const fastestCell = c ? `${ms(fastest(ours))} ÷ ${ms(fastest(c))} = ${ratio(fastest(ours) / fastest(c))}` : '-'
    lines.push(`| ${w} | ${ms(ours.time)} | ${inc ? ms(inc.time) : 'not run'} | ${ratio(vsInc)}${inc && w !== 'W4' ? ` (${mark(vsInc >= 10)})` : w === 'W4' && inc ? ' (no incremental peer for synchronous dynamics: W4 is judged against the batched peer)' : ''} | ${batch ? ms(batch.time) : '-'} | ${batch ? `${ratio(vsBatch)} (${mark(vsBatch >= 3)})` : '-'} | ${c ? `${ms(c.time)} (${c.variant})` : 'not run'} | ${c ? `${ratio(vsC)} (${mark(vsC <= TIME_VS_C_TARGET)})` : '-'} | ${inc ? (vsInc > 1 ? 'yes' : 'NO') : '-'} | ${fastestCell} | ${warmCell} |`)
  }
  return lines
}

const fmt = (x: unknown, digits: number): string => typeof x === 'number' ? x.toFixed(digits) : Array.isArray(x) ? x.map((v) => (v as number).toFixed(digits)).join(',') : String(x)

/** Output fields compared with the C integer variants, at the precision the C peer prints. */
const CHECKED: Record<string, Array<[string, number]>> = {
  W1: [['mean_overlap', 6], ['sd_overlap', 6], ['frac_success', 6], ['mean_sweeps', 4], ['n_maxed', 0]],
  W3: [['mean_overlap', 6], ['sd_overlap', 6], ['frac_success', 6], ['mean_sweeps', 4], ['n_maxed', 0]],
  W4: [['mean_overlap', 6], ['sd_overlap', 6], ['frac_success', 6], ['mean_steps', 4], ['n_maxed', 0], ['n_fixed', 0], ['n_cycle2', 0]],
  W2: [['success', 4], ['mean_overlap', 4], ['mean_sweeps', 3]]
}

function bitCheck (runs: Run[]): string[] {
  const lines = ['| workload | memsweep path | compared with | fields | outputs | same across repeats |', '|---|---|---|---|---|---|']
  for (const w of ['W1', 'W2', 'W3', 'W4']) {
    const fields = CHECKED[w]!
    const signature = (r: Run): string => fields.map(([f, d]) => `${f}=${fmt(r[f], d)}`).join('; ')
    const refs = runs.filter((r) => r.workload === w && r.label === 'c' && r.variant !== 'f32')
    for (const variant of ['fast', 'plain']) {
      const ours = runs.filter((r) => r.workload === w && r.label === 'memsweep' && r.variant === variant)
      if (ours.length === 0) continue
      const sigs = new Set(ours.map(signature))
      const consistent = sigs.size === 1 ? 'yes' : `NO (${sigs.size} different)`
      const mine = signature(ours[0]!)
      if (refs.length === 0) {
        lines.push(`| ${w} | ${variant} | C not run | ${fields.map((f) => f[0]).join(', ')} | ${mine} | ${consistent} |`)
        continue
      }
      const cVariants = [...new Set(refs.map((r) => r.variant))]
      const verdict = cVariants.map((v) => {
        const ref = refs.find((r) => r.variant === v)!
        return `${signature(ref) === mine ? 'identical to' : 'DIFFERS from'} C ${v}`
      }).join(', ')
      lines.push(`| ${w} | ${variant} | ${cVariants.map((v) => `C ${v}`).join(', ')} | ${fields.map((f) => f[0]).join(', ')} | ${verdict}: ${mine} | ${consistent} |`)
    }
  }
  return lines
}

const DENSE_WORKLOADS: Record<string, string> = {
  D1: 'Hebbian on 0/1 neurons, N=1000, P=50, 100 trials, 10 % flipped, async (integer couplings)',
  D2: 'pseudo-inverse, N=500, P=100, 50 trials, 10 % flipped, async',
  D3: 'Hebbian diluted to 30 % (symmetric), N=1000, P=50, 100 trials, 10 % flipped, synchronous'
}

/** Dense representations have no peer: the fast paths against the plain path on the same stream. */
function denseSection (runs: Run[]): string[] {
  const rows: string[] = []
  for (const [w, what] of Object.entries(DENSE_WORKLOADS)) {
    const fast = runs.filter((r) => r.workload === w && r.variant === 'fast')
    const plain = runs.filter((r) => r.workload === w && r.variant === 'plain')
    if (fast.length === 0 || plain.length === 0) continue
    const tf = median(fast.map(timeOf))
    const tp = median(plain.map(timeOf))
    const signature = (r: Run): string => JSON.stringify([r.mean_overlap, r.sd_overlap, r.frac_success, r.mean_sweeps ?? r.mean_steps, r.n_maxed, r.n_fixed, r.n_cycle2])
    const same = new Set([...fast, ...plain].map(signature)).size === 1
    rows.push(`| ${w} | ${what} | ${String(fast[0]!.fast_path)} | ${ms(tp)} | ${ms(tf)} | ${ratio(tp / tf)} | ${mib(median(plain.map((r) => r.maxrss_kb)))} / ${mib(median(fast.map((r) => r.maxrss_kb)))} | ${same ? 'yes' : 'NO'} |`)
  }
  if (rows.length === 0) return []
  return [
    '## Dense representations (no peer): fast path against the plain path',
    '',
    'Rules and codings that need an explicit coupling matrix. Time is the dynamics (`sim_s`), fresh processes, medians; the outputs',
    '(mean and sd of the overlap, success fraction, mean sweeps, endings) must be identical between the two paths.',
    '',
    '| workload | network | fast path | plain | fast | speed-up | peak RSS plain / fast | identical outputs |',
    '|---|---|---|---|---|---|---|---|',
    ...rows,
    ''
  ]
}

const MODEL_WORKLOADS: Record<string, string> = {
  D4: 'dense polynomial memory F(x) = x³, N=400, P=2000, 50 trials, 10 % flipped, async',
  D5: 'dense exponential memory, N=200, P=2000, 50 trials, 10 % flipped, async',
  D6: 'modern softmax network β = 32, d=400, P=2000, 50 trials, 10 % flipped',
  D7: 'fixed in-degree K = 50 (Hebbian), N=20,000, P=5, 20 trials, 10 % flipped, async'
}

/** Output fields that must agree between the fast and the plain path (and, statistically, with numpy). */
const signatureOf = (r: Run): string => JSON.stringify([r.mean_overlap, r.sd_overlap, r.frac_success, r.mean_sweeps ?? r.mean_steps, r.n_maxed, r.n_fixed, r.n_cycle2])

/** The model kernels: fast against plain (same stream, identical outputs) and against our numpy peer. */
function modelSection (runs: Run[]): string[] {
  const rows: string[] = []
  const median0 = (rs: Run[]): number => rs.length > 0 ? median(rs.map(timeOf)) : Number.NaN
  for (const [w, what] of Object.entries(MODEL_WORKLOADS)) {
    const fast = runs.filter((r) => r.workload === w && r.label === 'memsweep' && r.variant === 'fast')
    if (fast.length === 0) continue
    const plain = runs.filter((r) => r.workload === w && r.label === 'memsweep' && r.variant === 'plain')
    const np = runs.filter((r) => r.workload === w && r.label === 'numpy')
    const np1 = runs.filter((r) => r.workload === w && r.label === 'numpy-1t')
    const tf = median0(fast)
    const tp = median0(plain)
    const tn = median0(np)
    const tn1 = median0(np1)
    const bestNumpy = bestNumpyTime(runs, w)
    const same = plain.length === 0 ? '-' : new Set([...fast, ...plain].map(signatureOf)).size === 1 ? 'yes' : 'NO'
    const vsPlain = tp / tf
    const vsNumpy = bestNumpy / tf
    rows.push(`| ${w} | ${what} | ${String(fast[0]!.fast_path)} | ${ms(tf)} | ${plain.length > 0 ? ms(tp) : '-'} | ${plain.length > 0 ? `${ratio(vsPlain)} (${vsPlain >= 3 ? 'met' : 'missed'})` : '-'} | ${np.length > 0 ? ms(tn) : '-'} / ${np1.length > 0 ? ms(tn1) : '-'} | ${Number.isFinite(vsNumpy) ? `${ratio(vsNumpy)} (${vsNumpy >= 1 ? 'met' : 'missed'})` : '-'} | ${same} | ${np.length > 0 ? (np[0]!.mean_overlap as number).toFixed(4) : '-'} / ${(fast[0]!.mean_overlap as number).toFixed(4)} |`)
  }
  if (rows.length === 0) return []
  return [
    '## Model kernels (D4–D7): fast path against the plain path and a vectorised numpy peer',
    '',
    'Time is the trials (`sim_s`), fresh processes, medians. The numpy peer (bench/peers/models_numpy.py) vectorises each visit or',
    'update over the patterns (or couplings) as a researcher would; it draws its own random stream (PCG64), so its outputs agree',
    'statistically (mean overlap shown). It runs with its default BLAS threads and with one (`OPENBLAS_NUM_THREADS=1`); the target',
    'is judged against the faster of the two. Targets: at least 3× today\'s JavaScript (the plain path) and at least as fast as numpy;',
    'fast and plain outputs must be identical.',
    '',
    '| workload | network | fast path | fast | plain | × plain (target ≥ 3×) | numpy default / 1 thread | × best numpy (target ≥ 1×) | identical outputs | mean overlap numpy / memsweep |',
    '|---|---|---|---|---|---|---|---|---|---|',
    ...rows,
    ...softmaxBound(runs),
    ''
  ]
}

/** The faster of the numpy peer's medians (default BLAS threads, one thread) on a model workload; Infinity when neither ran. */
function bestNumpyTime (runs: Run[], workload: string): number {
  const medians = ['numpy', 'numpy-1t']
    .map((label) => runs.filter((r) => r.workload === workload && r.label === label))
    .filter((rs) => rs.length > 0)
    .map((rs) => median(rs.map(timeOf)))
  return Math.min(...medians)
}

/**
 * The D6 bound (bench/peers/softmax128.c): its time scaled to the engine's own passes in D6
 * (two per update, one for the final overlaps of each trial), beside numpy's. Returns the
 * lines that go after the model table's intro, or none when the bound did not run.
 */
function softmaxBound (runs: Run[]): string[] {
  const bound = runs.filter((r) => r.workload === 'D6' && r.label === 'c-128')
  const fastRuns = runs.filter((r) => r.workload === 'D6' && r.label === 'memsweep' && r.variant === 'fast')
  const fast = fastRuns[0]
  if (bound.length === 0 || fast === undefined) return []
  const enginePasses = 2 * (fast.sweeps as number) + (fast.trials as number)
  const scaled = median(bound.map((r) => (r.sim_s as number) * enginePasses / (r.passes as number)))
  const numpyBest = bestNumpyTime(runs, 'D6')
  return [
    '',
    `D6 and 128-bit vectors: the kernel must add every term of every sum in the plain order, one double at a time per lane and never fused (its outputs equal the plain JavaScript's bit for bit), and WebAssembly SIMD holds two doubles a vector. bench/peers/softmax128.c does only that arithmetic, ${enginePasses} passes over the patterns as the engine's D6 run made (2 × ${String(fast.sweeps)} updates + ${String(fast.trials)} final overlap passes), in gcc -O3 SSE2 code with the ±1 entries stored as ready sign masks (8 bytes an entry; the engine keeps 1 and derives each mask) and nothing else to do. It takes ${ms(scaled)} (median of ${bound.length} runs)${Number.isFinite(numpyBest) ? `, ${ratio(scaled / numpyBest)} numpy's best time of ${ms(numpyBest)}, which uses this machine's wider vectors and fused multiply-adds` : ''}; the engine takes ${ms(median(fastRuns.map(timeOf)))} (median). Even this idealised code of the same arithmetic falls short of numpy: meeting the D6 numpy target would take wider vectors than WebAssembly has.`
  ]
}

/** Glauber dynamics (G1) against our C peer: exp per visit, and the same probabilities tabulated. */
function glauberSection (runs: Run[]): string[] {
  const ours = runs.filter((r) => r.workload === 'G1' && r.label === 'memsweep' && r.variant === 'fast')
  if (ours.length === 0) return []
  const plain = runs.filter((r) => r.workload === 'G1' && r.label === 'memsweep' && r.variant === 'plain')
  const cs = ['exp', 'table'].map((v) => ({ v, rs: runs.filter((r) => r.workload === 'G1' && r.label === 'c' && r.variant === v) })).filter((c) => c.rs.length > 0)
  const t = median(ours.map(timeOf))
  const lines = [
    '## Glauber dynamics (G1) against C',
    '',
    'Hebbian N = 1000, P = 50, T = 0.4, asynchronous, 20 sweeps (time average over the last 10), 100 trials from a 10 % flipped cue,',
    'one network; time is the trials (`sim_s`). The C peer (bench/peers/glauber.c, -O3 -march=native) draws the same canonical stream',
    'and computes the same decisions, u·(1 + exp(factor·h)) < 1, with libm\'s exp per visit (`exp`) or memoised per integer field',
    '(`table`). Target: ≤ 1.2× the best C variant.',
    '',
    '| impl | variant | runs | median | min..max | time ÷ best C | mean overlap | sd overlap |',
    '|---|---|---|---|---|---|---|---|'
  ]
  const best = cs.length > 0 ? Math.min(...cs.map((c) => median(c.rs.map(timeOf)))) : Number.NaN
  const row = (impl: string, variant: string, rs: Run[]): string => {
    const times = rs.map(timeOf)
    const tm = median(times)
    return `| ${impl} | ${variant} | ${rs.length} | ${ms(tm)} | ${ms(Math.min(...times))}..${ms(Math.max(...times))} | ${Number.isFinite(best) ? ratio(tm / best) : '-'} | ${(rs[0]!.mean_overlap as number).toFixed(6)} | ${(rs[0]!.sd_overlap as number).toFixed(6)} |`
  }
  lines.push(row('memsweep', `fast (${String(ours[0]!.fast_path)})`, ours))
  if (plain.length > 0) lines.push(row('memsweep', 'plain (js)', plain))
  for (const c of cs) lines.push(row('c', c.v, c.rs))
  const verdict = Number.isFinite(best) ? `memsweep ÷ best C = ${ratio(t / best)} (${t / best <= 1.2 ? 'met' : 'missed'})` : 'C peer not run'
  return [...lines, '', `- ${verdict}.`, ''].concat(plain.length > 0 ? [`- Fast and plain outputs identical: ${new Set([...ours, ...plain].map(signatureOf)).size === 1 ? 'yes' : 'NO'}.`, ''] : [])
}

interface ScalingSide { one: number, two: number, speedup: number, identical: boolean, runs: { one: number[], two: number[] } }
interface PairCeiling { alone: number, together: number, ceiling: number }
/** What bench/scaling.ts prints. */
export interface ScalingReport { trialsPerLoad: number, reps: number, ceilingTrialsPerLoad?: number, notes: string[], embedded?: ScalingSide, redis?: ScalingSide, ceilingC?: PairCeiling, ceilingEngine?: PairCeiling }

function scalingSection (scaling: ScalingReport | null): string[] {
  const out = ['## Multi-core scaling', '']
  if (scaling === null) return [...out, 'Not run (SKIP_SCALING set, or the run failed: see the notes above).', '']
  const s = (x: number): string => `${x.toFixed(2)} s`
  const row = (name: string, side: ScalingSide | undefined, unit: string): string => side === undefined
    ? `| ${name} | - | - | - | not measured |`
    : `| ${name} | ${s(side.one)} | ${s(side.two)} | ${side.speedup.toFixed(2)}× (${side.speedup >= 1.8 ? 'met' : 'missed'}) | ${side.identical ? 'yes' : 'NO'} (${unit}) |`
  return [
    ...out,
    `The W2 capacity curve (N = 500, α = 0.02 … 0.24, 5 % flipped, a new network per trial) with ${scaling.trialsPerLoad} trials per load, submitted to a`,
    `backend and timed from submit to succeeded after a warm-up sweep; median of ${scaling.reps} runs. Target: wall time drops at least 1.8× from 1 to 2 cores.`,
    '',
    '| backend | 1 core | 2 cores | speed-up | results byte-identical |',
    '|---|---|---|---|---|',
    row('embedded (compute threads)', scaling.embedded, '1 vs 2 threads'),
    row('Redis (worker processes, one chunk at a time each)', scaling.redis, '1 vs 2 workers, and vs embedded'),
    ...scaling.notes.map((n) => `- Note: ${n}`),
    '',
    ...ceilingSection(scaling),
    ''
  ]
}

/** What a second core adds on this machine at all: the same curve by one process, then by two at once. */
function ceilingSection (scaling: ScalingReport): string[] {
  const rows: string[] = []
  const add = (name: string, c: PairCeiling | undefined): void => {
    if (c !== undefined) rows.push(`| ${name} | ${c.alone.toFixed(3)} s | ${c.together.toFixed(3)} s | ${c.ceiling.toFixed(2)}× |`)
  }
  add('C reference (`ovl`, -O3 -march=native)', scaling.ceilingC)
  add('memsweep engine without the service (bench/workload.ts W2)', scaling.ceilingEngine)
  if (rows.length === 0) return []
  const best = Math.max(scaling.ceilingC?.ceiling ?? 0, scaling.ceilingEngine?.ceiling ?? 0)
  const share = (side: ScalingSide | undefined): string => side === undefined ? 'not measured' : `${side.speedup.toFixed(2)}× = ${(100 * side.speedup / best).toFixed(0)} %`
  return [
    '### The machine\'s two-core ceiling, measured in the same run',
    '',
    `The same W2 curve (${scaling.ceilingTrialsPerLoad ?? '?'} trials per load) run by one process alone, then by two processes at once (median of each`,
    `process's own curve time over ${scaling.reps} repeats). Two processes deliver 2·t_alone / t_together times the throughput of one: no`,
    'program of that kind can gain more from the second core of this machine on this work. A ceiling below 2× means the two',
    'processes share something besides the cores\' time: execution units or caches of one physical core, memory bandwidth, or',
    'the runtime\'s helper threads (engine processes run with the service\'s flags, src/runtime/node-flags.ts).',
    '',
    '| program | alone | each of two at once | throughput of two ÷ one |',
    '|---|---|---|---|',
    ...rows,
    '',
    `Service speed-up as a share of the higher ceiling (${best.toFixed(2)}×): embedded ${share(scaling.embedded)}, Redis ${share(scaling.redis)}.`,
    ...(scaling.ceilingC !== undefined && scaling.ceilingTrialsPerLoad === scaling.trialsPerLoad
      ? ['', `Absolute two-core throughput on this curve: the service finishes it in ${scaling.embedded?.two.toFixed(2) ?? '-'} s (embedded) and ${scaling.redis?.two.toFixed(2) ?? '-'} s (Redis) on two cores; two C processes at once deliver one curve every ${(scaling.ceilingC.together / 2).toFixed(2)} s (one alone: ${scaling.ceilingC.alone.toFixed(2)} s).`]
      : [])
  ]
}

/** What bench/memory.ts prints per case. */
function memoryEstimateSection (memory: MemoryMeasurement[] | null): string[] {
  const out = ['## Memory estimate against measured peak', '']
  if (memory === null) return [...out, 'Not run (SKIP_MEMORY set, or the run failed: see the notes above).', '']
  const mb = (b: number): string => `${(b / 1e6).toFixed(1)} MB`
  return [
    ...out,
    'Each case runs its first grid point in a compute thread of a fresh process, after a toy-sized sweep of the same model has',
    'loaded and compiled the engine; the main thread samples the resident set every millisecond. Measured = highest sample minus',
    'the resident set just before the point; estimate = the validator\'s `peakBytes` for the same spec (what the memory limit is',
    'checked against). Target: within 25 %. Compute threads collect explicitly before building a network of 32 MiB or more',
    '(src/runtime/reclaim.ts), so a point holds one network at a time.',
    '',
    '| case | representation | estimate | measured peak | measured ÷ estimate | point run time |',
    '|---|---|---|---|---|---|',
    ...memory.map((m) => `| ${m.name} | ${m.representation} | ${mb(m.estimateBytes)} | ${mb(m.measuredBytes)} | ${m.ratio.toFixed(2)} (${Math.abs(m.ratio - 1) <= 0.25 ? 'met' : 'missed'}) | ${m.seconds.toFixed(1)} s |`),
    ''
  ]
}

export function renderReport (runs: Run[], extra: { scale: Run | null, baseline: Run[], scaling: ScalingReport | null, memory: MemoryMeasurement[] | null, overhead: ServiceOverheadReport | null, queueCeiling: QueueCeilingReport | null, estimates: EstimateMeasurement[] | null, healthz: HealthzReport | null, ctx: Context }): string {
  const { ctx, scale, baseline, scaling, memory } = extra
  const baselineKb = baseline.length > 0 ? median(baseline.map((r) => r.maxrss_kb)) : Number.NaN
  const w3 = runs.filter((r) => r.workload === 'W3' && r.label === 'memsweep' && r.variant === 'fast')
  const out: string[] = [
    '# Benchmark results: memsweep against the numpy and C peers',
    '',
    '<!-- Generated by `npm run bench` (bench/run.ts). Do not edit by hand: re-run the benchmark. -->',
    '',
    `Generated ${ctx.date} in ${ctx.seconds.toFixed(0)} s. Workloads, timing rules and peers: \`../shared/bench/WORKLOADS.md\`.`,
    'Every measurement is a fresh process running the workload once (JIT warm-up inside the timed region counts), single-threaded,',
    'seed 1, repeated with the implementations interleaved; medians are reported. Time is the dynamics (`sim_s`) for W1, W3, W4 and the',
    'whole curve including all pattern generation (`total_s`) for W2. Speed-ups are ratios of median times measured in this same run.',
    '',
    '## Machine and versions',
    '',
    `- CPU: ${ctx.cpu}, ${ctx.cores} cores; memory ${ctx.memoryGiB.toFixed(1)} GiB`,
    `- Node ${ctx.node} (V8 ${ctx.v8}); ${ctx.gcc}; Python ${ctx.python}`,
    `- Load average before / after: ${ctx.loadBefore} / ${ctx.loadAfter} (the run itself accounts for about 1)`,
    `- Repeats: ${Object.entries(ctx.reps).map(([k, v]) => `${k}=${v}`).join(', ')}; numpy with its default BLAS threads`,
    ...ctx.notes.map((n) => `- Note: ${n}`),
    '',
    '## Headline (single thread)',
    '',
    ...headline(runs),
    '',
    `Targets from the performance issues: at least 10× the incremental-field numpy peer (3× the batched numpy peer on W4) and at most ${ratio(TIME_VS_C_TARGET)}`,
    'the time of the best C variant, all on fresh-process medians. `memsweep plain` is the engine with its fast paths switched off (the',
    'per-neuron JavaScript path), run on the same stream for comparison. The per-workload tables also give, labelled apart, the median',
    'of warm repeats inside each fresh process (same seed, same outputs): the steady state a long-running worker sees once the JIT and',
    'the WebAssembly tier-up are done. On a machine shared with other jobs the fastest fresh-process runs of each side are the least',
    'disturbed samples; their ratio is given beside the medians as a check, not as the target figure.',
    '',
    '## Per workload',
    '',
    ...['W1', 'W2', 'W3', 'W4'].flatMap((w) => workloadTable(runs, w)),
    '## Bit-for-bit cross-check against the C integer variants',
    '',
    'memsweep draws the canonical xoshiro256** stream of WORKLOADS.md §7 and decides on exact integer fields, so its outputs must equal',
    'those of the C `i16` / `i16inc` / `ovl` variants printed in this run, field by field at the precision C prints.',
    '',
    ...bitCheck(runs),
    '',
    ...denseSection(runs),
    ...modelSection(runs),
    ...glauberSection(runs),
    '## Memory',
    '',
    `- Node baseline (a process that loads the engine and runs nothing): ${mib(baselineKb)} peak RSS (median of ${baseline.length}).`,
    '- Peak RSS of memsweep fast-path processes is taken at the end of the measured run, before the warm repeats.'
  ]
  if (w3.length > 0) {
    const bytes = w3[0]!.representation_bytes as number
    const peak = median(w3.map((r) => r.maxrss_kb))
    out.push(`- W3: representation ${(bytes / 1e6).toFixed(2)} MB (int8 patterns pattern-major and neuron-major, overlaps, state; no coupling matrix); peak RSS ${mib(peak)}; peak − baseline ${mib(peak - baselineKb)}; peak ÷ (representation + baseline) = ${(peak * 1024 / (bytes + baselineKb * 1024)).toFixed(2)} (target ≤ 1.5).`)
  }
  out.push('', '## Scale: Hebbian N = 100,000 at load 0.05 (P = 5000), one recall trial', '')
  if (scale === null) {
    out.push('Not run (set SKIP_SCALE unset to run it).')
  } else {
    const sweeps = scale.sweeps as number
    out.push(
      `- Fast path ${String(scale.fast_path)}; 10 % of the bits flipped; asynchronous dynamics.`,
      `- Build (patterns in both layouts): ${ms(scale.build_s as number)}; recall trial: ${ms(scale.sim_s as number)} for ${sweeps} sweeps, ${ms((scale.sim_s as number) / sweeps)} per sweep (including the initial overlaps); final overlap ${(scale.mean_overlap as number).toFixed(5)}.`,
      `- Representation ${(Number(scale.representation_bytes) / 1e6).toFixed(0)} MB; peak RSS ${mib(scale.maxrss_kb)}; process wall time ${(scale.proc_wall_s).toFixed(1)} s.`
    )
  }
  out.push('', ...memoryEstimateSection(memory), ...scalingSection(scaling), ...serviceOverheadSection(extra.overhead), ...queueCeilingSection(extra.queueCeiling), ...estimateSection(extra.estimates), ...healthzSection(extra.healthz))
  return out.join('\n')
}

/** What bench/service-overhead.ts prints. */
export interface ServiceOverheadReport {
  trialsPerLoad: number
  threads: number
  reps: number
  engine: { seconds: number[], median: number }
  /** ratio: median ÷ the engine's median; roundRatio: the median over rounds of the round's time ÷ the engine's in that round. */
  embedded?: { seconds: number[], median: number, ratio: number, roundRatio: number }
  redis?: { seconds: number[], median: number, ratio: number, roundRatio: number }
  notes: string[]
}

export function serviceOverheadSection (overhead: ServiceOverheadReport | null): string[] {
  const out = ['## Service overhead: POST to succeeded against the engine alone', '']
  if (overhead === null) return [...out, 'Not run (SKIP_SERVICE_OVERHEAD set, or the run failed: see the notes above).', '']
  const s = (x: number): string => `${x.toFixed(2)} s`
  const spread = (xs: number[]): string => `${s(Math.min(...xs))}..${s(Math.max(...xs))}`
  const row = (name: string, side: ServiceOverheadReport['embedded']): string => side === undefined
    ? `| ${name} | not measured | - | - | - |`
    : `| ${name} | ${s(side.median)} | ${spread(side.seconds)} | ${ratio(side.roundRatio)} (${side.roundRatio <= 1.1 ? 'met' : 'missed'}) | ${ratio(side.ratio)} |`
  return [
    ...out,
    `The capacity curve of W2 at ${overhead.trialsPerLoad} trials per load (N = 500, 12 loads, ${(12 * overhead.trialsPerLoad).toLocaleString('en')} trials, a new network per trial),`,
    `on ${overhead.threads} compute threads, ${overhead.reps} rounds that time each side once, in turn (this machine drifts between faster and slower`,
    'phases; a new seed each round, so no stored point is reused), medians reported. Service: a real server process,',
    'timed by the client from `POST /v1/sweeps` to the `succeeded` event on `/v1/sweeps/{id}/events`; embedded with `WORKER_THREADS` =',
    `${overhead.threads}, Redis with an API process and ${overhead.threads} worker processes of one compute thread each. Engine alone: the same plan's chunks,`,
    'costliest first, through the lifecycle core\'s chunk runner on the embedded backend\'s compute-thread pool of the same size, then',
    'assembled on one of its threads: every computation the service does (trials, chunk encoding, assembly, theory) without HTTP,',
    'store, queue or events. Target: service ÷ engine alone ≤ 1.1×, judged on the median of the rounds\' own ratios (each compares',
    'times taken seconds apart, so a drift of the machine between rounds cancels); the ratio of the medians is beside it.',
    '',
    '| run | median | min..max | ÷ engine alone (median of round ratios) | ratio of medians |',
    '|---|---|---|---|---|',
    `| engine alone (${overhead.threads} threads) | ${s(overhead.engine.median)} | ${spread(overhead.engine.seconds)} | 1.00× | 1.00× |`,
    row('embedded server', overhead.embedded),
    row('Redis: API + worker processes', overhead.redis),
    ...overhead.notes.map((n) => `- Note: ${n}`),
    ''
  ]
}

/** What bench/queue-ceiling.ts prints. */
export interface QueueCeilingReport {
  runs: Array<{ workers: number, chunks: number, seconds: number, chunksPerSecond: number, redisCpuPerChunk: number, backgroundRate: number }>
  computePerChunk: number
  model: { service: { perChunk: number, perWorkerPerSecond: number }, workerOverheadSeconds: number, chunkSeconds: number }
  ceiling: number
  efficiencyAt256: number
  /** Infinity (null in JSON) when no chunk duration is enough. */
  chunkSecondsFor256: number | null
  notes: string[]
}

export function queueCeilingSection (queue: QueueCeilingReport | null): string[] {
  const out = ['## Many workers on one Redis', '']
  if (queue === null) return [...out, 'Not run (SKIP_QUEUE_CEILING set, or the run failed: see the notes above).', '']
  const msec = (x: number): string => `${(x * 1000).toFixed(3)} ms`
  const { model } = queue
  return [
    ...out,
    'Worker processes (one chunk at a time each, sharing this machine\'s cores) run a sweep of tiny chunks (N = 16, one pattern,',
    '4 trials per grid point, one chunk per point) on a key prefix of their own; workers are added between runs. Measured: chunks per',
    'second, and the Redis server\'s CPU per chunk (INFO cpu, used_cpu_user + used_cpu_sys, less its background rate measured just',
    'before each run: the Redis is shared).',
    '',
    '| worker processes | chunks | wall | chunks/s | Redis CPU per chunk | Redis background |',
    '|---|---|---|---|---|---|',
    ...queue.runs.map((r) => `| ${r.workers} | ${r.chunks} | ${r.seconds.toFixed(2)} s | ${r.chunksPerSecond.toFixed(1)} | ${msec(r.redisCpuPerChunk)} | ${(100 * r.backgroundRate).toFixed(2)} % of a core |`),
    '',
    'Model (bench/queue-model.ts): Redis is one server. Its CPU rate is c·λ + s·W (c per chunk, s per attached worker per second,',
    'fitted over the runs, both ≥ 0); W busy workers with chunks of T seconds load it to ρ = W·(c/T + s), and a chunk waits',
    'ρ·c/(1 − ρ) (M/M/1, which overstates the wait of this closed system, so the ceiling errs low). A worker\'s efficiency is',
    'T / (T + o + wait), o its own per-chunk overhead: one worker\'s period on tiny chunks less their compute time (measured in',
    'this process) and Redis\'s time.',
    '',
    `- Fitted: c = ${msec(model.service.perChunk)} per chunk, s = ${msec(model.service.perWorkerPerSecond)} per worker per second; o = ${msec(model.workerOverheadSeconds)} (tiny chunk compute ${msec(queue.computePerChunk)}).`,
    `- At the planner's target chunk duration T = ${model.chunkSeconds} s (TARGET_CHUNK_SECONDS): efficiency with 256 workers ${(100 * queue.efficiencyAt256).toFixed(1)} %; the largest worker count with ≥ 90 % efficiency is **${queue.ceiling.toLocaleString('en')}** (target ≥ 256: ${queue.ceiling >= 256 ? 'met' : 'missed'}). ${typeof queue.chunkSecondsFor256 === 'number' && Number.isFinite(queue.chunkSecondsFor256) ? `256 workers need chunks of at least ${queue.chunkSecondsFor256.toFixed(2)} s.` : 'No chunk duration gives 256 workers 90 %: their standing cost alone, 256·s, fills Redis.'}`,
    ...queue.notes.map((n) => `- Note: ${n}`),
    ''
  ]
}

export function estimateSection (estimates: EstimateMeasurement[] | null): string[] {
  const out = ['## CPU estimate against measured CPU time', '']
  if (estimates === null) return [...out, 'Not run (SKIP_ESTIMATE set, or the run failed: see the notes above).', '']
  const ratios = estimates.map((e) => e.ratio).sort((a, b) => a - b)
  return [
    ...out,
    'For each spec, the validator\'s `cpuSeconds` (what `MAX_CPU_SECONDS` is checked against and the planner cuts chunks by) against',
    'the CPU time (user + system) of running every chunk of the sweep through the lifecycle core in one thread of one process, after',
    'a tenth of the case has warmed the engine up. Ratio = estimate ÷ measured: above 1 the estimate errs towards more work.',
    '',
    '| case | trials | estimate | measured | estimate ÷ measured |',
    '|---|---|---|---|---|',
    ...estimates.map((e) => `| ${e.name} | ${e.trials.toLocaleString('en')} | ${e.estimatedCpuSeconds.toFixed(3)} s | ${e.measuredCpuSeconds.toFixed(3)} s | ${e.ratio.toFixed(2)} |`),
    '',
    `- Estimate ÷ measured over ${ratios.length} cases: min ${ratios[0]!.toFixed(2)}, median ${median(ratios).toFixed(2)}, max ${ratios.at(-1)!.toFixed(2)}.`,
    ''
  ]
}

export function healthzSection (healthz: HealthzReport | null): string[] {
  const out = ['## /healthz while large results are downloaded', '']
  if (healthz === null) return [...out, 'Not run (SKIP_HEALTHZ set, or the run failed: see the notes above).', '']
  const msec = (x: number): string => `${x.toFixed(1)} ms`
  const row = (name: string, s: HealthzReport['idle']): string => `| ${name} | ${s.count} | ${msec(s.p50)} | ${msec(s.p99)} | ${msec(s.max)} |`
  return [
    ...out,
    `A real embedded server process (2 compute threads) holds a ${healthz.trials.toLocaleString('en')}-trial result (N = 10, one and two patterns, trial rows`,
    'stored) and a trajectory result (N = 400, four loads, 100 trials, overlap and energy after each of up to 60 sweeps), computed in',
    `${healthz.computeSeconds.toFixed(1)} s. For ${healthz.seconds} s one client downloads them back to back, each request with options not asked before (JSON and`,
    'CSV with trial rows, timing, the trajectory series, figures of a new width every time, and a figure the server must refuse),',
    'while a sequential prober times `GET /healthz` every 10 ms; the prober alone first gives the baseline.',
    '',
    '| phase | probes | p50 | p99 | max |',
    '|---|---|---|---|---|',
    row('idle', healthz.idle),
    row('during downloads', healthz.loaded),
    '',
    `- Downloads: ${healthz.downloads.count} (${(healthz.downloads.bytes / 1e6).toFixed(1)} MB), by status ${Object.entries(healthz.downloads.byStatus).map(([k, v]) => `${k}: ${v}`).join(', ')}.`,
    `- Peak resident set of the server process (VmHWM: computing both sweeps on its compute threads, storing them, rendering every download): ${healthz.serverPeakRssBytes === null ? 'not measured' : `${(healthz.serverPeakRssBytes / 2 ** 20).toFixed(0)} MiB`}.`,
    ''
  ]
}
