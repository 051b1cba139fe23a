/**
 * The spec as a form: one field per spec field, each with its help and an error slot that
 * shows the validation route's messages for that field. Any numeric parameter can be one
 * value, a list, or a range, as in the spec format. The spec object is the single source of
 * truth; fields write into it and the form is rebuilt when its shape changes (a kind switched).
 */
import { h, type Child } from './dom.js'
import { axisModeOf, convertAxis, getAt, parseList, parseNumber, setAt, type AxisMode } from './spec-paths.js'
import type { Spec } from './types.js'

export interface SpecForm {
  el: HTMLElement
  /** Paths of every field shown, for sorting errors to them. */
  fieldPaths: string[]
  /** Shows these messages at their fields and clears every other field's. */
  showIssues: (byField: Map<string, string[]>) => void
}

/** `structural`: the form's shape changed and must be rebuilt. */
export type EditHandler = (structural: boolean) => void

const idOf = (path: string, part = 'value'): string => `f-${path.replace(/\./g, '-')}-${part}`

interface FieldBox {
  path: string
  el: HTMLElement
  error: HTMLElement
  inputs: () => HTMLElement[]
}

class FormBuilder {
  readonly fields: FieldBox[] = []
  /** The parameter a threshold search moves: its own field is set by the search. */
  readonly searched: string | null
  constructor (readonly spec: Spec, readonly onEdit: EditHandler) {
    const parameter = getAt(spec, 'analysis.parameter')
    this.searched = typeof parameter === 'string' ? parameter : null
  }

