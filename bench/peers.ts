import { spawnSync } from 'node:child_process'
import { cpSync, existsSync, mkdtempSync, chmodSync, readdirSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'

/** Our own peer programs (measuring instruments written for this bench, not part of the product). */
const OWN_PEERS = join(dirname(fileURLToPath(import.meta.url)), 'peers')

/**
 * The shared peers (numpy and C programs in ../shared/bench) are measuring instruments, not
 * part of the product: they are copied to a temporary directory, built and run there, never
 * imported or copied into the repository. The peers of the workloads defined here (G1, D4–D7)
 * are our own, in bench/peers; the C one is built into the same temporary directory.
 */
export interface Peers {
  dir: string | null
  /** Path of the built C peer, or null with the reason in `notes`. */
  cBinary: string | null
  /** Path of our own C peer for the Glauber workload G1 (bench/peers/glauber.c), or null. */
  glauberBinary: string | null
  /** The 128-bit bound on D6's arithmetic (bench/peers/softmax128.c), built on x86-64 only, or null. */
  softmaxBoundBinary: string | null
  /** Our own numpy peer for D4–D7 (bench/peers/models_numpy.py), when python3 with numpy exists. */
  modelsScript: string | null
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
    return { dir: null, cBinary: null, glauberBinary: null, softmaxBoundBinary: null, modelsScript: null, numpy: false, notes, gcc: gcc ?? 'none', python: python ?? 'none' }
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
  // Our own peers (bench/peers): the Glauber C program, built with the reference flags, and the models' numpy program.
  let glauberBinary: string | null = null
  if (gcc !== null) {
    const out = join(dir, 'glauber_peer')
    const r = spawnSync('gcc', ['-O3', '-march=native', '-o', out, join(OWN_PEERS, 'glauber.c'), '-lm'], { encoding: 'utf8' })
    if (r.status === 0) glauberBinary = out
    else notes.push(`Glauber C peer failed to build: ${r.stderr.trim().split('\n')[0]}`)
  }
  // The D6 bound: SSE2 only, the width of WebAssembly SIMD (x86-64 only; elsewhere it is not built).
  let softmaxBoundBinary: string | null = null
  if (gcc !== null && process.arch === 'x64') {
    const out = join(dir, 'softmax128')
    const r = spawnSync('gcc', ['-O3', '-msse2', '-mno-avx', '-o', out, join(OWN_PEERS, 'softmax128.c')], { encoding: 'utf8' })
    if (r.status === 0) softmaxBoundBinary = out
    else notes.push(`D6 bound program failed to build: ${r.stderr.trim().split('\n')[0]}`)
  }
  if (python === null) notes.push('python3 with numpy not found: numpy peers skipped')
  return { dir, cBinary, glauberBinary, softmaxBoundBinary, modelsScript: python !== null ? join(OWN_PEERS, 'models_numpy.py') : null, numpy: python !== null, notes, gcc: gcc ?? 'none', python: python ?? 'none' }
}
