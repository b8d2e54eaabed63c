import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  createTestPatient,
  createTestPerson,
  pdtOrder,
  signedInAgent,
  startTestApp,
  type TestContext,
  type TestPerson,
} from '../support/api';

let ctx: TestContext;
let clinician: TestPerson;
type Agent = ReturnType<typeof supertest.agent>;
let agent: Agent;

beforeAll(async () => {
  ctx = await startTestApp();
  clinician = await createTestPerson(ctx, ['clinician']);
  agent = await signedInAgent(ctx, clinician);
});
afterAll(async () => {
  await ctx.close();
});

const v2 = { key: 'pdt-standard', version: 2 };
const body = (
  patientId: number,
  weight: { value: number; unit: 'kg' | 'lb' },
  extra: Record<string, unknown> = {},
) =>
  pdtOrder(patientId, {
    protocol: v2,
    inputs: {
      height: { value: 183, unit: 'cm' },
      weight,
      bsaFormula: 'mosteller',
      lesionGldUm: 2500,
      lensMagnification: 1,
    },
    ...extra,
  });

/** The order's row version as it stands: edits, signatures and amendments send the version they read. */
const versionOf = async (id: number, who: Agent = agent) =>
  (await who.get(`/api/orders/${id}`)).body.order.version as number;
const sign = async (id: number, who: Agent = agent, password = clinician.password) =>
  who
    .post(`/api/orders/${id}/signature`)
    .send({ password, meaning: 'ordered', version: await versionOf(id, who) });

/** What a refused signature must leave untouched: still a draft, no measurement, no signature audit, no e-mail. */
async function expectNothingSigned(orderId: number) {
  const order = await agent.get(`/api/orders/${orderId}`);
  expect(order.body.order).toMatchObject({ status: 'draft', signedAt: null, signedBy: null });
  expect(
    await ctx.dataSource.query('SELECT id FROM patient_measurement WHERE order_id = ?', [orderId]),
  ).toHaveLength(0);
  expect(
    await ctx.dataSource.query(
      "SELECT id FROM audit_event WHERE action = 'order.signed' AND entity_id = ?",
      [String(orderId)],
    ),
  ).toHaveLength(0);
  expect(
    await ctx.dataSource.query(
      "SELECT id FROM outbox_message WHERE related_type = 'order' AND related_id = ?",
      [String(orderId)],
    ),
  ).toHaveLength(0);
}

/** A patient whose 183 cm / 92 kg was recorded on a signed order today. */
async function patientWeighing92Kg() {
  const patient = await createTestPatient(ctx);
  const first = await agent.post('/api/orders').send(body(patient.id, { value: 92, unit: 'kg' }));
  expect(first.status).toBe(201);
  expect((await sign(first.body.order.id)).status).toBe(200);
  return patient;
}

