/**
 * Builds the web page into `out` (emptied first); returns `out`. See build-web.mjs.
 * `typecheck: false` translates each module on its own (fast, for tests).
 */
export function buildWeb (out: string, options?: { typecheck?: boolean }): string
