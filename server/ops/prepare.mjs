// Plain JavaScript on purpose: this runs before `npm ci`, so it may use nothing but Node itself.
// It makes a fresh clone runnable (npm packages, Debian packages), then hands over to the
// TypeScript entry for the command asked for.
import { spawn, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const command = process.argv[2];
const entries = {
  start: 'server/ops/start.ts',
  test: 'server/ops/test.ts',
  bench: 'server/ops/bench.ts',
  cluster: 'server/ops/cluster.ts',
  'test-cluster': 'server/ops/test-cluster.ts',
};
if (!entries[command]) {
  console.error(`usage: node server/ops/prepare.mjs <${Object.keys(entries).join('|')}>`);
  process.exit(2);
}

function run(cmd, args, options = {}) {
  const result = spawnSync(cmd, args, { stdio: 'inherit', cwd: root, ...options });
  if (result.status !== 0) {
    console.error(
      `\n✗ "${cmd} ${args.join(' ')}" failed (exit ${result.status ?? result.signal}).`,
    );
    process.exit(1);
  }
}

function ensureNpmPackages() {
  const lock = readFileSync(path.join(root, 'package-lock.json'));
  const wanted = createHash('sha256').update(lock).digest('hex');
  const stamp = path.join(root, 'node_modules', '.luxtempo-lock-sha256');
  if (existsSync(stamp) && readFileSync(stamp, 'utf8').trim() === wanted) return;
  console.log('• Installing npm packages (npm ci) …');
  // The mail catcher, the client build and the test tools are development dependencies that
  // `npm start` needs too: install them even where NODE_ENV=production would leave them out.
  run('npm', ['ci', '--include=dev', '--no-audit', '--no-fund']);
  writeFileSync(stamp, wanted);
}

function ensureDebianPackages(packages) {
  const missing = packages.filter((p) => !existsSync(p.binary)).map((p) => p.name);
  if (missing.length === 0) return;
  const asRoot = process.getuid?.() === 0;
  const sudo = asRoot ? [] : ['sudo', '-n'];
  console.log(`• Installing Debian packages: ${missing.join(', ')} (apt-get) …`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  const [cmd, ...pre] = asRoot ? ['apt-get'] : [...sudo, 'apt-get'];
  run(cmd, [...pre, 'update', '-qq'], { env });
  run(cmd, [...pre, 'install', '-y', '-qq', ...missing], { env });
}

const debian = [{ name: 'mariadb-server', binary: '/usr/sbin/mariadbd' }];
if (command === 'test' || command === 'bench')
  debian.push({ name: 'chromium', binary: '/usr/bin/chromium' });
// The cluster: Galera (a dependency of mariadb-server, named in case it was left out), HAProxy,
// rsync for a joining node's full copy (SST), and iproute2 for the partition test's namespaces.
if (command === 'cluster' || command === 'test-cluster')
  debian.push(
    { name: 'galera-4', binary: '/usr/lib/galera/libgalera_smm.so' },
    { name: 'haproxy', binary: '/usr/sbin/haproxy' },
    { name: 'rsync', binary: '/usr/bin/rsync' },
    { name: 'iproute2', binary: '/usr/sbin/ip' },
  );

ensureNpmPackages();
ensureDebianPackages(debian);

const child = spawn(
  path.join(root, 'node_modules/.bin/tsx'),
  [entries[command], ...process.argv.slice(3)],
  {
    cwd: root,
    stdio: 'inherit',
  },
);
// The child shares our terminal's process group, so Ctrl-C reaches it directly; a SIGTERM sent
// to us alone is passed on so the child can shut its services down cleanly.
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => child.kill(signal));
child.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
