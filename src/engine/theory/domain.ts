/**
 * Where a theory value holds. Every value the results report is a `TheoryEntry`: a name, a
 * declared domain and an evaluation. `evaluateModel` gives a value only inside the domain and
 * otherwise the reason code of the first condition that fails, and it turns any error or
 * non-finite number into a reason code too, so a theory value can never fail a sweep.
 */
import type { Cue, PointParams, UpdateScheme } from '../params.js'
import type { PointTheory, TheoryOutcome, UnavailableReason } from './availability.js'

/** A further condition of a domain (load, size, cue level), with its reason and a phrase for the docs. */
export interface DomainCondition {
  holds: (p: PointParams) => boolean
  reason: UnavailableReason
  /** E.g. "α ≤ 0.01". */
  text: string
}

export interface TheoryDomain {
  /** The self-coupling J_ii the theory assumes (rules that have one); absent: either. */
  selfCoupling?: boolean
  /** 'zero': T = 0 only; 'positive': T > 0 only; absent: any temperature. */
  temperature?: 'zero' | 'positive'
  /** Update schemes it describes; absent: any. */
  updates?: readonly UpdateScheme[]
  /** Cue kinds it starts from; absent: any. */
  cues?: ReadonlyArray<Cue['kind']>
  /** Checked in order after the fields above. */
  conditions?: readonly DomainCondition[]
}

export interface TheoryEntry {
  /** The stable name in results (`theory.<name>` in CSV). */
  name: string
  domain: TheoryDomain
  /**
   * What a zero local field does at T = 0 in the value's derivation, when that matters:
   * `keep` (the neuron keeps its state: the engine's rule) or `random` (±1 with equal odds).
   */
  ties?: 'keep' | 'random'
  /** The value at a point inside the domain, or why there is none there. */
  evaluate: (p: PointParams) => TheoryOutcome
}

/** The theory of one model (learning rule and connectivity) and the assumptions all its values share. */
export interface TheoryModel {
  name: string
  /** Whether the point is this model's (its rule and connectivity): only then are its values listed. */
  concerns: (p: PointParams) => boolean
  /** The assumptions every value shares (coding, pattern statistics, dilution): outside them every value is 'model-outside-domain'. */
  covers: (p: PointParams) => boolean
  entries: readonly TheoryEntry[]
}

// MAIN //

/** The first reason the point lies outside the domain, or null inside it. */
export function domainReason (domain: TheoryDomain, p: PointParams): UnavailableReason | null {
  if (domain.selfCoupling !== undefined && 'selfCoupling' in p.rule && p.rule.selfCoupling !== domain.selfCoupling) return 'model-outside-domain'
  const t = p.dynamics.temperature
  if (domain.temperature === 'zero' && t !== 0) return 'temperature-outside-domain'
  if (domain.temperature === 'positive' && !(t > 0)) return 'temperature-outside-domain'
  if (domain.updates !== undefined && !domain.updates.includes(p.dynamics.update)) return 'dynamics-outside-domain'
  if (domain.cues !== undefined && !domain.cues.includes(p.cue.kind)) return 'cue-outside-domain'
  for (const condition of domain.conditions ?? []) if (!condition.holds(p)) return condition.reason
  return null
}

/** Every value of the model at the point: inside its domain the value, outside the reason. */
export function evaluateModel (model: TheoryModel, p: PointParams): PointTheory {
  const values: Record<string, number> = {}
  const unavailable: Record<string, UnavailableReason> = {}
  const covered = model.covers(p)
  for (const entry of model.entries) {
    const outcome = covered ? evaluateEntry(entry, p) : 'model-outside-domain'
    if (typeof outcome === 'number') values[entry.name] = outcome
    else unavailable[entry.name] = outcome
  }
  return { values, unavailable }
}

/** One value, or its reason; never throws. */
export function evaluateEntry (entry: TheoryEntry, p: PointParams): TheoryOutcome {
  try {
    const reason = domainReason(entry.domain, p)
    if (reason !== null) return reason
    const outcome = entry.evaluate(p)
    // A NaN or an infinity is a defect of the evaluation, not a theory value.
    return typeof outcome === 'number' && !Number.isFinite(outcome) ? 'evaluation-failed' : outcome
  } catch {
    return 'evaluation-failed'
  }
}
