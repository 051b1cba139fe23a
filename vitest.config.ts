import { defineConfig } from 'vitest/config'

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    globals: false,
    testTimeout: 60_000,
    hookTimeout: 60_000,
    // Redis-backed files share one server; running files one at a time keeps them from
    // competing for the two cores and keeps timing-sensitive tests honest.
    fileParallelism: false
  }
})
