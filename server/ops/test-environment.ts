import { loadConfig, type Config } from '../config';
import { appDataSource } from '../db/options';
import { loadShippedProtocols } from '../protocols/load-shipped';
import { ensureDatabaseFor, recreateDatabase } from './database-setup';
import {
  localEnvironment,
  localOwnerCredentials,
  testDatabase as defaultTestDatabase,
} from './environment';
import type { DatabaseServer } from './mariadb';

/** The browser tests' database, beside the API tests' one. */
export function browserTestDatabase(testDatabase: string): string {
  return `${testDatabase}_e2e`;
}

/**
 * What every API and browser test needs: the private MariaDB, and the test database emptied and
 * migrated afresh, so a run never depends on what an earlier run left behind.
 */
export async function prepareTestEnvironment(): Promise<{
  config: Config;
  database: DatabaseServer;
}> {
  // LUXTEMPO_TEST_DB lets two people (or two checkouts) run tests side by side on one MariaDB.
  const testDatabase = process.env.LUXTEMPO_TEST_DB ?? defaultTestDatabase;
  if (!/^luxtempo_test[a-z0-9_]*$/.test(testDatabase))
    throw new Error('LUXTEMPO_TEST_DB must start with luxtempo_test (it is emptied on every run)');
  const env = localEnvironment(testDatabase);
  // Mail from tests goes to a port of its own (nothing listens there unless a test starts a catcher).
  Object.assign(process.env, env, { NODE_ENV: 'test', DEMO_DATA: 'false', SMTP_PORT: '1126' });
  const config = loadConfig(process.env);
  // The API tests and the browser tests each get a database: API tests leave many records behind
  // that a browser test, reading lists as a person would, should not have to wade through.
  const databases = [testDatabase, browserTestDatabase(testDatabase)];
  // The owner's password stays in this preparing process: vitest and the apps it starts get none.
  const owner = localOwnerCredentials();
  const database = await ensureDatabaseFor(config, owner, databases);
  for (const name of databases) {
    const named = { ...config, DB_NAME: name };
    await recreateDatabase(named, owner);
    const app = appDataSource(named);
    await app.initialize();
    await loadShippedProtocols(app).finally(() => app.destroy());
  }
  process.env.LUXTEMPO_TEST_PREPARED = '1';
  return { config, database };
}
