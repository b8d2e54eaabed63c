import { spawn, spawnSync } from 'node:child_process';
import {
  chmodSync,
  chownSync,
  existsSync,
  mkdirSync,
  openSync,
  readdirSync,
  readFileSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { repoRoot } from './paths';

/**
 * One MariaDB Galera node (Debian's `mariadb-server` with `galera-4`), run as a process of our
 * own: data under `dir`, bound to `address` only. `netns` runs it inside a network namespace
 * (the partition test); the socket is a file, so the test still reaches it from outside.
 */
export interface GaleraNodeSpec {
  name: string;
  dir: string;
  address: string;
  dbPort: number;
  galeraPort: number;
  istPort: number;
  sstPort: number;
  netns?: string;
}

export const galeraProvider = '/usr/lib/galera/libgalera_smm.so';
export const clusterName = 'luxtempo';

export function galeraPaths(dir: string) {
  return {
    datadir: path.join(dir, 'mariadb'),
    socketPath: path.join(dir, 'mariadb.sock'),
    pidFile: path.join(dir, 'mariadb.pid'),
    errorLog: path.join(dir, 'mariadb.err'),
    grastate: path.join(dir, 'mariadb', 'grastate.dat'),
  };
}

/** What a node says of itself: whether it may take writes (synced member of the primary component). */
export interface NodeState {
  answers: boolean;
  ready: boolean;
  clusterStatus: string;
  localState: number;
  clusterSize: number;
}

export const downState: NodeState = {
  answers: false,
  ready: false,
  clusterStatus: 'unknown',
  localState: 0,
  clusterSize: 0,
};

/** A node takes writes only when it is synced (state 4) in the primary component. */
export function takesWrites(state: NodeState): boolean {
  return state.ready && state.clusterStatus === 'Primary' && state.localState === 4;
}

/** The administrator's connection through the node's socket (root by unix_socket). */
export function nodeConnection(spec: Pick<GaleraNodeSpec, 'dir'>): Promise<mysql.Connection> {
  return mysql.createConnection({
    socketPath: galeraPaths(spec.dir).socketPath,
    user: 'root',
    connectTimeout: 2_000,
  });
}

export async function readNodeState(spec: Pick<GaleraNodeSpec, 'dir'>): Promise<NodeState> {
  if (!existsSync(galeraPaths(spec.dir).socketPath)) return downState;
  let db: mysql.Connection | undefined;
  try {
    db = await nodeConnection(spec);
    const [rows] = await db.query(
      "SHOW GLOBAL STATUS WHERE Variable_name IN ('wsrep_ready', 'wsrep_cluster_status', 'wsrep_local_state', 'wsrep_cluster_size')",
    );
    const status = Object.fromEntries(
      (rows as { Variable_name: string; Value: string }[]).map((r) => [r.Variable_name, r.Value]),
    );
    return {
      answers: true,
      ready: status.wsrep_ready === 'ON',
      clusterStatus: status.wsrep_cluster_status ?? 'unknown',
      localState: Number(status.wsrep_local_state ?? 0),
      clusterSize: Number(status.wsrep_cluster_size ?? 0),
    };
  } catch {
    return downState;
  } finally {
    await db?.end().catch(() => undefined);
  }
}

interface ServerUser {
  name: string;
  uid: number;
  gid: number;
}

/**
 * Debian's `mysql` system user when we are root. Not only hardening: the rsync daemon that
 * receives a full copy (SST) runs as the server's user, and one started by root drops to
 * `nobody`, which may not write the data folder.
 */
function serverUser(): ServerUser | null {
  if (process.getuid?.() !== 0) return null;
  const id = (flag: string) => spawnSync('id', [flag, 'mysql'], { encoding: 'utf8' });
  const uid = id('-u');
  const gid = id('-g');
  if (uid.status !== 0 || gid.status !== 0) return null;
  return { name: 'mysql', uid: Number(uid.stdout.trim()), gid: Number(gid.stdout.trim()) };
}

/** The node's folder, the server user's alone; the folders above it only let that user through. */
function prepareNodeDir(spec: GaleraNodeSpec, user: ServerUser | null): void {
  const p = galeraPaths(spec.dir);
  mkdirSync(p.datadir, { recursive: true, mode: 0o700 });
  if (!existsSync(p.errorLog)) writeFileSync(p.errorLog, '', { mode: 0o640 });
  if (!user) return;
  for (
    let above = path.dirname(spec.dir);
    above.startsWith(repoRoot + path.sep);
    above = path.dirname(above)
  )
    if ((statSync(above).mode & 0o111) !== 0o111) chmodSync(above, statSync(above).mode | 0o111);
  const walk = (target: string) => {
    const stat = statSync(target);
    if (stat.uid !== user.uid || stat.gid !== user.gid) chownSync(target, user.uid, user.gid);
    if (stat.isDirectory()) for (const entry of readdirSync(target)) walk(path.join(target, entry));
  };
  walk(spec.dir);
}

function readGrastate(file: string): { uuid: string; seqno: number; safeToBootstrap: boolean } {
  const text = existsSync(file) ? readFileSync(file, 'utf8') : '';
  const field = (name: string) => new RegExp(`^${name}:\\s*(\\S+)`, 'm').exec(text)?.[1];
  return {
    uuid: field('uuid') ?? '00000000-0000-0000-0000-000000000000',
    seqno: Number(field('seqno') ?? -1),
    safeToBootstrap: field('safe_to_bootstrap') === '1',
  };
}

function serverArgs(spec: GaleraNodeSpec, peers: GaleraNodeSpec[]): string[] {
  const asUser = process.getuid?.() === 0 ? [`--user=${serverUser()?.name ?? 'root'}`] : [];
  const p = galeraPaths(spec.dir);
  const members = peers.map((n) => `${n.address}:${n.galeraPort}`).join(',');
  // Short failure timeouts: a node that stops answering is left out within a few seconds, so the
  // others keep their quorum and the lone node learns it is alone (evs.* are Galera's own names).
  const provider = [
    `gmcast.listen_addr=tcp://${spec.address}:${spec.galeraPort}`,
    `ist.recv_addr=${spec.address}:${spec.istPort}`,
    'gcache.size=128M',
    'evs.keepalive_period=PT0.5S',
    'evs.inactive_check_period=PT0.5S',
    'evs.suspect_timeout=PT3S',
    'evs.inactive_timeout=PT6S',
    'pc.wait_prim_timeout=PT10S',
  ].join(';');
  return [
    '--no-defaults',
    ...asUser,
    `--datadir=${p.datadir}`,
    `--socket=${p.socketPath}`,
    `--pid-file=${p.pidFile}`,
    `--log-error=${p.errorLog}`,
    `--port=${spec.dbPort}`,
    `--bind-address=${spec.address}`,
    '--skip-name-resolve',
    '--local-infile=0',
    '--character-set-server=utf8mb4',
    '--collation-server=utf8mb4_unicode_ci',
    '--default-time-zone=+00:00',
    '--innodb-buffer-pool-size=64M',
    '--max-connections=300',
    // What Galera needs: row-based replication, InnoDB, interleaved auto-increment locks.
    '--binlog-format=ROW',
    '--default-storage-engine=InnoDB',
    '--innodb-autoinc-lock-mode=2',
    // Tables without a primary key would replicate unreliably: the server refuses to make them.
    '--innodb-force-primary-key=1',
    // Galera logs binary events, and with a binary log only SUPER may create triggers unless the
    // server trusts their creators: the owner account creates the integrity triggers in migrations.
    '--log-bin-trust-function-creators=1',
    '--wsrep-on=ON',
    `--wsrep-provider=${galeraProvider}`,
    `--wsrep-cluster-name=${clusterName}`,
    `--wsrep-cluster-address=gcomm://${members}`,
    `--wsrep-node-name=${spec.name}`,
    `--wsrep-node-address=${spec.address}:${spec.galeraPort}`,
    `--wsrep-provider-options=${provider}`,
    '--wsrep-sst-method=rsync',
    `--wsrep-sst-receive-address=${spec.address}:${spec.sstPort}`,
    '--wsrep-slave-threads=2',
  ];
}

function spawnServer(spec: GaleraNodeSpec, args: string[]) {
  const command = spec.netns
    ? ['ip', 'netns', 'exec', spec.netns, '/usr/sbin/mariadbd', ...args]
    : ['/usr/sbin/mariadbd', ...args];
  const log = openSync(galeraPaths(spec.dir).errorLog, 'a');
  // Detached: Ctrl-C on the supervisor reaches it, not the databases; it stops them in order.
  const child = spawn(command[0]!, command.slice(1), {
    detached: true,
    stdio: ['ignore', log, log],
  });
  child.unref();
  return child;
}

/**
 * After a crash grastate.dat holds seqno -1: the node's real position is in InnoDB. Reading it
 * back (`--wsrep-recover`) lets the node ask the others for only what it missed (IST) rather
 * than a full copy of the data (SST).
 */
function recoverPosition(spec: GaleraNodeSpec, peers: GaleraNodeSpec[]): string | null {
  const p = galeraPaths(spec.dir);
  const state = readGrastate(p.grastate);
  if (!existsSync(p.grastate) || state.seqno !== -1 || !existsSync(path.join(p.datadir, 'ibdata1')))
    return null;
  const recoveryLog = path.join(spec.dir, 'recovery.err');
  const args = serverArgs(spec, peers).map((a) =>
    a.startsWith('--log-error=') ? `--log-error=${recoveryLog}` : a,
  );
  const command = spec.netns
    ? ['ip', 'netns', 'exec', spec.netns, '/usr/sbin/mariadbd', ...args, '--wsrep-recover']
    : ['/usr/sbin/mariadbd', ...args, '--wsrep-recover'];
  writeFileSync(recoveryLog, '');
  const user = serverUser();
  if (user) chownSync(recoveryLog, user.uid, user.gid);
  spawnSync(command[0]!, command.slice(1), { stdio: 'ignore', timeout: 120_000 });
  const found = /Recovered position:\s*([0-9a-f-]{36}:-?\d+)/.exec(
    readFileSync(recoveryLog, 'utf8'),
  );
  return found ? found[1]! : null;
}

/** The position a stopped node has: for choosing which node may start the cluster. */
export function storedSeqno(spec: GaleraNodeSpec, peers: GaleraNodeSpec[]): number {
  const { grastate } = galeraPaths(spec.dir);
  const state = readGrastate(grastate);
  if (state.seqno !== -1) return state.seqno;
  const recovered = recoverPosition(spec, peers);
  return recovered ? Number(recovered.split(':')[1]) : -1;
}

async function until(
  check: () => Promise<boolean>,
  timeoutMs: number,
  what: () => string,
): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    if (await check()) return;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(what());
}

