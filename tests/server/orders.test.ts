import { DateTime } from 'luxon';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
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
let nurse: TestPerson;
type Agent = ReturnType<typeof supertest.agent>;
let clinicianAgent: Agent;
let pharmacistAgent: Agent;
let nurseAgent: Agent;

beforeAll(async () => {
  ctx = await startTestApp({ UPLOAD_DIR: `/tmp/luxtempo-test-uploads-${process.pid}` });
  clinician = await createTestPerson(ctx, ['clinician']);
  pharmacist = await createTestPerson(ctx, ['pharmacist']);
  nurse = await createTestPerson(ctx, ['nurse']);
  [clinicianAgent, pharmacistAgent, nurseAgent] = await Promise.all([
    signedInAgent(ctx, clinician),
    signedInAgent(ctx, pharmacist),
    signedInAgent(ctx, nurse),
  ]);
});
afterAll(async () => {
  await ctx.close();
});

async function signedPdtOrder(body?: object) {
  const patient = await createTestPatient(ctx);
  const draft = await clinicianAgent.post('/api/orders').send(body ?? pdtOrder(patient.id));
  expect(draft.status).toBe(201);
  const signed = await clinicianAgent
    .post(`/api/orders/${draft.body.order.id}/signature`)
    .send({ password: clinician.password, meaning: 'ordered', version: draft.body.order.version });
  expect(signed.status).toBe(200);
  return signed.body.order;
}

// Standard regimen figures for 170 cm / 70 kg: Mosteller BSA 1.8181 → 1.82 m² (Mosteller RD, N Engl J Med 1987);
// 6 mg/m² (TAP Study Group, Arch Ophthalmol 1999) → 10.92 mg; 2 mg/mL (review table, Drug Discov Today 2008) → 5.46 → 5.5 mL.
const matching = { bsaM2: 1.82, doseMg: 10.92, drugVolumeMl: 5.46 };

