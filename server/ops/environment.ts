import type { OwnerCredentials } from '../db/options';
import { loadLocalSecrets } from './local-secrets';

export const appDatabase = 'luxtempo';
export const testDatabase = 'luxtempo_test';

/**
 * The environment for a run on this machine: what is already set wins (so a site can point at
 * its own database and secrets), the rest comes from `.data/secrets.json` and local defaults.
 * It never carries the schema owner's password: that is for the migration step alone
 * (`localOwnerCredentials`), and the web server is started without it (`webServerEnvironment`).
 */
export function localEnvironment(database: string): NodeJS.ProcessEnv {
  const secrets = loadLocalSecrets();
  return webServerEnvironment({
    DB_PASSWORD: secrets.dbAppPassword,
    JWT_SECRET: secrets.jwtSecret,
    ...process.env,
    DB_NAME: database,
  });
}

/** The schema owner's sign-in for migrations, backups and restores: from the environment, else from `.data/`. */
export function localOwnerCredentials(env: NodeJS.ProcessEnv = process.env): OwnerCredentials {
  return {
    user: env.DB_OWNER_USER || 'luxtempo_owner',
    password: env.DB_OWNER_PASSWORD || loadLocalSecrets().dbOwnerPassword,
  };
}

/** An environment with the schema owner's password taken out: what a web server process is given. */
export function webServerEnvironment(env: NodeJS.ProcessEnv): NodeJS.ProcessEnv {
  const { DB_OWNER_PASSWORD: _dropped, ...rest } = env;
  return rest;
}
