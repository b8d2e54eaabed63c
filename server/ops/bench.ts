// npm run bench — measures Luxtempo on this machine and writes the figures to .data/bench/.
// It starts what it needs: the private MariaDB (a database of its own), a built client, and the
// API as a separate process, so the load generator does not share the server's event loop.
import type { EventEmitter } from 'node:events';
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { randomUUID } from 'node:crypto';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import autocannon from 'autocannon';
import mysql from 'mysql2/promise';
import { chromium } from 'playwright-core';
import { loadConfig } from '../config';
import { appDataSource } from '../db/options';
import { demoPassword, seedDemoData } from '../demo/seed';
import { loadShippedProtocols } from '../protocols/load-shipped';
import { startApiProcess } from './api-process';
import { measureEngine } from './bench-engine';
import { buildClient } from './build-client';
import { measureClockError } from './bench-clock';
import {
  measureOpenLoop,
  percentile,
  signIn,
  startCxlSessions,
  type MeasuredProcesses,
} from './bench-open-loop';
import { printSummary, profileFiles, summariseProfiles } from './cpu-profile-summary';
import { measureBundle } from './measure-bundle';
import { cpuTimeMs } from './process-cpu';
import { ensureDatabaseFor, recreateDatabase } from './database-setup';
import { localEnvironment, localOwnerCredentials } from './environment';
import { clientDistDir, dataDir } from './paths';

const benchDatabase = 'luxtempo_bench';
const port = Number(process.env.BENCH_PORT ?? 3398);
const connections = 50;
const durationS = Number(process.env.BENCH_SECONDS ?? 10);
const warmUpS = 3;
const sessionCount = Number(process.env.BENCH_SESSIONS ?? 300);
const targets = {
  calculationP95Ms: 20,
  eventWriteP95Ms: 40,
  firstLoadJsGzipKb: 120,
  openLoopP99At200PerSMs: 20,
  cpuPerTapMs: 1,
  clockErrorMs: 250,
};

// One API process per core, as the server would be run on this machine (WEB_CONCURRENCY overrides).
const webConcurrency = process.env.WEB_CONCURRENCY ?? String(availableParallelism());
const env = {
  ...localEnvironment(benchDatabase),
  NODE_ENV: 'production',
  DEMO_DATA: 'false',
  SMTP_PORT: process.env.SMTP_PORT ?? '1126',
  LOGIN_FAILURE_LIMIT: '1000',
  CLIENT_DIR: clientDistDir,
  WEB_CONCURRENCY: webConcurrency,
};
const config = loadConfig(env);

async function prepareDatabase() {
  const owner = localOwnerCredentials();
  const database = await ensureDatabaseFor(config, owner, [benchDatabase]);
  await recreateDatabase(config, owner);
  const app = appDataSource(config);
  await app.initialize();
  await loadShippedProtocols(app);
  await seedDemoData(app);
  await app.destroy();
  return database;
}

/** How many events the sessions hold, fewest and most. */
async function eventsPerSession(orderIds: number[]): Promise<{ min: number; max: number }> {
  const db = await mysql.createConnection({
    host: config.DB_HOST,
    port: config.DB_PORT,
    user: config.DB_USER,
    password: config.DB_PASSWORD,
    database: benchDatabase,
  });
  try {
    const [rows] = await db.query(
      'SELECT MIN(n) AS min, MAX(n) AS max FROM (SELECT COUNT(*) AS n FROM session_event WHERE order_id IN (?) GROUP BY order_id) counts',
      [orderIds],
    );
    const [row] = rows as { min: number; max: number }[];
    return { min: Number(row!.min), max: Number(row!.max) };
  } finally {
    await db.end();
  }
}

/** Processes whose CPU time each load run reports: the API (with its workers) and MariaDB. */
let measured: { apiPid: number; databasePid: number } | null = null;

/**
 * What each request cost in CPU time, and what that allows: if CPU were the only limit and every
 * core were kept busy, the most the machine could serve, and so (Little's law) the least average
 * wait with this many connections open.
 */
