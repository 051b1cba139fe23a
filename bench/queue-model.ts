/**
 * How many workers one Redis can feed: a model built from what bench/queue-ceiling.ts
 * measures. Pure functions, no I/O (test/sweep/queue-model.test.ts).
 *
 * Redis is one single-threaded server. It spends CPU in two ways: `perChunk` seconds for
 * every chunk (moving the job to active and to finished, our store scripts, the events),
 * and `perWorkerPerSecond` for every attached worker whether it computes or not (lock
 * renewals, stalled checks, blocking reads that time out and are reissued). Both come from
 * one fit over runs with different worker counts: Redis's CPU rate = perChunk·λ +
 * perWorkerPerSecond·W, λ the chunks per second of that run.
 *
 * A worker runs a chunk for T seconds, then pays its own per-chunk overhead `o` (sandbox
 * messages, reading the spec, storing the chunk, the round trips) and waits in Redis's
 * queue. W busy workers give Redis the utilisation ρ = W·(perChunk/T + perWorkerPerSecond):
 * with `perChunk` as the service time c, W·c/T plus the workers' standing cost. The wait is
 * that of an M/M/1 queue, ρ·c/(1 − ρ): an open queue with exponential service, which
 * overstates the wait of this closed system with near-constant service times, so the
 * ceiling errs low. A worker's efficiency is the share of its time spent computing,
 * T / (T + o + wait); the ceiling is the largest W whose efficiency is at least the target.
 */

export interface ServiceTime {
  /** Redis CPU seconds per chunk: the service time c. */
  perChunk: number
  /** Redis CPU seconds per second for every attached worker, busy or idle. */
  perWorkerPerSecond: number
}

export interface QueueModel {
  service: ServiceTime
  /** A worker's own time per chunk besides computing and waiting for Redis, seconds. */
  workerOverheadSeconds: number
  /** The compute time of a chunk, seconds (the planner's target chunk duration). */
  chunkSeconds: number
}

/** One measured run: W worker processes on tiny chunks. */
export interface QueueMeasurement {
  workers: number
  chunksPerSecond: number
  /** Redis CPU seconds (user + sys) per chunk, the server's own. */
  redisCpuPerChunk: number
}

// MAIN //

/**
 * Least squares (no intercept) of Redis's CPU rate r = c·λ + s·W over the runs, for c =
 * perChunk and s = perWorkerPerSecond, both kept non-negative: when the joint fit gives a
 * negative one, it is zero and the other is fitted alone. One run (or runs that cannot tell
 * the two apart) charges everything to the chunks.
 *
 * @throws {RangeError} without measurements.
 */
export function fitServiceTime (measurements: readonly QueueMeasurement[]): ServiceTime {
  if (measurements.length === 0) throw new RangeError('invalid argument. At least one measurement is needed.')
  let ll = 0
  let lw = 0
  let ww = 0
  let lr = 0
  let wr = 0
  for (const m of measurements) {
    const rate = m.redisCpuPerChunk * m.chunksPerSecond
    ll += m.chunksPerSecond ** 2
    lw += m.chunksPerSecond * m.workers
    ww += m.workers ** 2
    lr += m.chunksPerSecond * rate
    wr += m.workers * rate
  }
  const det = ll * ww - lw * lw
  const chunksOnly = { perChunk: ll > 0 ? Math.max(0, lr / ll) : 0, perWorkerPerSecond: 0 }
  if (measurements.length < 2 || Math.abs(det) <= 1e-12 * ll * ww) return chunksOnly
  const perChunk = (lr * ww - wr * lw) / det
  const perWorkerPerSecond = (ll * wr - lw * lr) / det
  if (perChunk < 0) return { perChunk: 0, perWorkerPerSecond: Math.max(0, wr / ww) }
  if (perWorkerPerSecond < 0) return chunksOnly
  return { perChunk, perWorkerPerSecond }
}

/** Share of Redis's time that `workers` busy workers take: W·(c/T + s). */
export function utilisation (model: QueueModel, workers: number): number {
  return workers * (model.service.perChunk / model.chunkSeconds + model.service.perWorkerPerSecond)
}

/** Mean wait per chunk in Redis's queue (M/M/1), seconds; infinite at or past saturation. */
export function queueingWait (model: QueueModel, workers: number): number {
  const rho = utilisation(model, workers)
  return rho >= 1 ? Infinity : rho * model.service.perChunk / (1 - rho)
}

/** Share of a worker's time spent computing: T / (T + o + wait). */
export function efficiency (model: QueueModel, workers: number): number {
  const wait = queueingWait(model, workers)
  return Number.isFinite(wait) ? model.chunkSeconds / (model.chunkSeconds + model.workerOverheadSeconds + wait) : 0
}

/**
 * The largest number of workers whose efficiency is at least `target` (0 when even one
 * worker falls short). Efficiency falls as workers are added, so a doubling search then a
 * bisection find it; `limit` bounds the search (returned when it is never reached).
 */
export function workerCeiling (model: QueueModel, target = 0.9, limit = 1e9): number {
  const ok = (workers: number): boolean => efficiency(model, workers) >= target
  if (!ok(1)) return 0
  let low = 1
  let high = 2
  while (high <= limit && ok(high)) {
    low = high
    high *= 2
  }
  if (high > limit) return ok(limit) ? limit : bisect(ok, low, limit)
  return bisect(ok, low, high)
}

/** Largest w in [low, high) with ok(w), given ok(low) and not ok(high). */
function bisect (ok: (w: number) => boolean, low: number, high: number): number {
  while (high - low > 1) {
    const mid = Math.floor((low + high) / 2)
    if (ok(mid)) low = mid
    else high = mid
  }
  return low
}

/**
 * The shortest chunk duration (to `resolution` seconds) at which `workers` workers keep
 * `target` efficiency: what the planner's chunk duration must be for that many workers.
 * Infinite when the worker overhead alone forbids it (it never does for a finite overhead).
 */
export function chunkSecondsFor (model: Omit<QueueModel, 'chunkSeconds'>, workers: number, target = 0.9, resolution = 0.01): number {
  const ok = (seconds: number): boolean => efficiency({ ...model, chunkSeconds: seconds }, workers) >= target
  let high = resolution
  while (!ok(high)) {
    high *= 2
    if (high > 1e9) return Infinity
  }
  let low = high / 2
  while (high - low > resolution) {
    const mid = (low + high) / 2
    if (ok(mid)) high = mid
    else low = mid
  }
  return high
}
