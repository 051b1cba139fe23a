/** The embedded queue backend: SQLite in DATA_DIR plus worker threads in this process. */
export { createEmbeddedQueue, type EmbeddedQueueOptions, type EmbeddedQueueTuning } from './queue.js'
export { InvalidCursorError } from './cursor.js'
export { DATABASE_FILE } from './store.js'
