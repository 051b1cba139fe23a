/**
 * What a trial measures beyond its target overlap: the end-state classifier of its point,
 * the time averages over the measured sweeps at T > 0, and the overlaps with a mixture cue's
 * components. Nothing here draws random numbers.
 */
import { END_STATES, EndStateClassifier, emptyEndStateCounts, endStateSettings, type EndState } from './end-states.js'
import type { ThermalSampling, ThermalTotals } from './network/network.js'
import type { PointParams } from './params.js'
import { maxOtherOverlap } from './measures.js'

const classifiers = new WeakMap<PointParams, EndStateClassifier>()

/** The classifier of a point (its mixture bands are computed once per parameters object). */
export function classifierFor (p: PointParams): EndStateClassifier {
  let classifier = classifiers.get(p)
  if (classifier === undefined) {
    classifier = new EndStateClassifier(endStateSettings(p))
    classifiers.set(p, classifier)
  }
  return classifier
}

/** Overlaps with the `components` cue components, patterns target, target + 1, … (mod P). */
export function componentOverlaps (overlaps: ArrayLike<number>, patterns: number, target: number, components: number): number[] {
  const out: number[] = []
  for (let k = 0; k < components; k++) out.push(overlaps[(target + k) % patterns]!)
  return out
}

/**
 * Sums over the measured sweeps of one T > 0 trial: every overlap (for the time-averaged
 * state), the largest other overlap, the energy, and the sweeps spent in each end-state
 * class. Sums run in sweep order, so the averages are bit-reproducible.
 */
export class ThermalAverages {
  count = 0
  private readonly sums: Float64Array
  private otherSum = 0
  private energySum = 0
  private readonly classCounts = emptyEndStateCounts()

  constructor (
    private readonly patterns: number,
    private readonly target: number,
    private readonly classifier: EndStateClassifier,
    sums: Float64Array
  ) {
    this.sums = sums
    sums.fill(0, 0, patterns)
  }

  /**
   * What a fast path needs to take this trial's samples itself (runGlauberSampled): sweeps
   * after `burnIn` are sampled; their totals come back through `absorb`.
   */
  nativeSampling (burnIn: number): ThermalSampling {
    const { classifier, patterns, target } = this
    return {
      burnIn,
      target,
      patternLevel: classifier.patternLevel,
      classify: (overlaps) => END_STATES.indexOf(classifier.classify(overlaps, patterns, target))
    }
  }

  /** Takes the totals of samples a fast path took: afterwards as if `add` had run once per sample. */
  absorb (totals: ThermalTotals): void {
    this.sums.set(totals.sums.subarray(0, this.patterns))
    this.otherSum = totals.otherSum
    this.energySum = totals.energySum
    END_STATES.forEach((state, k) => { this.classCounts[state] = totals.classCounts[k]! })
    this.count = totals.count
  }

  add (overlaps: Float64Array, energy: number): void {
    for (let mu = 0; mu < this.patterns; mu++) this.sums[mu] = this.sums[mu]! + overlaps[mu]!
    this.otherSum += maxOtherOverlap(overlaps, this.patterns, this.target)
    this.energySum += energy
    this.classCounts[this.classifier.classify(overlaps, this.patterns, this.target)]++
    this.count++
  }

  /** The time-averaged overlaps (a new array). */
  meanOverlaps (): Float64Array {
    const out = new Float64Array(this.patterns)
    for (let mu = 0; mu < this.patterns; mu++) out[mu] = this.sums[mu]! / this.count
    return out
  }

  meanMaxOther (): number {
    return this.otherSum / this.count
  }

  meanEnergy (): number {
    return this.energySum / this.count
  }

  /** Fraction of the measured sweeps in each class. */
  shares (): Record<EndState, number> {
    const out = emptyEndStateCounts()
    for (const key of Object.keys(out) as EndState[]) out[key] = this.classCounts[key] / this.count
    return out
  }
}
