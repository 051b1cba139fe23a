/**
 * The research workflow on a sweep's page: extend it (more trials per point, more values on an
 * axis; POST …/extend), and describe it (label, tags, notes; PATCH). Each is a small form that
 * says what the server will do and shows the server's problems at the form.
 */
import { annotateSweep, ApiProblem, extendSweep, type Extension } from './api.js'
import { h, uid } from './dom.js'
import { formatCount, formatGridValue } from './format.js'
import { parameterName } from './labels.js'
import { specAxes, valueAt } from './model-line.js'
import { routeHref } from './router.js'
import { parseList } from './spec-paths.js'
import type { Spec, SweepDetail } from './types.js'
import { messageOf, notify } from './widgets.js'

/** Parameters that can take more values when the spec holds them constant. */
const EXTENDABLE_CONSTANTS = ['neurons', 'load', 'patterns', 'cue.fraction', 'dynamics.temperature', 'dilution.keep', 'dilution.inDegree', 'family.activity']

/** Numeric axes of a spec (path and values) and numeric constants that could become axes. */
export function extendableParameters (spec: Spec): Array<{ path: string, values: number[] }> {
  const found = specAxes(spec)
    .filter((axis): axis is { path: string, values: number[] } => axis.values.every((value) => typeof value === 'number'))
  for (const path of EXTENDABLE_CONSTANTS) {
    const value = valueAt(spec, path)
    if (typeof value === 'number' && !found.some((entry) => entry.path === path)) found.push({ path, values: [value] })
  }
  return found
}

function problemText (error: unknown): string {
  if (error instanceof ApiProblem) {
    const issues = (error.problem.errors ?? []).map((issue) => `${issue.path === '' ? '' : `${issue.path}: `}${issue.message}`)
    return issues.length > 0 ? `${error.message} (${issues.join('; ')})` : error.message
  }
  return messageOf(error)
}

function field (label: string, control: HTMLElement, hint?: string): HTMLElement {
  return h('div', { class: 'field' }, h('label', { for: control.id }, label), control, hint === undefined ? null : h('p', { class: 'hint' }, hint))
}

/** "Extend this sweep": more trials, more values on one parameter, or both. */
export function extendForm (detail: SweepDetail): HTMLElement {
  const spec = detail.spec
  const trialsNow = typeof spec.trials === 'number' ? spec.trials : null
  const parameters = extendableParameters(spec)
  const trials = h('input', { id: uid('ext'), type: 'number', inputmode: 'numeric', min: trialsNow ?? 1, step: 1, placeholder: trialsNow === null ? '' : String(trialsNow), name: 'trials' })
  const axis = h('select', { id: uid('ext'), name: 'axis' },
    h('option', { value: '' }, 'no new values'),
    parameters.map(({ path, values }) => h('option', { value: path }, `${parameterName(path)} (now ${values.slice(0, 4).map((v) => formatGridValue(v, 4)).join(', ')}${values.length > 4 ? ', …' : ''})`)))
  const values = h('input', { id: uid('ext'), type: 'text', inputmode: 'decimal', name: 'values', placeholder: 'e.g. 0.13, 0.15', autocomplete: 'off' })
  const label = h('input', { id: uid('ext'), type: 'text', name: 'label', value: detail.label ?? '', maxlength: 200 })
  const problem = h('p', { class: 'field-error', role: 'alert', hidden: true })
  const submit = h('button', { type: 'submit', class: 'primary' }, 'Extend sweep')
  const form = h('form', {
    class: 'workflow-form extend-form',
    novalidate: true,
    onsubmit: async (event: Event) => {
      event.preventDefault()
      problem.hidden = true
      const extension: Extension = {}
      if (trials.value.trim() !== '') extension.trials = Number(trials.value)
      if (axis.value !== '' || values.value.trim() !== '') {
        const parsed = parseList(values.value)
        const list = parsed.filter((value): value is number => typeof value === 'number')
        if (axis.value === '' || list.length === 0 || list.length !== parsed.length) {
          problem.hidden = false
          problem.textContent = axis.value === '' ? 'Pick the parameter the new values belong to.' : 'Write the new values as numbers separated by commas.'
          return
        }
        extension.add = { [axis.value]: list }
      }
      if (extension.trials === undefined && extension.add === undefined) {
        problem.hidden = false
        problem.textContent = 'Give more trials per point, new values, or both.'
        return
      }
      if (label.value.trim() !== (detail.label ?? '')) extension.label = label.value.trim() === '' ? null : label.value.trim()
      submit.disabled = true
      try {
        const created = await extendSweep(detail.id, extension)
        notify(`Extension submitted: ${formatCount(created.reused.trials)} of its ${formatCount(created.progress.trialsTotal)} trials come from earlier sweeps, ${formatCount(created.progress.trialsTotal - created.reused.trials)} are computed.`)
        location.hash = routeHref({ page: 'sweep', id: created.id })
      } catch (error) {
        problem.hidden = false
        problem.textContent = `Not extended: ${problemText(error)}`
      } finally {
        submit.disabled = false
      }
    }
  },
  h('p', { class: 'hint' }, 'A new sweep is made; every trial this one stored is reused and only the missing ones are computed. Its rows equal those of a fresh run of the larger spec.'),
  h('div', { class: 'form-row' },
    field('Trials per point', trials, trialsNow === null ? undefined : `now ${formatCount(trialsNow)}; leave empty to keep`),
    field('Add values to', axis),
    field('New values', values)),
  field('Label of the new sweep', label),
  problem,
  h('div', { class: 'actions' }, submit))
  return form
}

