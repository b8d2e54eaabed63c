import { loadConfig } from '../config';
import { migrateDatabase } from '../db/migrate';
import { appDataSource } from '../db/options';
import { demoPassword, demoPeople, seedDemoData } from '../demo/seed';
import { startWebServer, stopWebServer } from '../index';
import { buildClient } from './build-client';
import { appDatabase, localEnvironment, testDatabase } from './environment';
import { ensureMailCatcher } from './mail-catcher';
import { ensureDatabaseServer } from './mariadb';
import { clientDistDir } from './paths';

const startedAt = performance.now();
const config = loadConfig(localEnvironment(process.env.DB_NAME ?? appDatabase));

const database = await ensureDatabaseServer({
  port: config.DB_PORT,
  databases: [config.DB_NAME, testDatabase],
  ownerUser: config.DB_OWNER_USER,
  ownerPassword: config.DB_OWNER_PASSWORD,
  appUser: config.DB_USER,
  appPassword: config.DB_PASSWORD,
});

const ran = await migrateDatabase(config);
console.log(ran.length ? `• Migrations run: ${ran.join(', ')}` : '• Database schema is up to date');

if (config.DEMO_DATA) {
  const seedSource = appDataSource(config);
  await seedSource.initialize();
  const { created } = await seedDemoData(seedSource);
  await seedSource.destroy();
  console.log(created.length ? `• Demo data added (${created.length} people)` : '• Demo data already present');
}

const mailWebPort = Number(process.env.MAIL_WEB_PORT ?? 1080);
const mail = await ensureMailCatcher(config.SMTP_PORT, mailWebPort);
console.log(`• Mail catcher: SMTP 127.0.0.1:${config.SMTP_PORT}, inbox ${mail.webUrl}`);

console.log(`• Client build: ${await buildClient()}`);
const running = await startWebServer({ config, clientDir: clientDistDir });

const seconds = ((performance.now() - startedAt) / 1000).toFixed(1);
console.log(`
Luxtempo is ready (${seconds} s): ${running.url}
${config.DEMO_DATA ? `
Demo sign-ins (password for all: ${demoPassword}):
${demoPeople.map((p) => `  ${p.email.padEnd(40)} ${p.roles.join(' + ')}`).join('\n')}
` : ''}
Stop with Ctrl-C.`);

let stopping = false;
async function shutdown(signal: string) {
  if (stopping) return;
  stopping = true;
  console.log(`\n${signal}: stopping Luxtempo …`);
  await stopWebServer(running).catch(() => undefined);
  mail.stop();
  await database.stop();
  console.log(database.startedHere ? '• MariaDB shut down.' : '• MariaDB left running (it was running before).');
  process.exit(0);
}
process.on('SIGINT', () => void shutdown('SIGINT'));
process.on('SIGTERM', () => void shutdown('SIGTERM'));