function logTail(spec: GaleraNodeSpec): string {
  const { errorLog } = galeraPaths(spec.dir);
  return existsSync(errorLog)
    ? readFileSync(errorLog, 'utf8').split('\n').slice(-20).join('\n')
    : '(no log)';
}

/**
 * Starts a node and waits until it is a synced member of the primary component. `bootstrap`
 * starts a new cluster from this node's data (`--wsrep-new-cluster`); the others join it and get
 * what they miss from it by IST, or a full copy (rsync SST) when they have no usable data.
 */
export async function startGaleraNode(
  spec: GaleraNodeSpec,
  peers: GaleraNodeSpec[],
  options: { bootstrap: boolean; timeoutMs?: number },
): Promise<void> {
  const p = galeraPaths(spec.dir);
  const user = serverUser();
  mkdirSync(spec.dir, { recursive: true, mode: 0o700 });
  prepareNodeDir(spec, user);
  if (options.bootstrap && !existsSync(path.join(p.datadir, 'mysql'))) {
    const r = spawnSync(
      'mariadb-install-db',
      [
        '--no-defaults',
        `--user=${user?.name ?? 'root'}`,
        `--datadir=${p.datadir}`,
        '--auth-root-authentication-method=socket',
        '--skip-test-db',
        '--skip-name-resolve',
      ],
      { encoding: 'utf8' },
    );
    if (r.status !== 0) throw new Error(`mariadb-install-db failed:\n${r.stdout}\n${r.stderr}`);
  }
  prepareNodeDir(spec, user);
  const args = serverArgs(spec, peers);
  const position = recoverPosition(spec, peers);
  if (position) args.push(`--wsrep-start-position=${position}`);
  if (options.bootstrap) {
    // This node's data is the cluster's from now on; Galera asks us to say so in grastate.dat.
    if (existsSync(p.grastate) && !readGrastate(p.grastate).safeToBootstrap)
      writeFileSync(
        p.grastate,
        readFileSync(p.grastate, 'utf8').replace(/^safe_to_bootstrap:.*$/m, 'safe_to_bootstrap: 1'),
      );
    args.push('--wsrep-new-cluster');
  }
  const child = spawnServer(spec, args);
  let exited = false;
  child.once('exit', () => (exited = true));
  await until(
    async () => {
      if (exited) throw new Error(`MariaDB node ${spec.name} exited at start:\n${logTail(spec)}`);
      return takesWrites(await readNodeState(spec));
    },
    options.timeoutMs ?? 180_000,
    () => `MariaDB node ${spec.name} did not join the cluster in time:\n${logTail(spec)}`,
  );
}

