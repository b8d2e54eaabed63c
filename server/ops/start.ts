import { loadConfig } from '../config';
import { migrateDatabase } from '../db/migrate';
import { appDataSource } from '../db/options';
import { seedDemoScenario } from '../demo/scenario';
import { seedDemoListsAndStock } from '../demo/lists-and-stock';
import { demoPassword, demoPeople, retireDemoPeople, seedDemoData } from '../demo/seed';
import { loadShippedProtocols } from '../protocols/load-shipped';
import { startApiProcess, type ApiProcess } from './api-process';
import { buildClient } from './build-client';
import { ensureDatabaseFor } from './database-setup';
import { appDatabase, localEnvironment, localOwnerCredentials, testDatabase } from './environment';
import { ensureMailCatcher, type MailCatcher } from './mail-catcher';
import type { DatabaseServer } from './mariadb';
import { clientDistDir } from './paths';

// This process prepares and supervises; the web server is a process of its own, started with an
// environment that has no schema owner's password (the migrations run here, before it starts).
const startedAt = performance.now();
const env = localEnvironment(process.env.DB_NAME ?? appDatabase);
const config = loadConfig(env);

let database: DatabaseServer | undefined;
let mail: MailCatcher | undefined;
let web: ApiProcess | undefined;
let stopping = false;

/** Stops what this run started, newest first; services that were already running stay up. */
async function shutdown(reason: string, exitCode: number) {
  if (stopping) return;
  stopping = true;
  console.log(`\n${reason}: stopping Luxtempo …`);
  if (web) {
    const exited = new Promise<void>((resolve) =>
      web!.child.exitCode !== null ? resolve() : web!.child.once('exit', () => resolve()),
    );
    web.child.kill('SIGTERM');
    await Promise.race([exited, new Promise((r) => setTimeout(r, 10_000))]);
    await web.kill();
  }
  mail?.stop();
  if (database) {
    await database.stop();
    console.log(
      database.startedHere
        ? '• MariaDB shut down.'
        : '• MariaDB left running (it was running before).',
    );
  }
  process.exit(exitCode);
}
process.on('SIGINT', () => void shutdown('SIGINT', 0));
process.on('SIGTERM', () => void shutdown('SIGTERM', 0));

try {
  const owner = localOwnerCredentials();
  database = await ensureDatabaseFor(config, owner, [config.DB_NAME, testDatabase]);
  const ran = await migrateDatabase(config, owner);
  console.log(
    ran.length ? `• Migrations run: ${ran.join(', ')}` : '• Database schema is up to date',
  );

  if (config.DEMO_DATA) {
    const seedSource = appDataSource(config);
    await seedSource.initialize();
    try {
      const { created } = await seedDemoData(seedSource);
      await loadShippedProtocols(seedSource);
      const sessions = await seedDemoScenario(seedSource, config.UNIT_TIME_ZONE);
      const listed = await seedDemoListsAndStock(seedSource, config.UNIT_TIME_ZONE);
      if (listed) console.log(`• Demo lists and stock added (${listed} rows)`);
      console.log(
        created.length || sessions
          ? `• Demo data added (${created.length} people and patients, ${sessions} orders)`
          : '• Demo data already present',
      );
    } finally {
      await seedSource.destroy();
    }
  } else {
    // Demo people have a published password: with demo data off, none of them may sign in.
    const source = appDataSource(config);
    await source.initialize();
    try {
      const retired = await retireDemoPeople(source);
      if (retired) console.log(`• Demo data is off: ${retired} demo people deactivated`);
      const [{ admins }] = await source.query(
        "SELECT COUNT(*) AS admins FROM user WHERE active = 1 AND FIND_IN_SET('admin', roles)",
      );
      if (Number(admins) === 0)
        console.log(
          '• Nobody can sign in yet: create the first administrator with\n    npm run admin:create -- --email you@hospital.example --name "Your Name"',
        );
    } finally {
      await source.destroy();
    }
  }

  mail = await ensureMailCatcher(config.SMTP_PORT, Number(process.env.MAIL_WEB_PORT ?? 1080));
  console.log(`• Mail catcher: SMTP 127.0.0.1:${config.SMTP_PORT}, inbox ${mail.webUrl}`);

  console.log(`• Client build: ${await buildClient()}`);
  web = await startApiProcess({ port: config.PORT, env: { ...env, CLIENT_DIR: clientDistDir } });
  web.child.once(
    'exit',
    (code, signal) => void shutdown(`The web server ended (${code ?? signal})`, code ? 1 : 0),
  );
} catch (error) {
  console.error(
    `\n✗ Luxtempo could not start: ${error instanceof Error ? error.message : String(error)}`,
  );
  await shutdown('Start failed', 1);
}

const seconds = ((performance.now() - startedAt) / 1000).toFixed(1);
const signIns = config.DEMO_DATA
  ? `\nDemo sign-ins (password for all: ${demoPassword}):\n${demoPeople.map((p) => `  ${p.email.padEnd(40)} ${p.roles.join(' + ')}`).join('\n')}\n`
  : '';
console.log(
  `\nLuxtempo is ready (${seconds} s): http://${config.HOST}:${config.PORT}\n${signIns}\nStop with Ctrl-C.`,
);
