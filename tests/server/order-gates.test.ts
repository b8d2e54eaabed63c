import { DateTime } from 'luxon';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoScenario } from '../../server/demo/scenario';
import { seedDemoData } from '../../server/demo/seed';
import { signatureProblems } from '../../shared/orders/readiness';
import type { ProtocolVersion as ProtocolDefinition } from '../../shared/protocol/protocol-schema';
import type { DosePlan } from '../../shared/schemas/calculation';
import type { ChecklistAnswer } from '../../shared/schemas/orders';
import {
  createTestPatient,
  createTestPerson,
  cxlOrder,
  pdtOrder,
  signedInAgent,
  startTestApp,
  type TestContext,
  type TestPerson,
} from '../support/api';

let ctx: TestContext;
let clinician: TestPerson;
let pharmacist: TestPerson;
type Agent = ReturnType<typeof supertest.agent>;
let clinicianAgent: Agent;
let pharmacistAgent: Agent;

beforeAll(async () => {
  ctx = await startTestApp();
  clinician = await createTestPerson(ctx, ['clinician']);
  pharmacist = await createTestPerson(ctx, ['pharmacist']);
  [clinicianAgent, pharmacistAgent] = await Promise.all([
    signedInAgent(ctx, clinician),
    signedInAgent(ctx, pharmacist),
  ]);
});
afterAll(async () => {
  await ctx.close();
});

const pdtV2 = { key: 'pdt-standard', version: 2 };
type Answer = { id: string; answer: 'yes' | 'no'; overrideReason?: string };

function withAnswer(body: { checklist: unknown }, answer: Answer) {
  return {
    ...body,
    checklist: (body.checklist as Answer[]).map((a) => (a.id === answer.id ? answer : a)),
  };
}

async function draft(body: object) {
  const res = await clinicianAgent.post('/api/orders').send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.order as { id: number };
}

/** The order's row version as it stands: edits and signatures send the version they read. */
const versionOf = async (id: number) =>
  (await clinicianAgent.get(`/api/orders/${id}`)).body.order.version as number;
const sign = async (id: number) =>
  clinicianAgent
    .post(`/api/orders/${id}/signature`)
    .send({ password: clinician.password, meaning: 'ordered', version: await versionOf(id) });

async function storedOrder(id: number) {
  const [row] = await ctx.dataSource.query(
    'SELECT status, signed_by, signed_at FROM treatment_order WHERE id = ?',
    [id],
  );
  return row as { status: string; signed_by: number | null; signed_at: Date | null };
}

async function refusalAudit(id: number) {
  const rows = await ctx.dataSource.query(
    "SELECT details FROM audit_event WHERE action = 'order.signature-refused' AND entity_id = ? ORDER BY id",
    [String(id)],
  );
  return rows.map(
    (r: { details: { problems?: { path: string }[] } }) =>
      r.details.problems?.map((p) => p.path) ?? [],
  );
}

async function expectNothingSigned(id: number) {
  const row = await storedOrder(id);
  expect(row).toMatchObject({ status: 'draft', signed_by: null, signed_at: null });
  const mail = await ctx.dataSource.query(
    "SELECT id FROM outbox_message WHERE kind = 'order-signed' AND related_id = ?",
    [String(id)],
  );
  expect(mail).toHaveLength(0);
}

