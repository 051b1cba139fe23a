import { defineConfig } from 'vitest/config'

/**
 * Two tiers. `fast`: pure computation (engine, spec, lifecycle core, figures), files in parallel on every
 * core; `npm run test:fast` runs only this tier. `service`: everything that starts servers,
 * threads, worker processes, Redis or a browser; its files run one at a time after the fast
 * tier, so they never compete with each other for the cores or the shared Redis.
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
    projects: [
      {
        test: {
          ...shared,
          name: 'fast',
          include: FAST,
          // Figure tests that drive the HTTP app belong with the service tier.
          exclude: ['test/figures/route.test.ts'],
          sequence: { groupOrder: 0 }
        }
      },
      {
        test: {
          ...shared,
          name: 'service',
          include: ['test/**/*.test.ts'],
          exclude: ['test/engine/**', 'test/spec/**', 'test/sweep/**', 'test/figures/!(route).test.ts', 'test/architecture.test.ts'],
          fileParallelism: false,
          sequence: { groupOrder: 1 }
        }
      }
    ]
  }
})
