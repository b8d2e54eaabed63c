import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, openSync, readFileSync } from 'node:fs';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { dataDir } from './paths';

/**
 * A private MariaDB (Debian's package) for this checkout: data under `.data/mariadb`, its own
 * socket and pid file, bound to 127.0.0.1 only. Root signs in through the socket alone; the app
 * uses two TCP users: an owner that runs migrations, and an app user with table grants.
 */
export interface DatabaseServerOptions {
  port: number;
  /** Where this instance keeps its files; `.data/` unless a test wants an instance of its own. */
  instanceDir?: string;
  databases: string[];
  ownerUser: string;
  ownerPassword: string;
  appUser: string;
  appPassword: string;
}

export interface DatabaseServer {
  startedHere: boolean;
  pid(): number;
  stop(): Promise<void>;
}

/** Asks an instance to shut down cleanly and waits until it has. */
export function shutdownDatabaseServer(instanceDir?: string): void {
  const { socketPath } = instancePaths(instanceDir);
  spawnSync('mariadb-admin', ['--no-defaults', `--socket=${socketPath}`, '-uroot', 'shutdown'], { stdio: 'ignore' });
}

function instancePaths(instanceDir = dataDir) {
  return {
    mariadbDir: path.join(instanceDir, 'mariadb'),
    socketPath: path.join(instanceDir, 'mariadb.sock'),
    pidFile: path.join(instanceDir, 'mariadb.pid'),
    errorLog: path.join(instanceDir, 'mariadb.err'),
  };
}
type InstancePaths = ReturnType<typeof instancePaths>;

function ping({ socketPath }: InstancePaths): boolean {
  const r = spawnSync('mariadb-admin', ['--no-defaults', `--socket=${socketPath}`, '-uroot', '--connect-timeout=2', 'ping'], {
    stdio: 'ignore',
  });
  return r.status === 0;
}

function initialise({ mariadbDir }: InstancePaths): void {
  if (existsSync(path.join(mariadbDir, 'mysql'))) return;
  mkdirSync(mariadbDir, { recursive: true });
  console.log(`• Initialising a private MariaDB data directory in ${path.relative(process.cwd(), mariadbDir)} …`);
  const r = spawnSync(
    'mariadb-install-db',
    [
      '--no-defaults',
      '--user=root',
      `--datadir=${mariadbDir}`,
      '--auth-root-authentication-method=normal',
      '--skip-test-db',
      '--skip-name-resolve',
    ],
    { encoding: 'utf8' },
  );
  if (r.status !== 0) throw new Error(`mariadb-install-db failed:\n${r.stdout}\n${r.stderr}`);
}

async function waitUntilAnswering(paths: InstancePaths, timeoutMs: number): Promise<void> {
  const { errorLog } = paths;
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (ping(paths)) return;
    await new Promise((r) => setTimeout(r, 150));
  }
  const tail = existsSync(errorLog) ? readFileSync(errorLog, 'utf8').split('\n').slice(-15).join('\n') : '(no log)';
  throw new Error(`MariaDB did not answer within ${timeoutMs / 1000} s. Last lines of ${errorLog}:\n${tail}`);
}

function launch({ mariadbDir, socketPath, pidFile, errorLog }: InstancePaths, port: number): void {
  const user = process.getuid?.() === 0 ? ['--user=root'] : [];
  const log = openSync(errorLog, 'a');
  // Detached so that Ctrl-C on `npm start` reaches us, not the database: we shut it down in order.
  const child = spawn(
    '/usr/sbin/mariadbd',
    [
      '--no-defaults',
      ...user,
      `--datadir=${mariadbDir}`,
      `--socket=${socketPath}`,
      `--pid-file=${pidFile}`,
      `--log-error=${errorLog}`,
      `--port=${port}`,
      '--bind-address=127.0.0.1',
      '--skip-name-resolve',
      '--character-set-server=utf8mb4',
      '--collation-server=utf8mb4_unicode_ci',
      '--default-time-zone=+00:00',
      '--innodb-buffer-pool-size=256M',
      '--max-connections=300',
    ],
    { detached: true, stdio: ['ignore', log, log] },
  );
  child.unref();
}

function sqlString(value: string): string {
  return `'${value.replace(/\\/g, '\\\\').replace(/'/g, "\\'")}'`;
}

async function createDatabasesAndUsers({ socketPath }: InstancePaths, options: DatabaseServerOptions): Promise<void> {
  const root = await mysql.createConnection({ socketPath, user: 'root', multipleStatements: true });
  try {
    for (const host of ['127.0.0.1', 'localhost']) {
      for (const [user, password] of [
        [options.ownerUser, options.ownerPassword],
        [options.appUser, options.appPassword],
      ] as const) {
        await root.query(`CREATE USER IF NOT EXISTS ${sqlString(user)}@${sqlString(host)} IDENTIFIED BY ${sqlString(password)}`);
        await root.query(`ALTER USER ${sqlString(user)}@${sqlString(host)} IDENTIFIED BY ${sqlString(password)}`);
      }
      for (const db of options.databases) {
        await root.query(`CREATE DATABASE IF NOT EXISTS \`${db}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
        // The owner runs migrations and hands table rights to the app user (see server/db/grants.ts);
        // the app user gets no database-wide rights, so the audit table can stay append-only.
        await root.query(`GRANT ALL PRIVILEGES ON \`${db}\`.* TO ${sqlString(options.ownerUser)}@${sqlString(host)} WITH GRANT OPTION`);
      }
    }
  } finally {
    await root.end();
  }
}

export async function ensureDatabaseServer(options: DatabaseServerOptions): Promise<DatabaseServer> {
  if (!existsSync('/usr/sbin/mariadbd')) {
    throw new Error('MariaDB is not installed: run `npm start` or `npm test` (they install mariadb-server with apt-get).');
  }
  const paths = instancePaths(options.instanceDir);
  initialise(paths);
  let startedHere = false;
  if (ping(paths)) {
    console.log(`• Reusing the private MariaDB already running on 127.0.0.1:${options.port}`);
  } else {
    console.log(`• Starting a private MariaDB on 127.0.0.1:${options.port} …`);
    launch(paths, options.port);
    startedHere = true;
    await waitUntilAnswering(paths, 30_000);
  }
  await createDatabasesAndUsers(paths, options);
  return {
    startedHere,
    /** The server's process id, from its pid file. */
    pid: () => Number(readFileSync(paths.pidFile, 'utf8').trim()),
    async stop() {
      if (!startedHere) return;
      shutdownDatabaseServer(options.instanceDir);
    },
  };
}
