#!/usr/bin/env node
/**
 * `npm test`'s first step: the linter and the type checker at once (each keeps one core busy
 * for a quarter of a minute, and neither needs the other), each one's output printed whole
 * when it ends. Fails when either fails, after both have finished.
 */
import { spawn } from 'node:child_process'

const CHECKS = [['lint'], ['typecheck']]

function run ([script]) {
  return new Promise((resolve) => {
    const child = spawn('npm', ['run', '--silent', script], { stdio: ['ignore', 'pipe', 'pipe'] })
    let output = ''
    child.stdout.on('data', (chunk) => { output += chunk })
    child.stderr.on('data', (chunk) => { output += chunk })
    child.on('close', (code) => resolve({ script, code, output }))
  })
}

const started = Date.now()
const results = await Promise.all(CHECKS.map(run))
for (const { script, code, output } of results) {
  process.stdout.write(`> ${script}: ${code === 0 ? 'passed' : `failed (exit ${code})`}\n${output}`)
}
process.stdout.write(`static checks took ${((Date.now() - started) / 1000).toFixed(1)} s\n`)
process.exitCode = results.every((r) => r.code === 0) ? 0 : 1
