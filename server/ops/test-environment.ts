import mysql from 'mysql2/promise';
import { loadConfig, type Config } from '../config';
import { migrateDatabase } from '../db/migrate';
import { appDataSource } from '../db/options';
import { loadShippedProtocols } from '../protocols/load-shipped';
import { localEnvironment, testDatabase as defaultTestDatabase } from './environment';
import { ensureDatabaseServer, type DatabaseServer } from './mariadb';

/**
 * What every API and browser test needs: the private MariaDB, and the test database emptied and
 * migrated afresh, so a run never depends on what an earlier run left behind.
 */
export async function prepareTestEnvironment(): Promise<{ config: Config; database: DatabaseServer }> {
  // LUXTEMPO_TEST_DB lets two people (or two checkouts) run tests side by side on one MariaDB.
  const testDatabase = process.env.LUXTEMPO_TEST_DB ?? defaultTestDatabase;
  if (!/^luxtempo_test[a-z0-9_]*$/.test(testDatabase)) throw new Error('LUXTEMPO_TEST_DB must start with luxtempo_test (it is emptied on every run)');
  const env = localEnvironment(testDatabase);
  // Mail from tests goes to a port of its own (nothing listens there unless a test starts a catcher).
  Object.assign(process.env, env, { NODE_ENV: 'test', DEMO_DATA: 'false', SMTP_PORT: '1126' });
  const config = loadConfig(process.env);
  const database = await ensureDatabaseServer({
    port: config.DB_PORT,
    databases: [testDatabase],
    ownerUser: config.DB_OWNER_USER,
    ownerPassword: config.DB_OWNER_PASSWORD,
    appUser: config.DB_USER,
    appPassword: config.DB_PASSWORD,
  });
  const owner = await mysql.createConnection({ host: config.DB_HOST, port: config.DB_PORT, user: config.DB_OWNER_USER, password: config.DB_OWNER_PASSWORD });
  await owner.query(`DROP DATABASE IF EXISTS \`${testDatabase}\``);
  await owner.query(`CREATE DATABASE \`${testDatabase}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  await owner.end();
  await migrateDatabase(config);
  const app = appDataSource(config);
  await app.initialize();
  await loadShippedProtocols(app).finally(() => app.destroy());
  process.env.LUXTEMPO_TEST_PREPARED = '1';
  return { config, database };
}
