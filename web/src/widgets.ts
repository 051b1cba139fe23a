/** Small pieces several pages share: status marks, the progress bar, confirmations, notices. */
import { h, s } from './dom.js'
import { formatCount, formatDuration, formatPercent } from './format.js'
import type { SweepStatus, SweepStatusName } from './types.js'

const STATUS_WORDS: Record<SweepStatusName, string> = {
  queued: 'queued',
  running: 'running',
  succeeded: 'succeeded',
  failed: 'failed',
  canceled: 'canceled'
}

/** What each status is called on the page: the API's own status words, so the page and scripts agree. */
export function statusWord (status: SweepStatusName): string {
  return STATUS_WORDS[status]
}

/** A shape per status, so the mark reads without colour. */
function statusIcon (status: SweepStatusName): SVGSVGElement {
  const icon = s('svg', { viewBox: '0 0 16 16', width: 14, height: 14, 'aria-hidden': 'true', focusable: 'false', class: 'status-icon' })
  switch (status) {
    case 'queued':
      icon.append(s('circle', { cx: 8, cy: 8, r: 5.5, fill: 'none', stroke: 'currentColor', 'stroke-width': 1.8, 'stroke-dasharray': '2.6 2' }))
      break
    case 'running':
      icon.append(
        s('circle', { cx: 8, cy: 8, r: 5.5, fill: 'none', stroke: 'currentColor', 'stroke-width': 1.8 }),
        s('path', { d: 'M8 2.5 A5.5 5.5 0 0 1 8 13.5 Z', fill: 'currentColor' }))
      break
    case 'succeeded':
      icon.append(s('path', { d: 'M3 8.5 L6.5 12 L13 4.5', fill: 'none', stroke: 'currentColor', 'stroke-width': 2.2, 'stroke-linecap': 'round', 'stroke-linejoin': 'round' }))
      break
    case 'failed':
      icon.append(s('path', { d: 'M4 4 L12 12 M12 4 L4 12', fill: 'none', stroke: 'currentColor', 'stroke-width': 2.2, 'stroke-linecap': 'round' }))
      break
    case 'canceled':
      icon.append(s('rect', { x: 4, y: 4, width: 8, height: 8, rx: 1, fill: 'currentColor' }))
      break
  }
  return icon
}

export function statusBadge (status: SweepStatusName): HTMLSpanElement {
  return h('span', { class: `status status-${status}`, 'data-status': status }, statusIcon(status), STATUS_WORDS[status])
}

/** Seconds left, counted down locally between server updates. */
function secondsLeft (status: SweepStatus, receivedAt: number, now: number): number | null {
  const left = status.progress.estimatedSecondsLeft
  if (left === null) return null
  return Math.max(0, left - (now - receivedAt) / 1000)
}

export interface ProgressView {
  el: HTMLElement
  update: (status: SweepStatus) => void
  /** Re-renders the time left; called about once a second. */
  tick: (now: number) => void
}

/**
 * A progress bar with a line of text under it: how far, how many trials, how long left.
 * The bar is an ARIA progressbar whose value text says the same as the visible text.
 */
export function progressView (name: string, compact = false): ProgressView {
  const fillBar = h('div', { class: 'bar-fill' })
  const bar = h('div', { class: 'bar', role: 'progressbar', 'aria-valuemin': 0, 'aria-valuemax': 100, 'aria-label': `Progress of ${name}` }, fillBar)
  const text = h('div', { class: 'bar-text' })
  const el = h('div', { class: `progress${compact ? ' compact' : ''}` }, bar, text)
  let last: SweepStatus | null = null
  let receivedAt = 0

  const render = (now: number): void => {
    if (last === null) return
    const { progress, status } = last
    const fraction = status === 'succeeded' ? 1 : progress.fraction
    const percent = formatPercent(fraction)
    fillBar.style.width = `${Math.round(fraction * 1000) / 10}%`
    el.dataset.status = status
    bar.setAttribute('aria-valuenow', String(status === 'succeeded' ? 100 : Math.min(99, Math.floor(fraction * 100))))
    const trials = `${formatCount(progress.trialsDone)} of ${formatCount(progress.trialsTotal)} trials`
    let when: string
    switch (status) {
      case 'queued':
        when = 'waiting for a worker'
        break
      case 'running': {
        const left = secondsLeft(last, receivedAt, now)
        when = left === null ? 'estimating time left…' : `about ${formatDuration(left)} left`
        break
      }
      case 'succeeded':
        when = progress.elapsedSeconds === null ? 'done' : `done in ${formatDuration(progress.elapsedSeconds)}`
        break
      case 'failed':
        when = 'stopped by an error'
        break
      case 'canceled':
        when = 'canceled'
        break
    }
    const summary = `${percent} · ${trials} · ${when}`
    text.textContent = compact ? `${percent} · ${when}` : summary
    bar.setAttribute('aria-valuetext', summary)
    bar.title = summary
  }

  return {
    el,
    update (status) {
      last = status
      receivedAt = Date.now()
      render(receivedAt)
    },
    tick: render
  }
}

/**
 * Asks a yes/no question in a modal dialog. The safe choice has the focus, so Enter or Escape
 * never does the harmful thing by accident.
 */
export function confirmAction (options: { title: string, body: string, confirm: string, keep: string }): Promise<boolean> {
  return new Promise((resolve) => {
    const keepButton = h('button', { type: 'submit', value: 'keep', class: 'secondary' }, options.keep)
    const dialog = h('dialog', { class: 'confirm-dialog', 'aria-labelledby': 'confirm-title', 'aria-describedby': 'confirm-body' },
      h('form', { method: 'dialog' },
        h('h2', { id: 'confirm-title' }, options.title),
        h('p', { id: 'confirm-body' }, options.body),
        h('div', { class: 'actions' },
          keepButton,
          h('button', { type: 'submit', value: 'confirm', class: 'danger' }, options.confirm))))
    dialog.addEventListener('close', () => {
      dialog.remove()
      resolve(dialog.returnValue === 'confirm')
    })
    document.body.append(dialog)
    dialog.showModal()
    keepButton.focus()
  })
}

/** Announces a short message in the notice area (polite live region) for a few seconds. */
export function notify (message: string, kind: 'info' | 'error' = 'info'): void {
  const area = document.getElementById('notices')
  if (area === null) return
  const note = h('p', { class: `notice notice-${kind}` }, message)
  area.append(note)
  setTimeout(() => note.remove(), kind === 'error' ? 9000 : 5000)
}

/** The message of any thrown value, for the page. */
export function messageOf (error: unknown): string {
  return error instanceof Error ? error.message : String(error)
}

/**
 * Starts a task nobody awaits (an event handler's work). The tasks handle their expected
 * failures themselves; anything unexpected is shown rather than lost.
 */
export function inBackground (task: Promise<unknown>): void {
  task.catch((error: unknown) => notify(`Something went wrong: ${messageOf(error)}`, 'error'))
}