  #box (path: string, label: string, help: string, control: (describedBy: string) => Child[], legend: boolean): HTMLElement {
    const helpId = idOf(path, 'help')
    const errorId = idOf(path, 'error')
    const error = h('div', { class: 'field-error', id: errorId, hidden: true })
    const describedBy = `${errorId} ${helpId}`
    const el = legend
      ? h('fieldset', { class: 'field', 'data-field': path },
        h('legend', {}, label), control(describedBy), h('p', { class: 'help', id: helpId }, help), error)
      : h('div', { class: 'field', 'data-field': path },
        h('label', { for: idOf(path) }, label), control(describedBy), h('p', { class: 'help', id: helpId }, help), error)
    this.fields.push({ path, el, error, inputs: () => [...el.querySelectorAll<HTMLElement>('input, select, textarea')] })
    return el
  }

  text (path: string, label: string, help: string, placeholder: string): HTMLElement {
    const value = getAt(this.spec, path)
    return this.#box(path, label, help, (describedBy) => [h('input', {
      id: idOf(path),
      type: 'text',
      value: typeof value === 'string' ? value : '',
      placeholder,
      maxlength: 200,
      'aria-describedby': describedBy,
      oninput: (event: Event) => {
        const text = (event.target as HTMLInputElement).value
        setAt(this.spec, path, text === '' ? undefined : text)
        this.onEdit(false)
      }
    })], false)
  }

  number (path: string, label: string, help: string, placeholder: string, extra?: (input: HTMLInputElement) => Child): HTMLElement {
    const value = getAt(this.spec, path)
    return this.#box(path, label, help, (describedBy) => {
      const input = h('input', {
        id: idOf(path),
        type: 'text',
        inputmode: 'numeric',
        value: value === undefined || value === null ? '' : typeof value === 'object' ? JSON.stringify(value) : String(value),
        placeholder,
        'aria-describedby': describedBy,
        oninput: () => {
          setAt(this.spec, path, parseNumber(input.value))
          this.onEdit(false)
        }
      })
      return [h('div', { class: 'inline' }, input, extra?.(input))]
    }, false)
  }

  select (path: string, label: string, help: string, options: Array<[string, string]>, fallback: string, onPick?: (value: string) => void): HTMLElement {
    const value = getAt(this.spec, path)
    const current = typeof value === 'string' ? value : fallback
    return this.#box(path, label, help, (describedBy) => [h('select', {
      id: idOf(path),
      'aria-describedby': describedBy,
      onchange: (event: Event) => {
        const picked = (event.target as HTMLSelectElement).value
        if (onPick !== undefined) onPick(picked)
        else setAt(this.spec, path, picked)
        this.onEdit(onPick !== undefined)
      }
    }, options.map(([v, text]) => h('option', { value: v, selected: v === current }, text)))], false)
  }

  checkbox (path: string, label: string, help: string, fallback: boolean): HTMLElement {
    const value = getAt(this.spec, path)
    const helpId = idOf(path, 'help')
    const errorId = idOf(path, 'error')
    const error = h('div', { class: 'field-error', id: errorId, hidden: true })
    const el = h('div', { class: 'field checkbox', 'data-field': path },
      h('input', {
        id: idOf(path),
        type: 'checkbox',
        checked: typeof value === 'boolean' ? value : fallback,
        'aria-describedby': `${errorId} ${helpId}`,
        onchange: (event: Event) => {
          setAt(this.spec, path, (event.target as HTMLInputElement).checked)
          this.onEdit(false)
        }
      }),
      h('label', { for: idOf(path) }, label),
      h('p', { class: 'help', id: helpId }, help),
      error)
    this.fields.push({ path, el, error, inputs: () => [...el.querySelectorAll<HTMLElement>('input')] })
    return el
  }

  /** A numeric parameter that may be varied: one value, a list, or a range by step or by count. */
  axis (path: string, label: string, help: string, placeholder: string): HTMLElement {
    if (path === this.searched) {
      return this.#box(path, label, help, () => [h('p', { class: 'searched' }, 'Moved by the threshold search (see below).')], true)
    }
    const value = getAt(this.spec, path)
    const mode = axisModeOf(value)
    const part = (name: string, text: string, current: unknown, write: (raw: string) => void, describedBy: string, wide = false): HTMLElement => {
      const id = idOf(path, name)
      return h('span', { class: `part${wide ? ' wide' : ''}` },
        h('label', { for: id, class: name === 'value' ? 'visually-hidden' : null }, text),
        h('input', {
          id,
          type: 'text',
          inputmode: 'decimal',
          value: current === undefined ? '' : Array.isArray(current) ? current.join(', ') : String(current),
          placeholder: name === 'value' ? placeholder : '',
          'aria-describedby': describedBy,
          oninput: (event: Event) => { write((event.target as HTMLInputElement).value); this.onEdit(false) }
        }))
    }
    const member = (key: string): unknown => typeof value === 'object' && value !== null ? (value as Record<string, unknown>)[key] : undefined
    const writeMember = (key: string, parse: (raw: string) => unknown) => (raw: string): void => {
      const next = { ...(typeof getAt(this.spec, path) === 'object' ? getAt(this.spec, path) as Record<string, unknown> : {}) }
      const parsed = parse(raw)
      if (parsed === undefined) delete next[key]
      else next[key] = parsed
      setAt(this.spec, path, next)
    }
    const box = this.#box(path, label, help, (describedBy) => {
      const modeSelect = h('select', {
        id: idOf(path, 'mode'),
        'aria-label': `How ${label} is given`,
        onchange: (event: Event) => {
          setAt(this.spec, path, convertAxis(getAt(this.spec, path), (event.target as HTMLSelectElement).value as AxisMode))
          this.onEdit(true)
        }
      },
      h('option', { value: 'single', selected: mode === 'single' }, 'one value'),
      h('option', { value: 'list', selected: mode === 'list' }, 'a list of values'),
      h('option', { value: 'step', selected: mode === 'step' }, 'a range, by step'),
      h('option', { value: 'count', selected: mode === 'count' }, 'a range, by count'))
      let parts: HTMLElement[]
      switch (mode) {
        case 'single':
          parts = [part('value', 'value', typeof value === 'object' && value !== null ? JSON.stringify(value) : value, (raw) => setAt(this.spec, path, parseNumber(raw)), describedBy)]
          break
        case 'list':
          parts = [part('values', 'values, comma-separated', member('values'), (raw) => setAt(this.spec, path, { values: parseList(raw) }), describedBy, true)]
          break
        case 'step':
          parts = [
            part('from', 'from', member('from'), writeMember('from', parseNumber), describedBy),
            part('to', 'to', member('to'), writeMember('to', parseNumber), describedBy),
            part('step', 'step', member('step'), writeMember('step', parseNumber), describedBy)
          ]
          break
        case 'count': {
          const scaleId = idOf(path, 'scale')
          parts = [
            part('from', 'from', member('from'), writeMember('from', parseNumber), describedBy),
            part('to', 'to', member('to'), writeMember('to', parseNumber), describedBy),
            part('count', 'count', member('count'), writeMember('count', parseNumber), describedBy),
            h('span', { class: 'part' },
              h('label', { for: scaleId }, 'spacing'),
              h('select', {
                id: scaleId,
                'aria-describedby': describedBy,
                onchange: (event: Event) => {
                  writeMember('scale', (raw) => raw === 'linear' ? undefined : raw)((event.target as HTMLSelectElement).value)
                  this.onEdit(false)
                }
              },
              h('option', { value: 'linear', selected: member('scale') !== 'log' }, 'even'),
              h('option', { value: 'log', selected: member('scale') === 'log' }, 'logarithmic')))
          ]
          break
        }
      }
      return [h('div', { class: 'axis-row' }, h('span', { class: 'part mode' }, modeSelect), parts)]
    }, true)
    box.classList.add(mode === 'single' ? 'axis-single' : 'axis-range')
    return box
  }
}