function cpuCost(
  before: { api: number; database: number; loadGenerator: NodeJS.CpuUsage },
  requests: number,
) {
  const perRequest = (ms: number) => Math.round((ms / Math.max(1, requests)) * 1000) / 1000;
  const api = perRequest(cpuTimeMs([measured!.apiPid]) - before.api);
  const database = perRequest(cpuTimeMs([measured!.databasePid]) - before.database);
  const generator = process.cpuUsage(before.loadGenerator);
  // autocannon runs in this process and takes its share of the same cores.
  const loadGenerator = perRequest((generator.user + generator.system) / 1000);
  const cores = availableParallelism();
  const ceilingPerS = Math.round((cores * 1000) / (api + database + loadGenerator));
  return {
    api,
    database,
    loadGenerator,
    cores,
    ceilingPerS,
    leastMeanLatencyMs: Math.round(((connections * 1000) / ceilingPerS) * 10) / 10,
  };
}

/** Runs autocannon and takes every response's time itself, so p95 is exact rather than bucketed. */
async function load(title: string, opts: autocannon.Options) {
  // A few seconds first that are not counted: the API's code is compiled as it is first used.
  await (autocannon({
    ...opts,
    connections,
    duration: warmUpS,
  }) as unknown as Promise<autocannon.Result>);
  const times: number[] = [];
  const cpuBefore = measured && {
    api: cpuTimeMs([measured.apiPid]),
    database: cpuTimeMs([measured.databasePid]),
    loadGenerator: process.cpuUsage(),
  };
  // Without a callback autocannon returns an emitter that is also a promise of the result.
  const instance = autocannon({
    ...opts,
    connections,
    duration: durationS,
  }) as unknown as EventEmitter & Promise<autocannon.Result>;
  instance.on(
    'response',
    (_client: unknown, _status: number, _bytes: number, responseTimeMs: number) =>
      times.push(responseTimeMs),
  );
  const result = await instance;
  times.sort((a, b) => a - b);
  const cpuMsPerRequest = measured && cpuBefore ? cpuCost(cpuBefore, times.length) : null;
  const out = {
    connections,
    durationS,
    requests: result.requests.total,
    throughputPerS: Math.round(result.requests.average),
    latencyMs: {
      p50: percentile(times, 50),
      p95: percentile(times, 95),
      p99: percentile(times, 99),
      max: percentile(times, 100),
    },
    non2xx: result.non2xx,
    errors: result.errors,
    cpuMsPerRequest,
  };
  console.log(
    `${title.padEnd(24)} p50 ${out.latencyMs.p50} ms  p95 ${out.latencyMs.p95} ms  p99 ${out.latencyMs.p99} ms  ${out.throughputPerS} req/s  (${out.requests} requests, ${out.non2xx} not 2xx, ${out.errors} errors)`,
  );
  if (cpuMsPerRequest) {
    const c = cpuMsPerRequest;
    console.log(
      `${''.padEnd(24)} CPU per request: API ${c.api} ms + MariaDB ${c.database} ms + load generator ${c.loadGenerator} ms → ${c.cores} cores serve at most ${c.ceilingPerS} req/s, so ${connections} connections wait ≥ ${c.leastMeanLatencyMs} ms on average`,
    );
  }
  return out;
}

async function measureJs(base: string) {
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
    ],
  });
  try {
    const sizeOf = async (signInFirst: boolean, urlPath: string) => {
      const context = await browser.newContext();
      if (signInFirst)
        await context.request.post(`${base}/api/auth/login`, {
          headers: { origin: base },
          data: { email: 'nurse@demo.luxtempo.example', password: demoPassword },
        });
      const page = await context.newPage();
      const scripts = new Map<string, number>();
      page.on('response', async (res) => {
        if (res.request().resourceType() === 'script' && res.ok())
          scripts.set(res.url(), gzipSync(await res.body()).length);
      });
      await page.goto(`${base}${urlPath}`, { waitUntil: 'networkidle' });
      await context.close();
      return {
        files: scripts.size,
        gzipKb: Math.round([...scripts.values()].reduce((a, b) => a + b, 0) / 102.4) / 10,
      };
    };
    const signInPage = await sizeOf(false, '/sign-in');
    const today = await sizeOf(true, '/');
    console.log(
      `first-load JS (gzip)   sign-in ${signInPage.gzipKb} kB in ${signInPage.files} files; Today ${today.gzipKb} kB in ${today.files} files`,
    );
    return { signIn: signInPage, today };
  } finally {
    await browser.close();
  }
}

