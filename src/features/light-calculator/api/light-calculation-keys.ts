/**
 * The light calculator's keys. A calculation is a pure answer to the figures sent, so nothing is
 * cached and nothing needs invalidating; the key names the mutation for devtools and tests.
 */
export const lightCalculationKeys = {
  all: () => ['light-calculations'] as const,
  run: () => [...lightCalculationKeys.all(), 'run'] as const,
};