function pidOf(spec: GaleraNodeSpec): number | null {
  const { pidFile } = galeraPaths(spec.dir);
  if (!existsSync(pidFile)) return null;
  const pid = Number(readFileSync(pidFile, 'utf8').trim());
  return Number.isInteger(pid) && pid > 0 ? pid : null;
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

/** Ends the node at once, as a crash or a pulled plug would. */
export async function killGaleraNode(spec: GaleraNodeSpec): Promise<void> {
  const pid = pidOf(spec);
  if (pid === null || !alive(pid)) return;
  process.kill(pid, 'SIGKILL');
  await until(
    async () => !alive(pid),
    10_000,
    () => `node ${spec.name} did not die`,
  );
}

/** A clean shutdown: the node leaves the cluster and records its position. */
export async function stopGaleraNode(spec: GaleraNodeSpec, timeoutMs = 60_000): Promise<void> {
  const pid = pidOf(spec);
  if (pid === null || !alive(pid)) return;
  process.kill(pid, 'SIGTERM');
  try {
    await until(
      async () => !alive(pid),
      timeoutMs,
      () => `node ${spec.name} did not stop`,
    );
  } catch {
    process.kill(pid, 'SIGKILL');
  }
}

export function nodeIsRunning(spec: GaleraNodeSpec): boolean {
  const pid = pidOf(spec);
  return pid !== null && alive(pid);
}