describe('a body-mass index outside the usual range', () => {
  it('the slip (183 cm, 92 typed with lb) is refused at signing until a reason is given, naming the field, the range, the BMI and both units', async () => {
    const patient = await createTestPatient(ctx);
    const draft = await agent.post('/api/orders').send(body(patient.id, { value: 92, unit: 'lb' }));
    expect(draft.status).toBe(201);
    // 92 lb = 41.73 kg; 41.73 / 1.83² = 12.5 kg/m² (common practice / WHO), below the demo range 16–45 (common practice).
    const warning = draft.body.order.warnings.find(
      (w: { field?: string }) => w.field === 'bmiKgPerM2',
    );
    expect(warning).toMatchObject({ code: 'soft-limit' });

    const refused = await sign(draft.body.order.id);
    expect(refused.status).toBe(400);
    const problem = refused.body.error.fields.find(
      (f: { path: string }) => f.path === 'softLimitReasons.bmiKgPerM2',
    );
    expect(problem.message).toContain('body-mass index 12.5 kg/m²');
    expect(problem.message).toContain('16 to 45 kg/m²');
    expect(problem.message).toContain('92 lb (41.7 kg)');
    expect(problem.message).toContain('5 to 500 characters');
    await expectNothingSigned(draft.body.order.id);
  });

  it('a reason shorter than 5 characters is refused when saved, naming the field and the length; the draft keeps what it had and still cannot be signed', async () => {
    const patient = await createTestPatient(ctx);
    const slip = body(patient.id, { value: 92, unit: 'lb' });
    const draft = await agent.post('/api/orders').send(slip);
    const short = await agent.put(`/api/orders/${draft.body.order.id}`).send({
      ...slip,
      softLimitReasons: { bmiKgPerM2: ' ok ' },
      version: draft.body.order.version,
    });
    expect(short.status).toBe(400);
    expect(short.body.error.fields).toEqual([
      expect.objectContaining({
        path: 'softLimitReasons.bmiKgPerM2',
        message: expect.stringContaining('5 to 500 characters'),
      }),
    ]);
    expect(
      (await agent.get(`/api/orders/${draft.body.order.id}`)).body.order.softLimitReasons,
    ).toEqual({});
    expect((await sign(draft.body.order.id)).status).toBe(400);
    await expectNothingSigned(draft.body.order.id);
  });

  it('a reason for another field does not stand for the BMI', async () => {
    const patient = await createTestPatient(ctx);
    const slip = body(
      patient.id,
      { value: 92, unit: 'lb' },
      { softLimitReasons: { 'inputs.weight.value': 'Weighed on the ward scale today.' } },
    );
    const draft = await agent.post('/api/orders').send(slip);
    const refused = await sign(draft.body.order.id);
    expect(refused.body.error.fields.map((f: { path: string }) => f.path)).toEqual([
      'softLimitReasons.bmiKgPerM2',
    ]);
    await expectNothingSigned(draft.body.order.id);
  });

  it('with a reason it signs, and the patient’s measurement is kept as typed and in cm and kg', async () => {
    const patient = await createTestPatient(ctx);
    const reason = 'Weighed again on the ward scale: 41.7 kg is right.';
    const draft = await agent
      .post('/api/orders')
      .send(
        body(patient.id, { value: 92, unit: 'lb' }, { softLimitReasons: { bmiKgPerM2: reason } }),
      );
    const signed = await sign(draft.body.order.id);
    expect(signed.status).toBe(200);
    expect(signed.body.order.softLimitReasons).toEqual({ bmiKgPerM2: reason });
    const audit = await ctx.dataSource.query(
      "SELECT details FROM audit_event WHERE action = 'order.signed' AND entity_id = ?",
      [String(draft.body.order.id)],
    );
    expect(audit[0].details.softLimitReasons).toEqual({ bmiKgPerM2: reason });
    const rows = await ctx.dataSource.query(
      'SELECT * FROM patient_measurement WHERE order_id = ?',
      [draft.body.order.id],
    );
    expect(rows).toHaveLength(1);
    // 1 lb = 0.45359237 kg (international definition).
    expect(rows[0]).toMatchObject({
      patient_id: patient.id,
      height_value: 183,
      height_unit: 'cm',
      height_cm: 183,
      weight_value: 92,
      weight_unit: 'lb',
    });
    expect(rows[0].weight_kg).toBeCloseTo(41.7305, 4);
  });

  it('a version approved before the BMI range is checked against the default range, and says so', async () => {
    const patient = await createTestPatient(ctx);
    const draft = await agent
      .post('/api/orders')
      .send(
        body(
          patient.id,
          { value: 92, unit: 'lb' },
          { protocol: { key: 'pdt-standard', version: 1 } },
        ),
      );
    const warning = draft.body.order.warnings.find(
      (w: { field?: string }) => w.field === 'bmiKgPerM2',
    );
    expect(warning.message).toContain(
      'the default range, as protocol pdt-standard v1 has none of its own',
    );
    expect((await sign(draft.body.order.id)).status).toBe(400);
    await expectNothingSigned(draft.body.order.id);
  });
});

