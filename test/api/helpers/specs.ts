/**
 * Sweep specs for the API tests, in an invented scenario: population codes of rooms
 * stored in a model place-cell network. Sizes are tiny so each finishes in well under a
 * second.
 */

/** Two grid points × 8 trials on 64 neurons: done in milliseconds. */
export const quickSpec = (seed = 11): Record<string, unknown> => ({
  label: 'rooms in a small hippocampus',
  neurons: 64,
  load: { values: [0.05, 0.1] },
  trials: 8,
  seed
})

/**
 * Four loads of a small network, one quick chunk each. Tests that need a sweep running (to
 * cancel it, watch its live events or find it unfinished) hold its chunks at the test gate
 * (test/helpers/chunk-gate.ts) instead of making it slow.
 */
export const heldSpec = (seed = 3): Record<string, unknown> => ({
  label: 'every room of the campus',
  neurons: 120,
  load: { values: [0.06, 0.08, 0.1, 0.12] },
  trials: 40,
  seed
})
