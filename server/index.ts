import 'reflect-metadata';
import cluster from 'node:cluster';
import type { Server } from 'node:http';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { createApp } from './app';
import { systemClock, type Clock } from './clock';
import { loadConfig, type Config } from './config';
import { appDataSource } from './db/options';
import type { Database } from './db/unit-of-work';
import { createSmtpMailer, type Mailer } from './mail/mailer';
import { createOutboxWorker, type OutboxWorker } from './mail/outbox';
import { createOutboxRepository } from './mail/outbox-repository';
import { createFhirGateway } from './fhir/client';
import { createFhirDeliveryWorker, type FhirDeliveryWorker } from './fhir/delivery-worker';
import { createFhirRepository } from './fhir/repository';
import { loadShippedProtocols } from './protocols/load-shipped';
import { recomputeRunningSessions } from './sessions/recover';

const followUpSweepMs = 15 * 60_000;

export interface RunningWebServer {
  url: string;
  server: Server;
  dataSource: Database;
  mailer: Mailer;
  outbox: OutboxWorker;
  /** Sends treatment bundles to the FHIR server; null when FHIR_BASE_URL is unset. */
  fhirOutbox: FhirDeliveryWorker | null;
  config: Config;
  /** Plans follow-up visits and queues reminders every quarter of an hour. */
  followUpTimer?: NodeJS.Timeout;
}

/**
 * Connects to the database as the app user, loads the shipped protocol files (refusing to start
 * if one differs from its stored version) and listens. Migrations are not run here.
 */
export async function startWebServer(
  options: { config?: Config; clientDir?: string; port?: number; clock?: Clock } = {},
): Promise<RunningWebServer> {
  const config = options.config ?? loadConfig();
  const clock = options.clock ?? systemClock;
  const dataSource = appDataSource(config);
  await dataSource.initialize();
  try {
    const { added } = await loadShippedProtocols(dataSource);
    if (added.length) console.log(`• Protocol versions loaded: ${added.join(', ')}`);
    const resumed = await recomputeRunningSessions(dataSource, config.UNIT_TIME_ZONE, clock);
    if (resumed) console.log(`• Sessions in progress brought up to date: ${resumed}`);
  } catch (error) {
    await dataSource.destroy();
    throw error;
  }
  const mailer = createSmtpMailer(config);
  const app = createApp({
    config,
    dataSource,
    mailer,
    clientDir: options.clientDir,
    clock,
  });
  const outbox = createOutboxWorker(createOutboxRepository(dataSource), mailer, clock);
  outbox.start();
  const fhirOutbox = config.FHIR_BASE_URL
    ? createFhirDeliveryWorker(
        createFhirRepository(dataSource),
        createFhirGateway(config.FHIR_BASE_URL, config.FHIR_TIMEOUT_MS),
        clock,
      )
    : null;
  fhirOutbox?.start();
  const port = options.port ?? config.PORT;
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(port, config.HOST, () => resolve(s));
    s.on('error', reject);
  });
  const address = server.address();
  const actualPort = typeof address === 'object' && address ? address.port : port;
  const sweep = app.locals.followUpSweep as () => Promise<void>;
  const followUpTimer = setInterval(() => {
    sweep().catch((error: unknown) => console.error('Follow-up sweep failed:', error));
  }, followUpSweepMs);
  followUpTimer.unref();
  return {
    url: `http://${config.HOST}:${actualPort}`,
    server,
    dataSource,
    mailer,
    outbox,
    fhirOutbox,
    config,
    followUpTimer,
  };
}

export async function stopWebServer(running: RunningWebServer): Promise<void> {
  clearInterval(running.followUpTimer);
  await new Promise<void>((resolve) => {
    running.server.close(() => resolve());
    running.server.closeAllConnections();
  });
  await running.outbox.stop();
  await running.fhirOutbox?.stop();
  running.mailer.close();
  if (running.dataSource.isInitialized) await running.dataSource.destroy();
}

// `tsx server/index.ts` serves with settings from the environment (see README, "Configuration").
// WEB_CONCURRENCY=n runs n worker processes sharing the port: the API keeps no state between
// requests, so they need nothing else to agree on.
if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  const workers = Number(process.env.WEB_CONCURRENCY ?? 1);
  if (workers > 1 && cluster.isPrimary) {
    for (let i = 0; i < workers; i++) cluster.fork();
    cluster.on('exit', (worker, code) =>
      console.error(`worker ${worker.process.pid} ended (${code})`),
    );
    for (const signal of ['SIGINT', 'SIGTERM'] as const) {
      process.once(signal, () => {
        for (const worker of Object.values(cluster.workers ?? {})) worker?.kill(signal);
        process.exit(0);
      });
    }
  } else {
    const running = await startWebServer({ clientDir: process.env.CLIENT_DIR });
    console.log(`Luxtempo is serving on ${running.url}`);
    for (const signal of ['SIGINT', 'SIGTERM'] as const) {
      process.once(signal, () => void stopWebServer(running).then(() => process.exit(0)));
    }
  }
}
