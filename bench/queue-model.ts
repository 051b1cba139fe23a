/**
 * How many workers one Redis can feed: a model built from what bench/queue-ceiling.ts
 * measures. Pure functions, no I/O (test/sweep/queue-model.test.ts).
 *
 * Redis is one single-threaded server. Every chunk costs it `c` seconds of CPU (moving the
 * job to active and to finished, the lock, our store scripts, progress, the events): its
 * service time per chunk. The measured `c` may grow with the number of workers W (every
 * idle worker blocks on the queue, every running chunk renews its lock), so it is fitted as
 * c(W) = base + perWorker·W over the measured worker counts.
 *
 * A worker runs a chunk for T seconds, then pays its own per-chunk overhead `o` (sandbox
 * messages, reading the spec, storing the chunk, the round trips) and waits in Redis's
 * queue. W workers offer Redis a utilisation ρ = W·c(W)/T; the wait is that of an M/M/1
 * queue, ρ·c/(1 − ρ): an open queue with exponential service, which overstates the wait of
 * this closed system with near-constant service times, so the ceiling errs low. A worker's
 * efficiency is the share of its time spent computing, T / (T + o + wait); the ceiling is the
 * largest W whose efficiency is at least the target.
 */

export interface ServiceTime {
  /** Redis CPU seconds per chunk at no workers (the intercept). */
  base: number
  /** Extra Redis CPU seconds per chunk for every worker attached. */
  perWorker: number
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
  /** Redis CPU seconds (user + sys) per chunk, the server's own. */
  redisCpuPerChunk: number
}

// MAIN //

/**
 * Least-squares line c(W) = base + perWorker·W through the measurements; a negative slope
 * (noise) is taken as flat at the largest measured cost, so the model never extrapolates a
 * cheaper Redis than was seen.
 *
 * @throws {RangeError} without measurements.
 */
export function fitServiceTime (measurements: readonly QueueMeasurement[]): ServiceTime {
  if (measurements.length === 0) throw new RangeError('invalid argument. At least one measurement is needed.')
  const n = measurements.length
  const meanW = measurements.reduce((s, m) => s + m.workers, 0) / n
  const meanC = measurements.reduce((s, m) => s + m.redisCpuPerChunk, 0) / n
  let sxx = 0
  let sxy = 0
  for (const m of measurements) {
    sxx += (m.workers - meanW) ** 2
    sxy += (m.workers - meanW) * (m.redisCpuPerChunk - meanC)
  }
  const slope = sxx > 0 ? sxy / sxx : 0
  if (slope <= 0) return { base: Math.max(...measurements.map((m) => m.redisCpuPerChunk)), perWorker: 0 }
  return { base: Math.max(0, meanC - slope * meanW), perWorker: slope }
}

/** Redis CPU seconds per chunk with `workers` workers attached. */
export function serviceSeconds (service: ServiceTime, workers: number): number {
  return service.base + service.perWorker * workers
}

/** Share of Redis's time that `workers` busy workers take: W·c(W)/T. */
export function utilisation (model: QueueModel, workers: number): number {
  return workers * serviceSeconds(model.service, workers) / model.chunkSeconds
}

/** Mean wait per chunk in Redis's queue (M/M/1), seconds; infinite at or past saturation. */
export function queueingWait (model: QueueModel, workers: number): number {
  const rho = utilisation(model, workers)
  return rho >= 1 ? Infinity : rho * serviceSeconds(model.service, workers) / (1 - rho)
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
