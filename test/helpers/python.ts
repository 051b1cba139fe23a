/**
 * The Python of the tests' shared virtual environment (scripts/ensure-python-venv.sh, with
 * test/python-requirements.txt), for tests that read the service's files with pandas. When it
 * is missing, such tests skip on a developer's machine but fail in CI (MEMSWEEP_REQUIRE_REDIS=1
 * marks a run that must not skip anything).
 */
import { spawn } from 'node:child_process'
import { existsSync } from 'node:fs'
import { homedir } from 'node:os'
import { join } from 'node:path'

export const TEST_VENV = process.env.MEMSWEEP_PY_VENV ?? join(homedir(), '.cache/memsweep-test-venv')

/** The venv's python, or null when absent (and skipping is allowed); throws in CI. */
export function testPython (): string | null {
  const python = join(TEST_VENV, 'bin/python')
  if (existsSync(python)) return python
  if (process.env.MEMSWEEP_REQUIRE_REDIS === '1') throw new Error(`the tests' Python environment is missing at ${TEST_VENV}: run bash scripts/prepare-tests.sh`)
  return null
}

export interface PythonRun { status: number | null, stdout: string, stderr: string }

/** Runs `code` with the venv's python, `args` as sys.argv[1:]. */
export async function runPython (python: string, code: string, args: string[] = []): Promise<PythonRun> {
  return await runCommand(python, ['-c', code, ...args], { env: { PYTHONDONTWRITEBYTECODE: '1' }, timeoutMs: 60_000 })
}

/** Runs a command to its end and collects what it printed; `env` adds to this process's environment. */
export async function runCommand (command: string, args: string[], options: { cwd?: string, env?: Record<string, string>, timeoutMs?: number } = {}): Promise<PythonRun> {
  const child = spawn(command, args, { ...(options.cwd === undefined ? {} : { cwd: options.cwd }), env: { ...process.env, ...options.env }, timeout: options.timeoutMs ?? 120_000 })
  let stdout = ''
  let stderr = ''
  child.stdout.on('data', (chunk: Buffer) => { stdout += chunk.toString('utf8') })
  child.stderr.on('data', (chunk: Buffer) => { stderr += chunk.toString('utf8') })
  const status = await new Promise<number | null>((resolve) => child.on('close', resolve))
  return { status, stdout, stderr }
}
