import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import mysql from 'mysql2/promise';
import { demoPassword } from '../../server/demo/seed';
import {
  FaultClient,
  faultConfig,
  readyCxlOrder,
  readyUvSource,
  faultDbPort,
  resetFaultDatabase,
  startApiProcess,
  startFaultDatabase,
  stopFaultDatabase,
  type ApiProcess,
} from '../support/fault-rig';

// Ports of these tests' own API processes.
const portA = 3391;
const portB = 3392;
let api: ApiProcess | undefined;
let second: ApiProcess | undefined;

beforeAll(async () => {
  await startFaultDatabase();
  await resetFaultDatabase();
  api = await startApiProcess(portA, 'api-a');
}, 120_000);

afterAll(async () => {
  await api?.kill();
  await second?.kill();
  stopFaultDatabase();
});

const allChecks = {
  patientIdentity: true,
  treatmentEye: true,
  consent: true,
  eyewear: true,
  deviceSettings: true,
};
const t0 = Date.now() - 30 * 60_000;
const at = (s: number, e: object) => ({
  idempotencyKey: randomUUID(),
  clientTime: new Date(t0 + s * 1000).toISOString(),
  ...e,
});

async function eventCount(orderId: number): Promise<number> {
  const config = faultConfig();
  const db = await mysql.createConnection({
    host: '127.0.0.1',
    port: faultDbPort,
    user: config.DB_USER,
    password: config.DB_PASSWORD,
    database: config.DB_NAME,
  });
  const [rows] = await db.query('SELECT COUNT(*) AS n FROM session_event WHERE order_id = ?', [
    orderId,
  ]);
  await db.end();
  return Number((rows as { n: number }[])[0]!.n);
}

describe('when the API process dies mid-session', () => {
  it('a restarted process shows the session exactly where it was, and the clock goes on', async () => {
    const orderId = await readyCxlOrder(api!.url);
    const device = await readyUvSource(api!.url);
    const nurse = await new FaultClient(api!.url).signIn(
      'nurse@demo.luxtempo.example',
      demoPassword,
    );
    for (const e of [
      at(0, { type: 'session-started', checks: allChecks, device }),
      at(60, { type: 'step-started', stepId: 'riboflavin-soak' }),
      at(180, { type: 'drop-given', stepId: 'riboflavin-soak' }),
    ]) {
      expect((await nurse.call('POST', `/orders/${orderId}/session-events`, e)).status).toBe(201);
    }
    const before = await nurse.call('GET', `/orders/${orderId}/session`);
    await api!.kill();
    api = await startApiProcess(portA, 'api-a');
    const after = await nurse.call('GET', `/orders/${orderId}/session`);
    expect(after.status).toBe(200);
    expect(after.body.events).toEqual(before.body.events);
    expect(after.body.record.soakStartAt).toBe(before.body.record.soakStartAt);
    // The old cookie still works: the session is a signed token, not server memory.
    expect(
      (
        await nurse.call(
          'POST',
          `/orders/${orderId}/session-events`,
          at(300, { type: 'drop-given', stepId: 'riboflavin-soak' }),
        )
      ).status,
    ).toBe(201);
  }, 90_000);

  it('deviations of an event written just before a crash are worked out when the server starts again', async () => {
    const orderId = await readyCxlOrder(api!.url);
    const device = await readyUvSource(api!.url);
    const nurse = await new FaultClient(api!.url).signIn(
      'nurse@demo.luxtempo.example',
      demoPassword,
    );
    await nurse.call(
      'POST',
      `/orders/${orderId}/session-events`,
      at(0, { type: 'session-started', checks: allChecks, device }),
    );
    await nurse.call(
      'POST',
      `/orders/${orderId}/session-events`,
      at(60, { type: 'step-started', stepId: 'riboflavin-soak' }),
    );
    await api!.kill();
    // The row as a dying process might have left it: stored, but nothing derived from it.
    const config = faultConfig();
    const db = await mysql.createConnection({
      host: '127.0.0.1',
      port: faultDbPort,
      user: config.DB_USER,
      password: config.DB_PASSWORD,
      database: config.DB_NAME,
    });
    const event = at(60 + 20 * 60, { type: 'step-ended', stepId: 'riboflavin-soak' });
    await db.query(
      'INSERT INTO session_event (order_id, idempotency_key, type, step_id, client_time, recorded_by, payload) VALUES (?, ?, ?, ?, ?, (SELECT id FROM user WHERE email = ?), ?)',
      [
        orderId,
        event.idempotencyKey,
        'step-ended',
        'riboflavin-soak',
        new Date(event.clientTime),
        'nurse@demo.luxtempo.example',
        JSON.stringify(event),
      ],
    );
    await db.end();
    api = await startApiProcess(portA, 'api-a');
    const state = await nurse.call('GET', `/orders/${orderId}/session`);
    // A 20-minute soak against the protocol's 30 minutes (Wollensak G et al., Am J Ophthalmol 2003; shortfall tolerance common practice).
    expect(state.body.deviations.map((d: { type: string }) => d.type)).toContain('soak-short');
  }, 90_000);
});