describe('gate 1: absolute contraindications stop the order; cautions need a reason of substance', () => {
  it('refuses to sign an order with porphyria answered yes, whatever reason is given, naming the question', async () => {
    // Porphyria: absolute contraindication for verteporfin (from memory, in the protocol file).
    const patient = await createTestPatient(ctx);
    const body = withAnswer(pdtOrder(patient.id, { protocol: pdtV2 }), {
      id: 'porphyria',
      answer: 'yes',
      overrideReason: 'Haematology reviewed the case and advised that treatment may go ahead.',
    });
    const order = await draft(body);

    const res = await sign(order.id);

    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual([
      expect.objectContaining({
        path: 'checklist.porphyria.answer',
        message: expect.stringMatching(/absolute contraindication.*no reason unlocks it/),
      }),
    ]);
    await expectNothingSigned(order.id);
    expect(await refusalAudit(order.id)).toEqual([['checklist.porphyria.answer']]);
  });

  it('refuses a caution whose reason is a placeholder or the question said back, then signs with a real reason and shows it to the pharmacist', async () => {
    const patient = await createTestPatient(ctx);
    const base = pdtOrder(patient.id, { protocol: pdtV2 });
    const order = await draft(
      withAnswer(base, { id: 'hepatic-impairment', answer: 'yes', overrideReason: 'n/a n/a n/a' }),
    );

    const placeholder = await sign(order.id);
    expect(placeholder.status).toBe(400);
    expect(placeholder.body.error.fields.map((f: { path: string }) => f.path)).toEqual([
      'checklist.hepatic-impairment.overrideReason',
    ]);

    await clinicianAgent.put(`/api/orders/${order.id}`).send({
      ...withAnswer(base, {
        id: 'hepatic-impairment',
        answer: 'yes',
        overrideReason: 'moderate or severe hepatic impairment',
      }),
      version: await versionOf(order.id),
    });
    const repeated = await sign(order.id);
    expect(repeated.status).toBe(400);
    expect(repeated.body.error.fields[0].message).toMatch(/repeats the question/);
    await expectNothingSigned(order.id);
    expect(await refusalAudit(order.id)).toHaveLength(2);

    const reason = 'Mild, stable on review; hepatology agrees with treatment.';
    await clinicianAgent.put(`/api/orders/${order.id}`).send({
      ...withAnswer(base, { id: 'hepatic-impairment', answer: 'yes', overrideReason: reason }),
      version: await versionOf(order.id),
    });
    const signed = await sign(order.id);
    expect(signed.status).toBe(200);
    expect(signed.body.order.answeredCautions).toEqual([
      {
        id: 'hepatic-impairment',
        question: 'Does the patient have moderate or severe hepatic impairment?',
        reason,
      },
    ]);

    // The pharmacist doing the blind check sees the caution and its reason, not the figures.
    const blind = await pharmacistAgent.get(`/api/orders/${order.id}`);
    expect(blind.body.order.plan).toBeNull();
    expect(blind.body.order.answeredCautions).toEqual([
      expect.objectContaining({ id: 'hepatic-impairment', reason }),
    ]);
  });
});

describe('gate 2: do-not-treat CXL plans cannot be signed', () => {
  // Minimum stromal thickness 400 µm before UV (Spoerl E et al., Cornea 2007).
  it('refuses a stroma below the minimum on a protocol without a swelling step, naming the thickness', async () => {
    const patient = await createTestPatient(ctx);
    const order = await draft(
      cxlOrder(patient.id, {
        protocol: { key: 'cxl-accelerated', version: 2 },
        inputs: { stromalThicknessUm: 380 },
        checklist: [
          { id: 'thin-stroma', answer: 'no' },
          { id: 'active-infection', answer: 'no' },
          { id: 'herpetic-keratitis', answer: 'no' },
        ],
      }),
    );

    const res = await sign(order.id);

    expect(res.status).toBe(400);
    const paths = res.body.error.fields.map((f: { path: string }) => f.path);
    expect(paths).toContain('inputs.stromalThicknessUm');
    expect(
      res.body.error.fields.find((f: { path: string }) => f.path === 'inputs.stromalThicknessUm')
        .message,
    ).toMatch(/380 µm.*400 µm.*no swelling step/);
    await expectNothingSigned(order.id);
  });

  it('with a swelling step, needs the clinician’s explicit acknowledgement before it signs', async () => {
    const patient = await createTestPatient(ctx);
    const thinYes = {
      id: 'thin-stroma',
      answer: 'yes' as const,
      overrideReason:
        'Keratoconus progressing; swelling with hypo-osmolar riboflavin planned before UV.',
    };
    const base = withAnswer(
      cxlOrder(patient.id, {
        protocol: { key: 'cxl-standard', version: 2 },
        inputs: { stromalThicknessUm: 380 },
      }),
      thinYes,
    );
    const order = await draft(base);

    const refused = await sign(order.id);
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields.map((f: { path: string }) => f.path)).toEqual([
      'swellingAcknowledged',
    ]);
    await expectNothingSigned(order.id);

    const notBoolean = await clinicianAgent
      .put(`/api/orders/${order.id}`)
      .send({ ...base, swellingAcknowledged: 'yes', version: await versionOf(order.id) });
    expect(notBoolean.status).toBe(400);
    expect(notBoolean.body.error.fields.map((f: { path: string }) => f.path)).toContain(
      'swellingAcknowledged',
    );

    await clinicianAgent
      .put(`/api/orders/${order.id}`)
      .send({ ...base, swellingAcknowledged: true, version: await versionOf(order.id) });
    const signed = await sign(order.id);
    expect(signed.status).toBe(200);
    expect(signed.body.order).toMatchObject({ status: 'ready', swellingAcknowledged: true });
  });

  it('refuses a thin-stroma answer that contradicts the thickness entered in the same order', async () => {
    // "Thin stroma: no" with 300 µm entered.
    const patient = await createTestPatient(ctx);
    const order = await draft({
      ...cxlOrder(patient.id, {
        protocol: { key: 'cxl-standard', version: 2 },
        inputs: { stromalThicknessUm: 300 },
      }),
      swellingAcknowledged: true,
    });

    const res = await sign(order.id);

    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual([
      expect.objectContaining({
        path: 'checklist.thin-stroma.answer',
        message: expect.stringMatching(
          /answered no, but the stromal thickness entered \(300 µm\) is below the minimum of 400 µm/,
        ),
      }),
    ]);
    await expectNothingSigned(order.id);
  });

  it('still signs a CXL order with a normal stroma and every answer no', async () => {
    const patient = await createTestPatient(ctx);
    const order = await draft(
      cxlOrder(patient.id, { protocol: { key: 'cxl-standard', version: 2 } }),
    );
    expect((await sign(order.id)).status).toBe(200);
  });
});

