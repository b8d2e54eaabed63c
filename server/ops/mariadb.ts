import { spawn, spawnSync } from 'node:child_process';
import {
  chmodSync,
  chownSync,
  closeSync,
  existsSync,
  mkdirSync,
  openSync,
  readFileSync,
  readdirSync,
  statSync,
} from 'node:fs';
import { userInfo } from 'node:os';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { dataDir } from './paths';

/**
 * A private MariaDB (Debian's package) for this checkout: data under `.data/mariadb`, bound to
 * 127.0.0.1 only, hardened on every start (see README, "Reliability"):
 * - the administrator signs in through the unix socket only (`root` when we run as root, else the
 *   OS user's own name), by the `unix_socket` plugin: no password exists that could be guessed
 *   or sent over TCP; no other root account, no anonymous account, no account with an empty password;
 * - the socket and pid file live in a folder of their own (`mariadb-run/`, mode 0700), the data
 *   folder is 0700, and `secure_file_priv` points at `mariadb-files/` (0700), so the server reads
 *   and writes files nowhere else;
 * - run as root, it starts the server as Debian's `mysql` system user whenever that user can reach
 *   the checkout's `.data/` (a checkout under a private home folder may not allow it: then it says
 *   so and the server runs as root with the other protections).
 * The app uses two TCP users: an owner that runs migrations, and an app user with table grants.
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
  /** The OS user the server runs as (`mysql`, or the user running Luxtempo). */
  osUser: string;
  pid(): number;
  stop(): Promise<void>;
}

export function instancePaths(instanceDir = dataDir) {
  const runDir = path.join(instanceDir, 'mariadb-run');
  return {
    instanceDir,
    mariadbDir: path.join(instanceDir, 'mariadb'),
    runDir,
    socketPath: path.join(runDir, 'mariadb.sock'),
    pidFile: path.join(runDir, 'mariadb.pid'),
    filesDir: path.join(instanceDir, 'mariadb-files'),
    errorLog: path.join(instanceDir, 'mariadb.err'),
    // Where an earlier version kept the socket and pid file, straight in the instance folder.
    legacySocketPath: path.join(instanceDir, 'mariadb.sock'),
    legacyPidFile: path.join(instanceDir, 'mariadb.pid'),
  };
}
type InstancePaths = ReturnType<typeof instancePaths>;

/** The MariaDB account that administers the instance through the socket (unix_socket plugin). */
export function adminUser(): string {
  return process.getuid?.() === 0 ? 'root' : userInfo().username;
}

/** Asks an instance to shut down cleanly and waits until it has. */
export function shutdownDatabaseServer(instanceDir?: string): void {
  const { socketPath } = instancePaths(instanceDir);
  spawnSync(
    'mariadb-admin',
    ['--no-defaults', `--socket=${socketPath}`, `-u${adminUser()}`, 'shutdown'],
    { stdio: 'ignore' },
  );
}

function ping(socketPath: string, user = adminUser()): boolean {
  if (!existsSync(socketPath)) return false;
  const r = spawnSync(
    'mariadb-admin',
    ['--no-defaults', `--socket=${socketPath}`, `-u${user}`, '--connect-timeout=2', 'ping'],
    { stdio: 'ignore' },
  );
  return r.status === 0;
}

interface ServerUser {
  name: string;
  uid: number;
  gid: number;
}

/**
 * Debian's `mysql` system user when we are root and that user can reach the instance folder;
 * otherwise null (the server runs as whoever runs Luxtempo), with the reason.
 */
function chooseServerUser(instanceDir: string): { user: ServerUser | null; why?: string } {
  if (process.getuid?.() !== 0) return { user: null };
  const id = (flag: string) => spawnSync('id', [flag, 'mysql'], { encoding: 'utf8' });
  const uid = id('-u');
  const gid = id('-g');
  if (uid.status !== 0 || gid.status !== 0)
    return { user: null, why: 'there is no `mysql` system user on this machine' };
  // `test -x` as that user: every folder above the instance folder must let it through (the
  // instance folder itself is ours to open, in prepareFolders).
  const above = path.dirname(instanceDir);
  const reach = spawnSync('su', ['-s', '/bin/sh', 'mysql', '-c', `test -x ${shellQuote(above)}`], {
    stdio: 'ignore',
  });
  if (reach.status !== 0)
    return {
      user: null,
      why: `the \`mysql\` system user cannot reach ${above} (it or a folder above it is private to its owner)`,
    };
  return {
    user: { name: 'mysql', uid: Number(uid.stdout.trim()), gid: Number(gid.stdout.trim()) },
  };
}

