/**
 * A new sweep: start from an example (or the draft of this tab), edit it as a form or as
 * JSON, see it checked by the validation route as you type, with each problem at its field,
 * and the work it would take, then submit it.
 */
import { ApiProblem, submitSweep, validateSpec } from '../api.js'
import { fill, h } from '../dom.js'
import { freshSeed, loadDraft, saveDraft } from '../drafts.js'
import { formatBytes, formatCount, formatDuration } from '../format.js'
import type { Dispose } from '../main.js'
import { routeHref } from '../router.js'
import { buildSpecForm, initialView, type FormView, type SpecForm } from '../spec-form.js'
import { assignIssues, lineAndColumn, lineOfPath } from '../spec-paths.js'
import type { FieldIssue, Spec, Validation } from '../types.js'
import { inBackground, confirmAction, messageOf } from '../widgets.js'

interface Example { name: string, spec: Spec }

/** Pause after the last keystroke before the spec is checked. */
const CHECK_DELAY_MS = 300

let examplesCache: Promise<Example[]> | null = null
function loadExamples (): Promise<Example[]> {
  examplesCache ??= fetch(new URL('assets/examples.json', document.baseURI)).then(async (response) => {
    if (!response.ok) throw new Error(`examples: HTTP ${response.status}`)
    return await response.json() as Example[]
  }).catch((error: unknown) => {
    examplesCache = null
    throw error
  })
  return examplesCache
}

const LIMIT_NAMES: Record<string, string> = {
  maxNeurons: 'neurons per network',
  maxPoints: 'grid points',
  maxTrials: 'trials in all',
  maxBytes: 'memory per worker',
  maxCpuSeconds: 'CPU time'
}

function limitValue (name: string, value: number): string {
  if (name === 'maxBytes') return formatBytes(value)
  if (name === 'maxCpuSeconds') return formatDuration(value)
  return formatCount(value)
}

const clone = (spec: Spec): Spec => JSON.parse(JSON.stringify(spec)) as Spec