describe('the PDT path: order, blind dose check, preparation', () => {
  it('runs from draft to prepared, with the plan hidden from the pharmacist until their figures match', async () => {
    const patient = await createTestPatient(ctx);
    const draft = await clinicianAgent.post('/api/orders').send(pdtOrder(patient.id));
    expect(draft.status).toBe(201);
    expect(draft.body.order).toMatchObject({
      status: 'draft',
      revision: 1,
      eye: 'right',
      kind: 'pdt',
    });
    expect(draft.body.order.plan.doseMg).toBeCloseTo(10.92, 2);

    const signed = await clinicianAgent.post(`/api/orders/${draft.body.order.id}/signature`).send({
      password: clinician.password,
      meaning: 'ordered',
      version: draft.body.order.version,
    });
    expect(signed.status).toBe(200);
    expect(signed.body.order).toMatchObject({ status: 'signed', signedBy: { id: clinician.id } });
    const id = signed.body.order.id;

    const blind = await pharmacistAgent.get(`/api/orders/${id}`);
    expect(blind.body.order.planWithheld).toBe(true);
    expect(blind.body.order.plan).toBeNull();
    expect(blind.body.order.inputs).toMatchObject({
      height: { value: 170, unit: 'cm' },
      weight: { value: 70, unit: 'kg' },
    });
    expect(JSON.stringify(blind.body)).not.toContain('10.92');

    const checked = await pharmacistAgent.post(`/api/orders/${id}/dose-checks`).send(matching);
    expect(checked.status).toBe(201);
    expect(checked.body.order.status).toBe('checked');
    expect(checked.body.order.plan.drugVolumeMl).toBe(5.5);
    expect(checked.body.order.doseChecks).toHaveLength(1);

    const reconstitutedAt = new Date(Date.now() - 10 * 60_000).toISOString();
    const expiry = DateTime.now().plus({ months: 6 }).toISODate();
    const prepared = await pharmacistAgent
      .post(`/api/orders/${id}/preparation`)
      .send({ vialLot: 'DEMO-LOT 42', vialExpiry: expiry, reconstitutedAt, volumeDrawnMl: 5.5 });
    expect(prepared.status).toBe(201);
    expect(prepared.body.order.status).toBe('prepared');
    // Beyond-use 4 h after reconstitution: review table, Drug Discov Today 2008 (label-derived).
    expect(Date.parse(prepared.body.order.beyondUseAt) - Date.parse(reconstitutedAt)).toBe(
      4 * 3600_000,
    );

    const today = await nurseAgent.get('/api/today');
    const ready = today.body.lists.find((l: { id: string }) => l.id === 'nurse-ready');
    expect(ready.orders.map((o: { id: number }) => o.id)).toContain(id);
  });

  it('tells the pharmacists by e-mail through the outbox, with no patient name in the subject', async () => {
    const order = await signedPdtOrder();
    const rows = await ctx.dataSource.query(
      "SELECT * FROM outbox_message WHERE kind = 'order-signed' AND related_id = ?",
      [String(order.id)],
    );
    expect(rows).toHaveLength(1);
    expect(rows[0].recipients).toContain(pharmacist.email);
    expect(rows[0].subject).not.toContain(order.patient.familyName);
    expect(rows[0].status).toBe('pending');
  });

  it('accepts figures just inside the 2% tolerance and refuses figures just outside it, naming which differ', async () => {
    const order = await signedPdtOrder();
    // Demo tolerance ±2% (site policy in the protocol file; common practice, no single source).
    const outside = await pharmacistAgent
      .post(`/api/orders/${order.id}/dose-checks`)
      .send({ ...matching, doseMg: +(10.92 * 1.021).toFixed(3) });
    expect(outside.status).toBe(422);
    expect(outside.body.error.code).toBe('dose_check_mismatch');
    expect(outside.body.error.fields.map((f: { path: string }) => f.path)).toEqual(['doseMg']);
    expect(JSON.stringify(outside.body)).not.toContain('10.92');
    const inside = await pharmacistAgent
      .post(`/api/orders/${order.id}/dose-checks`)
      .send({ ...matching, doseMg: +(10.92 * 1.019).toFixed(3) });
    expect(inside.status).toBe(201);
    expect(inside.body.order.status).toBe('checked');
  });

  it('sends the order back to the clinician after two refusals, with the comment, and e-mails them', async () => {
    const order = await signedPdtOrder();
    const wrong = { ...matching, bsaM2: 1.95 };
    expect(
      (await pharmacistAgent.post(`/api/orders/${order.id}/dose-checks`).send(wrong)).status,
    ).toBe(422);
    const second = await pharmacistAgent
      .post(`/api/orders/${order.id}/dose-checks`)
      .send({ ...wrong, comment: 'Weight on the form looks like pounds.' });
    expect(second.status).toBe(422);
    expect(second.body.error.code).toBe('dose_check_returned');
    const after = await clinicianAgent.get(`/api/orders/${order.id}`);
    expect(after.body.order).toMatchObject({
      status: 'returned',
      returnComment: 'Weight on the form looks like pounds.',
    });
    const mail = await ctx.dataSource.query(
      "SELECT recipients, body FROM outbox_message WHERE kind = 'order-returned' AND related_id = ?",
      [String(order.id)],
    );
    expect(mail[0].recipients).toEqual([clinician.email]);
    expect(mail[0].body).toContain('Weight on the form looks like pounds.');
    const today = await clinicianAgent.get('/api/today');
    expect(
      today.body.lists
        .find((l: { id: string }) => l.id === 'clinician-returned')
        .orders.map((o: { id: number }) => o.id),
    ).toContain(order.id);
  });

  it('never lets the person who signed an order check it, even holding the pharmacist role too', async () => {
    const both = await createTestPerson(ctx, ['clinician', 'pharmacist']);
    const agent = await signedInAgent(ctx, both);
    const patient = await createTestPatient(ctx);
    const draft = await agent.post('/api/orders').send(pdtOrder(patient.id));
    await agent
      .post(`/api/orders/${draft.body.order.id}/signature`)
      .send({ password: both.password, meaning: 'ordered', version: draft.body.order.version });
    const own = await agent.get(`/api/orders/${draft.body.order.id}`);
    expect(own.body.order.planWithheld).toBe(false);
    const res = await agent.post(`/api/orders/${draft.body.order.id}/dose-checks`).send(matching);
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/signed this order/);
  });

  it('never lets the person who drafted an order check it, though a colleague signed it', async () => {
    const both = await createTestPerson(ctx, ['clinician', 'pharmacist']);
    const drafter = await signedInAgent(ctx, both);
    const patient = await createTestPatient(ctx);
    const draft = await drafter.post('/api/orders').send(pdtOrder(patient.id));
    expect(
      (
        await clinicianAgent.post(`/api/orders/${draft.body.order.id}/signature`).send({
          password: clinician.password,
          meaning: 'ordered',
          version: draft.body.order.version,
        })
      ).status,
    ).toBe(200);
    const res = await drafter.post(`/api/orders/${draft.body.order.id}/dose-checks`).send(matching);
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/drafted this order/);
    const stored = await ctx.dataSource.query(
      'SELECT COUNT(*) AS n FROM dose_check WHERE order_id = ?',
      [draft.body.order.id],
    );
    expect(Number(stored[0].n)).toBe(0);
    expect((await clinicianAgent.get(`/api/orders/${draft.body.order.id}`)).body.order.status).toBe(
      'signed',
    );
  });

  it('gives a pharmacist with a blind check open no route to the figures: the dose calculation is for order writers only', async () => {
    const order = await signedPdtOrder();
    const read = await pharmacistAgent.get(`/api/orders/${order.id}`);
    expect(read.body.order.planWithheld).toBe(true);
    expect(read.body.order.plan).toBeNull();
    // The inputs are on the screen; sending them to the dose calculation must not give the plan back.
    const computed = await pharmacistAgent.post('/api/calculations').send({
      protocol: { key: order.protocol.key, version: order.protocol.version },
      inputs: read.body.order.inputs,
    });
    expect(computed.status).toBe(403);
    expect(JSON.stringify(computed.body)).not.toMatch(/doseMg|10\.92/);
    const session = await pharmacistAgent.get(`/api/orders/${order.id}/session`);
    expect(JSON.stringify(session.body)).not.toMatch(/10\.92|5\.46/);
    // The light calculator answers everyone: it knows no order.
    const light = await pharmacistAgent
      .post('/api/light-calculations')
      .send({ powerMw: 42.4, spotDiameterUm: 3000, exposureS: 83 });
    expect(light.status).toBe(200);
  });

  it('refuses an expired vial and a reconstitution time in the future, naming the field', async () => {
    const order = await signedPdtOrder();
    await pharmacistAgent.post(`/api/orders/${order.id}/dose-checks`).send(matching);
    const yesterday = DateTime.now().setZone('Europe/Lisbon').minus({ days: 1 }).toISODate();
    const expired = await pharmacistAgent
      .post(`/api/orders/${order.id}/preparation`)
      .send({ vialLot: 'L1', vialExpiry: yesterday, volumeDrawnMl: 5.5 });
    expect(expired.status).toBe(400);
    expect(expired.body.error.fields[0].path).toBe('vialExpiry');
    const expiry = DateTime.now().plus({ months: 3 }).toISODate();
    const future = await pharmacistAgent.post(`/api/orders/${order.id}/preparation`).send({
      vialLot: 'L1',
      vialExpiry: expiry,
      volumeDrawnMl: 5.5,
      reconstitutedAt: new Date(Date.now() + 10 * 60_000).toISOString(),
    });
    expect(future.status).toBe(400);
    expect(future.body.error.fields[0].path).toBe('reconstitutedAt');
    const volume = await pharmacistAgent
      .post(`/api/orders/${order.id}/preparation`)
      .send({ vialLot: 'L1', vialExpiry: expiry, volumeDrawnMl: 6.5 });
    expect(volume.status).toBe(400);
    expect(volume.body.error.fields[0].message).toMatch(/between 5\.39 and 5\.61 mL/);
  });

  it('only a pharmacist checks and prepares; a nurse or a clinician gets 403', async () => {
    const order = await signedPdtOrder();
    expect(
      (await nurseAgent.post(`/api/orders/${order.id}/dose-checks`).send(matching)).status,
    ).toBe(403);
    expect(
      (await clinicianAgent.post(`/api/orders/${order.id}/dose-checks`).send(matching)).status,
    ).toBe(403);
    expect((await nurseAgent.post('/api/orders').send(pdtOrder(1))).status).toBe(403);
  });
});