function shellQuote(value: string): string {
  return `'${value.replace(/'/g, `'\\''`)}'`;
}

/** Gives a folder tree to the server's user, when it is not theirs already (an upgrade from a root-run instance). */
function own(target: string, user: ServerUser | null): void {
  if (!user || !existsSync(target)) return;
  // Every entry, not just the top: a server once run as root may have left root's files inside.
  const walk = (p: string) => {
    const stat = statSync(p);
    if (stat.uid !== user.uid || stat.gid !== user.gid) chownSync(p, user.uid, user.gid);
    if (stat.isDirectory()) for (const entry of readdirSync(p)) walk(path.join(p, entry));
  };
  walk(target);
}

function prepareFolders(paths: InstancePaths, user: ServerUser | null): void {
  // .data/ itself: others may pass through (so the `mysql` user reaches its folders) but not list it.
  mkdirSync(paths.instanceDir, { recursive: true });
  chmodSync(paths.instanceDir, user ? 0o711 : 0o700);
  for (const dir of [paths.runDir, paths.filesDir]) {
    mkdirSync(dir, { recursive: true });
    chmodSync(dir, 0o700);
  }
  if (!existsSync(paths.errorLog)) closeSync(openSync(paths.errorLog, 'a', 0o640));
  chmodSync(paths.errorLog, 0o640);
  for (const p of [paths.mariadbDir, paths.runDir, paths.filesDir, paths.errorLog]) own(p, user);
  if (existsSync(paths.mariadbDir)) chmodSync(paths.mariadbDir, 0o700);
}

function initialise({ mariadbDir }: InstancePaths, user: ServerUser | null): void {
  if (existsSync(path.join(mariadbDir, 'mysql'))) return;
  mkdirSync(mariadbDir, { recursive: true, mode: 0o700 });
  if (user) chownSync(mariadbDir, user.uid, user.gid);
  console.log(
    `• Initialising a private MariaDB data directory in ${path.relative(process.cwd(), mariadbDir)} …`,
  );
  const who =
    process.getuid?.() === 0
      ? [`--user=${user?.name ?? 'root'}`]
      : [`--auth-root-socket-user=${adminUser()}`];
  const r = spawnSync(
    'mariadb-install-db',
    [
      '--no-defaults',
      ...who,
      `--datadir=${mariadbDir}`,
      '--auth-root-authentication-method=socket',
      '--skip-test-db',
      '--skip-name-resolve',
    ],
    { encoding: 'utf8' },
  );
  if (r.status !== 0) throw new Error(`mariadb-install-db failed:\n${r.stdout}\n${r.stderr}`);
}

async function waitUntil(
  check: () => boolean,
  paths: InstancePaths,
  timeoutMs: number,
  what: string,
): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (check()) return;
    await new Promise((r) => setTimeout(r, 150));
  }
  const tail = existsSync(paths.errorLog)
    ? readFileSync(paths.errorLog, 'utf8').split('\n').slice(-15).join('\n')
    : '(no log)';
  throw new Error(
    `MariaDB ${what} within ${timeoutMs / 1000} s. Last lines of ${paths.errorLog}:\n${tail}`,
  );
}

function launch(paths: InstancePaths, port: number, user: ServerUser | null): void {
  const asUser = process.getuid?.() === 0 ? [`--user=${user?.name ?? 'root'}`] : [];
  const log = openSync(paths.errorLog, 'a');
  // Detached so that Ctrl-C on `npm start` reaches us, not the database: we shut it down in order.
  const child = spawn(
    '/usr/sbin/mariadbd',
    [
      '--no-defaults',
      ...asUser,
      `--datadir=${paths.mariadbDir}`,
      `--socket=${paths.socketPath}`,
      `--pid-file=${paths.pidFile}`,
      `--log-error=${paths.errorLog}`,
      `--secure-file-priv=${paths.filesDir}`,
      `--port=${port}`,
      '--bind-address=127.0.0.1',
      '--skip-name-resolve',
      '--local-infile=0',
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

/**
 * An instance an earlier version started (socket straight in the instance folder) is shut down,
 * so that it comes back with the settings above; its data stays as it is.
 */
async function stopLegacyInstance(paths: InstancePaths): Promise<void> {
  if (!existsSync(paths.legacySocketPath)) return;
  if (ping(paths.legacySocketPath, 'root')) {
    console.log(
      '• A MariaDB started by an earlier Luxtempo is running on this checkout: restarting it hardened (its data stays) …',
    );
    spawnSync(
      'mariadb-admin',
      ['--no-defaults', `--socket=${paths.legacySocketPath}`, '-uroot', 'shutdown'],
      { stdio: 'ignore' },
    );
    await waitUntil(() => !existsSync(paths.legacySocketPath), paths, 60_000, 'did not stop');
  }
}

function sqlString(value: string): string {
  return `'${value.replace(/\\/g, '\\\\').replace(/'/g, "\\'")}'`;
}

