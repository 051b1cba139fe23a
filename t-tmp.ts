import { firstParallelStepExact } from './src/engine/theory/index.js'
for (const ties of ['keep','random'] as const) console.log(ties, firstParallelStepExact(786525, 42576, 0, { ties }), firstParallelStepExact(786525, 42576, 0.3, { ties }))
