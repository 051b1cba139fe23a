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

export type NormalisedRule =
  | { kind: 'hebbian' | 'pseudo-inverse' | 'storkey' | 'clipped', selfCoupling: boolean }
  | { kind: 'covariance', selfCoupling: boolean, threshold: Varied | null }
  | { kind: 'dense-polynomial', degree: Varied }
  | { kind: 'dense-exponential' }
  | { kind: 'modern-softmax', beta: Varied }

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
  /** Exactly one of `patterns` and `load` is present. */
  patterns?: Varied
  load?: Varied
  coding: Coding
  family: NormalisedFamily
  rule: NormalisedRule
  dilution: NormalisedDilution | null
  cue: NormalisedCue
  dynamics: { burnIn: Varied, maxSweeps: Varied, temperature: Varied, update: UpdateScheme }
  measures: { energyTrajectory: boolean, overlapTrajectory: boolean, stability: boolean }
  successThreshold: Varied
  trials: number
  trialsPerNetwork: Varied
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