/** The administrator's connection: through the socket, by unix_socket; an earlier version's root had an empty password. */
async function adminConnection({
  socketPath,
}: Pick<InstancePaths, 'socketPath'>): Promise<mysql.Connection> {
  try {
    return await mysql.createConnection({
      socketPath,
      user: adminUser(),
      multipleStatements: true,
    });
  } catch (error) {
    if (adminUser() === 'root') throw error;
    return mysql.createConnection({
      socketPath,
      user: 'root',
      password: '',
      multipleStatements: true,
    });
  }
}

export interface AccountRow {
  user: string;
  host: string;
  /** Each way the account may sign in (`IDENTIFIED VIA a OR b`), with its stored secret. */
  methods: { plugin: string; auth: string }[];
  locked: boolean;
}

interface GlobalPriv {
  plugin?: string;
  authentication_string?: string;
  auth_or?: { plugin?: string; authentication_string?: string }[];
  account_locked?: boolean;
}

/** Every account with how it signs in, read from mysql.global_priv. */
export async function listAccounts(db: mysql.Connection): Promise<AccountRow[]> {
  const [rows] = await db.query(
    'SELECT User AS user, Host AS host, Priv AS priv FROM mysql.global_priv',
  );
  return (rows as { user: string; host: string; priv: string | GlobalPriv }[]).map(
    ({ user, host, priv }) => {
      const p = (typeof priv === 'string' ? JSON.parse(priv) : priv) as GlobalPriv;
      const top = {
        plugin: p.plugin ?? 'mysql_native_password',
        auth: p.authentication_string ?? '',
      };
      // An empty entry in auth_or stands for the top-level method.
      const methods = p.auth_or
        ? p.auth_or.map((m) =>
            m.plugin ? { plugin: m.plugin, auth: m.authentication_string ?? '' } : top,
          )
        : [top];
      return { user, host, methods, locked: p.account_locked === true };
    },
  );
}

const passwordPlugins = new Set([
  'mysql_native_password',
  'mysql_old_password',
  'ed25519',
  'caching_sha2_password',
  'parsec',
]);

/** An account that is not locked and may sign in with an empty password by one of its methods. */
export function hasEmptyPassword(account: AccountRow): boolean {
  return (
    !account.locked && account.methods.some((m) => passwordPlugins.has(m.plugin) && m.auth === '')
  );
}

