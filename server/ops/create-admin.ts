import { parseArgs } from 'node:util';
import { z } from 'zod';
import { loadConfig } from '../config';
import { migrateDatabase } from '../db/migrate';
import { appDataSource } from '../db/options';
import { createFirstAdmin } from '../people/first-admin';
import { ensureDatabaseFor } from './database-setup';
import { appDatabase, localEnvironment, localOwnerCredentials, testDatabase } from './environment';

// npm run admin:create -- --email someone@hospital.example --name "Their Name"
const { values } = parseArgs({ options: { email: { type: 'string' }, name: { type: 'string' } } });
const email = z.string().trim().toLowerCase().email().max(254).safeParse(values.email);
const name = z.string().trim().min(2).max(120).safeParse(values.name);
if (!email.success || !name.success) {
  console.error(
    'Usage: npm run admin:create -- --email someone@hospital.example --name "Their Name"',
  );
  if (!email.success) console.error('  --email must be an e-mail address');
  if (!name.success) console.error('  --name must be 2 to 120 characters');
  process.exit(2);
}

const config = loadConfig(localEnvironment(process.env.DB_NAME ?? appDatabase));
// The same private MariaDB `npm start` uses; started (and stopped again) if it is not running.
const owner = localOwnerCredentials();
const database = await ensureDatabaseFor(config, owner, [config.DB_NAME, testDatabase]);
let exitCode = 0;
try {
  await migrateDatabase(config, owner);
  const dataSource = appDataSource(config);
  await dataSource.initialize();
  try {
    const { url, created, expiresInHours } = await createFirstAdmin(dataSource, config, {
      email: email.data,
      displayName: name.data,
    });
    console.log(
      created
        ? `Administrator ${email.data} created.`
        : `${email.data} is already an administrator: here is a fresh link.`,
    );
    console.log(
      `Give them this one-time link to set their password (it works once, for ${expiresInHours} hours):\n\n  ${url}\n`,
    );
  } finally {
    await dataSource.destroy();
  }
} catch (error) {
  console.error(`✗ ${error instanceof Error ? error.message : String(error)}`);
  exitCode = 1;
} finally {
  await database.stop();
}
process.exit(exitCode);
