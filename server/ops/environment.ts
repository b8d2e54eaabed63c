import { loadLocalSecrets } from './local-secrets';

export const appDatabase = 'luxtempo';
export const testDatabase = 'luxtempo_test';

/**
 * The environment for a run on this machine: what is already set wins (so a site can point at
 * its own database and secrets), the rest comes from `.data/secrets.json` and local defaults.
 */
export function localEnvironment(database: string): NodeJS.ProcessEnv {
  const secrets = loadLocalSecrets();
  return {
    DB_PASSWORD: secrets.dbAppPassword,
    DB_OWNER_PASSWORD: secrets.dbOwnerPassword,
    JWT_SECRET: secrets.jwtSecret,
    ...process.env,
    DB_NAME: database,
  };
}
