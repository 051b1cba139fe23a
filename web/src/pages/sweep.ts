/**
 * One sweep: what it is (normalised spec, provenance), how far it is (live), and what came out
 * (figure, table, downloads), with copy, re-run and cancel.
 */
import { ApiProblem, cancelSweep, download, followSweep, getJson, getSweep, purgeSweep, resumeSweep, submitSweep, sweepPath, TERMINAL } from '../api.js'
import { copyText } from '../clipboard.js'
import { fill, h } from '../dom.js'
import { freshSeed, saveDraft } from '../drafts.js'
import { analysisView } from '../analysis-view.js'
import { figurePanel } from '../figure-panel.js'
import { liveFigure, type LiveFigure } from '../live-figure.js'
import { modelLine, specAxes } from '../model-line.js'
import { describeForm, extendForm, tagMarks } from '../sweep-workflow.js'
import { formatAgo, formatCount, formatStamp } from '../format.js'
import { parameterName, rerunLabel } from '../labels.js'
import type { Dispose } from '../main.js'
import { resultsTable } from '../results-table.js'
import { routeHref } from '../router.js'
import type { Spec, SweepDetail, SweepResult, SweepStatus } from '../types.js'
import { inBackground, confirmAction, messageOf, notify, progressView, statusBadge } from '../widgets.js'

function describeGrid (spec: Spec): string {
  const axes = specAxes(spec).map(({ path, values }) => `${parameterName(path)} (${values.length})`)
  return axes.length === 0 ? 'a single point' : axes.join(' × ')
}

function metaList (entries: Array<[string, Node | string]>): HTMLDListElement {
  return h('dl', { class: 'meta' }, entries.flatMap(([term, value]) => [h('dt', {}, term), h('dd', {}, value)]))
}

function timeNode (iso: string | null): Node | string {
  if (iso === null) return '–'
  return h('time', { datetime: iso, title: iso }, `${formatStamp(iso)} (${formatAgo(iso, Date.now())})`)
}