describe('the CXL path', () => {
  it('goes from draft straight to ready: no drug, so no dose check or preparation', async () => {
    const patient = await createTestPatient(ctx);
    const draft = await clinicianAgent.post('/api/orders').send(cxlOrder(patient.id));
    expect(draft.status).toBe(201);
    // Wollensak G, Spoerl E, Seiler T. Am J Ophthalmol 2003 — 3 mW/cm² for 30 min.
    expect(draft.body.order.plan.uvTimeS).toBe(1800);
    const signed = await clinicianAgent.post(`/api/orders/${draft.body.order.id}/signature`).send({
      password: clinician.password,
      meaning: 'ordered',
      version: draft.body.order.version,
    });
    expect(signed.body.order.status).toBe('ready');
    const check = await pharmacistAgent
      .post(`/api/orders/${draft.body.order.id}/dose-checks`)
      .send(matching);
    expect(check.status).toBe(409);
    const mail = await ctx.dataSource.query(
      "SELECT id FROM outbox_message WHERE related_type = 'order' AND related_id = ?",
      [String(draft.body.order.id)],
    );
    expect(mail).toHaveLength(0);
  });
});

describe('what stops an order', () => {
  it('a measurement beyond the hard limit is refused at once, naming the field and range', async () => {
    const patient = await createTestPatient(ctx);
    const res = await clinicianAgent.post('/api/orders').send(
      pdtOrder(patient.id, {
        inputs: {
          height: { value: 170, unit: 'cm' },
          weight: { value: 70, unit: 'kg' },
          lesionGldUm: 6000,
          lensMagnification: 1,
        },
      }),
    );
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(
      'inputs.lesionGldUm',
    );
  });

  it('an unanswered checklist question blocks the signature, naming the question', async () => {
    const patient = await createTestPatient(ctx);
    const body = pdtOrder(patient.id);
    body.checklist = (body.checklist as { id: string; answer: string }[]).filter(
      (a) => a.id !== 'porphyria',
    );
    const draft = await clinicianAgent.post('/api/orders').send(body);
    const res = await clinicianAgent.post(`/api/orders/${draft.body.order.id}/signature`).send({
      password: clinician.password,
      meaning: 'ordered',
      version: draft.body.order.version,
    });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toEqual([
      'checklist.porphyria',
    ]);
  });

  it('a yes on the checklist blocks until overridden with a reason, and the override is recorded for the auditor', async () => {
    const patient = await createTestPatient(ctx);
    const body = pdtOrder(patient.id);
    const answers = body.checklist as { id: string; answer: string; overrideReason?: string }[];
    answers.find((a) => a.id === 'hepatic-impairment')!.answer = 'yes';
    const draft = await clinicianAgent.post('/api/orders').send(body);
    const blocked = await clinicianAgent.post(`/api/orders/${draft.body.order.id}/signature`).send({
      password: clinician.password,
      meaning: 'ordered',
      version: draft.body.order.version,
    });
    expect(blocked.status).toBe(400);
    expect(blocked.body.error.fields[0].path).toBe('checklist.hepatic-impairment.overrideReason');
    answers.find((a) => a.id === 'hepatic-impairment')!.overrideReason =
      'Mild, stable; hepatology agrees with treatment.';
    const edited = await clinicianAgent
      .put(`/api/orders/${draft.body.order.id}`)
      .send({ ...body, version: draft.body.order.version });
    expect(edited.status).toBe(200);
    const signed = await clinicianAgent.post(`/api/orders/${draft.body.order.id}/signature`).send({
      password: clinician.password,
      meaning: 'ordered',
      version: edited.body.order.version,
    });
    expect(signed.status).toBe(200);
    const audit = await ctx.dataSource.query(
      "SELECT details FROM audit_event WHERE action = 'order.signed' AND entity_id = ?",
      [String(draft.body.order.id)],
    );
    expect(audit[0].details.contraindicationOverrides).toEqual([
      { id: 'hepatic-impairment', reason: 'Mild, stable; hepatology agrees with treatment.' },
    ]);
  });

  it('a soft-limit warning needs a reason before signing', async () => {
    const patient = await createTestPatient(ctx);
    const body = pdtOrder(patient.id, {
      inputs: {
        height: { value: 170, unit: 'cm' },
        weight: { value: 160, unit: 'kg' },
        lesionGldUm: 2500,
        lensMagnification: 1,
      },
    });
    const draft = await clinicianAgent.post('/api/orders').send(body);
    expect(draft.body.order.warnings.map((w: { code: string }) => w.code)).toContain('soft-limit');
    const blocked = await clinicianAgent.post(`/api/orders/${draft.body.order.id}/signature`).send({
      password: clinician.password,
      meaning: 'ordered',
      version: draft.body.order.version,
    });
    expect(blocked.status).toBe(400);
    expect(blocked.body.error.fields[0].path).toBe('softLimitReasons.inputs.weight.value');
    // 160 kg at 170 cm is also a BMI of 55.4 kg/m², above the default usual range of 45 (common practice).
    expect(blocked.body.error.fields.map((f: { path: string }) => f.path)).toEqual([
      'softLimitReasons.inputs.weight.value',
      'softLimitReasons.bmiKgPerM2',
    ]);
    const edited = await clinicianAgent.put(`/api/orders/${draft.body.order.id}`).send({
      ...body,
      softLimitReasons: {
        'inputs.weight.value': 'Weighed today on the ward scale: 160 kg.',
        bmiKgPerM2: 'Height and weight both measured today.',
      },
      version: draft.body.order.version,
    });
    expect(edited.status).toBe(200);
    expect(
      (
        await clinicianAgent.post(`/api/orders/${draft.body.order.id}/signature`).send({
          password: clinician.password,
          meaning: 'ordered',
          version: edited.body.order.version,
        })
      ).status,
    ).toBe(200);
  });

  it('treating the same eye again inside the minimum interval warns and needs a reason', async () => {
    const patient = await createTestPatient(ctx);
    await signedPdtOrder(pdtOrder(patient.id));
    // The first is still open (signed), so the second also says why it is a second order.
    const again = await clinicianAgent.post('/api/orders').send(
      pdtOrder(patient.id, {
        duplicateOrderReason: 'Lesion grew since the first order was signed; replanning now.',
      }),
    );
    expect(again.body.order.warnings.map((w: { code: string }) => w.code)).toContain(
      'retreatment-interval',
    );
    const blocked = await clinicianAgent.post(`/api/orders/${again.body.order.id}/signature`).send({
      password: clinician.password,
      meaning: 'ordered',
      version: again.body.order.version,
    });
    expect(blocked.body.error.fields.map((f: { path: string }) => f.path)).toEqual([
      'retreatmentReason',
    ]);
    const otherEye = await clinicianAgent
      .post('/api/orders')
      .send(pdtOrder(patient.id, { eye: 'left' }));
    expect(otherEye.body.order.warnings.map((w: { code: string }) => w.code)).not.toContain(
      'retreatment-interval',
    );
  });

  it('a wrong password does not sign', async () => {
    const patient = await createTestPatient(ctx);
    const draft = await clinicianAgent.post('/api/orders').send(pdtOrder(patient.id));
    const res = await clinicianAgent
      .post(`/api/orders/${draft.body.order.id}/signature`)
      .send({ password: 'not-my-password', meaning: 'ordered', version: draft.body.order.version });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('password');
    expect((await clinicianAgent.get(`/api/orders/${draft.body.order.id}`)).body.order.status).toBe(
      'draft',
    );
  });
});

