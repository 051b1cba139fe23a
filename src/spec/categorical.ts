/**
 * Categorical axes: parameters whose values are not numbers. A rule axis holds whole rule
 * objects; rows, CSV cells and figure legends name each by its label. A self-coupling axis
 * holds true/false.
 */
import type { ConstantRule } from './types.js'

/** The value of an axis at a grid point: a number, a rule's label, or a flag. */
export type AxisValue = number | string | boolean

/**
 * A rule's label: its kind, then in parentheses every parameter not at its default, as
 * name=value: `storkey`, `hebbian(selfCoupling=true)`, `dense-polynomial(degree=3)`,
 * `covariance(selfCoupling=true, threshold=0.2)`. Distinct rules have distinct labels.
 */
export function ruleLabel (rule: ConstantRule): string {
  const parts: string[] = []
  if ('selfCoupling' in rule && rule.selfCoupling) parts.push('selfCoupling=true')
  if (rule.kind === 'covariance' && rule.threshold !== null) parts.push(`threshold=${rule.threshold}`)
  if (rule.kind === 'dense-polynomial') parts.push(`degree=${rule.degree}`)
  if (rule.kind === 'modern-softmax') parts.push(`beta=${rule.beta}`)
  return parts.length === 0 ? rule.kind : `${rule.kind}(${parts.join(', ')})`
}

/** A value as text for messages and labels. */
export function formatAxisValue (value: AxisValue): string {
  return String(value)
}
