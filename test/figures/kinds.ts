/**
 * One small example of every kind of figure, for the tests that check all of them (no text
 * outside the page, PNG and PDF renderings) and for `npm run figures:artifacts`. Scenario:
 * population codes of rooms stored in a model place-cell network. Sweeps are small: the
 * figures, not the statistics, are under test.
 */
import type { FigureOptionsInput } from '../../src/figures/index.js'
import type { SweepResult } from '../../src/results/index.js'
import { runSweep } from './helpers.js'

export interface FigureKind {
  name: string
  results: SweepResult[]
  options: FigureOptionsInput
}

let cached: FigureKind[] | null = null

export function figureKinds (): FigureKind[] {
  if (cached !== null) return cached
  const sizes = runSweep({ label: 'Rooms of a flat, two network sizes', neurons: { values: [60, 120] }, load: { values: [0.04, 0.08, 0.12, 0.16, 0.2] }, cue: { kind: 'flip', fraction: 0.1 }, trials: 12, seed: 21 })
  const storkey = runSweep({ label: 'Rooms of a flat, Storkey rule', neurons: 60, rule: { kind: 'storkey' }, load: { values: [0.04, 0.08, 0.12, 0.16, 0.2] }, cue: { kind: 'flip', fraction: 0.1 }, trials: 12, seed: 22 })
  const basin = runSweep({ label: 'How far can the view of a room be off?', neurons: 100, load: { values: [0.05, 0.1] }, cue: { kind: 'flip', fraction: { values: [0, 0.1, 0.2, 0.3, 0.4] } }, trials: 10, seed: 23 })
  const rules = runSweep({ label: 'Three learning rules', neurons: 60, load: { values: [0.05, 0.1, 0.15, 0.2] }, rule: { values: [{ kind: 'hebbian' }, { kind: 'storkey' }, { kind: 'pseudo-inverse' }] }, trials: 8, seed: 24 })
  const stability = runSweep({ label: 'Stable rooms', neurons: { values: [40, 80] }, load: { values: [0.1, 0.2, 0.3] }, measures: { stability: true }, dynamics: { maxSweeps: 1 }, trials: 4, seed: 25 })
  const warm = runSweep({ label: 'Rooms at a temperature', neurons: 100, load: { values: [0.03, 0.05, 0.07] }, cue: { kind: 'flip', fraction: 0 }, dynamics: { temperature: { values: [0.1, 0.4, 0.7] }, maxSweeps: 4, burnIn: 1 }, trials: 3, seed: 26 })
  const grow = runSweep({ label: 'Growing the network', neurons: { values: [25, 50, 100, 200] }, patterns: 3, trials: 4, seed: 27 })
  const scaling = runSweep({
    label: 'Capacity of rooms as the network grows',
    neurons: { values: [60, 120, 240] },
    cue: { kind: 'flip', fraction: 0 },
    trials: 40,
    seed: 3,
    analysis: { kind: 'threshold', parameter: 'load', measure: 'success', level: 0.5, from: 0.05, to: 0.3, maxSteps: 6, tolerance: 0.01, scaling: { form: 'power', exponent: 0.5 } }
  })
  const basinSearch = runSweep({
    label: 'How far off may the view of a room be?',
    neurons: 100,
    load: { values: [0.04, 0.08, 0.12] },
    cue: { kind: 'flip' },
    trials: 30,
    seed: 4,
    analysis: { kind: 'threshold', parameter: 'cue.fraction', measure: 'success', level: 0.5, from: 0, to: 0.5, direction: 'decreasing', maxSteps: 5, tolerance: 0.02 }
  })
  cached = [
    { name: 'success-vs-load', results: [sizes], options: { measure: 'success', x: 'load' } },
    { name: 'overlap-vs-load-theory', results: [sizes], options: { measure: 'overlap', x: 'load' } },
    { name: 'overlay-two-sweeps', results: [sizes, storkey], options: { measure: 'success', x: 'load' } },
    { name: 'basin-cue-noise', results: [basin], options: { measure: 'success', x: 'cue.fraction' } },
    { name: 'rules-categorical', results: [rules], options: { measure: 'success', theory: false } },
    { name: 'end-state-fraction', results: [basin], options: { measure: 'endState', endState: 'target' } },
    { name: 'stability-theory', results: [stability], options: { measure: 'unstableFraction' } },
    { name: 'temperature-references', results: [warm], options: { measure: 'success', x: 'dynamics.temperature' } },
    { name: 'log-x-sweeps', results: [grow], options: { measure: 'sweeps', x: 'neurons', xScale: 'log' } },
    { name: 'threshold-crossings', results: [basinSearch], options: {} },
    { name: 'scaling-fit', results: [scaling], options: {} }
  ]
  return cached
}