describe('signed orders and amendments', () => {
  it('a signed order cannot be edited; an amendment makes a new revision and the old one stays readable', async () => {
    const order = await signedPdtOrder();
    const body = pdtOrder(order.patient.id, { inputs: { ...order.inputs, lesionGldUm: 3000 } });
    const edit = await clinicianAgent
      .put(`/api/orders/${order.id}`)
      .send({ ...body, version: order.version });
    expect(edit.status).toBe(409);
    expect(edit.body.error.code).toBe('order_signed');

    const noReason = await clinicianAgent
      .post(`/api/orders/${order.id}/amendments`)
      .send({ ...body, version: order.version });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields[0].path).toBe('amendmentReason');

    const amended = await clinicianAgent.post(`/api/orders/${order.id}/amendments`).send({
      ...body,
      amendmentReason: 'New angiogram: lesion measured 3000 µm.',
      version: order.version,
    });
    expect(amended.status).toBe(201);
    expect(amended.body.order).toMatchObject({
      revision: 2,
      status: 'draft',
      previousRevisionId: order.id,
    });
    expect(amended.body.order.plan.spotDiameterUm).toBe(4000);

    await clinicianAgent.post(`/api/orders/${amended.body.order.id}/signature`).send({
      password: clinician.password,
      meaning: 'ordered',
      version: amended.body.order.version,
    });
    const old = await clinicianAgent.get(`/api/orders/${order.id}`);
    expect(old.body.order).toMatchObject({
      status: 'superseded',
      nextRevisionId: amended.body.order.id,
    });
    expect(old.body.order.plan.spotDiameterUm).toBe(3500);
  });
});

