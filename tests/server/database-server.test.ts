import { spawnSync } from 'node:child_process';
import { readFileSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config';
import { startApiProcess, type ApiProcess } from '../../server/ops/api-process';
import {
  localEnvironment,
  localOwnerCredentials,
  webServerEnvironment,
} from '../../server/ops/environment';
import { adminUser, hasEmptyPassword, instancePaths, listAccounts } from '../../server/ops/mariadb';
import { dataDir } from '../../server/ops/paths';
import { testConfig } from '../support/api';

// The private MariaDB as someone else on the machine would meet it: the OS user `nobody`.
const config = testConfig();
const paths = instancePaths();
const asRoot = process.getuid?.() === 0;
const nobody = { uid: 65534, gid: 65534 };

/** Runs a command as the OS user nobody, from /, with nothing of ours in its environment. */
function asNobody(cmd: string, args: string[], env: Record<string, string> = {}) {
  const r = spawnSync(cmd, args, {
    ...nobody,
    cwd: '/',
    encoding: 'utf8',
    env: { PATH: '/usr/bin:/bin', ...env },
    timeout: 15_000,
  });
  return { code: r.status, out: `${r.stdout}${r.stderr}` };
}
const tcp = (user: string) => [
  '--no-defaults',
  '--protocol=TCP',
  '-h127.0.0.1',
  `-P${config.DB_PORT}`,
  `-u${user}`,
  '--connect-timeout=5',
  '-e',
  'SELECT CURRENT_USER()',
];

describe.skipIf(!asRoot)('the database server, tried as the OS user nobody', () => {
  it('can reach MariaDB over TCP with the app password (so the refusals below are real), but not as root, anonymously or as any account with an empty password', () => {
    const control = asNobody('mariadb', tcp(config.DB_USER), { MYSQL_PWD: config.DB_PASSWORD });
    expect(control.code, control.out).toBe(0);
    for (const user of [
      'root',
      '',
      'mariadb.sys',
      'mysql',
      config.DB_USER,
      localOwnerCredentials().user,
    ]) {
      const attempt = asNobody('mariadb', tcp(user));
      expect(attempt.code, `${user || '(anonymous)'} with no password: ${attempt.out}`).not.toBe(0);
      expect(attempt.out).toMatch(/Access denied/);
    }
  });

  it('cannot read the secrets, list .data/, or read the data files', () => {
    expect(
      asNobody('test', ['-r', '/etc/passwd']).code,
      'control: nobody reads a public file',
    ).toBe(0);
    expect(asNobody('cat', [path.join(dataDir, 'secrets.json')]).out).toMatch(/Permission denied/);
    expect(asNobody('ls', [dataDir]).out).toMatch(/Permission denied/);
    expect(asNobody('ls', [paths.mariadbDir]).out).toMatch(/Permission denied/);
    expect(asNobody('cat', [path.join(paths.mariadbDir, 'ibdata1')]).out).toMatch(
      /Permission denied/,
    );
    expect(
      asNobody('cat', [path.join(paths.mariadbDir, config.DB_NAME, 'audit_event.ibd')]).out,
    ).toMatch(/Permission denied/);
  });

  it('cannot open the socket folder, write into it, or sign in through the socket', () => {
    expect(asNobody('ls', [paths.runDir]).out).toMatch(/Permission denied/);
    const write = asNobody('touch', [path.join(paths.runDir, 'planted')]);
    expect(write.code).not.toBe(0);
    expect(readdirSync(paths.runDir)).not.toContain('planted');
    const socket = asNobody('mariadb', [
      '--no-defaults',
      `--socket=${paths.socketPath}`,
      '-uroot',
      '-e',
      'SELECT 1',
    ]);
    expect(socket.code).not.toBe(0);
    expect(socket.out).toMatch(/Can't connect|Access denied|Permission denied/);
  });
});

describe('the database server, as set up', () => {
  let admin: mysql.Connection;
  beforeAll(async () => {
    admin = await mysql.createConnection({ socketPath: paths.socketPath, user: adminUser() });
  });
  afterAll(async () => {
    await admin?.end();
  });

  it('has no account with an empty password, and root only through the socket', async () => {
    const accounts = await listAccounts(admin);
    expect(accounts.filter(hasEmptyPassword)).toEqual([]);
    expect(accounts.filter((a) => a.user === '')).toEqual([]);
    const root = accounts.filter((a) => a.user === 'root');
    expect(root.map((a) => a.host)).toEqual(['localhost']);
    expect(root[0]!.methods.map((m) => m.plugin)).toEqual(['unix_socket']);
    // The check itself tells an empty password from a socket sign-in and a locked account.
    expect(
      hasEmptyPassword({
        user: 'x',
        host: 'localhost',
        methods: [{ plugin: 'mysql_native_password', auth: '' }],
        locked: false,
      }),
    ).toBe(true);
    expect(
      hasEmptyPassword({
        user: 'x',
        host: 'localhost',
        methods: [
          { plugin: 'mysql_native_password', auth: 'invalid' },
          { plugin: 'unix_socket', auth: '' },
        ],
        locked: false,
      }),
    ).toBe(false);
    expect(
      hasEmptyPassword({
        user: 'x',
        host: 'localhost',
        methods: [{ plugin: 'mysql_native_password', auth: '' }],
        locked: true,
      }),
    ).toBe(false);
  });

  it('keeps file import and export inside its own folder, and the app user has no FILE right', async () => {
    const [rows] = await admin.query('SELECT @@secure_file_priv AS dir');
    const { dir } = (rows as { dir: string }[])[0]!;
    expect(path.resolve(dir)).toBe(paths.filesDir);
    const app = await mysql.createConnection({
      host: config.DB_HOST,
      port: config.DB_PORT,
      user: config.DB_USER,
      password: config.DB_PASSWORD,
      database: config.DB_NAME,
    });
    try {
      await expect(
        app.query("SELECT 1 INTO OUTFILE '/tmp/luxtempo-outfile-probe'"),
      ).rejects.toThrow(/Access denied/);
    } finally {
      await app.end();
    }
  });

  it('keeps its socket folder, data folder and secrets closed to others, and runs as the mysql system user when it can', () => {
    for (const dir of [paths.runDir, paths.mariadbDir, paths.filesDir])
      expect(statSync(dir).mode & 0o077, dir).toBe(0);
    expect(statSync(path.join(dataDir, 'secrets.json')).mode & 0o077).toBe(0);
    expect(statSync(dataDir).mode & 0o066).toBe(0);
    const pid = readFileSync(paths.pidFile, 'utf8').trim();
    const uid = Number(/^Uid:\s+(\d+)/m.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))![1]);
    const mysqlUid = Number(spawnSync('id', ['-u', 'mysql'], { encoding: 'utf8' }).stdout.trim());
    // The rule: the mysql user runs it whenever the folders above .data/ let that user through.
    const reachable =
      spawnSync('su', ['-s', '/bin/sh', 'mysql', '-c', `test -x '${path.dirname(dataDir)}'`])
        .status === 0;
    if (asRoot && reachable) expect(uid).toBe(mysqlUid);
    else expect(uid).toBe(process.getuid!());
  });
});

