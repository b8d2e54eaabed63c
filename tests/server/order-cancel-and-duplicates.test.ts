import { randomUUID } from 'node:crypto';
import type supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  createTestPatient,
  createTestPerson,
  cxlOrder,
  pdtOrder,
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
let otherClinicianAgent: Agent;
let pharmacistAgent: Agent;
let nurseAgent: Agent;
let adminAgent: Agent;

let bench: Awaited<ReturnType<typeof readyBench>>;
beforeAll(async () => {
  ctx = await startTestApp();
  clinician = await createTestPerson(ctx, ['clinician']);
  clinicianAgent = await signedInAgent(ctx, clinician);
  otherClinicianAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['clinician']));
  pharmacistAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['pharmacist']));
  nurseAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['nurse']));
  adminAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['admin']));
  bench = await readyBench(adminAgent);
});
afterAll(async () => {
  await ctx.close();
});

const goodCancelReason = 'Patient declined treatment today after discussing the risks.';

async function draft(body: object, agent: Agent = clinicianAgent) {
  const res = await agent.post('/api/orders').send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.order as { id: number; version: number; status: string };
}

async function sign(order: { id: number; version: number }, agent: Agent = clinicianAgent) {
  return agent
    .post(`/api/orders/${order.id}/signature`)
    .send({ password: clinician.password, meaning: 'ordered', version: order.version });
}

async function stored(id: number) {
  const [row] = await ctx.dataSource.query(
    'SELECT status, cancel_reason AS cancelReason, cancelled_by AS cancelledBy, duplicate_order_reason AS duplicateOrderReason FROM treatment_order WHERE id = ?',
    [id],
  );
  return row as {
    status: string;
    cancelReason: string | null;
    cancelledBy: number | null;
    duplicateOrderReason: string | null;
  };
}

async function auditActions(id: number, action: string) {
  const rows: unknown[] = await ctx.dataSource.query(
    "SELECT id FROM audit_event WHERE entity_type = 'order' AND entity_id = ? AND action = ?",
    [id, action],
  );
  return rows.length;
}

async function todayIds(agent: Agent): Promise<number[]> {
  const res = await agent.get('/api/today');
  expect(res.status).toBe(200);
  return (res.body.lists as { orders: { id: number }[] }[]).flatMap((l) =>
    l.orders.map((o) => o.id),
  );
}

