/**
 * A sweep's supplementary-material bundle: everything a reader needs to check and reproduce
 * its numbers, as one zip (fflate, built on the rendering thread). The members are listed in
 * BUNDLE_MEMBERS, one entry per file, so a new representation (a columnar table, a print
 * figure) is one more entry there; each says in the README what it is and may leave itself
 * out with a reason. Every member carries the sweep's finishing time as its date, so the same
 * sweep gives the same bytes (and the same ETag) whenever it is bundled.
 */
import { zipSync, type Zippable } from 'fflate'
import { figureBytes, type FigureFormat } from '../../figure-files/index.js'
import { FigureOptionsError, renderFigure } from '../../figures/index.js'
import { resultToCsv, resultToJson, trajectoryCsv, trajectoryUnavailable, type SweepResult } from '../../results/index.js'
import { canonicalJson, gridAxes } from '../../spec/index.js'
import { resultToArrow } from '../../results/arrow-output.js'

/** What the API knows of the sweep besides its result: its record, and where it was served from. */
export interface BundleRecord {
  id: string
  label: string | null
  owner: string | null
  specHash: string
  createdAt: string
  startedAt: string | null
  finishedAt: string | null
  extends: string | null
  reusedFrom: string | null
  reused: { points: number, trials: number }
  tags: string[]
  notes: string | null
  /** The server's base URL as the client reached it, for the README's curl line. */
  serverUrl: string
}

/** Most trials whose per-trial rows go into a bundle; above it the README points to the API. */
export const BUNDLE_MAX_TRIAL_ROWS = 200_000

interface MemberContext { result: SweepResult, record: BundleRecord }

/** A file of the bundle: its bytes, or why this sweep has none (said in the README). */
export interface BundleMember {
  name: string
  what: string
  produce: (context: MemberContext) => Produced | Promise<Produced>
}

type Produced = string | Uint8Array | { omitted: string }

/** The default figure of the result, at `options` (a screen size by default), or why it has none. */
function figureOf (result: SweepResult, options: { column?: 'single' } = {}): string | { omitted: string } {
  try {
    return renderFigure(result, options)
  } catch (error) {
    if (error instanceof FigureOptionsError) return { omitted: error.issues.map((issue) => issue.message).join('; ') }
    throw error
  }
}

/** The single-column print figure as the figure routes render it (`?column=single`), the SVG's title as the PDF's. */
async function printFigure (result: SweepResult, format: FigureFormat): Promise<Produced> {
  const svg = figureOf(result, { column: 'single' })
  if (typeof svg !== 'string') return svg
  return await figureBytes(svg, format, { title: /<title[^>]*>([^<]*)</.exec(svg)?.[1] })
}

export const BUNDLE_MEMBERS: readonly BundleMember[] = [
  {
    name: 'spec.json',
    what: 'The spec to submit again: the sweep\'s normalised spec (every default filled in, every axis written out), label included.',
    produce: ({ result }) => JSON.stringify(result.spec, null, 2) + '\n'
  },
  {
    name: 'spec.normalised.json',
    what: 'The same spec in canonical form (keys sorted, no whitespace, label left out): its SHA-256 is the spec hash.',
    produce: ({ result }) => {
      const { label: _label, ...work } = result.spec
      return canonicalJson(work)
    }
  },
  {
    name: 'results.json',
    what: 'One record per grid point (or per search), every measure with its uncertainty and the theory values, as GET /v1/sweeps/{id}/results answers it.',
    produce: ({ result }) => resultToJson(result, { perTrial: false })
  },
  {
    name: 'results.csv',
    what: 'The same rows as CSV (RFC 4180, CRLF line ends), as ?format=csv answers it.',
    produce: ({ result, record }) => resultToCsv(result, { perTrial: false, sweepId: record.id })
  },
  {
    name: 'results.arrow',
    what: 'The same rows as an Apache Arrow IPC file (pandas: `pyarrow.ipc.open_file`), as ?format=arrow answers it.',
    produce: ({ result, record }) => resultToArrow(result, { perTrial: false, sweepId: record.id })
  },
  {
    name: 'trials.csv',
    what: `One row per trial (as ?format=csv&trials=true answers it), for sweeps of at most ${BUNDLE_MAX_TRIAL_ROWS.toLocaleString('en-US')} trials.`,
    produce: ({ result, record }) => result.trials.length === 0
      ? { omitted: result.searches !== undefined ? 'a threshold search keeps per-step summaries, not per-trial records (they are in results.json)' : `more than ${BUNDLE_MAX_TRIAL_ROWS.toLocaleString('en-US')} trials: download them with GET /v1/sweeps/{id}/results?format=csv&trials=true` }
      : resultToCsv(result, { perTrial: true, sweepId: record.id })
  },
  {
    name: 'trajectory.csv',
    what: 'Mean overlap and energy trajectories per grid point (long format), as ?series=trajectory answers it.',
    produce: ({ result, record }) => {
      const missing = trajectoryUnavailable(result.spec)
      return missing === null ? trajectoryCsv(result, record.id) : { omitted: 'the spec records no trajectories' }
    }
  },
  {
    name: 'figure.svg',
    what: 'The default figure of the main measure with 95 % intervals and the theory that applies, as GET /v1/sweeps/{id}/figure.svg draws it.',
    produce: ({ result }) => figureOf(result)
  },
  {
    name: 'figure.pdf',
    what: 'The same figure sized for a single journal column (85 mm), as vector PDF with its typeface embedded (figure.pdf?column=single).',
    produce: async ({ result }) => await printFigure(result, 'pdf')
  },
  {
    name: 'figure.png',
    what: 'The single-column figure as PNG at 300 dpi (figure.png?column=single).',
    produce: async ({ result }) => await printFigure(result, 'png')
  },
  {
    name: 'provenance.json',
    what: 'Who ran it and how: the sweep record (owner, label, tags, notes, times, what it extends or reused) and the result\'s provenance with the run timing.',
    produce: ({ result, record }) => {
      const { serverUrl: _server, ...sweep } = record
      return JSON.stringify({ sweep, provenance: result.provenance }, null, 2) + '\n'
    }
  }
]

