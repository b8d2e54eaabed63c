import { mkdirSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { loadConfig, type Config } from '../config';
import { startApiProcess, type ApiProcess } from './api-process';
import { prepareAppDatabase } from './app-database';
import { localEnvironment, localOwnerCredentials } from './environment';
import {
  galeraPaths,
  killGaleraNode,
  startGaleraNode,
  stopGaleraNode,
  storedSeqno,
  type GaleraNodeSpec,
} from './galera';
import { startHaproxy, type Haproxy } from './haproxy';
import { ensureMailCatcher, type MailCatcher } from './mail-catcher';
import { prepareAccounts } from './mariadb';
import { startNodeCheckAgent } from './node-check';
import { dataDir } from './paths';

/**
 * Where everything of a loopback cluster listens. Every port comes from the environment (a list
 * for the per-node and per-process ones), with defaults that collide with no other default
 * (the app's 3000 and 3307, the tests' 3317 and 3391-3392).
 */
export interface ClusterSettings {
  dir: string;
  database: string;
  webPort: number;
  apiPorts: number[];
  databasePort: number;
  checkPort: number;
  nodes: GaleraNodeSpec[];
  smtpPort: number;
  mailWebPort: number;
}

function portList(env: NodeJS.ProcessEnv, name: string, fallback: number[], count?: number) {
  const raw = env[name];
  const ports = raw ? raw.split(',').map((p) => Number(p.trim())) : fallback;
  if (ports.some((p) => !Number.isInteger(p) || p < 1 || p > 65535))
    throw new Error(`${name} must be a comma-separated list of ports (1-65535), got "${raw}"`);
  if (count !== undefined && ports.length !== count)
    throw new Error(`${name} must list ${count} ports, one per node; got ${ports.length}`);
  return ports;
}

function onePort(env: NodeJS.ProcessEnv, name: string, fallback: number) {
  return portList(env, name, [fallback], 1)[0]!;
}

export function clusterSettings(env: NodeJS.ProcessEnv = process.env): ClusterSettings {
  const dir = path.resolve(env.CLUSTER_DIR ?? path.join(dataDir, 'cluster'));
  const dbPorts = portList(env, 'CLUSTER_DB_PORTS', [3451, 3452, 3453], 3);
  const galeraPorts = portList(env, 'CLUSTER_GALERA_PORTS', [4571, 4572, 4573], 3);
  const istPorts = portList(env, 'CLUSTER_IST_PORTS', [4581, 4582, 4583], 3);
  const sstPorts = portList(env, 'CLUSTER_SST_PORTS', [4591, 4592, 4593], 3);
  const apiPorts = portList(env, 'CLUSTER_API_PORTS', [3151, 3152]);
  if (apiPorts.length < 2) throw new Error('CLUSTER_API_PORTS must list two or more ports');
  return {
    dir,
    database: env.CLUSTER_DB_NAME ?? 'luxtempo',
    webPort: onePort(env, 'CLUSTER_PORT', 3150),
    apiPorts,
    databasePort: onePort(env, 'CLUSTER_DB_FRONT_PORT', 3158),
    checkPort: onePort(env, 'CLUSTER_CHECK_PORT', 3159),
    smtpPort: onePort(env, 'CLUSTER_SMTP_PORT', 2526),
    mailWebPort: onePort(env, 'CLUSTER_MAIL_WEB_PORT', 1826),
    nodes: dbPorts.map((dbPort, i) => ({
      name: `node${i + 1}`,
      dir: path.join(dir, `node${i + 1}`),
      address: '127.0.0.1',
      dbPort,
      galeraPort: galeraPorts[i]!,
      istPort: istPorts[i]!,
      sstPort: sstPorts[i]!,
    })),
  };
}

async function portIsFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const probe = net.createServer();
    probe.once('error', () => resolve(false));
    probe.listen(port, '127.0.0.1', () => probe.close(() => resolve(true)));
  });
}

export interface RunningCluster {
  settings: ClusterSettings;
  /** The API processes' configuration (the database reached through HAProxy). */
  config: Config;
  url: string;
  mailWebUrl: string;
  apis: (ApiProcess | undefined)[];
  startApi(index: number): Promise<ApiProcess>;
  killApi(index: number): Promise<void>;
  startNode(index: number): Promise<void>;
  killNode(index: number): Promise<void>;
  stop(): Promise<void>;
}

/**
 * Starts the whole cluster on loopback: three Galera nodes (the one with the newest data starts
 * the cluster, the others join), HAProxy with its node-check agent, the schema and demo data
 * once, the mail catcher and the API processes. On a failure everything started so far is stopped.
 */
