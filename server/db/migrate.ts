import 'reflect-metadata';
import type { Config } from '../config';
import { grantAppUserRights } from './grants';
import { ownerDataSource, type OwnerCredentials } from './options';

/** Runs pending migrations as the owner user, then gives the app user its table rights. */
export async function migrateDatabase(
  config: Config,
  ownerCredentials: OwnerCredentials,
): Promise<string[]> {
  // The grant step tries REVOKEs that may find nothing to revoke; those failures are expected.
  const owner = ownerDataSource(config, ownerCredentials, {
    migrationsTransactionMode: 'each',
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
