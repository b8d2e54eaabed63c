// npm run restore -- FILE [--database NAME] [--force] — loads a backup made by `npm run backup`
// into a database (default: luxtempo). It refuses a database that holds tables unless --force,
// which empties it first. Then it runs any newer migrations, gives the app user its rights and
// checks the audit chain.
import 'reflect-metadata';
import { spawn } from 'node:child_process';
import { existsSync, openSync, closeSync } from 'node:fs';
import mysql from 'mysql2/promise';
import { verifyAuditChain } from '../audit/repository';
import { migrateDatabase } from '../db/migrate';
import { appDataSource } from '../db/options';
import { openMaintenance, runMaintenance } from './cli-database';

await runMaintenance(async () => {
  const { config, owner, database, values, positionals } = await openMaintenance(
    process.argv.slice(2),
    { force: { type: 'boolean' } },
  );
  const file = positionals[0];
  if (!file || !existsSync(file))
    throw new Error(
      `Name the backup file to restore: npm run restore -- .data/backups/<file>.sql${file ? ` (${file} does not exist)` : ''}`,
    );
  const connection = await mysql.createConnection({
    host: config.DB_HOST,
    port: config.DB_PORT,
    user: owner.user,
    password: owner.password,
  });
  try {
    const [rows] = await connection.query(
      'SELECT COUNT(*) AS n FROM information_schema.tables WHERE table_schema = ?',
      [config.DB_NAME],
    );
    const tables = Number((rows as { n: number }[])[0]!.n);
    if (tables > 0 && !(values as { force?: boolean }).force) {
      throw new Error(
        `The database ${config.DB_NAME} is not empty (${tables} tables); nothing was changed. Restore into a fresh one with --database NAME, or add --force to replace everything in it.`,
      );
    }
    if (tables > 0) {
      console.log(`• Emptying ${config.DB_NAME} (--force) …`);
      await connection.query(`DROP DATABASE \`${config.DB_NAME}\``);
      await connection.query(
        `CREATE DATABASE \`${config.DB_NAME}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
      );
    }
  } finally {
    await connection.end();
  }
  console.log(`• Loading ${file} into ${config.DB_NAME} …`);
  const fd = openSync(file, 'r');
  const code = await new Promise<number>((resolve, reject) => {
    const load = spawn(
      'mariadb',
      [
        '--no-defaults',
        `--host=${config.DB_HOST}`,
        `--port=${config.DB_PORT}`,
        `--user=${owner.user}`,
        config.DB_NAME,
      ],
      {
        env: { ...process.env, MYSQL_PWD: owner.password },
        stdio: [fd, 'inherit', 'inherit'],
      },
    );
    load.on('error', reject);
    load.on('exit', (c) => resolve(c ?? 1));
  });
  closeSync(fd);
  if (code !== 0)
    throw new Error(
      `Loading the backup failed (exit ${code}); ${config.DB_NAME} may be half-filled: restore again with --force.`,
    );
  const ran = await migrateDatabase(config, owner);
  if (ran.length) console.log(`• Migrations run after the restore: ${ran.join(', ')}`);
  const source = appDataSource(config);
  await source.initialize();
  try {
    const report = await verifyAuditChain(source);
    if (!report.ok) {
      console.error(
        `✗ Restored, but the audit trail is broken ${report.firstBrokenId ? `at row ${report.firstBrokenId}` : 'at its end'}: ${report.reason}`,
      );
      return { code: 1, database };
    }
    console.log(
      `✓ Restored ${file} into ${config.DB_NAME}; the audit trail is intact (${report.checked} rows).`,
    );
    return { code: 0, database };
  } finally {
    await source.destroy();
  }
});