export async function startCluster(
  settings: ClusterSettings,
  options: {
    clientDir?: string;
    env?: NodeJS.ProcessEnv;
    log?: (line: string) => void;
    /** The fault tests send no mail: they start no catcher (the outbox keeps its messages). */
    mailCatcher?: boolean;
  } = {},
): Promise<RunningCluster> {
  const log = options.log ?? (() => undefined);
  const { nodes } = settings;
  const busy: number[] = [];
  for (const port of [
    settings.webPort,
    ...settings.apiPorts,
    settings.databasePort,
    settings.checkPort,
    ...nodes.flatMap((n) => [n.dbPort, n.galeraPort, n.istPort, n.sstPort]),
  ])
    if (!(await portIsFree(port))) busy.push(port);
  if (busy.length)
    throw new Error(
      `ports already in use: ${busy.join(', ')} (another cluster running? set the CLUSTER_* ports, see README)`,
    );
  mkdirSync(settings.dir, { recursive: true, mode: 0o700 });

  const env = {
    ...localEnvironment(settings.database),
    DB_HOST: '127.0.0.1',
    DB_PORT: String(settings.databasePort),
    SMTP_PORT: String(settings.smtpPort),
    PUBLIC_URL: `http://127.0.0.1:${settings.webPort}`,
    // HAProxy, on loopback, says who connected (X-Forwarded-For): the throttle counts that address.
    TRUST_PROXY: 'loopback',
    ...options.env,
  };
  const config = loadConfig(env);
  const owner = localOwnerCredentials();

  let haproxy: Haproxy | undefined;
  let agent: { close(): Promise<void> } | undefined;
  let mail: MailCatcher | undefined;
  const apis: (ApiProcess | undefined)[] = settings.apiPorts.map(() => undefined);
  const started = new Set<number>();

  async function startApi(index: number): Promise<ApiProcess> {
    const api = await startApiProcess({
      port: settings.apiPorts[index]!,
      logFile: path.join(settings.dir, `api${index + 1}.log`),
      env: { ...env, ...(options.clientDir ? { CLIENT_DIR: options.clientDir } : {}) },
    });
    apis[index] = api;
    return api;
  }

  async function stopApi(index: number, signal: 'SIGTERM' | 'SIGKILL'): Promise<void> {
    const api = apis[index];
    apis[index] = undefined;
    if (!api || api.child.exitCode !== null || api.child.signalCode !== null) return;
    const exited = new Promise<void>((r) => api.child.once('exit', () => r()));
    api.child.kill(signal);
    await Promise.race([exited, new Promise((r) => setTimeout(r, 10_000))]);
    await api.kill();
  }

  async function stop(): Promise<void> {
    for (let i = 0; i < apis.length; i++) await stopApi(i, 'SIGTERM');
    await haproxy?.stop();
    await agent?.close();
    mail?.stop();
    // The first node last: it then holds the newest position and starts the cluster next time.
    for (const i of [...started].sort().reverse()) await stopGaleraNode(nodes[i]!);
  }

  try {
    // The node with the newest data starts the cluster; the others catch up from it.
    const seqnos = nodes.map((n) => storedSeqno(n, nodes));
    const first = seqnos.indexOf(Math.max(...seqnos));
    log(
      `• Starting MariaDB ${nodes[first]!.name} (new cluster) on 127.0.0.1:${nodes[first]!.dbPort} …`,
    );
    started.add(first);
    await startGaleraNode(nodes[first]!, nodes, { bootstrap: true });
    await prepareAccounts(galeraPaths(nodes[first]!.dir).socketPath, {
      databases: [settings.database],
      ownerUser: owner.user,
      ownerPassword: owner.password,
      appUser: config.DB_USER,
      appPassword: config.DB_PASSWORD,
    });
    for (const [i, node] of nodes.entries()) {
      if (i === first) continue;
      log(`• Starting MariaDB ${node.name} (joins) on 127.0.0.1:${node.dbPort} …`);
      started.add(i);
      await startGaleraNode(node, nodes, { bootstrap: false });
    }
    agent = await startNodeCheckAgent('127.0.0.1', settings.checkPort, nodes);
    haproxy = await startHaproxy({
      dir: settings.dir,
      webPort: settings.webPort,
      apiPorts: settings.apiPorts,
      databasePort: settings.databasePort,
      checkPort: settings.checkPort,
      nodes,
    });
    log(
      `• HAProxy: web 127.0.0.1:${settings.webPort}, database 127.0.0.1:${settings.databasePort}`,
    );
    await waitForWriter(config);
    await prepareAppDatabase(config, owner);
    if (options.mailCatcher !== false)
      mail = await ensureMailCatcher(settings.smtpPort, settings.mailWebPort);
    for (let i = 0; i < settings.apiPorts.length; i++) {
      await startApi(i);
      log(`• API process ${i + 1} on 127.0.0.1:${settings.apiPorts[i]}`);
    }
  } catch (error) {
    await stop();
    throw error;
  }

  return {
    settings,
    config,
    url: `http://127.0.0.1:${settings.webPort}`,
    mailWebUrl: mail?.webUrl ?? '(no mail catcher)',
    apis,
    startApi,
    killApi: (index) => stopApi(index, 'SIGKILL'),
    async startNode(index) {
      started.add(index);
      await startGaleraNode(nodes[index]!, nodes, { bootstrap: false });
    },
    killNode: (index) => killGaleraNode(nodes[index]!),
    stop,
  };
}

/** HAProxy needs a second or two of checks before it sends connections to a node. */
async function waitForWriter(config: Config): Promise<void> {
  const until = Date.now() + 30_000;
  for (;;) {
    try {
      const db = await mysql.createConnection({
        host: config.DB_HOST,
        port: config.DB_PORT,
        user: config.DB_USER,
        password: config.DB_PASSWORD,
        connectTimeout: 1_000,
      });
      await db.query('SELECT 1');
      await db.end();
      return;
    } catch (error) {
      if (Date.now() > until)
        throw new Error(`no database node behind HAProxy within 30 s: ${String(error)}`, {
          cause: error,
        });
      await new Promise((r) => setTimeout(r, 250));
    }
  }
}
