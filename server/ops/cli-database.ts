import { parseArgs } from 'node:util';
import { loadConfig, type Config } from '../config';
import type { OwnerCredentials } from '../db/options';
import { ensureDatabaseFor } from './database-setup';
import { appDatabase, localEnvironment, localOwnerCredentials } from './environment';
import type { DatabaseServer } from './mariadb';

/**
 * What the maintenance commands (audit:verify, backup, restore) share: `--database NAME`
 * (default: DB_NAME, else `luxtempo`), the private MariaDB started if it is not running (and
 * stopped again at the end if it was started here), and the owner's sign-in.
 */
export async function openMaintenance(
  argv: string[],
  extra: Record<string, { type: 'boolean' | 'string' }> = {},
) {
  const { values, positionals } = parseArgs({
    args: argv,
    options: { database: { type: 'string' }, ...extra },
    allowPositionals: true,
  });
  const name = (values.database as string | undefined) ?? process.env.DB_NAME ?? appDatabase;
  if (!/^[A-Za-z0-9_]+$/.test(name))
    throw new Error(`--database may hold letters, digits and _ only (got "${name}")`);
  const config: Config = loadConfig({ ...localEnvironment(name), DEMO_DATA: 'false' });
  const owner: OwnerCredentials = localOwnerCredentials();
  const database: DatabaseServer = await ensureDatabaseFor(config, owner, [name]);
  return { config, owner, database, values, positionals };
}

/** Runs a command's body, prints its failure plainly, and stops what it started. */
export async function runMaintenance(
  body: () => Promise<{ code: number; database?: DatabaseServer }>,
): Promise<never> {
  let code = 1;
  let database: DatabaseServer | undefined;
  try {
    ({ code, database } = await body());
  } catch (error) {
    console.error(`✗ ${error instanceof Error ? error.message : String(error)}`);
  }
  await database?.stop();
  process.exit(code);
}
