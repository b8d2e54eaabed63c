import { randomUUID } from 'node:crypto';
import type supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoData } from '../../server/demo/seed';
import { formatDuration, formatUnitTime } from '../../shared/format/figures';
import { seedVolume } from '../../server/demo/volume';
import { createReviewRepository } from '../../server/review/repository';
import { auditFilterSchema } from '../../shared/schemas/reviews';
import {
  createTestPerson,
  preparedPdtOrder,
  signedInAgent,
  startTestApp,
  type TestContext,
  type TestPerson,
  identityConfirmed,
} from '../support/api';
import { readyBench } from '../support/devices';

type Agent = ReturnType<typeof supertest.agent>;
let ctx: TestContext;
let clinician: TestPerson;
let clinicianAgent: Agent;
let pharmacistAgent: Agent;
let auditorAgent: Agent;

let bench: Awaited<ReturnType<typeof readyBench>>;
beforeAll(async () => {
  ctx = await startTestApp();
  clinician = await createTestPerson(ctx, ['clinician']);
  clinicianAgent = await signedInAgent(ctx, clinician);
  pharmacistAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['pharmacist']));
  auditorAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['auditor']));
  bench = await readyBench(await signedInAgent(ctx, await createTestPerson(ctx, ['admin'])));
});
afterAll(async () => {
  await ctx.close();
});

const allChecks = {
  patientIdentity: true,
  treatmentEye: true,
  consent: true,
  eyewear: true,
  deviceSettings: true,
};

/**
 * A finished standard PDT session run by `nurse`, with the light `lightLateS` seconds late.
 * Returns the order id.
 */
async function sessionWithLateLight(nurse: Agent, lightLateS: number): Promise<number> {
  // Made up an hour before: an infusion timed before the reconstitution is refused.
  const order = await preparedPdtOrder(
    ctx,
    { clinician: [clinicianAgent, clinician], pharmacist: pharmacistAgent },
    60,
  );
  const t0 = Date.now() - 40 * 60_000;
  const at = (s: number, e: object) => ({
    idempotencyKey: randomUUID(),
    clientTime: new Date(t0 + s * 1000).toISOString(),
    ...e,
  });
  const light = 60 + 900 + lightLateS;
  for (const event of [
    at(0, { type: 'session-started', checks: allChecks, device: bench.deviceFor(order) }),
    at(60, { type: 'step-started', stepId: 'infusion' }),
    at(660, { type: 'step-ended', stepId: 'infusion' }),
    at(light, identityConfirmed('laser')),
    at(light, { type: 'step-started', stepId: 'laser' }),
    at(light + 83, { type: 'step-ended', stepId: 'laser' }),
    // The laser's displayed exposure, which a PDT session with light needs before it completes.
    at(light + 90, { type: 'exposure-recorded', stepId: 'laser', exposureS: 83 }),
    at(light + 200, { type: 'session-completed' }),
  ]) {
    const res = await nurse.post(`/api/orders/${order.id}/session-events`).send(event);
    if (res.status !== 201) throw new Error(JSON.stringify(res.body));
  }
  return order.id;
}