function kindSwitch (spec: Spec, path: string, keep: Record<string, string[]>) {
  return (kind: string): void => {
    const old = getAt(spec, path)
    const next: Record<string, unknown> = { kind }
    if (old !== null && typeof old === 'object') {
      for (const key of keep[kind] ?? []) {
        const value = (old as Record<string, unknown>)[key]
        if (value !== undefined) next[key] = value
      }
    }
    setAt(spec, path, next)
  }
}

const RULE_KINDS: Array<[string, string]> = [
  ['hebbian', 'Hebbian'],
  ['pseudo-inverse', 'pseudo-inverse (projection)'],
  ['storkey', 'Storkey'],
  ['covariance', 'covariance'],
  ['clipped', 'clipped Hebbian synapses'],
  ['dense-polynomial', 'dense memory, polynomial'],
  ['dense-exponential', 'dense memory, exponential'],
  ['modern-softmax', 'modern continuous (softmax)']
]

/** Rules that build a coupling matrix, and so have a diagonal to keep or drop. */
const COUPLING_RULES = new Set(['hebbian', 'pseudo-inverse', 'storkey', 'covariance', 'clipped'])

function section (title: string, intro: string | null, ...children: Child[]): HTMLElement {
  return h('section', { class: 'form-section' }, h('h2', {}, title), intro === null ? null : h('p', { class: 'hint' }, intro), children)
}

/** Form state that is not in the spec: whether the size is asked as a load or a count while both are empty. */
export interface FormView {
  sizeBy: 'load' | 'patterns'
}

export function initialView (spec: Spec): FormView {
  return { sizeBy: getAt(spec, 'patterns') !== undefined && getAt(spec, 'load') === undefined ? 'patterns' : 'load' }
}

/** Carries a single load over to a single count and back, when N is a single number too. */
function switchSize (spec: Spec, to: 'load' | 'patterns'): void {
  const neurons = getAt(spec, 'neurons')
  const from = to === 'load' ? 'patterns' : 'load'
  const value = getAt(spec, from)
  setAt(spec, from, undefined)
  if (typeof value !== 'number' || typeof neurons !== 'number' || neurons <= 0) return
  setAt(spec, to, to === 'patterns' ? Math.max(1, Math.round(value * neurons)) : Number((value / neurons).toPrecision(4)))
}

