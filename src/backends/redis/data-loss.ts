/**
 * Notices when Redis lost memsweep's data: a server without persistence restarted, or
 * someone flushed it. Every process that opens the backend agrees on a random epoch stored
 * under `<prefix>:epoch`; if the key vanishes or changes, everything queued or running
 * before is gone, and the process says so loudly instead of carrying on as if nothing
 * happened.
 */
import { randomUUID } from 'node:crypto'
import type { Redis } from 'ioredis'
import type { Logger } from 'pino'

export class EpochWatch {
  #epoch: string | null = null

  constructor (readonly redis: Redis, readonly key: string, readonly logger: Logger) {}

  /** Joins the current epoch, creating it if this is the first process on a fresh Redis. */
  async start (): Promise<void> {
    this.#epoch = await this.#join()
  }

  /** True when the data this process knew about is gone; logs an error each time that happens. */
  async check (): Promise<boolean> {
    const current = await this.redis.get(this.key)
    if (current !== null && current === this.#epoch) return false
    const previous = this.#epoch
    this.#epoch = await this.#join()
    this.logger.error({ previousEpoch: previous, epoch: this.#epoch },
      'REDIS LOST MEMSWEEP DATA: the server restarted without persistence or was flushed; every sweep queued or running before is gone (the ones an API instance knew are recorded as failed, kind system; others answer 404). Enable appendonly on Redis.')
    return true
  }

  async #join (): Promise<string> {
    await this.redis.set(this.key, randomUUID(), 'NX')
    const epoch = await this.redis.get(this.key)
    if (epoch === null) throw new Error(`Redis key ${this.key} vanished right after it was set.`)
    return epoch
  }
}
