#!/usr/bin/env -S node --single-threaded-gc
/**
 * The `memsweep` command: serve the API, run a Redis worker, run a sweep locally, or submit
 * one to a server. Commands are functions of an injected CliIo, so tests drive them exactly
 * as a terminal does.
 */
import { availableParallelism } from 'node:os'
import { realpathSync } from 'node:fs'
import { pathToFileURL } from 'node:url'
import { Command, CommanderError, InvalidArgumentError } from 'commander'
import { bundle } from './commands/bundle.js'
import { figure } from './commands/figure.js'
import { runLocal } from './commands/run-local.js'
import { serve, worker } from './commands/services.js'
import { submit } from './commands/submit.js'
import { collect, extend, parseAddition, purge, resume } from './commands/workflow.js'
import { CliError, EXIT, say, type CliIo } from './io.js'
import { END_STATES } from '../engine/index.js'

const EPILOG = `
Exit codes: 0 success; 1 the sweep failed or was canceled; 2 invalid input or a request the
server refused; 3 the server could not be reached or failed.

Environment: MEMSWEEP_SERVER and MEMSWEEP_TOKEN are defaults for submit's --server and --token;
serve and worker read the variables listed in .env.example (PORT, DATA_DIR, REDIS_URL, ...).`

function positiveInt (value: string): number {
  const n = Number(value)
  if (!Number.isInteger(n) || n < 1) throw new InvalidArgumentError('must be a positive integer')
  return n
}

