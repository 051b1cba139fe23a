/**
 * The engine's T = 0 tie rule: a neuron whose local field is exactly zero keeps its state
 * (dynamics/run.ts). Results state it in their provenance; theory values derived under the
 * other common rule (ties broken at random) carry `TiesRandom` in their names.
 */
export const ENGINE_TIE_RULE = 'keep' as const
