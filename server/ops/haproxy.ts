import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, openSync, writeFileSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';

export interface HaproxyLayout {
  dir: string;
  /** Where browsers connect: HTTP to the API processes. */
  webPort: number;
  apiPorts: number[];
  /** Where the API processes connect: MySQL protocol to the one node that takes writes. */
  databasePort: number;
  nodes: { name: string; address: string; dbPort: number }[];
  /** The node-check agent (server/ops/node-check.ts). */
  checkPort: number;
}

export function haproxyPaths(dir: string) {
  return {
    config: path.join(dir, 'haproxy.cfg'),
    statsSocket: path.join(dir, 'haproxy.sock'),
    log: path.join(dir, 'haproxy.log'),
  };
}

/**
 * HTTP is spread over every API process that answers /api/health. The database goes to the first
 * node only, the others being backups: Galera takes writes on any node, but two nodes writing the
 * same rows at once refuse one of them at commit, so one writer at a time is simpler and as safe.
 * A node is used only while the agent says it is a synced member of the primary component; when
 * it leaves, its connections are cut, and when the first node comes back the backups' are cut so
 * that there is again exactly one writer.
 */
export function haproxyConfig(layout: HaproxyLayout): string {
  const { statsSocket } = haproxyPaths(layout.dir);
  const api = layout.apiPorts
    .map((port, i) => `  server api${i + 1} 127.0.0.1:${port} check`)
    .join('\n');
  const nodes = layout.nodes
    .map(
      (n, i) =>
        `  server ${n.name} ${n.address}:${n.dbPort} check agent-check agent-send "${n.name}\\n"` +
        (i === 0 ? ' on-marked-up shutdown-backup-sessions' : ' backup'),
    )
    .join('\n');
  return `# Written by server/ops/cluster-rig.ts at each start; edits are overwritten.
global
  stats socket ${statsSocket} mode 600 level admin
  maxconn 2000

defaults
  timeout connect 2s
  timeout client 60s
  timeout server 60s
  timeout check 2s

frontend web
  mode http
  bind 127.0.0.1:${layout.webPort}
  option forwardfor
  default_backend api

backend api
  mode http
  balance roundrobin
  option httpchk GET /api/health
  http-check expect status 200
  # A request that never reached a process goes to another one.
  option redispatch
  retries 2
  default-server inter 1s fall 2 rise 2
${api}

listen database
  mode tcp
  bind 127.0.0.1:${layout.databasePort}
  timeout client 8h
  timeout server 8h
  option redispatch
  default-server inter 1s fall 2 rise 2 on-marked-down shutdown-sessions agent-addr 127.0.0.1 agent-port ${layout.checkPort} agent-inter 1s
${nodes}
`;
}

export interface Haproxy {
  child: ChildProcess;
  stop(): Promise<void>;
}

export async function startHaproxy(layout: HaproxyLayout): Promise<Haproxy> {
  if (!existsSync('/usr/sbin/haproxy'))
    throw new Error(
      'HAProxy is not installed: run `npm run cluster` (it installs haproxy with apt-get).',
    );
  const paths = haproxyPaths(layout.dir);
  writeFileSync(paths.config, haproxyConfig(layout));
  const check = spawn('/usr/sbin/haproxy', ['-c', '-q', '-f', paths.config], { stdio: 'inherit' });
  const valid = await new Promise<number>((r) => check.once('exit', (c) => r(c ?? 1)));
  if (valid !== 0) throw new Error(`HAProxy refused its configuration ${paths.config}`);
  const log = openSync(paths.log, 'a');
  // -db: stays in the foreground as our child; detached so that Ctrl-C reaches the supervisor only.
  const child = spawn('/usr/sbin/haproxy', ['-db', '-f', paths.config], {
    detached: true,
    stdio: ['ignore', log, log],
  });
  child.unref();
  const until = Date.now() + 10_000;
  while (
    !existsSync(paths.statsSocket) ||
    (await serverStates(layout.dir).catch(() => null)) === null
  ) {
    if (child.exitCode !== null) throw new Error(`HAProxy stopped at start; see ${paths.log}`);
    if (Date.now() > until) throw new Error(`HAProxy did not start within 10 s; see ${paths.log}`);
    await new Promise((r) => setTimeout(r, 100));
  }
  return {
    child,
    async stop() {
      if (child.exitCode !== null || child.signalCode !== null) return;
      const exited = new Promise<void>((r) => child.once('exit', () => r()));
      child.kill('SIGTERM');
      await Promise.race([exited, new Promise((r) => setTimeout(r, 5_000))]);
      if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
    },
  };
}

/** Each server's state as HAProxy sees it (`UP`, `DOWN`, …), keyed `backend/server`. */
export async function serverStates(dir: string): Promise<Record<string, string>> {
  const csv = await new Promise<string>((resolve, reject) => {
    const socket = net.createConnection(haproxyPaths(dir).statsSocket);
    let text = '';
    socket.on('connect', () => socket.write('show stat\n'));
    socket.on('data', (d) => (text += d.toString('utf8')));
    socket.on('end', () => resolve(text));
    socket.on('error', reject);
  });
  const states: Record<string, string> = {};
  for (const line of csv.split('\n')) {
    if (!line || line.startsWith('#')) continue;
    const cells = line.split(',');
    if (cells[1] === 'FRONTEND' || cells[1] === 'BACKEND') continue;
    states[`${cells[0]}/${cells[1]}`] = cells[17] ?? '';
  }
  return states;
}