async function hardenAccounts(paths: Pick<InstancePaths, 'socketPath'>): Promise<void> {
  const db = await adminConnection(paths);
  try {
    const me = adminUser();
    if (me !== 'root') {
      // Before root is switched to the socket: the user running Luxtempo keeps a way in.
      await db.query(
        `CREATE USER IF NOT EXISTS ${sqlString(me)}@'localhost' IDENTIFIED VIA unix_socket`,
      );
      await db.query(
        `GRANT ALL PRIVILEGES ON *.* TO ${sqlString(me)}@'localhost' WITH GRANT OPTION`,
      );
    }
    await db.query(`ALTER USER 'root'@'localhost' IDENTIFIED VIA unix_socket`);
    for (const account of await listAccounts(db)) {
      const quoted = `${sqlString(account.user)}@${sqlString(account.host)}`;
      if (account.user === '' || (account.user === 'root' && account.host !== 'localhost')) {
        await db.query(`DROP USER ${quoted}`);
      } else if (hasEmptyPassword(account)) {
        console.log(`• MariaDB account ${quoted} had an empty password: locked.`);
        await db.query(`ALTER USER ${quoted} ACCOUNT LOCK`);
      }
    }
    await db.query('DROP DATABASE IF EXISTS test');
  } finally {
    await db.end();
  }
}

async function createDatabasesAndUsers(
  paths: Pick<InstancePaths, 'socketPath'>,
  options: Omit<DatabaseServerOptions, 'port' | 'instanceDir'>,
): Promise<void> {
  const root = await adminConnection(paths);
  try {
    for (const host of ['127.0.0.1', 'localhost']) {
      for (const [user, password] of [
        [options.ownerUser, options.ownerPassword],
        [options.appUser, options.appPassword],
      ] as const) {
        await root.query(
          `CREATE USER IF NOT EXISTS ${sqlString(user)}@${sqlString(host)} IDENTIFIED BY ${sqlString(password)}`,
        );
        await root.query(
          `ALTER USER ${sqlString(user)}@${sqlString(host)} IDENTIFIED BY ${sqlString(password)}`,
        );
      }
      for (const db of options.databases) {
        await root.query(
          `CREATE DATABASE IF NOT EXISTS \`${db}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
        );
        // The owner runs migrations and hands table rights to the app user (see server/db/grants.ts);
        // the app user gets no database-wide rights, so the audit table can stay append-only.
        await root.query(
          `GRANT ALL PRIVILEGES ON \`${db}\`.* TO ${sqlString(options.ownerUser)}@${sqlString(host)} WITH GRANT OPTION`,
        );
      }
    }
  } finally {
    await root.end();
  }
}

/**
 * The same accounts and databases as a private instance's, on a server reached through its socket
 * (a Galera node: the statements replicate to the others).
 */
export async function prepareAccounts(
  socketPath: string,
  options: Omit<DatabaseServerOptions, 'port' | 'instanceDir'>,
): Promise<void> {
  await hardenAccounts({ socketPath });
  await createDatabasesAndUsers({ socketPath }, options);
}

export async function ensureDatabaseServer(
  options: DatabaseServerOptions,
): Promise<DatabaseServer> {
  if (!existsSync('/usr/sbin/mariadbd')) {
    throw new Error(
      'MariaDB is not installed: run `npm start` or `npm test` (they install mariadb-server with apt-get).',
    );
  }
  const paths = instancePaths(options.instanceDir);
  await stopLegacyInstance(paths);
  const { user, why } = chooseServerUser(paths.instanceDir);
  let startedHere = false;
  if (ping(paths.socketPath)) {
    console.log(`• Reusing the private MariaDB already running on 127.0.0.1:${options.port}`);
  } else {
    if (why)
      console.log(
        `• Note: MariaDB runs as root because ${why}; the socket, password and file protections still hold.`,
      );
    prepareFolders(paths, user);
    initialise(paths, user);
    prepareFolders(paths, user);
    console.log(
      `• Starting a private MariaDB on 127.0.0.1:${options.port}${user ? ` as the ${user.name} system user` : ''} …`,
    );
    launch(paths, options.port, user);
    startedHere = true;
    await waitUntil(() => ping(paths.socketPath), paths, 30_000, 'did not answer');
  }
  await hardenAccounts(paths);
  await createDatabasesAndUsers(paths, options);
  const osUser = user?.name ?? userInfo().username;
  return {
    startedHere,
    osUser,
    /** The server's process id, from its pid file. */
    pid: () => Number(readFileSync(paths.pidFile, 'utf8').trim()),
    async stop() {
      if (!startedHere) return;
      shutdownDatabaseServer(options.instanceDir);
    },
  };
}
