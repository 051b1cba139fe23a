/**
 * Sweep ids: one definition for the API's parameter schema, both backends' guards and the
 * Redis key layout. Ids are random UUIDs; anything else cannot name a sweep (and must never
 * reach a key name or a file).
 */
import { randomUUID } from 'node:crypto'

export const SWEEP_ID_MAX_LENGTH = 64

/** Letters, digits, '-' and '_', 1 … SWEEP_ID_MAX_LENGTH characters. */
export const SWEEP_ID_PATTERN = /^[A-Za-z0-9_-]{1,64}$/

export function isSweepId (text: string): boolean {
  return SWEEP_ID_PATTERN.test(text)
}

export function newSweepId (): string {
  return randomUUID()
}
