import { loadConfig } from '../config';
import { demoFhirPatients } from '../fhir-fake/demo-patients';
import { startFakeFhirServer, type FakeFhirServer } from '../fhir-fake/fake-server';
import { demoSignIns, prepareAppDatabase } from './app-database';
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
let fakeFhir: FakeFhirServer | undefined;
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
  await fakeFhir?.stop();
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
  await prepareAppDatabase(config, owner);

  mail = await ensureMailCatcher(config.SMTP_PORT, Number(process.env.MAIL_WEB_PORT ?? 1080));
  console.log(`• Mail catcher: SMTP 127.0.0.1:${config.SMTP_PORT}, inbox ${mail.webUrl}`);

  // The hospital's FHIR server: the one configured, or the local fake with the demo patients.
  let fhirBaseUrl = config.FHIR_BASE_URL;
  if (!fhirBaseUrl && process.env.FHIR_FAKE !== 'false') {
    const port = Number(process.env.FHIR_FAKE_PORT ?? 3090);
    const url = `http://127.0.0.1:${port}`;
    const running = await fetch(`${url}/metadata`, { signal: AbortSignal.timeout(1000) })
      .then((r) => r.ok)
      .catch(() => false);
    if (!running) fakeFhir = await startFakeFhirServer({ port, patients: demoFhirPatients() });
    fhirBaseUrl = url;
    console.log(
      `• Fake FHIR server (fictitious demo patients): ${url}${running ? ' (already running)' : ''}`,
    );
  } else if (fhirBaseUrl) console.log(`• FHIR server: ${fhirBaseUrl}`);
  else console.log('• FHIR: off (FHIR_FAKE=false and no FHIR_BASE_URL)');

  console.log(`• Client build: ${await buildClient()}`);
  web = await startApiProcess({
    port: config.PORT,
    env: {
      ...env,
      CLIENT_DIR: clientDistDir,
      ...(fhirBaseUrl ? { FHIR_BASE_URL: fhirBaseUrl } : {}),
    },
  });
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
const signIns = demoSignIns(config);
console.log(
  `\nLuxtempo is ready (${seconds} s): http://${config.HOST}:${config.PORT}\n${signIns}\nStop with Ctrl-C.`,
);