describe('cancelling an order before its session', () => {
  it('the signer cancels a signed order with a reason: audited, and it leaves the dose-check worklist', async () => {
    const patient = await createTestPatient(ctx);
    const signed = (await sign(await draft(pdtOrder(patient.id)))).body.order;
    expect(await todayIds(pharmacistAgent)).toContain(signed.id);

    const res = await clinicianAgent
      .post(`/api/orders/${signed.id}/cancellation`)
      .send({ reason: goodCancelReason, version: signed.version });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.order).toMatchObject({
      status: 'cancelled',
      cancellation: { reason: goodCancelReason, by: { id: clinician.id } },
    });
    expect(await auditActions(signed.id, 'order.cancelled')).toBe(1);
    expect(await todayIds(pharmacistAgent)).not.toContain(signed.id);
    // Nor can the pharmacist check it any more.
    const check = await pharmacistAgent
      .post(`/api/orders/${signed.id}/dose-checks`)
      .send({ bsaM2: 1.82, doseMg: 10.92, drugVolumeMl: 5.46 });
    expect(check.status).toBeGreaterThanOrEqual(400);
    expect((await stored(signed.id)).status).toBe('cancelled');
  });

  it('a prepared order, once cancelled, leaves the nurse’s list and its session cannot start', async () => {
    const order = await preparedPdtOrder(ctx, {
      clinician: [clinicianAgent, clinician],
      pharmacist: pharmacistAgent,
    });
    expect(await todayIds(nurseAgent)).toContain(order.id);
    const res = await clinicianAgent
      .post(`/api/orders/${order.id}/cancellation`)
      .send({ reason: goodCancelReason, version: order.version });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(await todayIds(nurseAgent)).not.toContain(order.id);
    expect(await todayIds(pharmacistAgent)).not.toContain(order.id);
    const start = await nurseAgent.post(`/api/orders/${order.id}/session-events`).send({
      idempotencyKey: randomUUID(),
      clientTime: new Date().toISOString(),
      type: 'session-started',
      checks: {
        patientIdentity: true,
        treatmentEye: true,
        consent: true,
        eyewear: true,
        deviceSettings: true,
      },
      device: bench.deviceFor(order),
    });
    expect(start.status).toBe(409);
    expect((await stored(order.id)).status).toBe('cancelled');
  });

  it('refuses a missing, short or placeholder reason and stores nothing', async () => {
    const patient = await createTestPatient(ctx);
    const signed = (await sign(await draft(pdtOrder(patient.id)))).body.order;
    for (const body of [
      { version: signed.version },
      { reason: 'n/a', version: signed.version },
      { reason: 'ok ok ok ok ok ok ok', version: signed.version },
    ]) {
      const res = await clinicianAgent.post(`/api/orders/${signed.id}/cancellation`).send(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.fields.map((f: { path: string }) => f.path)).toEqual(['reason']);
    }
    expect(await stored(signed.id)).toMatchObject({ status: 'signed', cancelReason: null });
    expect(await auditActions(signed.id, 'order.cancelled')).toBe(0);
  });

  it('only the signer or an administrator may cancel; another clinician, a nurse and a pharmacist may not', async () => {
    const patient = await createTestPatient(ctx);
    const signed = (await sign(await draft(pdtOrder(patient.id)))).body.order;
    const body = { reason: goodCancelReason, version: signed.version };
    expect(
      (await otherClinicianAgent.post(`/api/orders/${signed.id}/cancellation`).send(body)).status,
    ).toBe(403);
    expect((await nurseAgent.post(`/api/orders/${signed.id}/cancellation`).send(body)).status).toBe(
      403,
    );
    expect(
      (await pharmacistAgent.post(`/api/orders/${signed.id}/cancellation`).send(body)).status,
    ).toBe(403);
    expect((await stored(signed.id)).status).toBe('signed');

    const byAdmin = await adminAgent.post(`/api/orders/${signed.id}/cancellation`).send(body);
    expect(byAdmin.status, JSON.stringify(byAdmin.body)).toBe(200);
    expect((await stored(signed.id)).status).toBe('cancelled');
  });

  it('an administrator lists open orders by identity only, cancels one, and still cannot read it', async () => {
    const patient = await createTestPatient(ctx);
    const signed = (await sign(await draft(pdtOrder(patient.id)))).body.order;
    const list = await adminAgent.get('/api/orders/cancellable');
    expect(list.status).toBe(200);
    const row = (list.body.orders as { id: number }[]).find((o) => o.id === signed.id);
    // Only what identifies the order: no inputs, plan, answers or reasons.
    expect(row).toEqual({
      id: signed.id,
      version: signed.version,
      eye: 'right',
      kind: 'pdt',
      patient: {
        recordNumber: patient.recordNumber,
        givenName: expect.any(String),
        familyName: expect.any(String),
      },
      createdAt: expect.any(String),
      signedAt: expect.any(String),
      createdBy: { id: clinician.id, displayName: expect.any(String) },
      signedBy: { id: clinician.id, displayName: expect.any(String) },
    });
    // The list is not a way in to the clinical page, before or after the cancellation.
    expect((await adminAgent.get(`/api/orders/${signed.id}`)).status).toBe(403);
    expect((await adminAgent.get(`/api/orders/${signed.id}/session`)).status).toBe(403);
    expect((await adminAgent.get('/api/orders')).status).toBe(403);

    // The same rule of substance as the signer's cancel; nothing stored when refused.
    const weak = await adminAgent
      .post(`/api/orders/${signed.id}/cancellation`)
      .send({ reason: 'admin', version: signed.version });
    expect(weak.status).toBe(400);
    expect(weak.body.error.fields.map((f: { path: string }) => f.path)).toEqual(['reason']);
    expect((await stored(signed.id)).status).toBe('signed');

    const res = await adminAgent
      .post(`/api/orders/${signed.id}/cancellation`)
      .send({ reason: goodCancelReason, version: signed.version });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.order).toEqual({
      id: signed.id,
      status: 'cancelled',
      version: expect.any(Number),
    });
    expect(await stored(signed.id)).toMatchObject({
      status: 'cancelled',
      cancelReason: goodCancelReason,
    });
    expect(await auditActions(signed.id, 'order.cancelled')).toBe(1);
    expect((await adminAgent.get(`/api/orders/${signed.id}`)).status).toBe(403);
    const after = (await adminAgent.get('/api/orders/cancellable')).body.orders as {
      id: number;
    }[];
    expect(after.map((o) => o.id)).not.toContain(signed.id);
  });

  it('the administrator’s list leaves out an order whose session has started', async () => {
    const order = await preparedPdtOrder(ctx, {
      clinician: [clinicianAgent, clinician],
      pharmacist: pharmacistAgent,
    });
    const listed = async () =>
      ((await adminAgent.get('/api/orders/cancellable')).body.orders as { id: number }[]).map(
        (o) => o.id,
      );
    expect(await listed()).toContain(order.id);
    const start = await nurseAgent.post(`/api/orders/${order.id}/session-events`).send({
      idempotencyKey: randomUUID(),
      clientTime: new Date().toISOString(),
      type: 'session-started',
      checks: {
        patientIdentity: true,
        treatmentEye: true,
        consent: true,
        eyewear: true,
        deviceSettings: true,
      },
      device: bench.deviceFor(order),
    });
    expect(start.status, JSON.stringify(start.body)).toBeLessThan(300);
    expect(await listed()).not.toContain(order.id);
  });

  it('a running session’s order cannot be cancelled, nor a cancelled one again', async () => {
    const order = await preparedPdtOrder(ctx, {
      clinician: [clinicianAgent, clinician],
      pharmacist: pharmacistAgent,
    });
    const start = await nurseAgent.post(`/api/orders/${order.id}/session-events`).send({
      idempotencyKey: randomUUID(),
      clientTime: new Date().toISOString(),
      type: 'session-started',
      checks: {
        patientIdentity: true,
        treatmentEye: true,
        consent: true,
        eyewear: true,
        deviceSettings: true,
      },
      device: bench.deviceFor(order),
    });
    expect(start.status, JSON.stringify(start.body)).toBeLessThan(300);
    const current = (await clinicianAgent.get(`/api/orders/${order.id}`)).body.order;
    const res = await clinicianAgent
      .post(`/api/orders/${order.id}/cancellation`)
      .send({ reason: goodCancelReason, version: current.version });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('not_cancellable');
    expect((await stored(order.id)).status).toBe('in-session');

    const patient = await createTestPatient(ctx);
    const other = (await sign(await draft(pdtOrder(patient.id)))).body.order;
    const first = await clinicianAgent
      .post(`/api/orders/${other.id}/cancellation`)
      .send({ reason: goodCancelReason, version: other.version });
    expect(first.status).toBe(200);
    const again = await clinicianAgent.post(`/api/orders/${other.id}/cancellation`).send({
      reason: 'Cancelled twice by mistake from two tabs.',
      version: first.body.order.version,
    });
    expect(again.status).toBe(409);
    expect((await stored(other.id)).cancelReason).toBe(goodCancelReason);
  });

  it('a cancellation from a stale read is refused', async () => {
    const patient = await createTestPatient(ctx);
    const signed = (await sign(await draft(pdtOrder(patient.id)))).body.order;
    const res = await clinicianAgent
      .post(`/api/orders/${signed.id}/cancellation`)
      .send({ reason: goodCancelReason, version: signed.version - 1 });
    expect(res.status).toBe(409);
    expect((await stored(signed.id)).status).toBe('signed');
  });

  it('the database keeps a cancellation as written, even for the owner', async () => {
    const patient = await createTestPatient(ctx);
    const order = await draft(cxlOrder(patient.id));
    const res = await clinicianAgent
      .post(`/api/orders/${order.id}/cancellation`)
      .send({ reason: goodCancelReason, version: order.version });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    await expect(
      ctx.dataSource.query(
        "UPDATE treatment_order SET cancel_reason = 'changed later' WHERE id = ?",
        [order.id],
      ),
    ).rejects.toThrow(/cancelled order stays cancelled/);
    await expect(
      ctx.dataSource.query("UPDATE treatment_order SET status = 'draft' WHERE id = ?", [order.id]),
    ).rejects.toThrow(/cancelled order stays cancelled/);
  });
});

