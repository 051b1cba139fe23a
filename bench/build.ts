/**
 * The engine runs of the bench time the JavaScript that ships: `bench/workload.ts` and what
 * it imports, compiled by the project's compiler with the project's settings, as `npm run
 * build` compiles the service into dist/. Run through tsx instead, the engine is tsx's
 * on-the-fly transform, which wraps functions and classes in name-keeping helper calls at run
 * time (about a millisecond of the G1 workload).
 *
 * The output goes under node_modules/.cache, so the compiled modules resolve the project's
 * packages.
 */
import { spawnSync } from 'node:child_process'
import { writeFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { fileURLToPath } from 'node:url'

const CONFIG = fileURLToPath(new URL('./tsconfig.workload.json', import.meta.url))
const OUT_DIR = fileURLToPath(new URL('../node_modules/.cache/memsweep-bench/', import.meta.url))

/** Compiles the workload runner; returns the path of its compiled entry. Throws when the compiler fails. */
export function buildWorkloadRunner (): string {
  const tsc = createRequire(import.meta.url).resolve('typescript/bin/tsc')
  const run = spawnSync(process.execPath, [tsc, '-p', CONFIG], { encoding: 'utf8' })
  if (run.status !== 0) throw new Error(`compiling bench/workload.ts failed:\n${run.stdout}${run.stderr}`)
  writeFileSync(`${OUT_DIR}package.json`, '{ "type": "module" }\n')
  return `${OUT_DIR}bench/workload.js`
}