export function buildSpecForm (spec: Spec, view: FormView, onEdit: EditHandler, newSeed: () => number): SpecForm {
  const f = new FormBuilder(spec, onEdit)
  const usesPatterns = view.sizeBy === 'patterns'
  const rule = String(getAt(spec, 'rule.kind') ?? 'hebbian')
  const family = String(getAt(spec, 'family.kind') ?? 'random')
  const cue = String(getAt(spec, 'cue.kind') ?? 'flip')
  const diluted = getAt(spec, 'dilution') !== undefined && getAt(spec, 'dilution') !== null
  const fixedInDegree = diluted && getAt(spec, 'dilution.kind') === 'fixed-in-degree'

  const sizeId = 'f-size-mode'
  const sizeField = h('fieldset', { class: 'field size-mode' },
    h('legend', {}, 'Number of stored patterns given as'),
    h('div', { class: 'choice-row' },
      ([['load', 'a load α = P/N'], ['patterns', 'a count P']] as const).map(([value, text]) => {
        const id = `${sizeId}-${value}`
        return h('span', { class: 'choice' },
          h('input', {
            type: 'radio',
            name: sizeId,
            id,
            value,
            checked: (value === 'patterns') === usesPatterns,
            onchange: () => {
              view.sizeBy = value
              switchSize(spec, value)
              onEdit(true)
            }
          }),
          h('label', { for: id }, text))
      })))

  const el = h('div', { class: 'spec-form' },
    section('Sweep', null,
      f.text('label', 'Label', 'Shown in the list and on the figure. Not part of the spec hash.', 'e.g. Kitchen and hallway codes, N = 400'),
      f.number('seed', 'Master seed', 'Same spec and seed, same results, bit for bit, however many workers run it. Default: 1.', '1',
        (input) => h('button', {
          type: 'button',
          class: 'small secondary',
          onclick: () => {
            const seed = newSeed()
            input.value = String(seed)
            setAt(spec, 'seed', seed)
            onEdit(false)
          }
        }, 'New seed'))),
    section('Network', 'Any numeric parameter can be one value, a list or a range: the sweep runs every combination.',
      f.axis('neurons', 'Neurons N', 'Network size. Required unless the patterns are supplied.', 'e.g. 400'),
      f.searched === 'load' ? f.axis('load', 'Load α = P/N', 'Patterns per neuron; P = round(α·N).', '') : sizeField,
      f.searched === 'load'
        ? null
        : usesPatterns
          ? f.axis('patterns', 'Stored patterns P', 'How many patterns are stored.', 'e.g. 40')
          : f.axis('load', 'Load α = P/N', 'Patterns per neuron; P = round(α·N).', 'e.g. 0.1'),
      f.select('coding', 'Neuron states', 'How states are written: −1/+1 or 0/1.', [['pm1', '−1 / +1'], ['binary', '0 / 1']], 'pm1'),
      f.select('rule.kind', 'Learning rule', 'How patterns become couplings, or which model stores them.', RULE_KINDS, 'hebbian',
        kindSwitch(spec, 'rule', { hebbian: ['selfCoupling'], 'pseudo-inverse': ['selfCoupling'], storkey: ['selfCoupling'], covariance: ['selfCoupling', 'threshold'], clipped: ['selfCoupling'], 'dense-polynomial': ['degree'], 'dense-exponential': [], 'modern-softmax': ['beta'] })),
      rule === 'covariance' ? f.axis('rule.threshold', 'Covariance threshold', 'Leave empty for the engine default.', 'engine default') : null,
      rule === 'dense-polynomial' ? f.axis('rule.degree', 'Interaction degree n', 'Energy −Σ_μ (ξ^μ·σ)ⁿ: an integer from 2 to 30; n = 2 is the Hebbian network.', 'e.g. 3') : null,
      rule === 'modern-softmax' ? f.axis('rule.beta', 'Inverse temperature β', 'Sharpness of the softmax update, above 0; the state is continuous and updated in parallel.', 'e.g. 8') : null,
      COUPLING_RULES.has(rule) ? f.checkbox('rule.selfCoupling', 'Keep self-couplings J_ii', 'Off by default: the diagonal of the coupling matrix is zero.', false) : null,
      h('div', { class: 'field checkbox' },
        h('input', {
          type: 'checkbox',
          id: 'f-dilution-on',
          checked: diluted,
          onchange: (event: Event) => {
            setAt(spec, 'dilution', (event.target as HTMLInputElement).checked ? { keep: 0.5, symmetric: true } : null)
            onEdit(true)
          }
        }),
        h('label', { for: 'f-dilution-on' }, 'Dilute the couplings'),
        h('p', { class: 'help' }, 'Keep only some of the connections: a random fraction, or a fixed number of inputs per neuron.')),
      diluted
        ? f.select('dilution.kind', 'Kind of dilution', 'Fixed in-degree is the extremely diluted network: Hebbian or clipped rule, ±1 neurons.',
          [['random', 'a random fraction of the couplings kept'], ['fixed-in-degree', 'a fixed number of inputs per neuron']], 'random',
          // Switching starts the other kind from its defaults: the two share no parameter.
          (kind) => setAt(spec, 'dilution', kind === 'fixed-in-degree' ? { kind: 'fixed-in-degree', inDegree: 20 } : { keep: 0.5, symmetric: true }))
        : null,
      diluted && !fixedInDegree ? f.axis('dilution.keep', 'Fraction of couplings kept', 'In (0, 1].', 'e.g. 0.5') : null,
      diluted && !fixedInDegree ? f.checkbox('dilution.symmetric', 'Symmetric dilution', 'Cut J_ij and J_ji together.', true) : null,
      diluted && fixedInDegree ? f.axis('dilution.inDegree', 'Inputs per neuron K', 'Each neuron listens to K other neurons drawn at random (asymmetric); the load that matters is P/K.', 'e.g. 20') : null),
    section('Stored patterns', null,
      f.select('family.kind', 'Pattern family', 'Where the stored patterns come from.', [['random', 'independent random'], ['correlated', 'correlated (children of parents)'], ['supplied', 'supplied in the spec']], 'random',
        kindSwitch(spec, 'family', { random: ['activity'], correlated: ['parents', 'parentOverlap'], supplied: ['data'] })),
      family === 'random' ? f.axis('family.activity', 'Activity', 'Probability that a neuron is active in a pattern; 0.5 is unbiased.', '0.5') : null,
      family === 'correlated' ? f.axis('family.parents', 'Parent patterns', 'Stored pattern μ derives from parent μ mod parents.', 'e.g. 4') : null,
      family === 'correlated' ? f.axis('family.parentOverlap', 'Overlap with parent', 'Expected overlap of each pattern with its parent.', 'e.g. 0.6') : null,
      family === 'supplied' ? h('p', { class: 'hint', 'data-field': 'family.data' }, 'The patterns themselves are rows of family.data: edit them in the JSON view.') : null),
    section('Cue', 'How recall starts: from a damaged version of one stored pattern.',
      f.select('cue.kind', 'Cue', 'What is done to the stored pattern.', [['flip', 'flip a fraction of states'], ['erase', 'erase a fraction of states'], ['random', 'a random state'], ['mixture', 'a mixture of patterns']], 'flip',
        kindSwitch(spec, 'cue', { flip: ['fraction'], erase: ['fraction', 'fill'], random: [], mixture: ['components'] })),
      cue === 'flip' || cue === 'erase' ? f.axis('cue.fraction', 'Cue noise f', 'Share of the neurons flipped or erased, 0 to 1.', '0.1') : null,
      cue === 'erase' ? f.select('cue.fill', 'Erased states become', 'What an erased neuron holds.', [['zero', 'zero'], ['random', 'random']], 'zero') : null,
      cue === 'mixture' ? f.axis('cue.components', 'Components', 'Patterns mixed into the cue.', '3') : null),
    section('Dynamics', null,
      f.select('dynamics.update', 'Update scheme', 'Asynchronous in random or fixed order, or all neurons at once.', [['async-random', 'asynchronous, random order'], ['async-sequential', 'asynchronous, fixed order'], ['sync', 'synchronous']], 'async-random'),
      f.axis('dynamics.temperature', 'Temperature T', '0 is deterministic; above 0, Glauber dynamics.', '0'),
      f.axis('dynamics.maxSweeps', 'Sweep limit', 'Most sweeps over all neurons per trial.', '100'),
      f.axis('dynamics.burnIn', 'Burn-in sweeps', 'At T > 0: sweeps before time-averaging starts.', '0')),
    section('Trials and measures', null,
      f.number('trials', 'Trials per grid point', 'More trials, narrower error bars.', '100'),
      f.axis('trialsPerNetwork', 'Trials per network', 'Consecutive trials sharing one pattern set and coupling matrix.', '1'),
      f.axis('successThreshold', 'Success threshold', 'A trial succeeds when its final overlap with the cued pattern reaches this.', '0.9'),
      f.checkbox('measures.stability', 'Measure one-step stability', 'Whether the stored patterns themselves are fixed points.', false),
      f.checkbox('measures.overlapTrajectory', 'Record overlap trajectories', 'Per trial, in the JSON results only.', false),
      f.checkbox('measures.energyTrajectory', 'Record energy trajectories', 'Per trial, in the JSON results only.', false)))

  el.append(analysisSection(f, spec, onEdit))

  return {
    el,
    fieldPaths: f.fields.map((field) => field.path),
    showIssues (byField) {
      for (const field of f.fields) {
        const messages = byField.get(field.path) ?? []
        field.error.hidden = messages.length === 0
        field.error.replaceChildren(...messages.map((m) => h('p', {}, m)))
        field.el.classList.toggle('invalid', messages.length > 0)
        for (const input of field.inputs()) {
          if (messages.length > 0) input.setAttribute('aria-invalid', 'true')
          else input.removeAttribute('aria-invalid')
        }
      }
    }
  }
}

