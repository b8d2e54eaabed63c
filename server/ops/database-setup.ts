import mysql from 'mysql2/promise';
import type { Config } from '../config';
import { migrateDatabase } from '../db/migrate';
import type { OwnerCredentials } from '../db/options';
import { ensureDatabaseServer, type DatabaseServer } from './mariadb';

/** The private MariaDB with the owner and app users, for the databases named. */
export function ensureDatabaseFor(
  config: Config,
  owner: OwnerCredentials,
  databases: string[],
  instanceDir?: string,
): Promise<DatabaseServer> {
  return ensureDatabaseServer({
    port: config.DB_PORT,
    instanceDir,
    databases,
    ownerUser: owner.user,
    ownerPassword: owner.password,
    appUser: config.DB_USER,
    appPassword: config.DB_PASSWORD,
  });
}

/** Drops the database if it exists, creates it empty and runs every migration (as the owner). */
export async function recreateDatabase(config: Config, owner: OwnerCredentials): Promise<void> {
  const db = await mysql.createConnection({
    host: config.DB_HOST,
    port: config.DB_PORT,
    user: owner.user,
    password: owner.password,
  });
  try {
    await db.query(`DROP DATABASE IF EXISTS \`${config.DB_NAME}\``);
    await db.query(
      `CREATE DATABASE \`${config.DB_NAME}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
    );
  } finally {
    await db.end();
  }
  await migrateDatabase(config, owner);
}
