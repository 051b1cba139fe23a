/**
 * Progress of a sweep for people and for logs: a bar (cli-progress) on a terminal, plain
 * lines at most every few seconds otherwise (a pipeline log should not fill with redraws).
 */
import cliProgress from 'cli-progress'
import type { CliIo } from './io.js'

export interface ProgressView {
  trialsDone: number
  trialsTotal: number
  pointsDone: number
  pointsTotal: number
  estimatedSecondsLeft?: number | null
}

export interface ProgressReporter {
  update: (progress: ProgressView) => void
  stop: () => void
}

/** Plain lines are printed at most this often, plus on completion. */
const LINE_INTERVAL_MS = 2000

export function createProgressReporter (io: CliIo, label: string): ProgressReporter {
  if (io.isTTY) {
    const bar = new cliProgress.SingleBar({
      stream: io.stderr,
      format: `${label} {bar} {percentage}% | {value}/{total} trials | {points} points | {left}`,
      hideCursor: true,
      clearOnComplete: false
    }, cliProgress.Presets.shades_classic)
    let started = false
    return {
      update (p) {
        const payload = { points: `${p.pointsDone}/${p.pointsTotal}`, left: formatLeft(p.estimatedSecondsLeft) }
        if (!started) { bar.start(p.trialsTotal, p.trialsDone, payload); started = true } else bar.update(p.trialsDone, payload)
      },
      stop () { if (started) bar.stop() }
    }
  }
  let lastLine = 0
  let lastDone = -1
  return {
    update (p) {
      const now = Date.now()
      const finished = p.trialsDone >= p.trialsTotal
      if (p.trialsDone === lastDone || (!finished && now - lastLine < LINE_INTERVAL_MS)) return
      lastLine = now
      lastDone = p.trialsDone
      const percent = p.trialsTotal === 0 ? 100 : Math.floor(100 * p.trialsDone / p.trialsTotal)
      io.stderr.write(`${label}: ${percent}% (${p.trialsDone}/${p.trialsTotal} trials, ${p.pointsDone}/${p.pointsTotal} points${finished ? '' : `, ${formatLeft(p.estimatedSecondsLeft)}`})\n`)
    },
    stop () {}
  }
}

function formatLeft (seconds: number | null | undefined): string {
  if (seconds === null || seconds === undefined) return 'estimating time left'
  if (seconds < 60) return `~${Math.ceil(seconds)} s left`
  return `~${Math.ceil(seconds / 60)} min left`
}