describe('a second open order for the same patient, eye and kind', () => {
  const goodReason = 'Second session planned for the other lesion after the first is treated.';

  it('is refused without a reason of substance, and nothing is stored', async () => {
    const patient = await createTestPatient(ctx);
    const first = await draft(pdtOrder(patient.id));
    const count = async () =>
      Number(
        (
          await ctx.dataSource.query(
            'SELECT COUNT(*) AS n FROM treatment_order WHERE patient_id = ?',
            [patient.id],
          )
        )[0].n,
      );
    for (const reason of [undefined, null, 'ok', 'same same same']) {
      const res = await clinicianAgent
        .post('/api/orders')
        .send(pdtOrder(patient.id, { duplicateOrderReason: reason }));
      expect(res.status, String(reason)).toBe(400);
      expect(res.body.error.fields).toEqual([
        expect.objectContaining({
          path: 'duplicateOrderReason',
          message: expect.stringContaining(`order ${first.id}`),
        }),
      ]);
    }
    expect(await count()).toBe(1);

    const withReason = await clinicianAgent
      .post('/api/orders')
      .send(pdtOrder(patient.id, { duplicateOrderReason: goodReason }));
    expect(withReason.status).toBe(201);
    expect(withReason.body.order.duplicateOrderReason).toBe(goodReason);
    expect(await count()).toBe(2);
  });

  it('asks nothing for the other eye, another kind, or once the first is cancelled', async () => {
    const patient = await createTestPatient(ctx);
    const first = await draft(pdtOrder(patient.id));
    await draft(pdtOrder(patient.id, { eye: 'left' }));
    await draft(cxlOrder(patient.id, { eye: 'right' }));
    const cancelled = await clinicianAgent
      .post(`/api/orders/${first.id}/cancellation`)
      .send({ reason: goodCancelReason, version: first.version });
    expect(cancelled.status).toBe(200);
    await draft(pdtOrder(patient.id));
  });

  it('an edit that makes a draft a duplicate is refused, and the draft stays as it was', async () => {
    const patient = await createTestPatient(ctx);
    await draft(pdtOrder(patient.id));
    const left = await draft(pdtOrder(patient.id, { eye: 'left' }));
    const res = await clinicianAgent
      .put(`/api/orders/${left.id}`)
      .send({ ...pdtOrder(patient.id, { eye: 'right' }), version: left.version });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('duplicateOrderReason');
    const [row] = await ctx.dataSource.query('SELECT eye FROM treatment_order WHERE id = ?', [
      left.id,
    ]);
    expect(row.eye).toBe('left');
  });

  it('the signature asks again: a draft saved before the other order existed is refused until it has a reason', async () => {
    const patient = await createTestPatient(ctx);
    const early = await draft(pdtOrder(patient.id, { eye: 'left' }));
    const other = await draft(pdtOrder(patient.id));
    // The early draft is moved to the same eye as if saved before the other: clear its reason.
    await ctx.dataSource.query(
      "UPDATE treatment_order SET eye = 'right', duplicate_order_reason = NULL WHERE id = ?",
      [early.id],
    );
    const read = (await clinicianAgent.get(`/api/orders/${early.id}`)).body.order;
    expect(read.beforeSigning.map((p: { path: string }) => p.path)).toEqual([
      'duplicateOrderReason',
    ]);
    const refused = await sign(read);
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields.map((f: { path: string }) => f.path)).toEqual([
      'duplicateOrderReason',
    ]);
    expect((await stored(early.id)).status).toBe('draft');

    // With the reason, the list is empty and the signature goes through.
    const edited = await clinicianAgent.put(`/api/orders/${early.id}`).send({
      ...pdtOrder(patient.id, { duplicateOrderReason: goodReason }),
      version: read.version,
    });
    expect(edited.status, JSON.stringify(edited.body)).toBe(200);
    expect(edited.body.order.beforeSigning).toEqual([]);
    const signed = await sign(edited.body.order);
    expect(signed.status, JSON.stringify(signed.body)).toBe(200);
    expect((await stored(early.id)).duplicateOrderReason).toBe(goodReason);
    expect(other.id).toBeGreaterThan(early.id);
  });

  it('the signing facts name the other open orders and the recent treatment, as the signature will', async () => {
    const patient = await createTestPatient(ctx);
    const signed = (await sign(await draft(pdtOrder(patient.id)))).body.order;
    const facts = await clinicianAgent.get('/api/orders/signing-facts').query({
      patientId: patient.id,
      eye: 'right',
      protocol: 'pdt-standard',
      version: 1,
    });
    expect(facts.status, JSON.stringify(facts.body)).toBe(200);
    expect(facts.body.openOrders.map((o: { id: number }) => o.id)).toEqual([signed.id]);
    // Signed today: 0 days since, inside the protocol file's minimum interval whatever it is.
    expect(facts.body.recentTreatmentDays).toBe(0);
    const own = await clinicianAgent.get('/api/orders/signing-facts').query({
      patientId: patient.id,
      eye: 'right',
      protocol: 'pdt-standard',
      version: 1,
      orderId: signed.id,
    });
    expect(own.body.openOrders).toEqual([]);
    const bad = await clinicianAgent
      .get('/api/orders/signing-facts')
      .query({ patientId: 'x', eye: 'up', protocol: 'pdt-standard', version: 1 });
    expect(bad.status).toBe(400);
  });
});
