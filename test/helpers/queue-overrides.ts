/**
 * A queue whose methods are the given queue's, except those overridden: tests replace
 * `close` (to stop a worker too) or a read (to inject a failure) without restating the port.
 */
import type { SweepQueue } from '../../src/backends/port.js'

export function withOverrides (queue: SweepQueue, overrides: Partial<SweepQueue>): SweepQueue {
  return new Proxy(queue, {
    get (target, property, receiver) {
      if (Object.hasOwn(overrides, property)) return overrides[property as keyof SweepQueue]
      const value: unknown = Reflect.get(target, property, receiver)
      return typeof value === 'function' ? (value as (...args: unknown[]) => unknown).bind(target) : value
    }
  })
}
