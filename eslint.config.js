import neostandard from 'neostandard'

// The engine is pure computation: no I/O, no clock, no ambient randomness.
const enginePurity = {
  files: ['src/engine/**/*.ts'],
  rules: {
    'no-restricted-imports': ['error', {
      patterns: [
        { group: ['node:*', 'fs', 'path', 'os', 'worker_threads', 'child_process'], message: 'src/engine is pure: no Node I/O.' },
        { group: ['fastify*', '@fastify/*', 'bullmq', 'ioredis', 'pino*', 'better-sqlite3', 'piscina'], message: 'src/engine knows nothing of HTTP, queues, logs or storage.' },
        { group: ['../api/*', '../backends/*', '../cli/*', '../worker/*', '../spec/*'], message: 'src/engine depends on nothing outside itself.' }
      ]
    }],
    'no-restricted-properties': ['error',
      { object: 'Math', property: 'random', message: 'Use the injected RandomSource.' },
      { object: 'Date', property: 'now', message: 'The engine has no clock.' },
      { object: 'process', property: 'env', message: 'The engine reads no environment.' }
    ],
    'no-restricted-globals': ['error', 'process', 'performance', 'setTimeout', 'setInterval']
  }
}

export default [
  ...neostandard({ ts: true, ignores: ['dist/**', 'node_modules/**', 'openapi/**', 'coverage/**', 'web/dist/**'] }),
  enginePurity
]
