import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { dataDir } from './paths';

export interface LocalSecrets {
  jwtSecret: string;
  dbOwnerPassword: string;
  dbAppPassword: string;
}

/**
 * Secrets for a local run, made once and kept under the ignored `.data/` so that a restart keeps
 * everyone signed in and the database users keep working. A real deployment sets them in the
 * environment instead (see README, "Configuration").
 */
export function loadLocalSecrets(): LocalSecrets {
  const file = path.join(dataDir, 'secrets.json');
  if (existsSync(file)) return JSON.parse(readFileSync(file, 'utf8')) as LocalSecrets;
  mkdirSync(dataDir, { recursive: true });
  const secrets: LocalSecrets = {
    jwtSecret: randomBytes(48).toString('base64url'),
    dbOwnerPassword: randomBytes(24).toString('base64url'),
    dbAppPassword: randomBytes(24).toString('base64url'),
  };
  writeFileSync(file, JSON.stringify(secrets, null, 2), { mode: 0o600 });
  return secrets;
}
