import { randomUUID } from 'node:crypto';
import type supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { pChart, wilsonInterval } from '../../shared/engine/proportions';
import {
  createTestPerson,
  identityConfirmed,
  preparedPdtOrder,
  signedInAgent,
  startTestApp,
  type TestContext,
  type TestPerson,
} from '../support/api';
import { readyBench } from '../support/devices';

type Agent = ReturnType<typeof supertest.agent>;
let ctx: TestContext;
let clinician: TestPerson;
let clinicianAgent: Agent;
let pharmacistAgent: Agent;
let nurseAgent: Agent;
let auditorAgent: Agent;
/** The server's clock runs this far ahead of the wall clock: the tests move it months on. */
let offsetMs = 0;
const days = (n: number) => n * 86_400_000;

let bench: Awaited<ReturnType<typeof readyBench>>;
beforeAll(async () => {
  ctx = await startTestApp({}, { now: () => Date.now() + offsetMs });
  clinician = await createTestPerson(ctx, ['clinician']);
  clinicianAgent = await signedInAgent(ctx, clinician);
  pharmacistAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['pharmacist']));
  nurseAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['nurse']));
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

/** A standard PDT session completed about 20 minutes ago; returns the order and its patient. */
async function completedPdtSession(
  patient: { email?: string | null; emailConsent?: boolean } = {},
): Promise<{ orderId: number; patientId: number }> {
  const order = await preparedPdtOrder(
    ctx,
    { clinician: [clinicianAgent, clinician], pharmacist: pharmacistAgent },
    60,
    patient,
  );
  const t0 = Date.now() - 40 * 60_000;
  const at = (s: number, e: object) => ({
    idempotencyKey: randomUUID(),
    clientTime: new Date(t0 + s * 1000).toISOString(),
    ...e,
  });
  for (const event of [
    at(0, { type: 'session-started', checks: allChecks, device: bench.deviceFor(order) }),
    at(60, { type: 'step-started', stepId: 'infusion' }),
    at(660, { type: 'step-ended', stepId: 'infusion' }),
    at(960, identityConfirmed('laser')),
    at(960, { type: 'step-started', stepId: 'laser' }),
    at(1043, { type: 'step-ended', stepId: 'laser' }),
    at(1050, { type: 'exposure-recorded', stepId: 'laser', exposureS: 83 }),
    at(1100, { type: 'session-completed' }),
  ]) {
    const res = await nurseAgent.post(`/api/orders/${order.id}/session-events`).send(event);
    if (res.status !== 201) throw new Error(JSON.stringify(res.body));
  }
  return { orderId: order.id, patientId: order.patient.id };
}

interface VisitDto {
  id: number;
  visitKey: string;
  offsetDays: number;
  dueOn: string;
  state: string;
  seenOn: string | null;
  acuity: { notation: string; entry: string; logMar: number; letters: number } | null;
}