/** `npm run bench -- [--open-loop] [--target URL] [--rates 50,200,500] [--api-pids …] [--db-pids …]` */
function option(name: string): string | undefined {
  const args = process.argv.slice(2);
  const at = args.findIndex((a) => a === `--${name}` || a.startsWith(`--${name}=`));
  if (at < 0) return undefined;
  const arg = args[at]!;
  return arg.includes('=') ? arg.slice(arg.indexOf('=') + 1) : (args[at + 1] ?? '');
}
const pidList = (value: string | undefined) =>
  (value ?? '')
    .split(',')
    .filter(Boolean)
    .map((p) => {
      const pid = Number(p);
      if (!Number.isInteger(pid) || pid <= 0) throw new Error(`not a process id: ${p}`);
      return pid;
    });
const target = option('target')?.replace(/\/+$/, '');
const openLoopOnly = process.argv.includes('--open-loop') || target !== undefined;
/** `--cpu-prof`: the API's workers are profiled (Node's --cpu-prof) and each open-loop run's share summarised. */
const cpuProfDir = process.argv.includes('--cpu-prof')
  ? path.join(dataDir, 'bench', `cpu-prof-${new Date().toISOString().replace(/[:.]/g, '-')}`)
  : null;
const openLoop = {
  ratesPerS: (option('rates') ?? '50,200,500').split(',').map(Number),
  seconds: Number(option('seconds') ?? durationS),
  // A tablet runs one session at a time; 20 tablets are a ward. The sessions are many more, so
  // that each gathers the 20–40 events of a real session over the whole run rather than hundreds.
  sessions: Number(option('sessions') ?? process.env.BENCH_SESSIONS ?? 400),
  tablets: Number(option('tablets') ?? 40),
};
if (openLoop.ratesPerS.some((r) => !(r > 0)) || !(openLoop.seconds > 0))
  throw new Error(
    '--rates must be positive numbers (taps per second) and --seconds a positive number',
  );

/** Signs in the tablets, starts the sessions and sends taps at each rate. */
async function openLoopRun(base: string, processes: MeasuredProcesses | null) {
  const clinician = await signIn(base, 'clinician');
  const tablets: string[] = [];
  for (let i = 0; i < openLoop.tablets; i++) tablets.push(await signIn(base, 'nurse'));
  const orderIds = await startCxlSessions(
    base,
    { clinician, nurse: tablets[0]! },
    openLoop.sessions,
  );
  const result = await measureOpenLoop({
    base,
    ratesPerS: openLoop.ratesPerS,
    seconds: openLoop.seconds,
    orderIds,
    tablets,
    measured: processes,
  });
  console.log(
    `${''.padEnd(24)} ${orderIds.length} sessions on ${tablets.length} tablets, taps sent round them in turn`,
  );
  return result;
}

const started = new Date();
const resultsFile = path.join(
  dataDir,
  'bench',
  `bench-${started.toISOString().replace(/[:.]/g, '-')}.json`,
);
mkdirSync(path.join(dataDir, 'bench'), { recursive: true });

