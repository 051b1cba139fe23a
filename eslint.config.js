import neostandard from 'neostandard'

/**
 * Import boundaries between the layers of src/, in every subfolder. Patterns match any
 * relative import that passes through a folder of that name, at any depth, so a file deep
 * in src/engine/kernels cannot reach ../../spec unnoticed. test/architecture.test.ts checks
 * the same table on the resolved import graph, and that it has no cycles.
 *
 *   engine      ← nothing
 *   spec        ← engine                      (the contract of a sweep)
 *   results     ← engine, spec                (a result's shape and representations)
 *   figures     ← engine, spec, results
 *   runtime     ← nothing of ours             (process settings for whatever runs the engine)
 *   sweep       ← engine, spec, results, runtime   (the lifecycle core)
 *   backends    ← sweep and below; embedded and redis never import each other
 *   api         ← the queue port (backends/port, backends/errors), sweep ids, and the pure layers
 */
const layer = (name) => [`../${name}/**`, `../../${name}/**`, `../../../${name}/**`, `../../../../${name}/**`]
const layers = (...names) => names.flatMap(layer)
const NODE_IO = ['node:fs', 'node:fs/*', 'node:path', 'node:os', 'node:worker_threads', 'node:child_process', 'node:net', 'node:http', 'fs', 'path', 'os', 'worker_threads', 'child_process']
const SERVICE_LIBRARIES = ['fastify*', '@fastify/*', 'bullmq', 'ioredis', 'pino*', 'better-sqlite3', 'piscina']

function boundary (files, denied, message, extra = []) {
  return {
    files,
    rules: {
      'no-restricted-imports': ['error', {
        patterns: [
          { group: denied, message },
          ...extra
        ]
      }]
    }
  }
}

/** Layers whose results must not depend on the process that computes them: no process, no clock. */
const noRuntime = {
  files: ['src/engine/**/*.ts', 'src/spec/**/*.ts', 'src/results/**/*.ts', 'src/figures/**/*.ts'],
  rules: {
    'no-restricted-properties': ['error',
      { object: 'Math', property: 'random', message: 'Use the injected RandomSource.' },
      { object: 'Date', property: 'now', message: 'Pure layers have no clock; pass times in.' },
      { object: 'process', property: 'env', message: 'Pure layers read no environment.' }
    ],
    'no-restricted-globals': ['error', 'process', 'performance', 'setTimeout', 'setInterval']
  }
}

export default [
  ...neostandard({ ts: true, ignores: ['dist/**', 'node_modules/**', 'openapi/**', 'coverage/**', 'web/dist/**', 'src/api-types/openapi.d.ts'] }),
  boundary(['src/engine/**/*.ts'], layers('spec', 'sweep', 'results', 'figures', 'runtime', 'backends', 'api', 'cli'), 'src/engine depends on nothing outside itself.', [
    { group: NODE_IO, message: 'src/engine is pure: no Node I/O.' },
    { group: SERVICE_LIBRARIES, message: 'src/engine knows nothing of HTTP, queues, logs or storage.' }
  ]),
  boundary(['src/spec/**/*.ts'], layers('sweep', 'results', 'figures', 'runtime', 'backends', 'api', 'cli'), 'src/spec is the contract: it may use the engine only.', [
    { group: NODE_IO, message: 'src/spec is pure: no Node I/O.' },
    { group: SERVICE_LIBRARIES, message: 'src/spec knows nothing of HTTP, queues, logs or storage.' }
  ]),
  boundary(['src/results/**/*.ts'], layers('sweep', 'figures', 'runtime', 'backends', 'api', 'cli'), 'src/results may use the engine and the spec only.', [
    { group: NODE_IO, message: 'src/results is pure: no Node I/O.' },
    { group: SERVICE_LIBRARIES, message: 'src/results knows nothing of HTTP, queues, logs or storage.' }
  ]),
  boundary(['src/figures/**/*.ts'], layers('sweep', 'runtime', 'backends', 'api', 'cli'), 'src/figures may use the engine, the spec and results only.', [
    { group: NODE_IO, message: 'src/figures is pure: no Node I/O.' },
    { group: SERVICE_LIBRARIES, message: 'src/figures knows nothing of HTTP, queues, logs or storage.' }
  ]),
  boundary(['src/runtime/**/*.ts'], layers('engine', 'spec', 'sweep', 'results', 'figures', 'backends', 'api', 'cli'), 'src/runtime is process settings: it depends on none of our layers.'),
  boundary(['src/sweep/**/*.ts'], layers('figures', 'backends', 'api', 'cli'), 'src/sweep is the lifecycle core: backends, API and CLI use it, never the other way.', [
    { group: SERVICE_LIBRARIES, message: 'src/sweep knows nothing of HTTP, queues, logs or a particular storage.' }
  ]),
  boundary(['src/backends/embedded/**/*.ts'], [...layers('api', 'cli', 'figures'), '../redis/**'], 'The embedded backend reaches neither the API, the CLI nor the Redis backend.'),
  boundary(['src/backends/redis/**/*.ts'], [...layers('api', 'cli', 'figures'), '../embedded/**', '../../embedded/**'], 'The Redis backend reaches neither the API, the CLI nor the embedded backend.'),
  boundary(['src/backends/*.ts'], [...layers('api', 'cli', 'figures'), './embedded/**', './redis/**'], 'The port knows no implementation of itself.'),
  boundary(['src/api/**/*.ts'], [...layers('cli'), '../backends/embedded/**', '../../backends/embedded/**', '../backends/redis/**', '../../backends/redis/**'], 'The API reaches a backend only through the queue port (src/backends/port.ts).'),
  noRuntime
]