async function followUpOf(patientId: number) {
  const res = await clinicianAgent.get(`/api/patients/${patientId}/follow-up`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as {
    today: string;
    treatments: {
      orderId: number;
      treatedOn: string;
      planFrom: { key: string; version: number } | null;
      complicationKinds: { id: string }[];
      visits: VisitDto[];
    }[];
  };
}

const addDays = (day: string, n: number) =>
  new Date(Date.parse(`${day}T00:00:00Z`) + days(n)).toISOString().slice(0, 10);

const pdtFindings = (subretinalFluid: 'present' | 'resolved') => ({
  centralSubfieldThicknessUm: subretinalFluid === 'resolved' ? 265 : 390,
  subretinalFluid,
  leakage: subretinalFluid === 'resolved' ? 'none' : 'present',
  retreatmentDecision: subretinalFluid === 'resolved' ? 'discharge' : 'retreat',
});

describe('follow-up visits', () => {
  it('are planned from the protocol when a session completes: baseline, 6 weeks and 3 months after PDT', async () => {
    const { orderId, patientId } = await completedPdtSession();
    const [treatment] = (await followUpOf(patientId)).treatments;
    expect(treatment?.orderId).toBe(orderId);
    // The order is on version 1, approved before follow-up fields: its plan comes from version 3.
    expect(treatment?.planFrom).toEqual({ key: 'pdt-standard', version: 3 });
    // 0, 42 and 91 days after the treatment (protocols/pdt-standard.v3.json; common practice).
    expect(treatment?.visits.map((v) => [v.visitKey, v.offsetDays])).toEqual([
      ['baseline', 0],
      ['week-6', 42],
      ['month-3', 91],
    ]);
    expect(treatment?.visits.map((v) => v.dueOn)).toEqual(
      [0, 42, 91].map((n) => addDays(treatment!.treatedOn, n)),
    );
    const rows = await ctx.dataSource.query(
      'SELECT COUNT(*) AS n FROM follow_up_visit WHERE order_id = ?',
      [orderId],
    );
    expect(Number(rows[0].n)).toBe(3);
  });

  it('are recorded by a clinician with acuity in feet, stored as logMAR with the entry kept', async () => {
    const { patientId } = await completedPdtSession();
    const { treatments, today } = await followUpOf(patientId);
    const baseline = treatments[0]!.visits[0]!;
    const res = await clinicianAgent.post(`/api/follow-up-visits/${baseline.id}`).send({
      seenOn: today,
      acuity: { notation: 'snellen-ft', value: '20/40' },
      pdt: pdtFindings('present'),
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // 20/40 = decimal 0.5 → logMAR 0.30 → 70 letters (Gregori NZ et al., Retina 2010).
    expect(res.body.visit.acuity).toEqual({
      notation: 'snellen-ft',
      entry: '20/40',
      logMar: 0.3,
      letters: 70,
    });
    expect(res.body.visit.state).toBe('recorded');
    const again = await clinicianAgent.post(`/api/follow-up-visits/${baseline.id}`).send({
      seenOn: today,
      acuity: { notation: 'logmar', value: '0.1' },
      pdt: pdtFindings('resolved'),
    });
    expect(again.status).toBe(409);
    const stored = (await followUpOf(patientId)).treatments[0]!.visits[0]!;
    expect(stored.acuity?.entry).toBe('20/40');
  });

  it('may be recorded by clinicians only: a nurse and an auditor are refused and nothing is stored', async () => {
    const { patientId } = await completedPdtSession();
    const { treatments, today } = await followUpOf(patientId);
    const visit = treatments[0]!.visits[0]!;
    const body = {
      seenOn: today,
      acuity: { notation: 'decimal', value: '0.5' },
      pdt: pdtFindings('present'),
    };
    expect((await nurseAgent.post(`/api/follow-up-visits/${visit.id}`).send(body)).status).toBe(
      403,
    );
    expect((await auditorAgent.post(`/api/follow-up-visits/${visit.id}`).send(body)).status).toBe(
      403,
    );
    const complication = await nurseAgent.post('/api/complications').send({
      orderId: treatments[0]!.orderId,
      kind: 'infusion-back-pain',
      severity: 'mild',
      onsetOn: today,
      outcome: 'resolved',
    });
    expect(complication.status).toBe(403);
    const after = (await followUpOf(patientId)).treatments[0]!;
    expect(after.visits[0]!.state).not.toBe('recorded');
    const rows = await ctx.dataSource.query(
      'SELECT COUNT(*) AS n FROM complication WHERE order_id = ?',
      [after.orderId],
    );
    expect(Number(rows[0].n)).toBe(0);
  });

  it('refuse impossible entries naming the field and the range, and store nothing', async () => {
    const { patientId } = await completedPdtSession();
    const { treatments, today } = await followUpOf(patientId);
    const visit = treatments[0]!.visits[0]!;
    const tryRecord = (body: object) =>
      clinicianAgent.post(`/api/follow-up-visits/${visit.id}`).send({
        seenOn: today,
        acuity: { notation: 'snellen-m', value: '6/12' },
        pdt: pdtFindings('present'),
        ...body,
      });
    const zero = await tryRecord({ acuity: { notation: 'snellen-m', value: '6/0' } });
    expect(zero.status).toBe(400);
    expect(zero.body.error.fields).toContainEqual(
      expect.objectContaining({
        path: 'acuity.value',
        message: expect.stringContaining('3 to 600 m'),
      }),
    );
    const negative = await tryRecord({ acuity: { notation: 'etdrs-letters', value: '-4' } });
    expect(negative.body.error.fields[0].message).toContain('0 to 100');
    const wrongKind = await tryRecord({
      cxl: { kmaxD: 52, thinnestPachymetryUm: 450, endothelialCellsPerMm2: null, hazeGrade: 0 },
    });
    expect(wrongKind.status).toBe(400);
    expect(wrongKind.body.error.fields).toContainEqual(expect.objectContaining({ path: 'cxl' }));
    const future = await tryRecord({ seenOn: addDays(today, 2) });
    expect(future.body.error.fields).toContainEqual(expect.objectContaining({ path: 'seenOn' }));
    const thickness = await tryRecord({
      pdt: { ...pdtFindings('present'), centralSubfieldThicknessUm: 20 },
    });
    expect(thickness.status).toBe(400);
    expect(JSON.stringify(thickness.body.error.fields)).toContain('100 to 1500 µm');
    const badKind = await clinicianAgent.post('/api/complications').send({
      orderId: treatments[0]!.orderId,
      kind: 'haze',
      severity: 'mild',
      onsetOn: today,
      outcome: 'resolved',
    });
    expect(badKind.status).toBe(400);
    expect(badKind.body.error.fields[0]).toMatchObject({ path: 'kind' });
    expect(badKind.body.error.fields[0].message).toContain('infusion-back-pain');

    const rows = await ctx.dataSource.query(
      'SELECT (SELECT COUNT(*) FROM follow_up_visit WHERE order_id = ? AND recorded_at IS NOT NULL) AS visits, (SELECT COUNT(*) FROM complication WHERE order_id = ?) AS complications',
      [treatments[0]!.orderId, treatments[0]!.orderId],
    );
    expect(Number(rows[0].visits)).toBe(0);
    expect(Number(rows[0].complications)).toBe(0);
  });
});

describe('outcomes for the auditor', () => {
  it('count fluid resolved at 3 months with a Wilson interval, and eyes lost to follow-up apart', async () => {
    offsetMs = 0;
    const resolved = await completedPdtSession({
      email: 'reach@test.luxtempo.example',
      emailConsent: true,
    });
    const persisting = await completedPdtSession();
    const lost = await completedPdtSession();
    const month3 = async (patientId: number, fluid: 'present' | 'resolved', acuity: string) => {
      const { treatments } = await followUpOf(patientId);
      const visits = treatments[0]!.visits;
      const baseline = visits.find((v) => v.visitKey === 'baseline')!;
      const outcomeVisit = visits.find((v) => v.visitKey === 'month-3')!;
      const first = await clinicianAgent.post(`/api/follow-up-visits/${baseline.id}`).send({
        seenOn: baseline.dueOn,
        acuity: { notation: 'snellen-m', value: '6/12' },
        pdt: pdtFindings('present'),
      });
      expect(first.status, JSON.stringify(first.body)).toBe(200);
      const res = await clinicianAgent.post(`/api/follow-up-visits/${outcomeVisit.id}`).send({
        seenOn: outcomeVisit.dueOn,
        acuity: { notation: 'snellen-m', value: acuity },
        pdt: pdtFindings(fluid),
      });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      return treatments[0]!;
    };

    // Reminder: 3 days before the 6-week visit of a patient who consents (protocol file; common practice).
    offsetMs = days(39);
    expect((await clinicianAgent.get('/api/follow-up/overdue')).status).toBe(200);
    const reminders = await ctx.dataSource.query(
      "SELECT COUNT(*) AS n FROM outbox_message WHERE kind = 'follow-up-reminder' AND JSON_CONTAINS(recipients, '\"reach@test.luxtempo.example\"')",
    );
    expect(Number(reminders[0].n)).toBe(1);

    offsetMs = days(95);
    const reached = await month3(resolved.patientId, 'resolved', '6/9');
    await month3(persisting.patientId, 'present', '6/18');
    const complication = await clinicianAgent.post('/api/complications').send({
      orderId: reached.orderId,
      kind: 'photosensitivity-reaction',
      severity: 'mild',
      onsetOn: reached.treatedOn,
      outcome: 'resolved',
      note: 'Sunburn on the forearm on the day after treatment.',
    });
    expect(complication.status, JSON.stringify(complication.body)).toBe(201);

    // 91 + 14 days after the treatment the unrecorded 3-month visit is missed (protocol file).
    offsetMs = days(120);
    const overdue = await clinicianAgent.get('/api/follow-up/overdue');
    expect(overdue.body.visits.map((v: { orderId: number }) => v.orderId)).toContain(lost.orderId);

    const res = await auditorAgent.get('/api/outcomes').query({ protocol: 'pdt-standard' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const outcomeOf = (orderId: number) =>
      res.body.eyes.find((e: { orderId: number }) => e.orderId === orderId);
    expect(outcomeOf(resolved.orderId)).toMatchObject({
      outcome: 'reached',
      // 6/12 → 6/9: logMAR 0.30 → 0.18 (−log10 0.667), a change of −0.12 (definition of logMAR).
      acuityChangeLogMar: -0.12,
      complications: 1,
    });
    expect(outcomeOf(persisting.orderId)).toMatchObject({ outcome: 'not-reached' });
    expect(outcomeOf(lost.orderId)).toMatchObject({ outcome: 'lost-to-follow-up' });

    const row = res.body.protocols.find(
      (p: { protocolKey: string }) => p.protocolKey === 'pdt-standard',
    );
    const eyes = res.body.eyes as { outcome: string }[];
    const count = (o: string) => eyes.filter((e) => e.outcome === o).length;
    expect(row.lostToFollowUp).toBe(count('lost-to-follow-up'));
    expect(row.lostToFollowUp).toBeGreaterThanOrEqual(1);
    expect(row.treatedEyes).toBe(eyes.length);
    expect(
      row.reached + row.notReached + row.lostToFollowUp + row.pending + row.notAssessable,
    ).toBe(row.treatedEyes);
    // The share is of eyes assessed; the lost ones are not in it but in the worst case beside it.
    expect(row.share).toEqual(wilsonInterval(row.reached, row.reached + row.notReached));
    expect(row.shareIfLostFailed).toEqual(
      wilsonInterval(row.reached, row.reached + row.notReached + row.lostToFollowUp),
    );
    expect(res.body.charts.map((c: { id: string }) => c.id)).toEqual([
      'deviations',
      'complications',
      'outcome',
    ]);

    const csv = await auditorAgent
      .get('/api/exports/outcomes.csv')
      .query({ protocol: 'pdt-standard' });
    expect(csv.status).toBe(200);
    expect(csv.text.split('\r\n')[0]).toContain('lost_to_follow_up');
    expect(csv.text).toContain(`pdt-standard,`);

    const queue = await auditorAgent.get('/api/complications/review-queue');
    expect(queue.body.complications.map((c: { id: number }) => c.id)).toContain(
      complication.body.complication.id,
    );
    expect((await clinicianAgent.get('/api/complications/review-queue')).status).toBe(403);
    expect((await nurseAgent.get('/api/outcomes')).status).toBe(403);
    offsetMs = 0;
  });

  it('refuses a malformed period, naming the field', async () => {
    const res = await auditorAgent.get('/api/outcomes').query({ from: '2026-13' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0]).toMatchObject({ path: 'from' });
  });
});

describe('the deviation trend as a p-chart', () => {
  it('gives each month of a protocol version its own 3-sigma limits and a reading in words', async () => {
    await completedPdtSession();
    const res = await auditorAgent.get('/api/trends');
    expect(res.status).toBe(200);
    const months = res.body.months as {
      protocolKey: string;
      protocolVersion: number;
      month: string;
      sessions: number;
      sessionsWithDeviation: number;
      upperLimitPct: number | null;
      lowerLimitPct: number | null;
      reading: string;
    }[];
    const series = months.filter(
      (m) => m.protocolKey === 'pdt-standard' && m.protocolVersion === 1,
    );
    expect(series.length).toBeGreaterThan(0);
    // p̄ ± 3√(p̄(1−p̄)/n) per month (Benneyan JC, Lloyd RC, Plsek PE, Qual Saf Health Care 2003).
    const chart = pChart(
      series.map((m) => ({ label: m.month, count: m.sessionsWithDeviation, total: m.sessions })),
    );
    series.forEach((m, i) => {
      const point = chart.points[i]!;
      expect(m.upperLimitPct).toBeCloseTo((point.upperLimit ?? 0) * 100, 1);
      expect(m.lowerLimitPct).toBeCloseTo((point.lowerLimit ?? 0) * 100, 1);
      expect(m.reading).toMatch(/within limits|special-cause variation/);
    });
  });
});
