import { spawn, spawnSync } from 'node:child_process';
import path from 'node:path';
import { buildClient } from './build-client';
import { repoRoot } from './paths';
import { prepareTestEnvironment } from './test-environment';

const startedAt = performance.now();
const filesNamed = process.argv.slice(2).some((arg) => !arg.startsWith('-'));
if (!filesNamed) {
  // The whole suite starts with the checks that keep the code as DEVELOPERS.md describes it:
  // types, lint (with the import boundaries) and one format. A run of named files skips them.
  console.log('• Checks: tsc, ESLint, Prettier (npm run check) …');
  const checks = spawnSync('npm', ['run', '--silent', 'check'], {
    cwd: repoRoot,
    stdio: 'inherit',
  });
  if (checks.status !== 0) {
    console.error(
      '\n✗ npm run check failed: fix the types, lint or format above, then run npm test again.',
    );
    process.exit(1);
  }
  console.log(`• Checks passed in ${((performance.now() - startedAt) / 1000).toFixed(1)} s`);
}
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
