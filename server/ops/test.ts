import { spawn } from 'node:child_process';
import path from 'node:path';
import { buildClient } from './build-client';
import { repoRoot } from './paths';
import { prepareTestEnvironment } from './test-environment';

const startedAt = performance.now();
const { database } = await prepareTestEnvironment();
console.log(`• Test database ready; client build: ${await buildClient()}`);

const vitest = spawn(
  path.join(repoRoot, 'node_modules/.bin/vitest'),
  ['run', ...process.argv.slice(2)],
  {
    cwd: repoRoot,
    stdio: 'inherit',
    env: process.env,
  },
);
for (const signal of ['SIGINT', 'SIGTERM'] as const) process.on(signal, () => vitest.kill(signal));
const code: number = await new Promise((resolve) =>
  vitest.on('exit', (c, s) => resolve(c ?? (s ? 1 : 0))),
);
await database.stop();
console.log(`• npm test finished in ${((performance.now() - startedAt) / 1000).toFixed(1)} s`);
process.exit(code);
