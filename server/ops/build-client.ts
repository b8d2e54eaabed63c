import { createHash } from 'node:crypto';
import { existsSync, readFileSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { clientDistDir, repoRoot } from './paths';

const inputs = [
  'src',
  'shared',
  'index.html',
  'vite.config.ts',
  'tailwind.config.ts',
  'package-lock.json',
];

function fingerprint(): string {
  const hash = createHash('sha256');
  const walk = (p: string) => {
    const full = path.join(repoRoot, p);
    if (!existsSync(full)) return;
    const stat = statSync(full);
    if (stat.isDirectory()) {
      for (const name of readdirSync(full).sort()) walk(path.join(p, name));
    } else {
      hash.update(p).update(readFileSync(full));
    }
  };
  inputs.forEach(walk);
  return hash.digest('hex');
}

/** Builds the client with Vite unless the last build came from exactly these sources. */
export async function buildClient(): Promise<'built' | 'up to date'> {
  const stamp = path.join(clientDistDir, '.source-sha256');
  const wanted = fingerprint();
  if (existsSync(stamp) && readFileSync(stamp, 'utf8') === wanted) return 'up to date';
  const { build } = await import('vite');
  // Always the production build, even from the test runner (which sets NODE_ENV=test and would
  // otherwise get React's larger development build).
  const nodeEnv = process.env.NODE_ENV;
  process.env.NODE_ENV = 'production';
  try {
    await build({
      root: repoRoot,
      configFile: path.join(repoRoot, 'vite.config.ts'),
      logLevel: 'warn',
      mode: 'production',
    });
  } finally {
    if (nodeEnv === undefined) delete process.env.NODE_ENV;
    else process.env.NODE_ENV = nodeEnv;
  }
  writeFileSync(stamp, wanted);
  return 'built';
}