describe("the schema owner's password", () => {
  let api: ApiProcess | undefined;
  afterAll(async () => {
    await api?.kill();
  });

  it('is in no configuration the web server reads, even when the environment has it', () => {
    const ownerPassword = localOwnerCredentials().password;
    const env = { ...localEnvironment(config.DB_NAME), DB_OWNER_PASSWORD: ownerPassword };
    const webConfig = loadConfig(env);
    expect(JSON.stringify(webConfig)).not.toContain(ownerPassword);
    expect(Object.values(webServerEnvironment(env))).not.toContain(ownerPassword);
    expect(Object.values(localEnvironment(config.DB_NAME))).not.toContain(ownerPassword);
    const { DB_OWNER_PASSWORD: _none, ...withoutOwner } = env;
    expect(() => loadConfig(withoutOwner)).not.toThrow();
  });

  it('is not in the environment of a web server process started the way `npm start` starts it', async () => {
    const ownerPassword = localOwnerCredentials().password;
    api = await startApiProcess({
      port: 3393,
      env: {
        ...localEnvironment(config.DB_NAME),
        DB_OWNER_PASSWORD: ownerPassword,
        NODE_ENV: 'test',
        DEMO_DATA: 'false',
        SMTP_PORT: '1126',
      },
      logFile: path.join(dataDir, 'owner-secret-probe.log'),
    });
    expect((await fetch(`${api.url}/api/health`)).status).toBe(200);
    const environ = readFileSync(`/proc/${api.child.pid}/environ`, 'utf8').split('\0');
    expect(environ.some((line) => line.startsWith('DB_OWNER_PASSWORD='))).toBe(false);
    expect(environ.some((line) => line.includes(ownerPassword))).toBe(false);
    expect(environ.some((line) => line.startsWith('DB_PASSWORD='))).toBe(true);
  });
});
