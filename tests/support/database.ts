import { spawnSync } from 'node:child_process';
import mysql from 'mysql2/promise';
import type { Config } from '../../server/config';
import { ensureDatabaseFor, recreateDatabase } from '../../server/ops/database-setup';
import { localOwnerCredentials } from '../../server/ops/environment';
import { repoRoot } from '../../server/ops/paths';
import { testConfig } from './api';

/** A connection as the app's own database user (table rights only), as the web server has. */
export function appConnection(config: Config) {
  return mysql.createConnection({
    host: config.DB_HOST,
    port: config.DB_PORT,
    user: config.DB_USER,
    password: config.DB_PASSWORD,
    database: config.DB_NAME,
    dateStrings: true,
  });
}

/** A connection as the schema owner: what someone with the migration password could do. */
export function ownerConnection(config: Config) {
  const owner = localOwnerCredentials();
  return mysql.createConnection({
    host: config.DB_HOST,
    port: config.DB_PORT,
    user: owner.user,
    password: owner.password,
    database: config.DB_NAME,
    dateStrings: true,
  });
}

/** A database of the test's own beside the test database, emptied and migrated. */
export async function freshTestDatabase(suffix: string): Promise<Config> {
  const config = testConfig({ DB_NAME: `${testConfig().DB_NAME}_${suffix}` });
  await ensureDatabaseFor(config, localOwnerCredentials(), [config.DB_NAME]);
  await recreateDatabase(config, localOwnerCredentials());
  return config;
}

/** Runs one of the maintenance commands (`npm run <name>`) as its own process, the way a person would. */
export function runCommand(script: string, args: string[], env: NodeJS.ProcessEnv = {}) {
  const r = spawnSync(process.execPath, ['--import', 'tsx', script, ...args], {
    cwd: repoRoot,
    encoding: 'utf8',
    env: { ...process.env, ...env },
    timeout: 120_000,
  });
  return { code: r.status, out: `${r.stdout}${r.stderr}` };
}
