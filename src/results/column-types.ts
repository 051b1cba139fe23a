/**
 * The value type of every table column, by name: what the Arrow file declares, so a column
 * has the same type in every sweep's file whatever its values happen to be (a column of means
 * that are all 1 stays floating point; a parameter that does not apply is a typed null).
 * Columns not listed here hold floating-point measures.
 */

export type ColumnType = 'int' | 'float' | 'string' | 'bool'

const STRING_COLUMNS = new Set([
  'sweepId', 'specHash', 'coding', 'family.kind', 'rule.kind', 'dilution.kind', 'cue.kind', 'cue.fill', 'dynamics.update', 'streams',
  'ending', 'endState', 'finalEndState', 'side', 'parameter', 'measure', 'stoppedBy', 'fit.method', 'note'
])

const BOOLEAN_COLUMNS = new Set(['rule.selfCoupling', 'dilution.symmetric', 'fit.separated'])

const INTEGER_COLUMNS = new Set([
  'seed', 'point', 'search', 'step', 'trial', 'target', 'sweep', 'running', 'steps', 'trials', 'success',
  'neurons', 'patterns', 'family.parents', 'rule.degree', 'dilution.inDegree', 'cue.components',
  'dynamics.maxSweeps', 'dynamics.burnIn', 'trialsPerNetwork', 'sweeps',
  'success.count', 'stability.networks', 'patternOverlaps.networks', 'patternOverlaps.pairs'
])

/** Counts per class: `ending.<kind>`, `endStates.<class>`, `finalEndStates.<class>` (and their format-1 CSV names). */
const INTEGER_GROUPS = ['ending.', 'endStates.', 'finalEndStates.', 'endState.', 'finalEndState.']

// MAIN //

export function columnType (name: string): ColumnType {
  if (STRING_COLUMNS.has(name)) return 'string'
  if (BOOLEAN_COLUMNS.has(name)) return 'bool'
  if (INTEGER_COLUMNS.has(name) || INTEGER_GROUPS.some((prefix) => name.startsWith(prefix))) return 'int'
  return 'float'
}
