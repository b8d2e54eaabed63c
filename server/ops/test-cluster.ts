import { spawn } from 'node:child_process';
import path from 'node:path';
import { repoRoot } from './paths';

// `npm run test:cluster`: the cluster's fault tests, apart from `npm test` (they start three
// database nodes several times and wait out failure detection: minutes, not seconds).
const startedAt = performance.now();
const vitest = spawn(
  path.join(repoRoot, 'node_modules/.bin/vitest'),
  ['run', '--config', 'vitest.cluster.config.ts', ...process.argv.slice(2)],
  { cwd: repoRoot, stdio: 'inherit', env: process.env },
);
for (const signal of ['SIGINT', 'SIGTERM'] as const) process.on(signal, () => vitest.kill(signal));
const code: number = await new Promise((resolve) =>
  vitest.on('exit', (c, s) => resolve(c ?? (s ? 1 : 0))),
);
console.log(
  `• npm run test:cluster finished in ${((performance.now() - startedAt) / 1000).toFixed(1)} s`,
);
process.exit(code);
