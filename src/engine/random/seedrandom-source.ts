import seedrandom from 'seedrandom'
import { mulHigh64, toUnitInterval, type RandomSource } from './source.js'

/**
 * Adapter that lets any seedrandom 3.0.5 generator (pinned) drive the engine, 32 bits at
 * a time. Used to show that results depend on the injected source only.
 */
export class SeedrandomSource implements RandomSource {
  readonly algorithm: string
  readonly word = new Uint32Array(2)
  private readonly gen: seedrandom.PRNG

  constructor (seed: string, algorithm: 'alea' | 'xor4096' | 'tychei' = 'alea') {
    this.algorithm = `seedrandom-3.0.5/${algorithm}`
    this.gen = seedrandom[algorithm](seed)
  }

  next64 (): void {
    this.word[0] = this.gen.int32()
    this.word[1] = this.gen.int32()
  }

  below (n: number): number {
    this.next64()
    return mulHigh64(this.word[1]!, this.word[0]!, n)
  }

  uniform (): number {
    this.next64()
    return toUnitInterval(this.word[1]!, this.word[0]!)
  }
}