/** The zip's bytes, and the names of its members in order (README.md first). */
export async function buildBundle (result: SweepResult, record: BundleRecord): Promise<{ zip: Uint8Array, members: string[] }> {
  const mtime = new Date(record.finishedAt ?? record.createdAt)
  const files: Array<[string, Uint8Array]> = []
  const listed: Array<{ name: string, what: string, omitted: string | null }> = []
  for (const member of BUNDLE_MEMBERS) {
    const produced = await member.produce({ result, record })
    if (typeof produced === 'object' && !(produced instanceof Uint8Array)) {
      listed.push({ name: member.name, what: member.what, omitted: produced.omitted })
      continue
    }
    files.push([member.name, typeof produced === 'string' ? Buffer.from(produced, 'utf8') : produced])
    listed.push({ name: member.name, what: member.what, omitted: null })
  }
  const readme = Buffer.from(bundleReadme(result, record, listed), 'utf8')
  const folder = `memsweep-${record.id}`
  const zippable: Zippable = {}
  for (const [name, bytes] of [['README.md', readme] as [string, Uint8Array], ...files]) {
    zippable[`${folder}/${name}`] = [bytes, { mtime, level: 6 }]
  }
  return { zip: zipSync(zippable), members: ['README.md', ...files.map(([name]) => name)] }
}

function gridLine (result: SweepResult): string {
  const spec = result.spec
  if (result.searches !== undefined) return `a threshold search (${result.searches.length} searches)`
  const axes = gridAxes(spec).map((axis) => `${axis.path} (${axis.values.length} values)`)
  return `${result.rows.length} grid point${result.rows.length === 1 ? '' : 's'}${axes.length === 0 ? '' : ` over ${axes.join(' × ')}`}`
}

function bundleReadme (result: SweepResult, record: BundleRecord, members: ReadonlyArray<{ name: string, what: string, omitted: string | null }>): string {
  const title = record.label ?? 'Untitled sweep'
  const engine = result.provenance.engineVersion
  const present = members.filter((member) => member.omitted === null)
  const absent = members.filter((member) => member.omitted !== null)
  const lines = [
    `# ${title}`,
    '',
    `memsweep sweep \`${record.id}\`: ${gridLine(result)}, master seed ${String(result.spec.seed)}, engine ${engine}.`,
    `Spec hash \`${record.specHash}\`. Finished ${record.finishedAt ?? '(not recorded)'}${record.owner === null ? '' : ` for owner ${record.owner}`}.`,
    ...(record.tags.length === 0 ? [] : [`Tags: ${record.tags.join(', ')}.`]),
    ...(record.extends === null ? [] : [`Extends sweep \`${record.extends}\` (${record.reused.trials} trials taken from earlier sweeps; they are bit for bit the trials a fresh run computes).`]),
    ...(record.notes === null ? [] : ['', '> ' + record.notes.split('\n').join('\n> ')]),
    '',
    '## Files',
    '',
    '| file | what it holds |',
    '| --- | --- |',
    '| `README.md` | This page. |',
    ...present.map((member) => `| \`${member.name}\` | ${member.what} |`),
    ...(absent.length === 0 ? [] : ['', 'Not in this bundle:', '', ...absent.map((member) => `- \`${member.name}\`: ${member.omitted ?? ''}.`)]),
    '',
    '## Reproduce the numbers',
    '',
    'Every random draw comes from a stream keyed by the master seed, the grid point\'s parameters and',
    'the trial\'s index, so the same spec gives the same rows whatever machine, number of threads or',
    `workers ran it, as long as the engine release is the same (${engine}). From this folder, with the`,
    '`memsweep` command and no server:',
    '',
    '```',
    'memsweep run spec.json -o results.csv',
    '```',
    '',
    'writes a `results.csv` identical to the one here except its `sweepId` column, which is empty for a',
    'local run. Or submit the spec to a memsweep server:',
    '',
    '```',
    `curl -sS -X POST ${record.serverUrl}/v1/sweeps -H 'content-type: application/json' -H "authorization: Bearer $MEMSWEEP_TOKEN" --data-binary @spec.json`,
    '```',
    '',
    'and download its results when it has finished (`/v1/sweeps/<new id>/results?format=csv`).',
    'To check that `spec.json` is the spec that was run: `sha256sum spec.normalised.json` prints the spec hash above.',
    ''
  ]
  return lines.join('\n')
}
