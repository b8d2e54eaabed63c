import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
export const dataDir = path.join(repoRoot, '.data');
export const clientDistDir = path.join(repoRoot, 'dist/client');
