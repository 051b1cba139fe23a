/**
 * Which sweep gets the next free thread. Between owners: the owner served least recently
 * goes first, so one owner's long queue cannot starve another's (a newcomer gets the very
 * next thread). Within an owner: first come, first served, whole sweep by whole sweep.
 */

export interface DispatchCandidate {
  id: string
  /** The owner, or '' when tokens are off. */
  ownerKey: string
  /** Insertion order (creation order) of the sweep. */
  seq: number
}

export class FairOrder {
  /** Owner → tick at which it was last served. */
  #lastServed = new Map<string, number>()
  #tick = 0

  /** The candidate to serve next, or undefined when there is none. */
  pick<C extends DispatchCandidate> (candidates: Iterable<C>): C | undefined {
    let best: C | undefined
    let bestServed = Infinity
    for (const candidate of candidates) {
      const served = this.#lastServed.get(candidate.ownerKey) ?? -1
      if (best === undefined || served < bestServed || (served === bestServed && candidate.seq < best.seq)) {
        best = candidate
        bestServed = served
      }
    }
    return best
  }

  served (ownerKey: string): void {
    this.#lastServed.set(ownerKey, this.#tick++)
  }

  /** Drops owners with no active work, keeping the map bounded by the active owners. */
  retainOnly (activeOwnerKeys: ReadonlySet<string>): void {
    for (const key of this.#lastServed.keys()) {
      if (!activeOwnerKeys.has(key)) this.#lastServed.delete(key)
    }
  }
}
