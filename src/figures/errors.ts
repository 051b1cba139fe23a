/** Why a figure cannot be drawn, field by field, so callers can point at the offending option. */

export interface FigureIssue {
  /** The option at fault (`x`, `series`, `measure`, …); '' for the options as a whole. */
  path: string
  message: string
}

export class FigureOptionsError extends Error {
  constructor (readonly issues: readonly FigureIssue[]) {
    super(`invalid figure options: ${issues.map((i) => (i.path === '' ? i.message : `${i.path}: ${i.message}`)).join('; ')}`)
    this.name = 'FigureOptionsError'
  }
}
