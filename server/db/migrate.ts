import 'reflect-metadata';
import { DataSource } from 'typeorm';
import type { Config } from '../config';
import { grantAppUserRights } from './grants';
import { dataSourceOptions } from './options';

/** Runs pending migrations as the owner user, then gives the app user its table rights. */
export async function migrateDatabase(config: Config): Promise<string[]> {
  const owner = new DataSource({
    ...dataSourceOptions({
      host: config.DB_HOST,
      port: config.DB_PORT,
      database: config.DB_NAME,
      username: config.DB_OWNER_USER,
      password: config.DB_OWNER_PASSWORD,
    }),
    migrationsTransactionMode: 'each',
    // The grant step tries REVOKEs that may find nothing to revoke; those failures are expected.
    logging: false,
  });
  await owner.initialize();
  try {
    const ran = await owner.runMigrations();
    await grantAppUserRights(owner, config.DB_USER);
    return ran.map((m) => m.name);
  } finally {
    await owner.destroy();
  }
}