describe('two API instances on one database', () => {
  it('store one row when both receive the same event at the same moment', async () => {
    second ??= await startApiProcess(portB, 'api-b');
    const orderId = await readyCxlOrder(api!.url);
    const device = await readyUvSource(api!.url);
    const nurse = await new FaultClient(api!.url).signIn(
      'nurse@demo.luxtempo.example',
      demoPassword,
    );
    await nurse.call(
      'POST',
      `/orders/${orderId}/session-events`,
      at(0, { type: 'session-started', checks: allChecks, device }),
    );
    const event = at(60, { type: 'step-started', stepId: 'riboflavin-soak' });
    const answers = await Promise.all([
      ...Array.from({ length: 5 }, () =>
        nurse.call('POST', `/orders/${orderId}/session-events`, event, api!.url),
      ),
      ...Array.from({ length: 5 }, () =>
        nurse.call('POST', `/orders/${orderId}/session-events`, event, second!.url),
      ),
    ]);
    expect(answers.map((a) => a.status).sort()).toEqual([
      200, 200, 200, 200, 200, 200, 200, 200, 200, 201,
    ]);
    expect(await eventCount(orderId)).toBe(2);
  }, 90_000);

  it('take turns on one session, and every answer counts the events the other one stored', async () => {
    second ??= await startApiProcess(portB, 'api-b');
    const orderId = await readyCxlOrder(api!.url);
    const device = await readyUvSource(api!.url);
    const nurse = await new FaultClient(api!.url).signIn(
      'nurse@demo.luxtempo.example',
      demoPassword,
    );
    const taps = [
      at(0, { type: 'session-started', checks: allChecks, device }),
      at(60, { type: 'step-started', stepId: 'riboflavin-soak' }),
      ...[180, 300, 420, 540, 660].map((s) =>
        at(s, { type: 'drop-given', stepId: 'riboflavin-soak' }),
      ),
    ];
    for (const [index, tap] of taps.entries()) {
      // Each process remembers the events it has seen; the other's writes must still be counted.
      const answer = await nurse.call(
        'POST',
        `/orders/${orderId}/session-events`,
        tap,
        index % 2 === 0 ? api!.url : second!.url,
      );
      expect(answer.status).toBe(201);
      expect(answer.body.event.idempotencyKey).toBe(tap.idempotencyKey);
      expect(answer.body.eventCount).toBe(index + 1);
    }
    const state = await nurse.call('GET', `/orders/${orderId}/session`);
    expect(state.body.events.map((e: { idempotencyKey: string }) => e.idempotencyKey)).toEqual(
      taps.map((t) => t.idempotencyKey),
    );
  }, 90_000);
});

describe('when the database stops for 20 seconds', () => {
  it('the API answers 503 with a clear message meanwhile, and the queued events are all stored once it is back', async () => {
    const orderId = await readyCxlOrder(api!.url);
    const device = await readyUvSource(api!.url);
    const nurse = await new FaultClient(api!.url).signIn(
      'nurse@demo.luxtempo.example',
      demoPassword,
    );
    await nurse.call(
      'POST',
      `/orders/${orderId}/session-events`,
      at(0, { type: 'session-started', checks: allChecks, device }),
    );
    const queue = [
      at(60, { type: 'step-started', stepId: 'riboflavin-soak' }),
      at(180, { type: 'drop-given', stepId: 'riboflavin-soak' }),
      at(300, { type: 'drop-given', stepId: 'riboflavin-soak' }),
    ];

    stopFaultDatabase();
    const downSince = Date.now();
    const health = await nurse.call('GET', '/health');
    expect(health.status).toBe(503);
    const refused = await nurse.call('POST', `/orders/${orderId}/session-events`, queue[0]);
    expect(refused.status).toBe(503);
    expect(refused.body.error.message).toMatch(/database is not answering/i);
    expect(JSON.stringify(refused.body)).not.toMatch(/ECONNREFUSED|SELECT|INSERT|at .*\.ts/);
    await new Promise((r) => setTimeout(r, Math.max(0, 20_000 - (Date.now() - downSince))));
    await startFaultDatabase();

    // The client's queue: send in order, retry what fails, until every event is stored.
    const until = Date.now() + 30_000;
    for (const event of queue) {
      for (;;) {
        const res = await nurse.call('POST', `/orders/${orderId}/session-events`, event);
        if (res.status === 201 || res.status === 200) break;
        expect(res.status).toBe(503);
        if (Date.now() > until) throw new Error('the API did not recover within 30 s');
        await new Promise((r) => setTimeout(r, 500));
      }
    }
    expect(await eventCount(orderId)).toBe(4);
    const state = await nurse.call('GET', `/orders/${orderId}/session`);
    expect(state.body.record.drops).toHaveLength(2);
  }, 120_000);
});
