/** Engine version recorded with every result; bump when any result for a given spec can change. */
export const ENGINE_VERSION = '0.2.0'