export function renderSubmit (main: HTMLElement, from: string | null): Dispose {
  const stop = new AbortController()
  let spec: Spec = loadDraft() ?? {}
  let view: FormView = initialView(spec)
  let mode: 'form' | 'json' = 'form'
  let form: SpecForm | null = null
  let dirty = false
  let checkTimer: ReturnType<typeof setTimeout> | null = null
  let checking: AbortController | null = null
  let checked: { text: string, validation: Validation } | null = null
  let submitKey: string | null = null
  let submitting = false

  const exampleSelect = h('select', { id: 'example-select' })
  const editorSlot = h('div', { class: 'editor-slot' })
  const otherIssues = h('div', { class: 'other-issues', role: 'alert', hidden: true })
  const jsonArea = h('textarea', { id: 'spec-json', class: 'json-editor', spellcheck: 'false', wrap: 'off', rows: 28, 'aria-describedby': 'spec-json-issues' })
  const jsonIssues = h('div', { id: 'spec-json-issues', class: 'field-error', hidden: true })
  const checkState = h('p', { class: 'check-state', id: 'check-state', role: 'status' })
  const estimates = h('dl', { class: 'estimates', hidden: true })
  const exceededNote = h('p', { class: 'limit-note', hidden: true })
  const reuseBox = h('input', { type: 'checkbox', id: 'reuse' })
  const submitButton = h('button', { type: 'button', class: 'primary wide', id: 'submit-sweep', disabled: true, 'aria-describedby': 'check-state', onclick: () => { inBackground(submit()) } }, 'Submit sweep')
  const submitProblem = h('p', { class: 'field-error', role: 'alert', hidden: true })

  const specText = (): string => JSON.stringify(spec)

  const setCheckState = (kind: 'idle' | 'checking' | 'valid' | 'invalid' | 'error', text: string): void => {
    checkState.dataset.state = kind
    checkState.textContent = text
  }

  const updateSubmit = (): void => {
    const ready = checked !== null && checked.text === specText() && checked.validation.exceeded === null
    submitButton.disabled = !ready || submitting
  }

  const showIssues = (issues: readonly FieldIssue[]): void => {
    const paths = form?.fieldPaths ?? []
    const { byField, others } = assignIssues(issues, mode === 'form' ? paths : [])
    form?.showIssues(mode === 'form' ? byField : new Map())
    const text = jsonArea.value
    const describe = (issue: FieldIssue): HTMLElement => {
      const line = mode === 'json' ? lineOfPath(text, issue.path) : null
      return h('li', {},
        issue.path === '' ? 'The spec' : h('code', {}, issue.path),
        line === null ? '' : [' (', h('button', { type: 'button', class: 'link-button', onclick: () => goToLine(line) }, `line ${line}`), ')'],
        `: ${issue.message}`)
    }
    if (mode === 'json') {
      jsonIssues.hidden = issues.length === 0
      fill(jsonIssues, issues.length === 0 ? null : h('ul', {}, issues.map(describe)))
      jsonArea.toggleAttribute('aria-invalid', issues.length > 0)
      otherIssues.hidden = true
      return
    }
    otherIssues.hidden = others.length === 0
    fill(otherIssues, others.length === 0
      ? null
      : [h('p', {}, 'Problems that no form field shows (see the JSON view):'), h('ul', {}, others.map(describe))])
  }

  const showEstimates = (validation: Validation): void => {
    const { work, limits, exceeded } = validation
    estimates.hidden = false
    estimates.classList.remove('stale')
    const row = (term: string, value: string, detail: string): HTMLElement[] => [h('dt', {}, term), h('dd', {}, h('strong', {}, value), detail === '' ? '' : h('span', { class: 'of-limit' }, ` ${detail}`))]
    fill(estimates,
      row('Grid points', formatCount(work.points), `(limit ${formatCount(limits.maxPoints)})`),
      row('Trials', formatCount(work.trials), `= ${formatCount(work.points)} × ${formatCount(work.trialsPerPoint)} (limit ${formatCount(limits.maxTrials)})`),
      row('Peak memory', formatBytes(work.peakBytes), `per worker (limit ${formatBytes(limits.maxBytes)})`),
      row('CPU time', `≈ ${formatDuration(work.cpuSeconds)}`, `on one core${limits.maxCpuSeconds === null ? '' : ` (limit ${formatDuration(limits.maxCpuSeconds)})`}; several workers share it`))
    exceededNote.hidden = exceeded === null
    if (exceeded !== null) {
      const name = LIMIT_NAMES[exceeded.name] ?? exceeded.name
      exceededNote.textContent = `Too large for this server: ${limitValue(exceeded.name, exceeded.value)} ${name}, above its limit of ${limitValue(exceeded.name, exceeded.max)}. Make the grid or the trials smaller.`
    }
  }

  const check = async (): Promise<void> => {
    checking?.abort()
    const controller = new AbortController()
    checking = controller
    const text = specText()
    setCheckState('checking', 'Checking the spec…')
    try {
      const validation = await validateSpec(spec, controller.signal)
      if (controller.signal.aborted) return
      checked = { text, validation }
      showIssues([])
      showEstimates(validation)
      setCheckState(validation.exceeded === null ? 'valid' : 'invalid',
        validation.exceeded === null ? 'The spec is valid.' : 'The spec is valid but too large for this server.')
    } catch (error) {
      if (controller.signal.aborted) return
      checked = null
      estimates.hidden = true
      exceededNote.hidden = true
      if (error instanceof ApiProblem && error.problem.errors !== undefined && error.problem.errors.length > 0) {
        const count = error.problem.errors.length
        showIssues(error.problem.errors)
        setCheckState('invalid', `${count} problem${count === 1 ? '' : 's'}: ${mode === 'form' ? 'see the marked fields' : 'see the list under the JSON'}.`)
      } else if (error instanceof ApiProblem && error.status === 429) {
        const wait = error.problem.retryAfter ?? 5
        setCheckState('error', `The server asks to slow down; checking again in ${wait} s.`)
        checkTimer = setTimeout(() => { inBackground(check()) }, wait * 1000)
      } else {
        showIssues([])
        setCheckState('error', `Could not check the spec: ${messageOf(error)}`)
      }
    } finally {
      if (checking === controller) checking = null
      updateSubmit()
    }
  }

  const scheduleCheck = (): void => {
    if (checkTimer !== null) clearTimeout(checkTimer)
    checked = null
    submitKey = null
    // Numbers of the previous spec stay visible but dimmed until the new ones arrive.
    estimates.classList.add('stale')
    setCheckState('checking', 'Checking the spec…')
    updateSubmit()
    checkTimer = setTimeout(() => { checkTimer = null; inBackground(check()) }, CHECK_DELAY_MS)
  }

  const onEdit = (structural: boolean): void => {
    dirty = true
    saveDraft(spec)
    if (structural) renderEditor()
    scheduleCheck()
  }

  function renderEditor (): void {
    const focused = document.activeElement?.id ?? null
    if (mode === 'form') {
      form = buildSpecForm(spec, view, onEdit, freshSeed)
      fill(editorSlot, form.el)
    } else {
      form = null
      jsonArea.value = JSON.stringify(spec, null, 2)
      fill(editorSlot,
        h('label', { for: 'spec-json', class: 'json-label' }, 'The spec as JSON'),
        h('p', { class: 'hint' }, 'Everything the format allows, including supplied patterns (family.data). The form shows the same spec.'),
        jsonArea,
        jsonIssues)
    }
    if (focused !== null) document.getElementById(focused)?.focus()
  }

  /** Selects a line of the JSON and scrolls it into view. */
  const goToLine = (line: number): void => {
    const lines = jsonArea.value.split('\n')
    const start = lines.slice(0, line - 1).reduce((sum, l) => sum + l.length + 1, 0)
    jsonArea.focus()
    jsonArea.setSelectionRange(start, start + (lines[line - 1]?.length ?? 0))
    const lineHeight = parseFloat(getComputedStyle(jsonArea).lineHeight) || 20
    jsonArea.scrollTop = Math.max(0, (line - 4) * lineHeight)
  }

  jsonArea.addEventListener('input', () => {
    let parsed: unknown
    try {
      parsed = JSON.parse(jsonArea.value)
    } catch (error) {
      const at = /position (\d+)/.exec(messageOf(error))
      const where = at === null ? '' : (() => { const p = lineAndColumn(jsonArea.value, Number(at[1])); return ` at line ${p.line}, column ${p.column}` })()
      checked = null
      updateSubmit()
      if (checkTimer !== null) clearTimeout(checkTimer)
      checking?.abort()
      jsonIssues.hidden = false
      fill(jsonIssues, h('p', {}, `This is not valid JSON${where}.`))
      jsonArea.setAttribute('aria-invalid', 'true')
      estimates.classList.add('stale')
      setCheckState('invalid', 'Fix the JSON first.')
      return
    }
    if (parsed === null || typeof parsed !== 'object' || Array.isArray(parsed)) {
      fill(jsonIssues, h('p', {}, 'A spec is a JSON object: { … }.'))
      jsonIssues.hidden = false
      setCheckState('invalid', 'Fix the JSON first.')
      return
    }
    spec = parsed as Spec
    view = initialView(spec)
    dirty = true
    saveDraft(spec)
    scheduleCheck()
  })

  const modeRadios = (['form', 'json'] as const).map((value) => h('span', { class: 'choice' },
    h('input', {
      type: 'radio',
      name: 'edit-mode',
      id: `edit-mode-${value}`,
      value,
      checked: value === mode,
      onchange: () => {
        mode = value
        renderEditor()
        scheduleCheck()
      }
    }),
    h('label', { for: `edit-mode-${value}` }, value === 'form' ? 'Form' : 'JSON')))

  const useExample = async (name: string, ask: boolean): Promise<void> => {
    const examples = await loadExamples()
    const example = examples.find((e) => e.name === name)
    if (example === undefined) return
    if (ask && dirty) {
      const sure = await confirmAction({
        title: 'Replace the spec you are editing?',
        body: `Your edits are replaced by the example “${example.name}”.`,
        confirm: 'Replace it',
        keep: 'Keep my edits'
      })
      if (!sure) return
    }
    spec = clone(example.spec)
    view = initialView(spec)
    dirty = false
    saveDraft(spec)
    renderEditor()
    scheduleCheck()
  }

  async function submit (): Promise<void> {
    if (submitButton.disabled) return
    submitting = true
    updateSubmit()
    submitProblem.hidden = true
    submitKey ??= crypto.randomUUID()
    submitButton.textContent = 'Submitting…'
    try {
      const sweep = await submitSweep(spec, { reuse: reuseBox.checked, idempotencyKey: submitKey })
      dirty = false
      location.hash = routeHref({ page: 'sweep', id: sweep.id })
    } catch (error) {
      submitProblem.hidden = false
      if (error instanceof ApiProblem && error.problem.errors !== undefined) {
        showIssues(error.problem.errors)
        submitProblem.textContent = 'The server refused the spec: see the marked fields.'
      } else {
        submitProblem.textContent = `Not submitted: ${messageOf(error)}`
      }
    } finally {
      submitting = false
      submitButton.textContent = 'Submit sweep'
      updateSubmit()
    }
  }

  main.append(
    h('div', { class: 'page-head' }, h('h1', {}, 'New sweep')),
    h('div', { class: 'submit-layout' },
      h('div', { class: 'editor' },
        h('div', { class: 'start-row' },
          h('div', { class: 'control' }, h('label', { for: 'example-select' }, 'Start from an example'), exampleSelect),
          h('button', { type: 'button', class: 'secondary', id: 'use-example', onclick: () => { inBackground(useExample(exampleSelect.value, true)) } }, 'Use this example'),
          h('fieldset', { class: 'edit-mode' }, h('legend', {}, 'Edit as'), modeRadios)),
        otherIssues,
        editorSlot),
      h('aside', { class: 'check-panel', 'aria-labelledby': 'check-heading' },
        h('h2', { id: 'check-heading' }, 'Before you submit'),
        checkState,
        estimates,
        exceededNote,
        h('div', { class: 'field checkbox' },
          reuseBox,
          h('label', { for: 'reuse' }, 'Reuse my identical finished sweep, if any'),
          h('p', { class: 'help' }, 'Same spec and seed give the same results, so they can be returned at once.')),
        submitButton,
        submitProblem)))

  loadExamples().then((examples) => {
    fill(exampleSelect, examples.map((e) => h('option', { value: e.name, selected: e.name === from }, `${e.name}: ${String(e.spec.label ?? '')}`)))
    const wanted = from !== null ? from : Object.keys(spec).length === 0 ? examples[0]?.name : undefined
    if (wanted !== undefined) inBackground(useExample(wanted, false))
  }, (error: unknown) => {
    fill(exampleSelect, h('option', { value: '' }, 'examples unavailable'))
    setCheckState('error', `Could not load the examples: ${messageOf(error)}`)
  })
  renderEditor()
  if (Object.keys(spec).length > 0) scheduleCheck()
  else setCheckState('idle', 'Loading an example…')

  return () => {
    stop.abort()
    checking?.abort()
    if (checkTimer !== null) clearTimeout(checkTimer)
  }
}