describe('the deviations queue', () => {
  it('filters by staff member and type, pages, and sorts on the server', async () => {
    const nurse = await createTestPerson(ctx, ['nurse']);
    const nurseAgent = await signedInAgent(ctx, nurse);
    const orderIds = [];
    for (const late of [180, 240, 300]) orderIds.push(await sessionWithLateLight(nurseAgent, late));
    const page1 = await auditorAgent.get('/api/deviations').query({
      staff: nurse.id,
      type: 'light-start-window',
      pageSize: 2,
      sort: 'detectedAt',
      direction: 'asc',
    });
    expect(page1.status).toBe(200);
    expect(page1.body.total).toBe(3);
    expect(page1.body.deviations).toHaveLength(2);
    expect(page1.body.deviations.map((d: { orderId: number }) => d.orderId)).toEqual(
      orderIds.slice(0, 2),
    );
    // Light 15 min ± 1 min after infusion start (TAP Study Group, Arch Ophthalmol 1999; tolerance common practice).
    expect(page1.body.deviations[0]).toMatchObject({
      type: 'light-start-window',
      expected: 15,
      actual: 18,
      unit: 'min',
      protocolKey: 'pdt-standard',
      reviewStatus: 'open',
    });
    expect(page1.body.deviations[0].detectedAt).toMatch(/[+-]\d{2}:\d{2}$/);
    const page2 = await auditorAgent.get('/api/deviations').query({
      staff: nurse.id,
      type: 'light-start-window',
      pageSize: 2,
      page: 2,
      sort: 'detectedAt',
      direction: 'asc',
    });
    expect(page2.body.deviations.map((d: { orderId: number }) => d.orderId)).toEqual(
      orderIds.slice(2),
    );
    const otherType = await auditorAgent
      .get('/api/deviations')
      .query({ staff: nurse.id, type: 'soak-short' });
    expect(otherType.body.total).toBe(0);
    const bad = await auditorAgent.get('/api/deviations').query({ severity: 'terrible' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields[0].path).toBe('severity');
  });

  it('is for auditors only', async () => {
    expect((await clinicianAgent.get('/api/deviations')).status).toBe(403);
    expect((await pharmacistAgent.get('/api/exports/deviations.csv')).status).toBe(403);
  });
});

describe('reviewing a deviation', () => {
  it('an auditor closes it with a classification and comment, reopens it, and the history keeps every step', async () => {
    const nurse = await signedInAgent(ctx, await createTestPerson(ctx, ['nurse']));
    const orderId = await sessionWithLateLight(nurse, 200);
    const list = await auditorAgent
      .get('/api/deviations')
      .query({ type: 'light-start-window', pageSize: 200 });
    const id = list.body.deviations.find((d: { orderId: number }) => d.orderId === orderId).id;

    const noComment = await auditorAgent
      .post(`/api/deviations/${id}/closure`)
      .send({ classification: 'acceptable' });
    expect(noComment.status).toBe(400);
    expect(noComment.body.error.fields[0].path).toBe('comment');

    const closed = await auditorAgent
      .post(`/api/deviations/${id}/closure`)
      .send({ classification: 'acceptable', comment: 'Laser room delayed; within local policy.' });
    expect(closed.status).toBe(200);
    expect(closed.body.deviation).toMatchObject({
      reviewStatus: 'closed',
      classification: 'acceptable',
    });
    expect((await clinicianAgent.get(`/api/orders/${orderId}`)).body.order.status).toBe('reviewed');

    expect(
      (
        await auditorAgent
          .post(`/api/deviations/${id}/closure`)
          .send({ classification: 'incident', comment: 'Second look.' })
      ).status,
    ).toBe(409);
    const reopened = await auditorAgent
      .post(`/api/deviations/${id}/reopening`)
      .send({ comment: 'Pharmacy asks for a second look.' });
    expect(reopened.body.deviation.reviewStatus).toBe('open');
    expect((await clinicianAgent.get(`/api/orders/${orderId}`)).body.order.status).toBe(
      'completed',
    );
    const again = await auditorAgent.post(`/api/deviations/${id}/closure`).send({
      classification: 'needs-follow-up',
      comment: 'Discuss scheduling at the unit meeting.',
    });
    expect(
      again.body.history.map((h: { action: string; classification: string | null }) => [
        h.action,
        h.classification,
      ]),
    ).toEqual([
      ['closed', 'acceptable'],
      ['reopened', null],
      ['closed', 'needs-follow-up'],
    ]);
  });

  it('nobody reviews a session they took part in, even holding the auditor role', async () => {
    const both = await createTestPerson(ctx, ['nurse', 'auditor']);
    const agent = await signedInAgent(ctx, both);
    const orderId = await sessionWithLateLight(agent, 200);
    const list = await agent.get('/api/deviations').query({ staff: both.id });
    const id = list.body.deviations.find((d: { orderId: number }) => d.orderId === orderId).id;
    const detail = await agent.get(`/api/deviations/${id}`);
    expect(detail.body.canReview).toBe(false);
    const res = await agent
      .post(`/api/deviations/${id}/closure`)
      .send({ classification: 'acceptable', comment: 'Looks fine to me.' });
    expect(res.status).toBe(403);
  });
});

describe('reviewing during a running session', () => {
  it('closing the last open deviation of a running session leaves it in session, and every later tap is stored', async () => {
    const nurse = await signedInAgent(ctx, await createTestPerson(ctx, ['nurse']));
    const order = await preparedPdtOrder(ctx, {
      clinician: [clinicianAgent, clinician],
      pharmacist: pharmacistAgent,
    });
    const t0 = Date.now() - 30 * 60_000;
    const at = (s: number, e: object) => ({
      idempotencyKey: randomUUID(),
      clientTime: new Date(t0 + s * 1000).toISOString(),
      ...e,
    });
    const send = (event: object) =>
      nurse.post(`/api/orders/${order.id}/session-events`).send(event);
    // Light 20 min after the infusion started, outside 15 ± 1 min (TAP Study Group, Arch Ophthalmol 1999;
    // the window's tolerance common practice): a deviation while the laser step runs.
    const light = 60 + 1200;
    for (const event of [
      at(0, { type: 'session-started', checks: allChecks, device: bench.deviceFor(order) }),
      at(60, { type: 'step-started', stepId: 'infusion' }),
      at(660, { type: 'step-ended', stepId: 'infusion' }),
      at(light, identityConfirmed('laser')),
      at(light, { type: 'step-started', stepId: 'laser' }),
    ])
      expect((await send(event)).status).toBe(201);
    const list = await auditorAgent
      .get('/api/deviations')
      .query({ type: 'light-start-window', pageSize: 200 });
    const deviation = list.body.deviations.find((d: { orderId: number }) => d.orderId === order.id);
    expect(deviation).toBeDefined();

    const closed = await auditorAgent
      .post(`/api/deviations/${deviation.id}/closure`)
      .send({ classification: 'acceptable', comment: 'Laser room was still being cleaned.' });
    expect(closed.status).toBe(200);
    expect((await clinicianAgent.get(`/api/orders/${order.id}`)).body.order.status).toBe(
      'in-session',
    );

    const laterTaps = [
      at(light + 83, { type: 'step-ended', stepId: 'laser' }),
      at(light + 90, { type: 'exposure-recorded', stepId: 'laser', exposureS: 83 }),
      at(light + 200, { type: 'session-completed' }),
    ];
    for (const tap of laterTaps) {
      const res = await send(tap);
      expect(res.status, JSON.stringify(res.body)).toBe(201);
    }
    const state = await nurse.get(`/api/orders/${order.id}/session`);
    const storedKeys = state.body.events.map((e: { idempotencyKey: string }) => e.idempotencyKey);
    for (const tap of laterTaps) expect(storedKeys).toContain(tap.idempotencyKey);
    expect((await clinicianAgent.get(`/api/orders/${order.id}`)).body.order.status).toBe(
      'completed',
    );

    // Ended, with nothing open: the next review settles it as reviewed.
    const reopened = await auditorAgent
      .post(`/api/deviations/${deviation.id}/reopening`)
      .send({ comment: 'Closed before the session ended; look again.' });
    expect(reopened.status).toBe(200);
    expect((await clinicianAgent.get(`/api/orders/${order.id}`)).body.order.status).toBe(
      'completed',
    );
    await auditorAgent
      .post(`/api/deviations/${deviation.id}/closure`)
      .send({ classification: 'acceptable', comment: 'Reviewed after the end.' });
    expect((await clinicianAgent.get(`/api/orders/${order.id}`)).body.order.status).toBe(
      'reviewed',
    );

    // A tap from an offline queue, made before the end, still lands on a reviewed session; an
    // extravasation it reports is a new open deviation, so the session goes back to the queue.
    // Timed before the stored end, it is a queued tap and needs no late-entry reason (a tap timed
    // after the end would: sessions.test.ts 'tap times are bounded'). The nurse read the pump
    // (the whole 30 mL bag: TAP Study Group 1999) when recording it.
    const late = await send(
      at(light + 150, {
        type: 'extravasation',
        note: 'Swelling at the cannula noted on paper, tablet was offline.',
        volumeInfusedMl: 30,
      }),
    );
    expect(late.status, JSON.stringify(late.body)).toBe(201);
    expect((await clinicianAgent.get(`/api/orders/${order.id}`)).body.order.status).toBe(
      'completed',
    );
    const open = await auditorAgent
      .get('/api/deviations')
      .query({ type: 'extravasation', pageSize: 200 });
    expect(
      open.body.deviations.find((d: { orderId: number }) => d.orderId === order.id),
    ).toMatchObject({ reviewStatus: 'open' });
  });
});

describe('the CSV export', () => {
  it('has units in the headers, ISO 8601 times with offset, and escapes commas, quotes and line breaks', async () => {
    const nurse = await createTestPerson(ctx, ['nurse']);
    const orderId = await sessionWithLateLight(await signedInAgent(ctx, nurse), 240);
    const list = await auditorAgent.get('/api/deviations').query({ staff: nurse.id });
    const id = list.body.deviations[0].id;
    const comment = 'Delayed, "laser room" busy,\nsee incident log';
    await auditorAgent
      .post(`/api/deviations/${id}/closure`)
      .send({ classification: 'needs-follow-up', comment });
    const res = await auditorAgent
      .get('/api/exports/deviations.csv')
      .query({ staff: nurse.id })
      .buffer(true);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    const text = res.text;
    const header = text.split('\r\n')[0]!;
    expect(header).toBe(
      'deviation_id,order_id,detected_at (ISO 8601),protocol,protocol_version,patient_record_number,eye,type,severity,expected,actual,unit,message,review_status,classification,reviewed_by,reviewed_at (ISO 8601),review_comment',
    );
    expect(text).toContain(`"${comment.replace(/"/g, '""')}"`);
    expect(text).toMatch(
      new RegExp(
        `^${id},${orderId},\\d{4}-\\d{2}-\\d{2}T\\d{2}:\\d{2}:\\d{2}\\.\\d{3}[+-]\\d{2}:\\d{2},pdt-standard,1,`,
        'm',
      ),
    );

    // The export writes times and durations through the shared formatters: the stored instant
    // as ISO 8601 with the unit zone's offset, and the message's durations in words.
    const [stored] = await ctx.dataSource.query('SELECT detected_at FROM deviation WHERE id = ?', [
      id,
    ]);
    const row = text.split('\r\n').find((line) => line.startsWith(`${id},`))!;
    expect(row.split(',')[2]).toBe(
      formatUnitTime(new Date(stored.detected_at).toISOString(), ctx.config.UNIT_TIME_ZONE, 'iso'),
    );
    // Light due 15 min after the infusion start (TAP Study Group, Arch Ophthalmol 1999), 240 s late.
    expect(row).toContain(formatDuration(900 + 240, 'words'));

    const records = await auditorAgent
      .get('/api/exports/dose-records.csv')
      .query({ staff: nurse.id })
      .buffer(true);
    expect(records.text.split('\r\n')[0]).toContain('delivered_fluence (J/cm²)');
    // 6 mg/m² × 1.82 m² = 10.92 mg; 30 mL infused; 83 s at 600 mW/cm² = 49.8 J/cm² planned and
    // delivered (TAP Study Group, Arch Ophthalmol 1999; Mosteller RD, N Engl J Med 1987). Every
    // session names its device: delivered is nominal, from the 57.7 mW set over the 3,500 µm spot
    // (49.78 J/cm², shown to 0.1), then the laser, its serial, the lens and its factor, the power
    // and spot set, no UV columns; one deviation.
    expect(records.text.split('\r\n')[1]).toMatch(
      /,10\.92,30,83,49\.8,49\.8,nominal,Test laser [0-9a-f]{8},SN-[0-9a-f]{6},Test lens ×1 [0-9a-f]{6},1,57\.7,3500,,,1$/,
    );
  });
});

describe('dose records and trends', () => {
  it('lists completed sessions with delivered fluence, and counts sessions with a deviation per month', async () => {
    const nurse = await createTestPerson(ctx, ['nurse']);
    const agent = await signedInAgent(ctx, nurse);
    await sessionWithLateLight(agent, 0);
    await sessionWithLateLight(agent, 300);
    const records = await auditorAgent.get('/api/dose-records').query({ staff: nurse.id });
    expect(records.body.total).toBe(2);
    expect(records.body.records[0]).toMatchObject({
      protocolKey: 'pdt-standard',
      outcome: 'completed',
    });
    expect(
      records.body.records.map((r: { deviationCount: number }) => r.deviationCount).sort(),
    ).toEqual([0, 1]);
    const trends = await auditorAgent.get('/api/trends').query({ protocol: 'pdt-standard' });
    const month = trends.body.months.at(-1);
    expect(month.sessions).toBeGreaterThanOrEqual(2);
    expect(month.ratePct).toBeCloseTo((month.sessionsWithDeviation / month.sessions) * 100, 1);
  });

  it('splits the month’s deviations by type and severity, and the split adds up', async () => {
    const nurse = await createTestPerson(ctx, ['nurse']);
    const agent = await signedInAgent(ctx, nurse);
    // Light 5 min late: outside 15 min ± 1 min (TAP Study Group 1999; tolerance common practice).
    await sessionWithLateLight(agent, 300);
    const trends = await auditorAgent.get('/api/trends').query({ protocol: 'pdt-standard' });
    const month = trends.body.months.at(-1).month;
    const late = trends.body.byType.find(
      (r: { month: string; type: string }) => r.month === month && r.type === 'light-start-window',
    );
    const [stored] = await ctx.dataSource.query(
      `SELECT COUNT(*) AS n FROM deviation d JOIN dose_record r ON r.order_id = d.order_id
        JOIN protocol_version pv ON pv.id = r.protocol_version_id
       WHERE d.withdrawn_at IS NULL AND d.type = 'light-start-window' AND d.severity = 'major'
         AND r.local_month = ? AND pv.protocol_key = 'pdt-standard' AND r.outcome IN ('completed', 'stopped')`,
      [month],
    );

    expect(late).toMatchObject({ severity: 'major', protocolKey: 'pdt-standard' });
    expect(
      trends.body.byType
        .filter(
          (r: { month: string; type: string; severity: string }) =>
            r.month === month && r.type === 'light-start-window' && r.severity === 'major',
        )
        .reduce((sum: number, r: { deviations: number }) => sum + r.deviations, 0),
    ).toBe(Number(stored.n));
  });
});

describe('the staff list for filters', () => {
  it('gives auditors names, roles and ids, and no e-mail addresses', async () => {
    const nurse = await createTestPerson(ctx, ['nurse']);
    const res = await auditorAgent.get('/api/staff');
    expect(res.status).toBe(200);
    expect(res.body.staff).toContainEqual({
      id: nurse.id,
      displayName: 'Test nurse',
      roles: ['nurse'],
      active: true,
    });
    expect(JSON.stringify(res.body)).not.toContain('@');
  });
});

describe('the audit trail', () => {
  it('shows who did what, filterable, to auditors', async () => {
    const res = await auditorAgent
      .get('/api/audit-events')
      .query({ action: 'order.signed', pageSize: 5 });
    expect(res.status).toBe(200);
    expect(res.body.events.length).toBeGreaterThan(0);
    expect(res.body.events.every((e: { action: string }) => e.action === 'order.signed')).toBe(
      true,
    );
    expect(res.body.events[0].occurredAt).toMatch(/[+-]\d{2}:\d{2}$/);
  });
});

describe('with 5,000 sessions loaded', () => {
  it(
    'the queue’s page query uses an index rather than reading the whole table',
    { timeout: 180_000 },
    async () => {
      await seedDemoData(ctx.dataSource);
      await seedVolume(ctx.dataSource, 5000, { unitTimeZone: 'Europe/Lisbon', seed: 7 });
      const repo = createReviewRepository(ctx.dataSource);
      for (const query of [
        {},
        { status: 'open' },
        { protocol: 'cxl-standard' },
        { type: 'light-start-window' },
        { severity: 'major', sort: 'detectedAt' },
      ]) {
        const filter = auditFilterSchema.parse(query);
        const [sql, params] = await repo.deviationPageSql(filter, {});
        const plan: { table: string; type: string; key: string | null; rows: number }[] =
          await ctx.dataSource.query(`EXPLAIN ${sql}`, params);
        const deviationRow = plan.find((p) => p.table === 'd')!;
        expect({ query, type: deviationRow.type, key: deviationRow.key }).toMatchObject({
          query,
          key: expect.stringMatching(/^(ix_deviation_|PRIMARY)/),
        });
        expect(deviationRow.type).not.toBe('ALL');
      }
    },
  );
});
