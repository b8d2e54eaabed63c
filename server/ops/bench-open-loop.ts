// The open-loop part of `npm run bench`: taps sent at a fixed arrival rate, as a ward's tablets
// send them, whatever the server's answers do. A closed loop (autocannon's N connections, each
// waiting for its answer before the next request) slows down with the server and so hides the
// wait a tap would really have had ("coordinated omission"); here every tap has an intended send
// time from the schedule, and its latency is measured from that time, not from when it left.
import { randomUUID } from 'node:crypto';
import http from 'node:http';
import https from 'node:https';
import { availableParallelism } from 'node:os';
import { performance } from 'node:perf_hooks';
import { demoPassword } from '../demo/seed';
import { cpuTimeMs } from './process-cpu';

/**
 * The bench's orders keep version 1 of cxl-standard (its figures are the ones worked out before);
 * an order on a superseded version must say why.
 */
export const benchVersionReason =
  'Benchmark orders keep version 1, on which the benchmark was first measured';

export async function signIn(base: string, role: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: `${role}@demo.luxtempo.example`, password: demoPassword }),
  });
  if (!res.ok) throw new Error(`sign-in as ${role}: ${res.status}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}

async function call(base: string, cookie: string, method: string, url: string, body?: unknown) {
  const res = await fetch(`${base}/api${url}`, {
    method,
    headers: { Cookie: cookie, 'Content-Type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const json = (await res.json()) as Record<string, any>;
  if (!res.ok) throw new Error(`${method} ${url}: ${res.status} ${JSON.stringify(json)}`);
  return json;
}

/**
 * A UV source of the bench's own on the device register, added by the demo administrator with a
 * passing output check now (3 mW/cm² set and read: the irradiance of cxl-standard v1), since every
 * session start names a checked device. Returns the `device` the bench's session starts send.
 */
export async function benchUvSource(base: string) {
  const admin = await signIn(base, 'admin');
  const { device } = await call(base, admin, 'POST', '/devices', {
    name: `Bench UV source ${randomUUID().slice(0, 8)}`,
    kind: 'uv',
    wavelengthNm: 370,
    serialNumber: 'BENCH-UV-1',
    location: 'Benchmark',
    powerRangeMw: null,
    spotRangeUm: null,
    irradianceRangeMwPerCm2: { min: 1, max: 45 },
    pulsedAvailable: true,
    serviceDueOn: '2099-12-31',
    status: 'in-use',
    outOfServiceReason: null,
  });
  await call(base, admin, 'POST', `/devices/${device.id}/output-checks`, {
    irradianceSetMwPerCm2: 3,
    irradianceMeasuredMwPerCm2: 3,
    meterIdentity: 'Bench meter',
    meterCalibrationDueOn: '2099-06-30',
  });
  return { deviceId: device.id as number, irradianceSetMwPerCm2: 3 };
}

/**
 * Running CXL sessions, in their riboflavin soak (the step where drops are given every few
 * minutes), made through the API as a clinician and a nurse would: patient, order, signature,
 * session start, step start. Ten at a time. Returns the orders' ids.
 */
export async function startCxlSessions(
  base: string,
  people: { clinician: string; nurse: string },
  count: number,
): Promise<number[]> {
  const { clinician, nurse } = people;
  const device = await benchUvSource(base);
  const orderIds: number[] = [];
  const startSession = async (i: number) => {
    const patient = await call(base, clinician, 'POST', '/patients', {
      recordNumber: `B-${randomUUID().slice(0, 8)}`,
      givenName: 'Bench',
      familyName: `Session ${i}`,
      dateOfBirth: '1970-01-01',
    });
    const draft = await call(base, clinician, 'POST', '/orders', {
      patientId: patient.patient.id,
      eye: 'right',
      protocol: { key: 'cxl-standard', version: 1 },
      inputs: { stromalThicknessUm: 470 },
      checklist: ['thin-stroma', 'active-infection', 'herpetic-keratitis'].map((id) => ({
        id,
        answer: 'no',
      })),
      supersededVersionReason: benchVersionReason,
    });
    await call(base, clinician, 'POST', `/orders/${draft.order.id}/signature`, {
      password: demoPassword,
      meaning: 'ordered',
      version: draft.order.version,
    });
    const now = new Date().toISOString();
    await call(base, nurse, 'POST', `/orders/${draft.order.id}/session-events`, {
      idempotencyKey: randomUUID(),
      clientTime: now,
      type: 'session-started',
      checks: {
        patientIdentity: true,
        treatmentEye: true,
        consent: true,
        eyewear: true,
        deviceSettings: true,
      },
      device,
    });
    await call(base, nurse, 'POST', `/orders/${draft.order.id}/session-events`, {
      idempotencyKey: randomUUID(),
      clientTime: now,
      type: 'step-started',
      stepId: 'riboflavin-soak',
    });
    orderIds.push(draft.order.id);
  };
  for (let i = 0; i < count; i += 10)
    await Promise.all(
      Array.from({ length: Math.min(10, count - i) }, (_, j) => startSession(i + j)),
    );
  return orderIds;
}

export function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  const index = Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1);
  return Math.round(sorted[index]! * 100) / 100;
}

/** Processes whose CPU time is counted: the API (with its workers) and MariaDB. */
export interface MeasuredProcesses {
  apiPids: number[];
  databasePids: number[];
}

export interface OpenLoopOptions {
  /** The API's base URL: the single server the benchmark started, or a load balancer in front of several. */
  base: string;
  ratesPerS: number[];
  seconds: number;
  /** Running sessions the taps are spread over, each on one tablet. */
  orderIds: number[];
  /** Signed-in tablets (cookies): session i is run from tablet i mod tablets. */
  tablets: string[];
  measured: MeasuredProcesses | null;
  warmUpS?: number;
}

interface Sent {
  /** When the schedule meant the tap to leave (performance.now() ms). */
  intendedMs: number;
  /** Wall-clock time of that moment, sent as the tap's clientTime. */
  clientTime: string;
  orderId: number;
  cookie: string;
}

/** One tap over a kept-alive connection; resolves with the HTTP status (0 for a network error). */
function sendTap(agent: http.Agent, base: URL, tap: Sent): Promise<number> {
  const body = JSON.stringify({
    idempotencyKey: randomUUID(),
    clientTime: tap.clientTime,
    type: 'drop-given',
    stepId: 'riboflavin-soak',
  });
  const transport = base.protocol === 'https:' ? https : http;
  return new Promise((resolve) => {
    const req = transport.request(
      {
        agent,
        host: base.hostname,
        port: base.port,
        method: 'POST',
        path: `/api/orders/${tap.orderId}/session-events`,
        headers: {
          'content-type': 'application/json',
          'content-length': Buffer.byteLength(body),
          cookie: tap.cookie,
        },
      },
      (res) => {
        res.resume();
        res.on('end', () => resolve(res.statusCode ?? 0));
        res.on('error', () => resolve(0));
      },
    );
    req.on('error', () => resolve(0));
    req.end(body);
  });
}

/**
 * Sends `ratePerS × seconds` taps, each at its own time on a fixed schedule (not when an earlier
 * answer came back), round the sessions in turn. Latency = answer received (the event stored and
 * its record recomputed: the API answers 201 after the commit) − intended send time.
 */
async function runRate(
  options: OpenLoopOptions,
  agent: http.Agent,
  ratePerS: number,
  seconds: number,
  nextTap: { i: number },
) {
  const base = new URL(options.base);
  const total = Math.round(ratePerS * seconds);
  const intervalMs = 1000 / ratePerS;
  const latencies: number[] = [];
  const statuses = new Map<number, number>();
  let lateStartMaxMs = 0;
  const wallMinusPerf = Date.now() - performance.now();
  const t0 = performance.now() + 20;
  const inFlight: Promise<void>[] = [];
  const queues = new Map<number, Promise<void>>();
  let peakInFlight = 0;
  let open = 0;
  await new Promise<void>((resolve) => {
    let sent = 0;
    const tick = () => {
      const now = performance.now();
      while (sent < total && t0 + sent * intervalMs <= now) {
        const intendedMs = t0 + sent * intervalMs;
        lateStartMaxMs = Math.max(lateStartMaxMs, now - intendedMs);
        const i = nextTap.i++;
        const session = i % options.orderIds.length;
        const tap: Sent = {
          intendedMs,
          clientTime: new Date(wallMinusPerf + intendedMs).toISOString(),
          orderId: options.orderIds[session]!,
          cookie: options.tablets[session % options.tablets.length]!,
        };
        open++;
        peakInFlight = Math.max(peakInFlight, open);
        // A tablet sends its taps in order, one at a time (its queue): a tap due while the
        // session's previous one is still unanswered leaves after it, and waits meanwhile.
        const previous = queues.get(session) ?? Promise.resolve();
        const done = previous.then(() => sendTap(agent, base, tap));
        queues.set(
          session,
          done.then(() => undefined),
        );
        inFlight.push(
          done.then((status) => {
            open--;
            statuses.set(status, (statuses.get(status) ?? 0) + 1);
            if (status === 201) latencies.push(performance.now() - tap.intendedMs);
          }),
        );
        sent++;
      }
      if (sent < total) setTimeout(tick, Math.max(0, t0 + sent * intervalMs - performance.now()));
      else resolve();
    };
    setTimeout(tick, 20);
  });
  await Promise.all(inFlight);
  latencies.sort((a, b) => a - b);
  return { total, latencies, statuses, lateStartMaxMs, peakInFlight };
}

export async function measureOpenLoop(options: OpenLoopOptions) {
  const agent = new http.Agent({ keepAlive: true, maxSockets: 512 });
  const nextTap = { i: 0 };
  const results = [];
  try {
    // Not counted: the API's code is compiled as it is first used.
    await runRate(options, agent, 50, options.warmUpS ?? 3, nextTap);
    for (const ratePerS of options.ratesPerS) {
      const m = options.measured;
      const before = m && {
        api: cpuTimeMs(m.apiPids),
        database: cpuTimeMs(m.databasePids),
        generator: process.cpuUsage(),
      };
      const fromUs = Number(process.hrtime.bigint() / 1000n);
      const run = await runRate(options, agent, ratePerS, options.seconds, nextTap);
      /** The run's span on the monotonic clock V8's profiles use (µs), to cut a `--cpu-prof` profile. */
      const window = { fromUs, toUs: Number(process.hrtime.bigint() / 1000n) };
      const perTap = (ms: number) => Math.round((ms / run.total) * 1000) / 1000;
      const cpuMsPerTap =
        m && before
          ? (() => {
              const g = process.cpuUsage(before.generator);
              const api = perTap(cpuTimeMs(m.apiPids) - before.api);
              const database = perTap(cpuTimeMs(m.databasePids) - before.database);
              return {
                api,
                database,
                apiPlusDatabase: Math.round((api + database) * 1000) / 1000,
                loadGenerator: perTap((g.user + g.system) / 1000),
              };
            })()
          : null;
      const stored = run.latencies.length;
      const out = {
        ratePerS,
        seconds: options.seconds,
        taps: run.total,
        stored,
        notStored: Object.fromEntries([...run.statuses].filter(([status]) => status !== 201)),
        latencyMs: {
          p50: percentile(run.latencies, 50),
          p95: percentile(run.latencies, 95),
          p99: percentile(run.latencies, 99),
          max: percentile(run.latencies, 100),
        },
        /** How far behind its schedule the generator itself sent a tap (its own lateness counts in the latency). */
        generatorLateMaxMs: Math.round(run.lateStartMaxMs * 10) / 10,
        peakInFlight: run.peakInFlight,
        cpuMsPerTap,
        window,
      };
      results.push(out);
      const failed = run.total - stored;
      console.log(
        `open loop ${String(ratePerS).padStart(4)} taps/s  p50 ${out.latencyMs.p50} ms  p95 ${out.latencyMs.p95} ms  p99 ${out.latencyMs.p99} ms  max ${out.latencyMs.max} ms  (${run.total} taps, ${failed} not stored${failed ? ` ${JSON.stringify(out.notStored)}` : ''}, up to ${run.peakInFlight} sent and unanswered)`,
      );
      if (cpuMsPerTap)
        console.log(
          `${''.padEnd(24)} CPU per tap: API ${cpuMsPerTap.api} ms + MariaDB ${cpuMsPerTap.database} ms = ${cpuMsPerTap.apiPlusDatabase} ms (load generator ${cpuMsPerTap.loadGenerator} ms; ${availableParallelism()} cores)`,
        );
    }
  } finally {
    agent.destroy();
  }
  return {
    sessions: options.orderIds.length,
    tablets: options.tablets.length,
    target: options.base,
    runs: results,
  };
}