describe('gate 3: the drawn volume delivers the dose', () => {
  it('refuses to store a plan whose volume rounding would move the dose by more than 1%, naming the protocol', async () => {
    // Half dose 3 mg/m² (van Dijk EHC et al., Ophthalmology 2018) × 1.82 m² = 5.46 mg → 2.73 mL;
    // v1 rounds to 0.1 mL: 2.7 mL holds 5.4 mg, 1.1% short (hand arithmetic).
    const patient = await createTestPatient(ctx);
    const res = await clinicianAgent
      .post('/api/orders')
      .send(pdtOrder(patient.id, { protocol: { key: 'pdt-half-dose', version: 1 } }));

    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual([
      expect.objectContaining({
        path: 'protocol',
        message: expect.stringMatching(/moves the dose in the syringe by -1\.1%/),
      }),
    ]);
    const stored = await ctx.dataSource.query(
      'SELECT id FROM treatment_order WHERE patient_id = ?',
      [patient.id],
    );
    expect(stored).toHaveLength(0);
    const audit = await ctx.dataSource.query(
      "SELECT details FROM audit_event WHERE action = 'order.plan-refused' AND actor_user_id = ? ORDER BY id DESC LIMIT 1",
      [clinician.id],
    );
    expect(audit[0].details).toMatchObject({ protocol: 'pdt-half-dose v1', rule: 'drawn-volume' });
  });

  it('draws to the 0.01 mL graduation, shows the dose in the drawn volume and the drug left over, and accepts the pharmacist’s exact figures', async () => {
    // 170 cm / 70 kg: Mosteller 1.8181 → 1.82 m² (Mosteller 1987); 6 mg/m² (TAP Study Group 1999) →
    // 10.92 mg; 2 mg/mL (Drug Discov Today 2008) → 5.46 mL, on the 0.01 mL graduation (common practice);
    // one 15 mg / 7.5 mL vial (from memory) with 7 mL withdrawable (demo) → 2.04 mL, 4.08 mg left over.
    const patient = await createTestPatient(ctx);
    const order = await draft(pdtOrder(patient.id, { protocol: pdtV2 }));
    expect((await sign(order.id)).status).toBe(200);

    // The pharmacist carries every digit: 1.8181 m², 10.9087 mg, 5.4544 mL.
    const checked = await pharmacistAgent
      .post(`/api/orders/${order.id}/dose-checks`)
      .send({ bsaM2: 1.8181, doseMg: 10.9087, drugVolumeMl: 5.4544 });
    expect(checked.status, JSON.stringify(checked.body)).toBe(201);
    expect(checked.body.order.plan).toMatchObject({
      drugVolumeMl: 5.46,
      drawnDoseMg: 10.92,
      drawnDoseDifferencePct: 0,
      vials: 1,
      drugLeftOverMl: 2.04,
      drugLeftOverMg: 4.08,
    });

    const prepared = await pharmacistAgent.post(`/api/orders/${order.id}/preparation`).send({
      vialLot: 'DEMO-LOT 7',
      vialExpiry: DateTime.now().plus({ months: 3 }).toISODate(),
      volumeDrawnMl: 5.46,
    });
    expect(prepared.status).toBe(201);
  });

  it('plans a second vial when the volume to draw exceeds what one vial gives up', async () => {
    // 195 cm / 102 kg: Mosteller √(195 × 102 ÷ 3600) = 2.3505 → 2.35 m²; × 6 mg/m² = 14.1 mg (under
    // the 15 mg in one vial) → 7.05 mL, more than the 7 mL withdrawable: 2 vials, 7.95 mL left over.
    const patient = await createTestPatient(ctx);
    const res = await clinicianAgent.post('/api/orders').send(
      pdtOrder(patient.id, {
        protocol: pdtV2,
        inputs: {
          height: { value: 195, unit: 'cm' },
          weight: { value: 102, unit: 'kg' },
          bsaFormula: 'mosteller',
          lesionGldUm: 2500,
          lensMagnification: 1,
        },
      }),
    );

    expect(res.status).toBe(201);
    expect(res.body.order.plan).toMatchObject({
      doseMg: 14.1,
      drugVolumeMl: 7.05,
      vials: 2,
      drugLeftOverMl: 7.95,
      drugLeftOverMg: 15.9,
    });
  });

  it('still refuses a pharmacist’s figure outside the tolerance of every reference, storing no match', async () => {
    const patient = await createTestPatient(ctx);
    const order = await draft(pdtOrder(patient.id, { protocol: pdtV2 }));
    await sign(order.id);
    // 2% dose-check tolerance (site default, common practice): 11.3 mg is 3.5% above 10.92 mg.
    const res = await pharmacistAgent
      .post(`/api/orders/${order.id}/dose-checks`)
      .send({ bsaM2: 1.82, doseMg: 11.3, drugVolumeMl: 5.46 });
    expect(res.status).toBe(422);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toEqual(['doseMg']);
    expect((await storedOrder(order.id)).status).toBe('signed');
  });
});

