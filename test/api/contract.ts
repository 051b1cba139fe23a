/**
 * The API contract, as a function of the queue backend: the same suite runs against the
 * embedded backend (test/api/embedded.contract.test.ts) and against Redis.
 */
import type { QueueFactory } from './helpers/harness.js'
import { errorsContract } from './contract/errors.js'
import { eventsContract } from './contract/events.js'
import { resultsContract } from './contract/results.js'
import { sweepContract } from './contract/sweeps.js'
import { tokensContract } from './contract/tokens.js'
import { operationsContract } from './contract/operations.js'
import { measuresContract } from './contract/measures.js'
import { workflowContract } from './contract/workflow.js'
import { bundleContract } from './contract/bundle.js'
import { callbacksContract } from './contract/callbacks.js'

export type { QueueFactory } from './helpers/harness.js'

export function defineApiContract (factory: QueueFactory): void {
  sweepContract(factory)
  resultsContract(factory)
  eventsContract(factory)
  errorsContract(factory)
  tokensContract(factory)
  operationsContract(factory)
  measuresContract(factory)
  workflowContract(factory)
  bundleContract(factory)
  callbacksContract(factory)
}
