// npm run backup [-- --database NAME] — a consistent backup of one database with mariadb-dump
// --single-transaction (a snapshot: the app keeps running), written to .data/backups/ with mode
// 0600. Restore it with `npm run restore -- FILE`.
import { spawn } from 'node:child_process';
import { closeSync, mkdirSync, openSync, chmodSync, statSync } from 'node:fs';
import path from 'node:path';
import { openMaintenance, runMaintenance } from './cli-database';
import { dataDir } from './paths';

export const backupDir = path.join(dataDir, 'backups');

await runMaintenance(async () => {
  const { config, owner, database } = await openMaintenance(process.argv.slice(2));
  mkdirSync(backupDir, { recursive: true, mode: 0o700 });
  chmodSync(backupDir, 0o700);
  const stamp = new Date()
    .toISOString()
    .replace(/[-:]/g, '')
    .replace(/\.\d+Z$/, 'Z');
  const file = path.join(backupDir, `${config.DB_NAME}-${stamp}.sql`);
  // Created 0600 before a byte is written: the dump holds health data and password hashes.
  const fd = openSync(file, 'wx', 0o600);
  const code = await new Promise<number>((resolve, reject) => {
    const dump = spawn(
      'mariadb-dump',
      [
        '--no-defaults',
        `--host=${config.DB_HOST}`,
        `--port=${config.DB_PORT}`,
        `--user=${owner.user}`,
        '--single-transaction',
        '--triggers',
        '--hex-blob',
        '--no-tablespaces',
        '--skip-comments',
        config.DB_NAME,
      ],
      // The password goes by the environment, never on the command line where `ps` shows it.
      { env: { ...process.env, MYSQL_PWD: owner.password }, stdio: ['ignore', fd, 'inherit'] },
    );
    dump.on('error', reject);
    dump.on('exit', (c) => resolve(c ?? 1));
  });
  closeSync(fd);
  if (code !== 0)
    throw new Error(
      `mariadb-dump failed (exit ${code}); the partial file ${file} is not a backup.`,
    );
  console.log(`✓ Backup of ${config.DB_NAME} written (${statSync(file).size} bytes, mode 0600):`);
  console.log(file);
  return { code: 0, database };
});
