/**
 * Sweep specs for the API tests, in an invented scenario: population codes of rooms
 * stored in a model place-cell network. Sizes are tiny so each finishes in well under a
 * second, except where a test needs a sweep that is still running.
 */

/** Two grid points × 8 trials on 64 neurons: done in milliseconds. */
export const quickSpec = (seed = 11): Record<string, unknown> => ({
  label: 'rooms in a small hippocampus',
  neurons: 64,
  load: { values: [0.05, 0.1] },
  trials: 8,
  seed
})

/** Four loads × 3000 trials on 1000 neurons: about 2 s of CPU (1 s on two threads), several progress events. */
export const mediumSpec = (): Record<string, unknown> => ({
  label: 'rooms along a corridor',
  neurons: 1000,
  load: { from: 0.04, to: 0.16, count: 4 },
  trials: 3000,
  seed: 5
})

/** Tens of seconds of work on two threads with the fast engine: for tests that need a sweep to stay running until canceled. */
export const slowSpec = (): Record<string, unknown> => ({
  label: 'every room of the campus',
  neurons: 1500,
  load: { values: [0.1, 0.12, 0.14] },
  trials: 40000,
  seed: 3
})