/** Parses argv and runs the command; returns the process exit code. */
export async function runCli (argv: readonly string[], io: CliIo): Promise<number> {
  let exitCode: number = EXIT.ok
  const program = new Command()
    .name('memsweep')
    .description('Simulation sweeps of Hopfield-type associative-memory networks.')
    .exitOverride()
    .configureOutput({ writeOut: (s) => io.stdout.write(s), writeErr: (s) => io.stderr.write(s) })
    .addHelpText('after', EPILOG)
    .showHelpAfterError()

  program.command('serve')
    .description('start the HTTP API (embedded backend, or Redis when --redis-url / REDIS_URL is set)')
    .option('--port <port>', 'port to listen on (PORT, default 8080)')
    .option('--host <host>', 'address to bind (HOST, default 127.0.0.1: this machine only)')
    .option('--data-dir <dir>', 'where the embedded backend keeps sweeps and results (DATA_DIR, default ./data)')
    .option('--threads <n>', 'compute threads of the embedded backend (WORKER_THREADS, default: cores)')
    .option('--tokens-file <file>', 'bearer tokens, one owner:token[:role] per line (TOKENS_FILE)')
    .option('--allow-anonymous', 'serve without tokens on an address other machines reach (ALLOW_ANONYMOUS)')
    .option('--redis-url <url>', 'use the Redis backend (REDIS_URL)')
    .action(async (options) => { await serve(io, options) })

  program.command('worker')
    .description('start a worker of the Redis backend (any number, on any machines sharing the Redis)')
    .option('--redis-url <url>', 'the shared Redis (REDIS_URL)')
    .option('--prefix <prefix>', 'key prefix shared with the API (REDIS_PREFIX, default memsweep)')
    .option('--concurrency <n>', 'chunks run at once (WORKER_THREADS, default: cores)')
    .option('--max-runtime <duration>', 'inside a batch allocation: take no chunk that would not end within this time of the start, hand back what still runs, exit 0 (WORKER_MAX_RUNTIME; e.g. 2h, 1h30m, 01:55:00)')
    .option('--exit-when-idle <duration>', 'exit 0 after this long without a chunk to run (WORKER_EXIT_WHEN_IDLE; e.g. 5m)')
    .option('--shutdown-grace <duration>', 'after SIGTERM, how long running chunks may go on before they are handed back (WORKER_SHUTDOWN_GRACE, default 60s)')
    .option('--health-port <port>', 'serve /livez and /readyz on this port, for probes (WORKER_HEALTH_PORT)')
    .action(async (options) => { await worker(io, options) })

  program.command('run')
    .description('run a sweep on this machine, no server, and write its results')
    .argument('<spec>', 'sweep spec (JSON file)')
    .requiredOption('-o, --output <file>', 'results file: .csv or .json')
    .option('--format <format>', 'csv or json (default: from the file name)')
    .option('--trials', 'one row per trial instead of one per grid point')
    .option('--series <series>', 'write another series instead of the rows: trajectory (mean trajectories, long format; needs measures.overlapTrajectory)')
    .option('--threads <n>', `compute threads (default: ${availableParallelism()}); 1 runs in this process`, positiveInt)
    .action(async (spec: string, options) => {
      exitCode = await runLocal(io, spec, { ...options, ...(io.signal === undefined ? {} : { signal: io.signal }) })
    })

  program.command('submit')
    .description('submit a sweep to a server; with --wait, follow it and download the results')
    .argument('<spec>', 'sweep spec (JSON file)')
    .option('--server <url>', 'server URL (MEMSWEEP_SERVER)', io.env.MEMSWEEP_SERVER ?? 'http://127.0.0.1:8080')
    .option('--token <token>', 'bearer token (MEMSWEEP_TOKEN)', io.env.MEMSWEEP_TOKEN)
    .option('--wait', 'follow the sweep until it ends; exit non-zero unless it succeeded')
    .option('--output <file>', 'download the results here (.csv or .json); implies --wait')
    .option('--format <format>', 'csv or json (default: from the file name)')
    .option('--trials', 'per-trial rows')
    .option('--series <series>', 'download another series instead of the rows: trajectory (mean trajectories, long format)')
    .option('--reuse', 'reuse the results of an identical finished sweep instead of running again')
    .option('--callback-url <url>', 'ask the server to POST a signed event to this address when the sweep ends (docs/callbacks.md)')
    .option('--idempotency-key <key>', 'makes retrying this submission safe')
    .action(async (spec: string, options) => { exitCode = await submit(io, spec, options) })

  const serverOptions = (command: Command): Command => command
    .option('--server <url>', 'server URL (MEMSWEEP_SERVER)', io.env.MEMSWEEP_SERVER ?? 'http://127.0.0.1:8080')
    .option('--token <token>', 'bearer token (MEMSWEEP_TOKEN)', io.env.MEMSWEEP_TOKEN)
  // extend's --trials is a count, so its per-trial download flag has another name.
  const followOptions = (command: Command, perTrialFlag = '--trials'): Command => command
    .option('--wait', 'follow the sweep until it ends; exit non-zero unless it succeeded')
    .option('--output <file>', 'download the results here (.csv or .json); implies --wait')
    .option('--format <format>', 'csv or json (default: from the file name)')
    .option(perTrialFlag, 'per-trial rows')

  followOptions(serverOptions(program.command('extend')
    .description('extend a sweep with more trials per point and/or more values on an axis; its stored trials are reused, only the rest is computed; prints the new sweep\'s id')
    .argument('<id>', 'the sweep to extend')
    .option('--trials <n>', 'trials per point of the extension (at least the sweep\'s)', positiveInt)
    .option('--add <parameter=values>', 'values to add on an axis, e.g. load=0.13,0.15 (repeatable)', parseAddition)
    .option('--label <text>', 'label of the new sweep (default: the extended sweep\'s)')
    .option('--tag <tag>', 'tag of the new sweep (repeatable; default: the extended sweep\'s tags)', collect)), '--trial-rows')
    .action(async (id: string, options) => { exitCode = await extend(io, id, options) })

  followOptions(serverOptions(program.command('resume')
    .description('let a canceled or failed sweep run on under its id; the chunks it stored are kept')
    .argument('<id>', 'the sweep to resume')))
    .action(async (id: string, options) => { exitCode = await resume(io, id, options) })

  serverOptions(program.command('purge')
    .description('remove a finished sweep with its stored trials and results, for good (its owner only)')
    .argument('<id>', 'the sweep to remove')
    .option('--yes', 'confirm: without it nothing is removed'))
    .action(async (id: string, options) => { exitCode = await purge(io, id, options) })

  serverOptions(program.command('bundle')
    .description('download a succeeded sweep\'s bundle for supplementary material: spec, results, figure, provenance and a README saying how to reproduce them (zip)')
    .argument('<id>', 'the sweep')
    .option('-o, --output <file>', 'zip file to write, - for standard output (default: memsweep-<id>.zip)'))
    .action(async (id: string, options) => { exitCode = await bundle(io, id, options) })

  program.command('figure')
    .description('draw results files (JSON) as a figure (SVG, PNG or PDF); several files are overlaid, one colour per sweep')
    .argument('<results...>', 'results files written by run or downloaded from /results (JSON)')
    .requiredOption('-o, --output <file>', 'file to write: .svg, .png or .pdf (- for standard output)')
    .option('--format <format>', 'svg, png or pdf (default: from the output file\'s extension, else svg)')
    .option('--dpi <dpi>', 'PNG resolution (default 300 for a size in mm, 192 for a size in px)')
    .option('--measure <measure>', 'success, overlap, sweeps, maxOtherOverlap, energy, endState, unstableFraction or fixedPatternFraction (default success)')
    .option('--end-state <class>', `with --measure endState: ${END_STATES.join(', ')}`)
    .option('--x <parameter>', 'varied parameter on the x axis, e.g. load (default: the one with the most values)')
    .option('--series <parameter>', 'varied parameter named first in the series labels')
    .option('--x-scale <scale>', 'linear or log')
    .option('--y-scale <scale>', 'linear or log')
    .option('--error-bars <kind>', 'ci (95 %), se, sd or none (default ci)')
    .option('--no-theory', 'leave theory curves out')
    .option('--width <px>', 'width in px (default 640)')
    .option('--height <px>', 'height in px (default 440)')
    .option('--column <single|double>', 'print size of a journal column: single (85 mm) or double (180 mm); laid out in pt')
    .option('--width-mm <mm>', 'width in mm (print)')
    .option('--height-mm <mm>', 'height in mm (print; default three quarters of the width)')
    .option('--font-size <size>', 'body type size, px (screen) or pt (print); titles and notes scale with it')
    .option('--title <text>', 'title (default: the sweep label)')
    .option('--subtitle <text>', 'line under the title (default: the model conditions)')
    .option('--footnote <text>', 'note under the plot (default: error bars and provenance)')
    .option('--hide-title', 'draw no title')
    .option('--hide-subtitle', 'draw no subtitle')
    .option('--hide-footnote', 'draw no footnote')
    .option('--series-name <name>', 'name of the next series, in the order drawn (repeatable; "" keeps the generated one; no |)', collect)
    .option('--sweep-name <name>', 'overlays: short name of the next sweep, in the order of the files (repeatable)', collect)
    .action(async (files: string[], options) => { exitCode = await figure(io, files, options) })

  try {
    await program.parseAsync([...argv], { from: 'user' })
    return exitCode
  } catch (error) {
    if (error instanceof CommanderError) {
      return error.code === 'commander.helpDisplayed' || error.code === 'commander.version' || error.code === 'commander.help' ? EXIT.ok : EXIT.refused
    }
    if (error instanceof CliError) {
      say(io, error.message)
      return error.exitCode
    }
    say(io, `Unexpected error: ${error instanceof Error ? error.stack ?? error.message : String(error)}`)
    return EXIT.unavailable
  }
}

// Compared through realpath: an npm bin is a symlink to this file.
const invokedDirectly = process.argv[1] !== undefined && import.meta.url === pathToFileURL(realpathSync(process.argv[1])).href
if (invokedDirectly) {
  const interrupt = new AbortController()
  process.once('SIGINT', () => interrupt.abort())
  runCli(process.argv.slice(2), { stdout: process.stdout, stderr: process.stderr, env: process.env, isTTY: process.stderr.isTTY, signal: interrupt.signal })
    .then((code) => { process.exitCode = code }, (error: unknown) => {
      console.error(error)
      process.exitCode = EXIT.unavailable
    })
}
