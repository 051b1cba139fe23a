import { availableParallelism } from 'node:os'
import { defineConfig } from 'vitest/config'

/**
 * Two tiers. `fast`: pure computation (engine, spec, lifecycle core, figures), files in
 * parallel on every core (vitest's default leaves one idle) and sharing one module graph per
 * worker: these files start nothing and restore what they change (fast paths, workspace
 * limits), and loading the engine anew for each file took two thirds of the tier's time
 * (67 s → 16 s here; the tests also pass in shuffled file and test orders on one worker).
 * `npm run test:fast` runs only this tier. `service`: everything that starts servers,
 * threads, worker processes, Redis or a browser; it runs after the fast tier, two files at a
 * time, each file in a fresh process: much of a service test is waiting (process start-up,
 * Redis round trips, sockets), and no service test depends on the machine's speed or on
 * being alone (each has its own data directory, port and Redis key prefix; sweeps in
 * progress are held at the chunk gate).
 */
const shared = {
  globals: false,
  testTimeout: 60_000,
  hookTimeout: 60_000,
  setupFiles: ['test/setup/fast-check.ts']
}

const FAST = ['test/engine/**/*.test.ts', 'test/spec/**/*.test.ts', 'test/sweep/**/*.test.ts', 'test/figures/**/*.test.ts', 'test/architecture.test.ts']

export default defineConfig({
  test: {
    // Threads start from bundles built once per run instead of loading through tsx (see the file).
    globalSetup: ['test/setup/thread-bundles.ts'],
    projects: [
      {
        test: {
          ...shared,
          name: 'fast',
          include: FAST,
          // Figure tests that drive the HTTP app belong with the service tier.
          exclude: ['test/figures/route.test.ts'],
          isolate: false,
          maxWorkers: availableParallelism(),
          sequence: { groupOrder: 0 }
        }
      },
      {
        test: {
          ...shared,
          name: 'service',
          include: ['test/**/*.test.ts'],
          exclude: ['test/engine/**', 'test/spec/**', 'test/sweep/**', 'test/figures/!(route).test.ts', 'test/architecture.test.ts'],
          maxWorkers: 2,
          sequence: { groupOrder: 1 }
        }
      }
    ]
  }
})