/** Label, tags and notes, saved with PATCH; `onSaved` gets the updated sweep. */
export function describeForm (detail: SweepDetail, onSaved: (updated: SweepDetail) => void): HTMLElement {
  const label = h('input', { id: uid('ann'), type: 'text', name: 'label', value: detail.label ?? '', maxlength: 200 })
  const tags = h('input', { id: uid('ann'), type: 'text', name: 'tags', value: detail.tags.join(', '), placeholder: 'e.g. transition, draft-2', autocomplete: 'off' })
  const notes = h('textarea', { id: uid('ann'), name: 'notes', rows: 3, maxlength: 4000 }, detail.notes ?? '')
  const problem = h('p', { class: 'field-error', role: 'alert', hidden: true })
  const save = h('button', { type: 'submit', class: 'secondary' }, 'Save')
  return h('form', {
    class: 'workflow-form describe-form',
    novalidate: true,
    onsubmit: async (event: Event) => {
      event.preventDefault()
      problem.hidden = true
      const tagList = [...new Set(tags.value.split(',').map((tag) => tag.trim()).filter((tag) => tag !== ''))]
      save.disabled = true
      try {
        const updated = await annotateSweep(detail.id, {
          label: label.value.trim() === '' ? null : label.value.trim(),
          tags: tagList,
          notes: notes.value.trim() === '' ? null : notes.value
        })
        notify('Saved.')
        onSaved(updated)
      } catch (error) {
        problem.hidden = false
        problem.textContent = `Not saved: ${problemText(error)}`
      } finally {
        save.disabled = false
      }
    }
  },
  field('Label', label),
  field('Tags', tags, 'Separated by commas; the list of sweeps filters by them.'),
  field('Notes', notes),
  problem,
  h('div', { class: 'actions' }, save))
}

/** Tags as small marks, each a link to the list filtered by it. */
export function tagMarks (tags: readonly string[]): HTMLElement | null {
  if (tags.length === 0) return null
  return h('ul', { class: 'tags', 'aria-label': 'Tags' }, tags.map((tag) => h('li', {}, h('a', { href: routeHref({ page: 'list', tag }) }, tag))))
}
