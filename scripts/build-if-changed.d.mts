/** See build-if-changed.mjs: builds dist/ only when its inputs changed since the last build. */
export const BUILD_INPUTS: readonly string[]
export const BUILD_OUTPUTS: readonly string[]
export const STAMP: string
export function buildFingerprint (root?: string): string
export interface BuildOutcome { built: boolean, reason: string, fingerprint: string }
export function buildIfChanged (options?: { root?: string, force?: boolean, build?: (root: string) => Promise<void> | void }): Promise<BuildOutcome>
