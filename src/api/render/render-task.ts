/**
 * The messages between the API and its rendering thread: stored results go in as bytes, the
 * representation comes back as bytes with its strong ETag, so the API's event loop never
 * decodes trial records or builds a large string.
 */
import type { EncodedResult, StoredProgress } from '../../backends/port.js'
import type { FigureIssue, FigureOptions } from '../../figures/index.js'
import type { FigureFormat } from '../../figure-files/index.js'
import type { ResultSeries } from '../../results/index.js'
import type { BundleRecord } from './bundle.js'

export type ResultFormat = 'json' | 'csv' | 'arrow'

/** What a rendering reads: a finished result, or what an unfinished sweep has stored so far (its finished points). */
export type RenderSource =
  | { kind: 'result', stored: EncodedResult }
  | { kind: 'partial', progress: StoredProgress }

export interface RenderResultTask {
  kind: 'result'
  /** The sweep's id, for the tables' `sweepId` column. */
  sweepId: string
  source: RenderSource
  format: ResultFormat
  perTrial: boolean
  timing: boolean
  /** Another series instead of the rows (see RESULT_SERIES); the route has checked the sweep records it. */
  series: ResultSeries | null
}

export interface RenderFigureTask {
  kind: 'figure'
  sources: RenderSource[]
  options: FigureOptions
  /** The SVG itself, or its PNG or PDF rendering. */
  format: FigureFormat
  /** PNG resolution (undefined: the default for the figure's size). */
  dpi?: number
}

/** The supplementary-material zip of a succeeded sweep (render/bundle.ts). */
export interface RenderBundleTask {
  kind: 'bundle'
  stored: EncodedResult
  record: BundleRecord
}

export type RenderTask = RenderResultTask | RenderFigureTask | RenderBundleTask

export type RenderOutcome =
  | { kind: 'rendered', body: Uint8Array, etag: string }
  /** The figure options do not fit the sweep(s): the API answers 422 naming each option. */
  | { kind: 'figure-misfit', issues: readonly FigureIssue[] }
