/**
 * The normalised sweep spec: plain JSON with every default filled in, every axis expanded
 * to `{ values }`, and keys in sorted order. It is itself a valid spec (normalising it again
 * changes nothing), it is what gets hashed, stored and handed to workers.
 */
import type { Coding, UpdateScheme } from '../engine/index.js'
import type { Varied } from './axis.js'
import type { NormalisedAnalysis } from './analysis/types.js'

export type { Varied }

export type NormalisedFamily =
  | { kind: 'random', activity: Varied }
  | { kind: 'correlated', parentOverlap: Varied, parents: Varied }
  | { kind: 'supplied', data: number[][] }

/** A self-coupling flag, or an axis of them. */
export type SelfCoupling = boolean | { values: boolean[] }

export type NormalisedRule =
  | { kind: 'hebbian' | 'pseudo-inverse' | 'storkey' | 'clipped', selfCoupling: SelfCoupling }
  | { kind: 'covariance', selfCoupling: SelfCoupling, threshold: Varied | null }
  | { kind: 'dense-polynomial', degree: Varied }
  | { kind: 'dense-exponential' }
  | { kind: 'modern-softmax', beta: Varied }
  /** A categorical axis of rules, each with constant parameters. */
  | { values: ConstantRule[] }

/** A rule with every parameter a plain value: an entry of a rule axis, and a point's rule. */
export type ConstantRule =
  | { kind: 'hebbian' | 'pseudo-inverse' | 'storkey' | 'clipped', selfCoupling: boolean }
  | { kind: 'covariance', selfCoupling: boolean, threshold: number | null }
  | { kind: 'dense-polynomial', degree: number }
  | { kind: 'dense-exponential' }
  | { kind: 'modern-softmax', beta: number }

/** Random dilution has no `kind` in the normalised form, so specs written before other dilutions existed keep their hash. */
export type NormalisedDilution =
  | { keep: Varied, symmetric: boolean }
  | { kind: 'fixed-in-degree', inDegree: Varied }

export type NormalisedCue =
  | { kind: 'flip', fraction: Varied }
  | { kind: 'erase', fill: 'zero' | 'random', fraction: Varied }
  | { kind: 'random' }
  | { kind: 'mixture', components: Varied }

export interface NormalisedSpec {
  /** Spec format version (SPEC_FORMAT_VERSION). */
  version: number
  label: string | null
  seed: number
  neurons: Varied
  /** Exactly one of `patterns`, `load` and `inDegreeLoad` is present (none for a load search). */
  patterns?: Varied
  load?: Varied
  /** P/K under a fixed in-degree dilution (format 2). */
  inDegreeLoad?: Varied
  coding: Coding
  family: NormalisedFamily
  rule: NormalisedRule
  dilution: NormalisedDilution | null
  cue: NormalisedCue
  dynamics: { burnIn: Varied, maxSweeps: Varied, temperature: Varied, update: UpdateScheme }
  /** `patternOverlaps` (format 2) is present only when true, so version 1 specs keep their hash. */
  measures: { energyTrajectory: boolean, overlapTrajectory: boolean, stability: boolean, patternOverlaps?: true }
  successThreshold: Varied
  trials: number
  trialsPerNetwork: Varied
  /** Format 2: present only when `canonical` (absent means keyed streams), so version 1 specs keep their hash. */
  streams?: 'canonical'
  /** Present only for an analysis (threshold search); absent for a grid sweep, so grid specs and their hashes are unchanged. */
  analysis?: NormalisedAnalysis
  /** Present only with precision targets: points take blocks of trials until their interval is narrow enough (`trials` is the ceiling). */
  precision?: NormalisedPrecision
}

export interface NormalisedPrecision {
  measure: 'success' | 'overlap'
  halfWidth: number
  block: number
}
