import { spawnSync } from 'node:child_process'
import { cpSync, existsSync, mkdtempSync, chmodSync, readdirSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'

/**
 * The shared peers (numpy and C programs in ../shared/bench) are measuring instruments, not
 * part of the product: they are copied to a temporary directory, built and run there, never
 * imported or copied into the repository.
 */
export interface Peers {
  dir: string | null
  /** Path of the built C peer, or null with the reason in `notes`. */
  cBinary: string | null
  numpy: boolean
  notes: string[]
  gcc: string
  python: string
}

function version (cmd: string, args: string[]): string | null {
  const r = spawnSync(cmd, args, { encoding: 'utf8' })
  return r.status === 0 ? (r.stdout + r.stderr).trim().split('\n')[0]! : null
}

export function preparePeers (source: string): Peers {
  const notes: string[] = []
  const gcc = version('gcc', ['--version'])
  const python = version('python3', ['-c', 'import sys, numpy; print(sys.version.split()[0], "numpy", numpy.__version__)'])
  if (!existsSync(join(source, 'peer_c.c'))) {
    notes.push(`peer sources not found at ${source}: peers skipped`)
    return { dir: null, cBinary: null, numpy: false, notes, gcc: gcc ?? 'none', python: python ?? 'none' }
  }
  const dir = join(mkdtempSync(join(tmpdir(), 'memsweep-peers-')), 'bench')
  cpSync(source, dir, { recursive: true })
  chmodSync(dir, 0o755)
  for (const f of readdirSync(dir)) chmodSync(join(dir, f), 0o755)
  let cBinary: string | null = null
  if (gcc === null) {
    notes.push('gcc not found: C peer skipped')
  } else {
    // The peer's reference build (its README): SIMD float reductions via OpenMP-SIMD pragmas only, popcount weight build.
    const r = spawnSync('gcc', ['-O3', '-march=native', '-fopenmp-simd', '-DPEER_SIMD', '-DPEER_POPCOUNT_BUILD', '-o', 'peer_c', 'peer_c.c', '-lm'], { cwd: dir, encoding: 'utf8' })
    if (r.status === 0) cBinary = join(dir, 'peer_c')
    else notes.push(`C peer failed to build: ${r.stderr.trim().split('\n')[0]}`)
  }
  if (python === null) notes.push('python3 with numpy not found: numpy peer skipped')
  return { dir, cBinary, numpy: python !== null, notes, gcc: gcc ?? 'none', python: python ?? 'none' }
}