describe('a weight far from the patient’s last recorded weight', () => {
  it('more than 10 % within 90 days is refused at signing until a reason is given, naming the field, the rule and both weights in both units', async () => {
    const patient = await patientWeighing92Kg();
    // 80 kg is 13 % below 92 kg (demo rule: more than 10 % within 90 days, common practice).
    const draft = await agent
      .post('/api/orders')
      .send(body(patient.id, { value: 80, unit: 'kg' }, { eye: 'left' }));
    expect(draft.body.order.warnings.map((w: { code: string }) => w.code)).toContain(
      'weight-change',
    );
    const refused = await sign(draft.body.order.id);
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields.map((f: { path: string }) => f.path)).toEqual([
      'weightChangeReason',
    ]);
    const message = refused.body.error.fields[0].message;
    expect(message).toContain(
      '80 kg (176.4 lb) is 13 % less than the 92 kg (202.8 lb) recorded today',
    );
    expect(message).toContain('more than 10 % within 90 days');
    expect(message).toContain('5 to 500 characters');
    await expectNothingSigned(draft.body.order.id);
  });

  it('a too-short weight-change reason is refused when saved, naming the field; with a real reason it signs and is kept', async () => {
    const patient = await patientWeighing92Kg();
    const changed = body(patient.id, { value: 80, unit: 'kg' }, { eye: 'left' });
    const draft = await agent.post('/api/orders').send(changed);
    const short = await agent
      .put(`/api/orders/${draft.body.order.id}`)
      .send({ ...changed, weightChangeReason: 'diet', version: draft.body.order.version });
    expect(short.status).toBe(400);
    expect(short.body.error.fields).toEqual([
      expect.objectContaining({
        path: 'weightChangeReason',
        message: expect.stringContaining('5 to 500 characters'),
      }),
    ]);
    expect(
      (await agent.get(`/api/orders/${draft.body.order.id}`)).body.order.weightChangeReason,
    ).toBeNull();
    await expectNothingSigned(draft.body.order.id);

    const reason = 'Lost 12 kg on a supervised diet; weighed today.';
    expect(
      (
        await agent
          .put(`/api/orders/${draft.body.order.id}`)
          .send({ ...changed, weightChangeReason: reason, version: draft.body.order.version })
      ).status,
    ).toBe(200);
    const signed = await sign(draft.body.order.id);
    expect(signed.status).toBe(200);
    expect(signed.body.order.weightChangeReason).toBe(reason);
    const audit = await ctx.dataSource.query(
      "SELECT details FROM audit_event WHERE action = 'order.signed' AND entity_id = ?",
      [String(draft.body.order.id)],
    );
    expect(audit[0].details.weightChangeReason).toBe(reason);
  });

  it('the pound slip against a recorded 92 kg needs both reasons', async () => {
    const patient = await patientWeighing92Kg();
    const draft = await agent
      .post('/api/orders')
      .send(body(patient.id, { value: 92, unit: 'lb' }, { eye: 'left' }));
    const refused = await sign(draft.body.order.id);
    expect(refused.body.error.fields.map((f: { path: string }) => f.path)).toEqual([
      'softLimitReasons.bmiKgPerM2',
      'weightChangeReason',
    ]);
    expect(refused.body.error.fields[1].message).toContain(
      '92 lb (41.7 kg) is 54.6 % less than the 92 kg (202.8 lb)',
    );
    await expectNothingSigned(draft.body.order.id);
  });

  it('within 10 % signs without a reason, the same weight typed in pounds too', async () => {
    const patient = await patientWeighing92Kg();
    // 84 kg is 8.7 % below 92 kg; 202.8 lb = 91.99 kg (1 lb = 0.45359237 kg).
    const near = await agent
      .post('/api/orders')
      .send(body(patient.id, { value: 84, unit: 'kg' }, { eye: 'left' }));
    expect(near.body.order.warnings.map((w: { code: string }) => w.code)).not.toContain(
      'weight-change',
    );
    expect((await sign(near.body.order.id)).status).toBe(200);
    const other = await createTestPatient(ctx);
    const first = await agent.post('/api/orders').send(body(other.id, { value: 92, unit: 'kg' }));
    await sign(first.body.order.id);
    const pounds = await agent
      .post('/api/orders')
      .send(body(other.id, { value: 202.8, unit: 'lb' }, { eye: 'left' }));
    expect((await sign(pounds.body.order.id)).status).toBe(200);
  });

  it('a weight recorded 90 days ago or more is not compared', async () => {
    const patient = await createTestPatient(ctx);
    // A measurement dated 120 days back (the table is append-only, so it is written dated).
    const old = await agent.post('/api/orders').send(body(patient.id, { value: 92, unit: 'kg' }));
    await ctx.dataSource.query(
      "INSERT INTO patient_measurement (patient_id, order_id, measured_at, height_value, height_unit, height_cm, weight_value, weight_unit, weight_kg) VALUES (?, ?, NOW(3) - INTERVAL 120 DAY, 183, 'cm', 183, 92, 'kg', 92)",
      [patient.id, old.body.order.id],
    );
    const now = await agent
      .post('/api/orders')
      .send(body(patient.id, { value: 75, unit: 'kg' }, { eye: 'left' }));
    expect((await sign(now.body.order.id)).status).toBe(200);
  });

  it('the rule comes from the server’s configuration', async () => {
    const loose = await startTestApp({
      WEIGHT_CHANGE_MAX_PCT: '20',
      WEIGHT_CHANGE_WITHIN_DAYS: '30',
    });
    try {
      const looseAgent = await signedInAgent(loose, clinician);
      const patient = await patientWeighing92Kg();
      // 80 kg is 13 % below 92 kg: inside a 20 % rule.
      const draft = await looseAgent
        .post('/api/orders')
        .send(body(patient.id, { value: 80, unit: 'kg' }, { eye: 'left' }));
      expect((await sign(draft.body.order.id, looseAgent)).status).toBe(200);
      expect(
        (await looseAgent.get(`/api/patients/${patient.id}/measurements`)).body.weightChangeRule,
      ).toEqual({ maxPct: 20, withinDays: 30 });
    } finally {
      await loose.close();
    }
  });

  it('an amendment is not compared with the revision it replaces, and the replaced revision leaves the history', async () => {
    const patient = await createTestPatient(ctx);
    const slip = body(
      patient.id,
      { value: 92, unit: 'lb' },
      { softLimitReasons: { bmiKgPerM2: 'Confirmed on the ward scale.' } },
    );
    const first = await agent.post('/api/orders').send(slip);
    await sign(first.body.order.id);
    const corrected = {
      ...body(patient.id, { value: 92, unit: 'kg' }),
      amendmentReason: 'Weight was 92 kg, typed with the unit on lb.',
    };
    const amended = await agent
      .post(`/api/orders/${first.body.order.id}/amendments`)
      .send({ ...corrected, version: await versionOf(first.body.order.id) });
    expect(amended.status).toBe(201);
    expect(amended.body.order.warnings.map((w: { code: string }) => w.code)).not.toContain(
      'weight-change',
    );
    expect((await sign(amended.body.order.id)).status).toBe(200);
    const history = await agent.get(`/api/patients/${patient.id}/measurements`);
    expect(history.body.measurements.map((m: { orderId: number }) => m.orderId)).toEqual([
      amended.body.order.id,
    ]);
  });
});

