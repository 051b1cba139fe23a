/**
 * Thrown when parameters reaching the engine are outside its domain. `field` is the
 * dotted path of the offending parameter, `value` what it was, so the service can map
 * the error to a 4xx naming the field.
 */
export class EngineInputError extends RangeError {
  readonly field: string
  readonly value: unknown

  constructor (field: string, value: unknown, reason: string) {
    super(`invalid argument. ${field}: ${reason} Value: ${formatValue(value)}.`)
    this.name = 'EngineInputError'
    this.field = field
    this.value = value
    Object.setPrototypeOf(this, new.target.prototype)
  }
}

function formatValue (value: unknown): string {
  if (typeof value === 'number' || typeof value === 'boolean' || value === null || value === undefined) return String(value)
  const text = JSON.stringify(value)
  return text.length > 80 ? `${text.slice(0, 77)}...` : text
}