export function renderSweep (main: HTMLElement, id: string): Dispose {
  const stop = new AbortController()
  let ticker: ReturnType<typeof setInterval> | null = null
  const head = h('div', { class: 'page-head' }, h('h1', {}, 'Sweep'))
  const body = h('div', { class: 'sweep-page' }, h('p', { class: 'loading' }, 'Loading the sweep…'))
  main.append(h('p', { class: 'crumbs' }, h('a', { href: '#/' }, '← All sweeps')), head, body)

  const progress = progressView('this sweep')
  const statusSlot = h('span', { class: 'status-slot' })
  const actions = h('div', { class: 'actions sweep-actions' })
  const failure = h('div', { class: 'failure', role: 'alert', hidden: true })
  const resultsSlot = h('div', { class: 'results-slot' })
  const liveSlot = h('div', { class: 'live-slot' })
  const workflowSlot = h('div', { class: 'workflow-slot' })
  const subhead = h('div', { class: 'sweep-subhead' })
  let current: SweepDetail | null = null
  let resultsShown = false
  let live: LiveFigure | null = null

  const rerun = async (detail: SweepDetail): Promise<void> => {
    const seed = freshSeed()
    const sure = await confirmAction({
      title: 'Run this sweep again with a new seed?',
      body: `A copy of this spec is submitted with master seed ${seed} (this one used ${String(detail.spec.seed)}). Everything else stays the same, so the two runs are independent replicates.`,
      confirm: 'Submit the copy',
      keep: 'Not now'
    })
    if (!sure) return
    try {
      const submitted = await submitSweep({ ...detail.spec, seed, label: rerunLabel(detail.label, seed) }, { reuse: false, idempotencyKey: crypto.randomUUID() })
      location.hash = routeHref({ page: 'sweep', id: submitted.id })
    } catch (error) {
      notify(`The copy was not submitted: ${messageOf(error)}`, 'error')
    }
  }

  const resume = async (detail: SweepDetail): Promise<void> => {
    try {
      const resumed = await resumeSweep(detail.id)
      notify(`Resumed: ${formatCount(resumed.progress.chunksDone)} of ${formatCount(resumed.progress.chunksTotal)} chunks were kept, the rest is computed now.`)
      live = null
      renderDetail(resumed)
    } catch (error) {
      notify(`Could not resume: ${messageOf(error)}`, 'error')
    }
  }

  const purge = async (detail: SweepDetail): Promise<void> => {
    const sure = await confirmAction({
      title: 'Remove this sweep for good?',
      body: `“${detail.label ?? detail.id}” is removed with its stored trials and its results. This cannot be undone; sweeps that copied its trials keep their copies.`,
      confirm: 'Remove for good',
      keep: 'Keep it'
    })
    if (!sure) return
    try {
      await purgeSweep(detail.id)
      notify(`Removed “${detail.label ?? detail.id}”.`)
      location.hash = routeHref({ page: 'list' })
    } catch (error) {
      notify(`Could not remove: ${messageOf(error)}`, 'error')
    }
  }

  const renderActions = (detail: SweepDetail): void => {
    const label = detail.label ?? detail.id
    const finished = TERMINAL.has(detail.status)
    const resumable = detail.status === 'canceled' || detail.status === 'failed'
    fill(actions,
      resumable ? h('button', { type: 'button', class: 'primary', onclick: () => { inBackground(resume(detail)) } }, 'Resume') : null,
      h('button', {
        type: 'button',
        class: 'secondary',
        onclick: async () => {
          const copied = await copyText(JSON.stringify(detail.spec, null, 2))
          notify(copied ? 'The normalised spec is on the clipboard.' : 'Copying was refused by the browser; select the spec below instead.', copied ? 'info' : 'error')
        }
      }, 'Copy spec'),
      h('button', { type: 'button', class: 'secondary', onclick: () => { inBackground(rerun(detail)) } }, 'Re-run with a new seed'),
      h('button', {
        type: 'button',
        class: 'secondary',
        onclick: () => {
          saveDraft({ ...detail.spec, label: detail.label ?? undefined })
          location.hash = routeHref({ page: 'submit', from: null })
        }
      }, 'Edit a copy'),
      h('a', { class: 'button secondary', href: routeHref({ page: 'list', replicatesOf: detail.id }) }, 'Replicates'),
      finished
        ? h('button', { type: 'button', class: 'danger-outline', onclick: () => { inBackground(purge(detail)) } }, 'Remove…')
        : h('button', {
          type: 'button',
          class: 'danger-outline',
          onclick: async () => {
            const sure = await confirmAction({
              title: 'Cancel this sweep?',
              body: `“${label}” stops within about a second. The points it finished are kept: you can resume it later, and nothing finished is computed again.`,
              confirm: 'Cancel sweep',
              keep: 'Keep it running'
            })
            if (!sure) return
            try {
              applyStatus(await cancelSweep(detail.id))
            } catch (error) {
              notify(`Could not cancel: ${messageOf(error)}`, 'error')
            }
          }
        }, 'Cancel sweep'))
  }

  /** Extend (finished sweeps) and the description form. */
  const renderWorkflow = (detail: SweepDetail): void => {
    const finished = TERMINAL.has(detail.status)
    fill(workflowSlot,
      finished
        ? h('details', { class: 'panel fold refine' }, h('summary', {}, h('h2', {}, 'Extend: more trials or more values')), extendForm(detail))
        : null,
      h('details', { class: 'panel fold describe' }, h('summary', {}, h('h2', {}, 'Label, tags and notes')), describeForm(detail, (updated) => {
        if (current === null) return
        current = { ...current, ...updated }
        renderHead(current)
        renderWorkflow(current)
      })))
  }

  /** The partial figure of a sweep that has not succeeded, fed by its progress events. */
  const showLive = (detail: SweepStatus): void => {
    if (detail.status === 'succeeded') {
      live = null
      fill(liveSlot)
      return
    }
    if (live === null) {
      live = liveFigure(detail.id, stop.signal)
      fill(liveSlot, live.el)
    }
    live.update(detail)
  }

  const showResults = async (detail: SweepDetail): Promise<void> => {
    if (resultsShown) return
    resultsShown = true
    fill(resultsSlot, h('p', { class: 'loading' }, 'Loading the results…'))
    let result: SweepResult
    try {
      result = await getJson<SweepResult>(`${sweepPath(detail.id)}/results`, { signal: stop.signal })
    } catch (error) {
      if (stop.signal.aborted) return
      resultsShown = false
      fill(resultsSlot, h('p', { class: 'page-error', role: 'alert' }, `Could not load the results: ${messageOf(error)}`))
      return
    }
    const label = detail.label ?? 'Untitled sweep'
    // An analysis (threshold search) has searches instead of grid rows, and its own figure.
    const isAnalysis = result.searches !== undefined
    const figure = isAnalysis
      ? null
      : figurePanel({
        route: `${sweepPath(detail.id)}/figure.svg`,
        query: {},
        fileStem: `memsweep-${detail.id}`,
        results: [{ name: label, result }],
        title: label,
        seriesControl: true
      }, stop.signal)
    const analysis = isAnalysis ? analysisView(result) : null
    const saveFigure = async (): Promise<void> => {
      if (figure !== null) { await figure.downloadSvg(); return }
      const svg = analysis?.querySelector('svg.plot')
      if (svg === null || svg === undefined) return
      const href = URL.createObjectURL(new Blob([new XMLSerializer().serializeToString(svg)], { type: 'image/svg+xml' }))
      const link = h('a', { href, download: `memsweep-${detail.id}-search.svg` })
      document.body.append(link)
      link.click()
      link.remove()
      setTimeout(() => URL.revokeObjectURL(href), 10_000)
    }
    const downloads = h('section', { class: 'panel downloads', 'aria-labelledby': 'downloads-heading' },
      h('h2', { id: 'downloads-heading' }, 'Downloads'),
      h('div', { class: 'actions' },
        h('button', { type: 'button', class: 'secondary', 'data-download': 'csv', onclick: () => { inBackground(save(`${sweepPath(detail.id)}/results?format=csv`, `memsweep-${detail.id}.csv`, 'text/csv')) } }, 'Results (CSV)'),
        h('button', { type: 'button', class: 'secondary', 'data-download': 'json', onclick: () => { inBackground(save(`${sweepPath(detail.id)}/results?format=json`, `memsweep-${detail.id}.json`, 'application/json')) } }, 'Results (JSON)'),
        h('button', { type: 'button', class: 'secondary', 'data-download': 'svg', onclick: () => { saveFigure().catch((error: unknown) => notify(`Could not download the figure: ${messageOf(error)}`, 'error')) } }, 'Figure (SVG)'),
        figure === null ? null : h('button', { type: 'button', class: 'secondary', 'data-download': 'pdf', onclick: () => { figure.downloadPrint('pdf').catch((error: unknown) => notify(`Could not download the figure: ${messageOf(error)}`, 'error')) } }, 'Figure (PDF, one column)'),
        figure === null ? null : h('button', { type: 'button', class: 'secondary', 'data-download': 'png', onclick: () => { figure.downloadPrint('png').catch((error: unknown) => notify(`Could not download the figure: ${messageOf(error)}`, 'error')) } }, 'Figure (PNG, 300 dpi)'),
        h('button', { type: 'button', class: 'secondary', 'data-download': 'bundle', onclick: () => { inBackground(save(`${sweepPath(detail.id)}/bundle.zip`, `memsweep-${detail.id}.zip`, 'application/zip')) } }, 'Bundle for a paper (zip)')),
      h('p', { class: 'hint' }, isAnalysis
        ? 'The JSON holds every search with all its steps and fits; the CSV one row per search.'
        : 'CSV and JSON hold one row per grid point with every measure, its uncertainty and the theory values; the per-trial rows are in the API (?trials=true). The bundle holds the spec, results, figure and provenance with a README saying how to reproduce them.'))
    const provenance = h('section', { class: 'panel', 'aria-labelledby': 'provenance-heading' },
      h('h2', { id: 'provenance-heading' }, 'Provenance'),
      metaList(Object.entries(result.provenance).map(([key, value]): [string, string] => [key, String(value)])))
    fill(resultsSlot,
      figure === null ? null : h('section', { class: 'panel figure-panel', 'aria-labelledby': 'figure-heading' }, h('h2', { id: 'figure-heading' }, 'Figure'), figure.el),
      analysis ?? h('section', { class: 'panel', 'aria-labelledby': 'table-heading' }, h('h2', { id: 'table-heading' }, 'Results'), resultsTable(result)),
      h('div', { class: 'two-up' }, downloads, provenance))
  }

  async function save (path: string, name: string, accept: string): Promise<void> {
    try {
      await download(path, name, accept)
    } catch (error) {
      notify(`Could not download: ${messageOf(error)}`, 'error')
    }
  }

  function applyStatus (status: SweepStatus): void {
    if (current === null) return
    const changed = current.status !== status.status
    const moved = current.startedAt !== status.startedAt || current.finishedAt !== status.finishedAt
    current = { ...current, ...status }
    progress.update(current)
    showLive(current)
    if (changed || moved) renderRecord(current)
    if (!changed) return
    fill(statusSlot, statusBadge(current.status))
    renderActions(current)
    renderWorkflow(current)
    showFailure(current)
    if (current.status === 'succeeded') inBackground(showResults(current))
  }

  function showFailure (detail: SweepDetail): void {
    failure.hidden = detail.status !== 'failed'
    if (detail.error === null) return
    fill(failure,
      h('h2', {}, detail.error.kind === 'user' ? 'The spec cannot be computed as given' : 'The service failed while running this sweep'),
      h('p', {}, detail.error.message),
      h('p', { class: 'hint' }, detail.error.kind === 'user' ? 'Change the spec (Edit a copy) and submit it again.' : 'Nothing is wrong with the spec: re-running it may work.'))
  }

  const recordPanel = h('section', { class: 'panel', 'aria-labelledby': 'record-heading' })
  const renderRecord = (detail: SweepStatus): void => {
    fill(recordPanel,
      h('h2', { id: 'record-heading' }, 'Record'),
      metaList([
        ['id', h('code', {}, detail.id)],
        ['owner', detail.owner ?? '– (server without tokens)'],
        ['submitted', timeNode(detail.createdAt)],
        ['started', timeNode(detail.startedAt)],
        ['finished', timeNode(detail.finishedAt)],
        ['spec hash', h('code', { class: 'hash' }, detail.specHash)],
        ...(detail.reusedFrom === null ? [] : [['reuses results of', h('a', { href: routeHref({ page: 'sweep', id: detail.reusedFrom }) }, detail.reusedFrom)] as [string, Node]])
      ]))
  }

  function renderHead (detail: SweepDetail): void {
    const label = detail.label ?? 'Untitled sweep'
    document.title = `${label} · memsweep`
    fill(head, h('h1', {}, label), statusSlot)
    fill(subhead,
      h('p', { class: 'model-line' }, modelLine(detail.spec)),
      tagMarks(detail.tags),
      detail.notes === null ? null : h('p', { class: 'notes' }, detail.notes),
      detail.extends === null
        ? (detail.reused.trials > 0 ? h('p', { class: 'hint' }, `${formatCount(detail.reused.trials)} of its trials were taken from earlier sweeps of the same model and seed, not computed again.`) : null)
        : h('p', { class: 'hint' }, 'Extends ', h('a', { href: routeHref({ page: 'sweep', id: detail.extends }) }, detail.extends.slice(0, 8)), `: ${formatCount(detail.reused.trials)} trials reused.`))
  }

  function renderDetail (detail: SweepDetail): void {
    current = detail
    renderHead(detail)
    fill(statusSlot, statusBadge(detail.status))
    progress.update(detail)
    renderActions(detail)
    renderWorkflow(detail)
    showFailure(detail)
    renderRecord(detail)
    const seed = typeof detail.spec.seed === 'number' ? String(detail.spec.seed) : '–'
    resultsShown = false
    fill(body,
      subhead,
      h('section', { class: 'panel live', 'aria-labelledby': 'progress-heading' },
        h('h2', { id: 'progress-heading', class: 'visually-hidden' }, 'Progress'),
        progress.el,
        h('p', { class: 'grid-line' },
          `${formatCount(detail.progress.pointsTotal)} grid points (${describeGrid(detail.spec)}), ${formatCount(detail.progress.trialsTotal)} trials, seed ${seed}.`),
        actions),
      failure,
      liveSlot,
      resultsSlot,
      workflowSlot,
      h('div', { class: 'two-up' },
        recordPanel,
        h('section', { class: 'panel', 'aria-labelledby': 'spec-heading' },
          h('h2', { id: 'spec-heading' }, 'Normalised spec'),
          h('p', { class: 'hint' }, 'Every default filled in and every axis written out; it can be submitted again as it is.'),
          h('pre', { class: 'spec-json', tabindex: 0, 'aria-label': 'Normalised spec as JSON' }, JSON.stringify(detail.spec, null, 2)))))
    showLive(detail)
    if (detail.status === 'succeeded') inBackground(showResults(detail))
    if (!TERMINAL.has(detail.status)) {
      followSweep(detail.id, applyStatus, stop.signal).catch((error: unknown) => {
        if (!stop.signal.aborted) notify(`Live progress stopped: ${messageOf(error)}`, 'error')
      })
    }
  }

  getSweep(id, stop.signal).then(renderDetail, (error: unknown) => {
    if (stop.signal.aborted) return
    const missing = error instanceof ApiProblem && error.status === 404
    fill(head, h('h1', {}, missing ? 'No such sweep' : 'Sweep'))
    fill(body, h('p', { class: 'page-error', role: 'alert' },
      missing ? `There is no sweep ${id} that you can see.` : `Could not load the sweep: ${messageOf(error)}`))
  })
  ticker = setInterval(() => progress.tick(Date.now()), 1000)

  return () => {
    stop.abort()
    if (ticker !== null) clearInterval(ticker)
  }
}