if (target !== undefined) {
  // Someone else's servers (the cluster behind HAProxy, say): nothing is started or seeded here;
  // the demo people must exist there. CPU is counted only for the processes named.
  if (!/^https?:\/\//.test(target)) throw new Error(`--target must be an http(s) URL: ${target}`);
  const apiPids = pidList(option('api-pids'));
  const databasePids = pidList(option('db-pids'));
  const processes = apiPids.length > 0 ? { apiPids, databasePids } : null;
  console.log(
    `Luxtempo benchmark, open loop — ${started.toISOString()} — Node ${process.version} — target ${target}${processes ? '' : ' (CPU not counted: give --api-pids and --db-pids)'}\n`,
  );
  const result = await openLoopRun(target, processes);
  writeFileSync(
    resultsFile,
    JSON.stringify(
      { startedAt: started.toISOString(), node: process.version, openLoop: result },
      null,
      2,
    ),
  );
  console.log(`\nwritten to ${path.relative(process.cwd(), resultsFile)}`);
  process.exit(0);
}

console.log(
  `Luxtempo benchmark — ${started.toISOString()} — Node ${process.version} — API processes: ${webConcurrency}\n`,
);
const database = await prepareDatabase();
console.log(`client build: ${await buildClient()}`);
// Before the API starts, so that its start-up does not share the core.
const engine = openLoopOnly ? null : measureEngine(3);
const api = await startApiProcess({
  port,
  env,
  logFile: path.join(dataDir, 'bench', 'api.log'),
  startTimeoutMs: 300_000,
  nodeArgs: cpuProfDir ? ['--cpu-prof', `--cpu-prof-dir=${cpuProfDir}`] : [],
}).catch(async (error: unknown) => {
  await database.stop();
  throw error;
});
let results: Record<string, unknown>;
try {
  const base = api.url;
  measured = { apiPid: api.child.pid!, databasePid: database.pid() };
  const processes = { apiPids: [api.child.pid!], databasePids: [database.pid()] };
  if (openLoopOnly) {
    results = { openLoop: await openLoopRun(base, processes) };
  } else {
    const nurse = await signIn(base, 'nurse');
    const clinician = await signIn(base, 'clinician');

    // The smallest answer the API gives (public, no database, a few bytes): what the HTTP stack
    // and the middleware every request passes through cost before any work of Luxtempo's own.
    const floor = await load('GET /api/unit (floor)', { url: `${base}/api/unit`, method: 'GET' });

    const calculation = await load('POST /api/calculations', {
      url: `${base}/api/calculations`,
      method: 'POST',
      headers: { 'content-type': 'application/json', cookie: clinician },
      body: JSON.stringify({
        protocol: { key: 'pdt-standard', version: 1 },
        inputs: {
          height: { value: 170, unit: 'cm' },
          weight: { value: 70, unit: 'kg' },
          lesionGldUm: 2500,
          lensMagnification: 1,
        },
      }),
    });

    // Running CXL sessions to write to, taken in turn. A real session gathers some 20–40 events
    // (drops every few minutes through the soak and the UV); this many sessions keep every one of
    // them within that over the whole run, instead of piling hundreds of drops onto 50 sessions.
    const orderIds = await startCxlSessions(base, { clinician, nurse }, sessionCount);
    let next = 0;
    const eventWrites = await load('POST session-events', {
      url: base,
      requests: [
        {
          method: 'POST',
          headers: { 'content-type': 'application/json', cookie: nurse },
          setupRequest: (request) => ({
            ...request,
            path: `/api/orders/${orderIds[next++ % orderIds.length]}/session-events`,
            body: JSON.stringify({
              idempotencyKey: randomUUID(),
              clientTime: new Date().toISOString(),
              type: 'drop-given',
              stepId: 'riboflavin-soak',
            }),
          }),
        },
      ],
    });

    const perSession = await eventsPerSession(orderIds);
    console.log(
      `${''.padEnd(24)} ${orderIds.length} sessions written to in turn; events per session at the end: ${perSession.min}–${perSession.max}`,
    );
    Object.assign(eventWrites, { sessions: orderIds.length, eventsPerSession: perSession });

    // Taps at a ward's pace: a fixed arrival rate, latency from each tap's intended send time.
    const openLoopResult = await openLoopRun(base, processes);
    const js = await measureJs(base);
    const clock = await measureClockError(base);
    results = {
      engine,
      floor,
      calculation,
      eventWrites,
      openLoop: openLoopResult,
      firstLoadJs: js,
      // The same from the build's manifest, the service worker counted (npm run measure:bundle).
      firstLoadJsFromManifest: measureBundle(),
      clock,
    };
  }
} finally {
  if (cpuProfDir) await api.stop();
  else await api.kill();
  if (cpuProfDir) await summariseApiProfiles(cpuProfDir);
  await database.stop();
}

/** Waits for every worker's profile, then prints where the API's CPU went in each open-loop run. */
async function summariseApiProfiles(dir: string) {
  // The primary exits first; each worker (and each module-loader thread) writes its profile as
  // it ends. Wait until there is one per process at least and no more have come for a second.
  const processes = Number(webConcurrency) > 1 ? Number(webConcurrency) + 1 : 1;
  let seen = -1;
  let stableMs = 0;
  for (let waited = 0; waited < 30_000 && stableMs < 1000; waited += 250) {
    await new Promise((r) => setTimeout(r, 250));
    const count = existsSync(dir) ? profileFiles([dir]).length : 0;
    stableMs = count >= processes && count === seen ? stableMs + 250 : 0;
    seen = count;
  }
  const files = existsSync(dir) ? profileFiles([dir]) : [];
  type Run = { ratePerS: number; taps: number; window: { fromUs: number; toUs: number } };
  const runs = ((results?.openLoop as { runs?: Run[] } | undefined)?.runs ?? []) as Run[];
  for (const run of runs)
    printSummary(
      `API profile at ${run.ratePerS} taps/s (${files.length} processes)`,
      summariseProfiles(files, [run.window], 25),
      run.taps,
    );
  console.log(`\nprofiles in ${path.relative(process.cwd(), dir)}`);
}

if (openLoopOnly) {
  writeFileSync(
    resultsFile,
    JSON.stringify(
      {
        startedAt: started.toISOString(),
        node: process.version,
        webConcurrency: Number(webConcurrency),
        results,
      },
      null,
      2,
    ),
  );
  console.log(`\nwritten to ${path.relative(process.cwd(), resultsFile)}`);
  process.exit(0);
}

type OpenLoopRuns = {
  runs: {
    ratePerS: number;
    latencyMs: { p99: number };
    cpuMsPerTap: { apiPlusDatabase: number } | null;
  }[];
};
const runAt200 = (results.openLoop as OpenLoopRuns).runs.find((r) => r.ratePerS === 200);
const bundle = results.firstLoadJsFromManifest as ReturnType<typeof measureBundle>;
const verdict = {
  calculationP95: `${(results.calculation as { latencyMs: { p95: number } }).latencyMs.p95} ms (target ≤ ${targets.calculationP95Ms})`,
  eventWriteP95: `${(results.eventWrites as { latencyMs: { p95: number } }).latencyMs.p95} ms (target ≤ ${targets.eventWriteP95Ms})`,
  firstLoadJs: `loaded by the browser: sign-in ${(results.firstLoadJs as { signIn: { gzipKb: number } }).signIn.gzipKb} kB, Today ${(results.firstLoadJs as { today: { gzipKb: number } }).today.gzipKb} kB; with the service worker: sign-in ${bundle.screens['sign-in']!.gzipKb} kB, Today ${bundle.screens.today!.gzipKb} kB (target ≤ ${targets.firstLoadJsGzipKb})`,
  openLoopP99At200: runAt200
    ? `${runAt200.latencyMs.p99} ms (target ≤ ${targets.openLoopP99At200PerSMs})`
    : 'not run at 200 taps/s',
  cpuPerTap: `${(results.openLoop as OpenLoopRuns).runs.map((r) => `${r.cpuMsPerTap?.apiPlusDatabase} ms at ${r.ratePerS}/s`).join(', ')} (API + MariaDB; target ≤ ${targets.cpuPerTapMs})`,
  clockError: `${(results.clock as { maxErrorMs: number }).maxErrorMs} ms (target ≤ ${targets.clockErrorMs})`,
};
const file = resultsFile;
writeFileSync(
  file,
  JSON.stringify(
    {
      startedAt: started.toISOString(),
      node: process.version,
      webConcurrency: Number(webConcurrency),
      cpus: (await import('node:os')).cpus().length,
      targets,
      results,
      verdict,
    },
    null,
    2,
  ),
);
console.log(
  `\n${Object.entries(verdict)
    .map(([k, v]) => `${k.padEnd(16)} ${v}`)
    .join('\n')}\n\nwritten to ${path.relative(process.cwd(), file)}`,
);
