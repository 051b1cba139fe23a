/** The API contract against the embedded backend (SQLite in a temp dir, two worker threads). */
import { createEmbeddedQueue } from '../../src/backends/embedded/index.js'
import { defineApiContract } from './contract.js'

defineApiContract(async ({ dataDir }) => await createEmbeddedQueue({ dataDir, threads: 2 }))
