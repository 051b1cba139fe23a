/**
 * Facts about the process that assembles a result, recorded in its provenance. Read here,
 * at the edge, and passed into the pure layers, which never read `process` themselves.
 */
export interface RuntimeFacts {
  /** Node.js version (process.version). */
  node: string
  /** V8 version; Math.exp and friends may change with it. */
  v8: string
}

export function runtimeFacts (): RuntimeFacts {
  return { node: process.version, v8: process.versions.v8 }
}
