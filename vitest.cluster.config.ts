import { defineConfig } from 'vitest/config';

// The cluster's fault tests (`npm run test:cluster`): not part of `npm test`, whose projects
// (vite.config.ts) never include tests/cluster/. One file at a time: they share ports.
export default defineConfig({
  test: {
    include: ['tests/cluster/**/*.test.ts'],
    environment: 'node',
    fileParallelism: false,
    testTimeout: 240_000,
    hookTimeout: 300_000,
  },
});