describe('the demo scenario under the gates', () => {
  it(
    'seeds orders that all pass the signature gates, and its draft PDT order signs through the API',
    { timeout: 120_000 },
    async () => {
      await seedDemoData(ctx.dataSource);
      await seedDemoScenario(ctx.dataSource, 'Europe/Lisbon');
      const rows: {
        id: number;
        status: string;
        note: string;
        plan: DosePlan;
        checklist: ChecklistAnswer[];
        definition: ProtocolDefinition;
        swelling_acknowledged: number;
      }[] = await ctx.dataSource.query(
        "SELECT o.id, o.status, o.note, o.plan, o.checklist, o.swelling_acknowledged, v.definition FROM treatment_order o JOIN protocol_version v ON v.id = o.protocol_version_id WHERE o.note LIKE 'Demo %'",
      );
      expect(rows.length).toBeGreaterThan(10);
      for (const row of rows) {
        const problems = signatureProblems({
          definition: row.definition,
          plan: row.plan,
          checklist: row.checklist,
          softLimitReasons: {},
          retreatmentReason: null,
          recentTreatmentDays: null,
          swellingAcknowledged: row.swelling_acknowledged === 1,
          weightChange: null,
          weightChangeReason: null,
          openOrders: [],
          duplicateOrderReason: null,
        });
        expect({ note: row.note, problems }).toEqual({ note: row.note, problems: [] });
      }

      const draftRow = rows.find((r) => r.note === 'Demo today: PDT draft');
      if (draftRow?.status === 'draft') {
        const demoClinician = supertest.agent(ctx.app);
        expect(
          (
            await demoClinician
              .post('/api/auth/login')
              .send({ email: 'clinician@demo.luxtempo.example', password: 'luxtempo-demo' })
          ).status,
        ).toBe(200);
        const signed = await demoClinician.post(`/api/orders/${draftRow.id}/signature`).send({
          password: 'luxtempo-demo',
          meaning: 'ordered',
          version: (await demoClinician.get(`/api/orders/${draftRow.id}`)).body.order.version,
        });
        expect(signed.status, JSON.stringify(signed.body)).toBe(200);
      }
    },
  );
});