/** Parameters a threshold search may move (continuous ones; see src/spec/analysis/schema.ts). */
const SEARCHABLE: Array<[string, string]> = [
  ['load', 'load α'],
  ['cue.fraction', 'cue noise f'],
  ['dynamics.temperature', 'temperature T'],
  ['family.activity', 'pattern activity a'],
  ['family.parentOverlap', 'parent overlap b'],
  ['dilution.keep', 'couplings kept c'],
  ['rule.threshold', 'threshold θ']
]

/** The search's own parameter takes its value from the search: a load leaves neither load nor patterns. */
function makeRoomFor (spec: Spec, parameter: string | null, previous: string | null): void {
  if (parameter === 'load') {
    setAt(spec, 'load', undefined)
    setAt(spec, 'patterns', undefined)
  } else if (previous === 'load' && getAt(spec, 'load') === undefined && getAt(spec, 'patterns') === undefined) {
    setAt(spec, 'load', 0.1)
  }
}

function analysisSection (f: FormBuilder, spec: Spec, onEdit: EditHandler): HTMLElement {
  const on = getAt(spec, 'analysis') !== undefined
  const toggle = h('div', { class: 'field checkbox' },
    h('input', {
      type: 'checkbox',
      id: 'f-analysis-on',
      checked: on,
      onchange: (event: Event) => {
        const previous = f.searched
        if ((event.target as HTMLInputElement).checked) {
          setAt(spec, 'analysis', { kind: 'threshold', parameter: 'load', from: 0.05, to: 0.25 })
          makeRoomFor(spec, 'load', previous)
        } else {
          setAt(spec, 'analysis', undefined)
          makeRoomFor(spec, null, previous)
        }
        onEdit(true)
      }
    }),
    h('label', { for: 'f-analysis-on' }, 'Search for a threshold instead of running a grid'),
    h('p', { class: 'help' }, 'Finds where the measure crosses a level as one parameter moves (a capacity, a basin radius), with a confidence interval, for every point of the other varied parameters.'))
  if (!on) return section('Threshold search', null, toggle)
  const scaling = getAt(spec, 'analysis.scaling')
  const scalingForm = scaling !== null && typeof scaling === 'object' ? String((scaling as Record<string, unknown>).form ?? '') : 'none'
  return section('Threshold search', null,
    toggle,
    f.select('analysis.parameter', 'Searched parameter', 'Its own field above is set by the search.', SEARCHABLE, 'load', (picked) => {
      const previous = f.searched
      setAt(spec, 'analysis.parameter', picked)
      makeRoomFor(spec, picked, previous)
    }),
    f.select('analysis.measure', 'Measure', 'Success rate or mean final overlap.', [['success', 'success rate'], ['overlap', 'final overlap']], 'success'),
    f.number('analysis.level', 'Level', 'The crossing sought: a rate in (0, 1) or an overlap in (−1, 1).', '0.5'),
    f.select('analysis.direction', 'The measure…', 'How it moves as the parameter grows.', [['decreasing', 'falls as the parameter grows'], ['increasing', 'rises as the parameter grows']], 'decreasing'),
    f.number('analysis.from', 'From', 'Low end of the searched range. Required.', ''),
    f.number('analysis.to', 'To', 'High end of the searched range. Required.', ''),
    f.number('analysis.maxSteps', 'Most steps', 'Values evaluated per search, both ends included; each runs the trials above.', '12'),
    f.number('analysis.tolerance', 'Tolerance', 'Stop once the bracket is this narrow.', '(to − from) / 32'),
    f.number('analysis.confidence', 'Confidence', 'Of the reported interval.', '0.95'),
    f.select('analysis.scaling', 'Finite-size fit over N', 'Needs neurons as a list of at least 3 sizes (4 to fit the exponent).', [['none', 'none'], ['power', 'x∞ + a·N^(−b)'], ['linear-inverse', 'x∞ + a/N']], scalingForm, (picked) => {
      setAt(spec, 'analysis.scaling', picked === 'none' ? undefined : picked === 'power' ? { form: 'power', exponent: null } : { form: 'linear-inverse' })
    }),
    scalingForm === 'power' ? f.number('analysis.scaling.exponent', 'Exponent b', 'Empty: fitted.', 'fitted') : null)
}