describe('attachments', () => {
  const pdf = Buffer.concat([
    Buffer.from('%PDF-1.7\n'),
    Buffer.alloc(2000, 0x20),
    Buffer.from('\n%%EOF\n'),
  ]);

  it('a PDF report is stored with its SHA-256 and can be downloaded by signed-in staff only', async () => {
    const patient = await createTestPatient(ctx);
    const draft = await clinicianAgent.post('/api/orders').send(pdtOrder(patient.id));
    const res = await clinicianAgent
      .post(`/api/orders/${draft.body.order.id}/attachments`)
      .attach('file', pdf, { filename: 'angiogram.pdf', contentType: 'application/pdf' });
    expect(res.status).toBe(201);
    expect(res.body.attachment).toMatchObject({
      fileName: 'angiogram.pdf',
      mimeType: 'application/pdf',
      sizeBytes: pdf.length,
    });
    expect(res.body.attachment.sha256).toMatch(/^[0-9a-f]{64}$/);
    const download = await nurseAgent
      .get(`/api/attachments/${res.body.attachment.id}`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(download.status).toBe(200);
    expect(Buffer.compare(download.body as Buffer, pdf)).toBe(0);
    expect(
      (await supertest(ctx.app).get(`/api/attachments/${res.body.attachment.id}`)).status,
    ).toBe(401);
  });

  it('a renamed executable is refused with 415, and a file over 10 MB with 413', async () => {
    const patient = await createTestPatient(ctx);
    const draft = await clinicianAgent.post('/api/orders').send(pdtOrder(patient.id));
    const elf = Buffer.concat([
      Buffer.from([0x7f, 0x45, 0x4c, 0x46, 0x02, 0x01, 0x01]),
      Buffer.alloc(4000),
    ]);
    const renamed = await clinicianAgent
      .post(`/api/orders/${draft.body.order.id}/attachments`)
      .attach('file', elf, { filename: 'report.pdf', contentType: 'application/pdf' });
    expect(renamed.status).toBe(415);
    const big = Buffer.concat([Buffer.from('%PDF-1.7\n'), Buffer.alloc(11 * 1024 * 1024)]);
    const tooBig = await clinicianAgent
      .post(`/api/orders/${draft.body.order.id}/attachments`)
      .attach('file', big, { filename: 'big.pdf', contentType: 'application/pdf' });
    expect(tooBig.status).toBe(413);
  });

  it('reports are attached before signing, not after', async () => {
    const order = await signedPdtOrder();
    const res = await clinicianAgent
      .post(`/api/orders/${order.id}/attachments`)
      .attach('file', pdf, { filename: 'late.pdf', contentType: 'application/pdf' });
    expect(res.status).toBe(409);
  });
});

describe('the orders list', () => {
  it('pages, filters by status and protocol, and sorts on the server', async () => {
    const patient = await createTestPatient(ctx);
    const duplicateOrderReason = 'Three drafts on purpose: this test pages through them.';
    for (let i = 0; i < 3; i++)
      await clinicianAgent.post('/api/orders').send(cxlOrder(patient.id, { duplicateOrderReason }));
    const filtered = await nurseAgent.get('/api/orders').query({
      patientId: patient.id,
      protocol: 'cxl-standard',
      status: 'draft',
      pageSize: 2,
      page: 1,
      sort: 'createdAt',
      direction: 'asc',
    });
    expect(filtered.status).toBe(200);
    expect(filtered.body.total).toBe(3);
    expect(filtered.body.orders).toHaveLength(2);
    expect(filtered.body.orders[0].id).toBeLessThan(filtered.body.orders[1].id);
    const page2 = await nurseAgent
      .get('/api/orders')
      .query({ patientId: patient.id, pageSize: 2, page: 2, direction: 'asc' });
    expect(page2.body.orders).toHaveLength(1);
    const none = await nurseAgent
      .get('/api/orders')
      .query({ patientId: patient.id, status: 'prepared' });
    expect(none.body.total).toBe(0);
    const bad = await nurseAgent.get('/api/orders').query({ pageSize: 1000 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields[0].path).toBe('pageSize');
  });
});