describe('GET /api/patients/:id/measurements', () => {
  it('lists the last recorded heights and weights, newest first, as typed and in cm and kg, with the rule', async () => {
    const patient = await patientWeighing92Kg();
    const later = await agent
      .post('/api/orders')
      .send(body(patient.id, { value: 200, unit: 'lb' }, { eye: 'left' }));
    await sign(later.body.order.id);
    const res = await agent.get(`/api/patients/${patient.id}/measurements`);
    expect(res.status).toBe(200);
    expect(res.body.weightChangeRule).toEqual({ maxPct: 10, withinDays: 90 });
    expect(res.body.measurements).toHaveLength(2);
    expect(res.body.measurements[0]).toMatchObject({
      orderId: later.body.order.id,
      height: { value: 183, unit: 'cm' },
      heightCm: 183,
      weight: { value: 200, unit: 'lb' },
    });
    expect(res.body.measurements[0].weightKg).toBeCloseTo(90.7185, 4); // 1 lb = 0.45359237 kg
    expect(res.body.measurements[1]).toMatchObject({
      weight: { value: 92, unit: 'kg' },
      weightKg: 92,
    });
    expect(Date.parse(res.body.measurements[0].measuredAt)).toBeGreaterThanOrEqual(
      Date.parse(res.body.measurements[1].measuredAt),
    );
  });

  it('names an unknown patient with 404 and a bad id with 400, and needs a signed-in person', async () => {
    expect((await agent.get('/api/patients/99999999/measurements')).status).toBe(404);
    const bad = await agent.get('/api/patients/abc/measurements');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields[0].path).toBe('id');
    expect((await supertest(ctx.app).get('/api/patients/1/measurements')).status).toBe(401);
  });

  it('the app cannot change or remove a recorded measurement', async () => {
    const patient = await patientWeighing92Kg();
    await expect(
      ctx.dataSource.query('UPDATE patient_measurement SET weight_kg = 41 WHERE patient_id = ?', [
        patient.id,
      ]),
    ).rejects.toThrow(/denied/i);
    await expect(
      ctx.dataSource.query('DELETE FROM patient_measurement WHERE patient_id = ?', [patient.id]),
    ).rejects.toThrow(/denied/i);
  });
});
