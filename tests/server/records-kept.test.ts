import { randomUUID } from 'node:crypto';
import type { Connection } from 'mysql2/promise';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { createAuditRepository } from '../../server/audit/repository';
import {
  createTestPatient,
  createTestPerson,
  pdtOrder,
  preparedPdtOrder,
  signOrder,
  signedInAgent,
  startTestApp,
  type TestContext,
  type TestPerson,
  identityConfirmed,
} from '../support/api';
import { appConnection, ownerConnection } from '../support/database';
import { readyBench } from '../support/devices';

// What was signed or recorded stays as it was, even for someone who goes around the API with the
// app's own database user (its password is in the web server's environment).
type Agent = ReturnType<typeof supertest.agent>;
let ctx: TestContext;
let clinician: TestPerson;
let clinicianAgent: Agent;
let pharmacistAgent: Agent;
let nurse: TestPerson;
let nurseAgent: Agent;
let app: Connection;
let owner: Connection;

let bench: Awaited<ReturnType<typeof readyBench>>;
beforeAll(async () => {
  ctx = await startTestApp();
  clinician = await createTestPerson(ctx, ['clinician']);
  clinicianAgent = await signedInAgent(ctx, clinician);
  pharmacistAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['pharmacist']));
  nurse = await createTestPerson(ctx, ['nurse']);
  nurseAgent = await signedInAgent(ctx, nurse);
  app = await appConnection(ctx.config);
  owner = await ownerConnection(ctx.config);
  bench = await readyBench(await signedInAgent(ctx, await createTestPerson(ctx, ['admin'])));
});
afterAll(async () => {
  await app?.end();
  await owner?.end();
  await ctx.close();
});

const allChecks = {
  patientIdentity: true,
  treatmentEye: true,
  consent: true,
  eyewear: true,
  deviceSettings: true,
};

async function row(table: string, where: string, id: unknown) {
  const [rows] = await owner.query(`SELECT * FROM \`${table}\` WHERE ${where} = ?`, [id]);
  return (rows as Record<string, unknown>[])[0];
}

/** Tries a statement as the app's user: it must fail with the given error, and the row must stay as it was. */
async function refused(
  sql: string,
  params: unknown[],
  table: string,
  where: string,
  id: unknown,
  error: RegExp,
) {
  const before = await row(table, where, id);
  expect(before, `the ${table} row exists`).toBeDefined();
  await expect(app.query(sql, params)).rejects.toThrow(error);
  expect(await row(table, where, id)).toEqual(before);
}

/** A finished PDT session (light on time) run through the API; returns the order id. */
async function finishedSession(): Promise<number> {
  // Made up an hour ago: the infusion (40 minutes ago) comes after the reconstitution.
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
  for (const event of [
    at(0, { type: 'session-started', checks: allChecks, device: bench.deviceFor(order) }),
    at(60, { type: 'step-started', stepId: 'infusion' }),
    // A short infusion (8 of 10 minutes), so the session has a deviation.
    at(540, { type: 'step-ended', stepId: 'infusion', reason: 'Line came out; ended early.' }),
    at(960, identityConfirmed('laser')),
    at(960, { type: 'step-started', stepId: 'laser' }),
    at(1043, { type: 'step-ended', stepId: 'laser' }),
    at(1050, { type: 'exposure-recorded', stepId: 'laser', exposureS: 83 }),
    at(1100, { type: 'session-completed' }),
  ]) {
    const res = await nurseAgent.post(`/api/orders/${order.id}/session-events`).send(event);
    if (res.status !== 201) throw new Error(JSON.stringify(res.body));
  }
  return order.id;
}

const denied = /command denied/;
const signedKept = /A signed order cannot be changed/;

describe("a signed order, as the app's database user", () => {
  it('moves its beyond-use time only later (a fresh preparation), never earlier and never away', async () => {
    const order = await preparedPdtOrder(ctx, {
      clinician: [clinicianAgent, clinician],
      pharmacist: pharmacistAgent,
    });
    const laterOnly = /only moves later/;
    await refused(
      'UPDATE treatment_order SET beyond_use_at = beyond_use_at - INTERVAL 1 HOUR WHERE id = ?',
      [order.id],
      'treatment_order',
      'id',
      order.id,
      laterOnly,
    );
    await refused(
      'UPDATE treatment_order SET beyond_use_at = NULL WHERE id = ?',
      [order.id],
      'treatment_order',
      'id',
      order.id,
      laterOnly,
    );
  });

  it('cannot have its plan, inputs, signer or patient changed, nor be deleted; the row stays as it was', async () => {
    const patient = await createTestPatient(ctx);
    const order = await signOrder(clinicianAgent, clinician, pdtOrder(patient.id));
    await refused(
      "UPDATE treatment_order SET plan = JSON_SET(plan, '$.doseMg', 99) WHERE id = ?",
      [order.id],
      'treatment_order',
      'id',
      order.id,
      signedKept,
    );
    await refused(
      "UPDATE treatment_order SET inputs = JSON_SET(inputs, '$.weightKg', 140) WHERE id = ?",
      [order.id],
      'treatment_order',
      'id',
      order.id,
      signedKept,
    );
    await refused(
      'UPDATE treatment_order SET signed_by = NULL, signed_at = NULL WHERE id = ?',
      [order.id],
      'treatment_order',
      'id',
      order.id,
      signedKept,
    );
    await refused(
      "UPDATE treatment_order SET eye = 'left' WHERE id = ?",
      [order.id],
      'treatment_order',
      'id',
      order.id,
      signedKept,
    );
    await refused(
      'DELETE FROM treatment_order WHERE id = ?',
      [order.id],
      'treatment_order',
      'id',
      order.id,
      /A signed order cannot be deleted/,
    );
    // Columns added after the first trigger are part of what was signed too.
    for (const change of [
      "protocol_sha256 = REPEAT('0', 64)",
      "superseded_version_reason = 'changed afterwards'",
      "duplicate_order_reason = 'changed afterwards'",
      "weight_change_reason = 'changed afterwards'",
      'swelling_acknowledged = NOT swelling_acknowledged',
    ])
      await refused(
        `UPDATE treatment_order SET ${change} WHERE id = ?`,
        [order.id],
        'treatment_order',
        'id',
        order.id,
        signedKept,
      );
  });

  it('is still changed by an amendment: the new revision is signed and the old one only moves to superseded', async () => {
    const patient = await createTestPatient(ctx);
    const order = await signOrder(clinicianAgent, clinician, pdtOrder(patient.id));
    const before = await row('treatment_order', 'id', order.id);
    const amended = await clinicianAgent.post(`/api/orders/${order.id}/amendments`).send({
      ...pdtOrder(patient.id),
      amendmentReason: 'Weight re-measured on the ward.',
      version: (await clinicianAgent.get(`/api/orders/${order.id}`)).body.order.version,
    });
    expect(amended.status, JSON.stringify(amended.body)).toBe(201);
    const signed = await clinicianAgent
      .post(`/api/orders/${amended.body.order.id}/signature`)
      .send({
        password: clinician.password,
        meaning: 'ordered',
        version: amended.body.order.version,
      });
    expect(signed.status, JSON.stringify(signed.body)).toBe(200);
    const after = await row('treatment_order', 'id', order.id);
    // The status, and with it the row's version (optimistic locking) and update time, are all that move.
    expect(after).toEqual({
      ...before,
      status: 'superseded',
      updated_at: after!.updated_at,
      row_version: Number(before!.row_version) + 1,
    });
  });

  it('a draft stays editable: the rule starts at the signature', async () => {
    const patient = await createTestPatient(ctx);
    const draft = await clinicianAgent.post('/api/orders').send(pdtOrder(patient.id));
    expect(draft.status).toBe(201);
    await app.query("UPDATE treatment_order SET note = 'changed before signing' WHERE id = ?", [
      draft.body.order.id,
    ]);
    expect((await row('treatment_order', 'id', draft.body.order.id))!.note).toBe(
      'changed before signing',
    );
  });
});

describe("records the app only adds to, as the app's database user", () => {
  it('a preparation, a dose check, a session event, a protocol approval and an audit row cannot be updated or deleted', async () => {
    const orderId = await finishedSession();
    const [[prep]] = (await app.query('SELECT id FROM preparation WHERE order_id = ?', [
      orderId,
    ])) as unknown as [{ id: number }[]];
    await refused(
      'UPDATE preparation SET volume_drawn_ml = 9.9 WHERE id = ?',
      [prep!.id],
      'preparation',
      'id',
      prep!.id,
      denied,
    );
    await refused(
      'DELETE FROM preparation WHERE id = ?',
      [prep!.id],
      'preparation',
      'id',
      prep!.id,
      denied,
    );
    const [[check]] = (await app.query('SELECT id FROM dose_check WHERE order_id = ?', [
      orderId,
    ])) as unknown as [{ id: number }[]];
    await refused(
      "UPDATE dose_check SET outcome = 'match', dose_mg = 1 WHERE id = ?",
      [check!.id],
      'dose_check',
      'id',
      check!.id,
      denied,
    );
    const [[event]] = (await app.query(
      'SELECT id FROM session_event WHERE order_id = ? ORDER BY id LIMIT 1',
      [orderId],
    )) as unknown as [{ id: number }[]];
    await refused(
      'DELETE FROM session_event WHERE id = ?',
      [event!.id],
      'session_event',
      'id',
      event!.id,
      denied,
    );

    const [[version]] = (await app.query(
      "SELECT id FROM protocol_version WHERE protocol_key = 'pdt-standard' AND version = 1",
    )) as unknown as [{ id: number }[]];
    const approver = await createTestPerson(ctx, ['pharmacist']);
    await app.query(
      "INSERT INTO protocol_approval (protocol_version_id, user_id, approved_as, definition_sha256) VALUES (?, ?, 'pharmacist', ?)",
      [version!.id, approver.id, 'a'.repeat(64)],
    );
    await refused(
      "UPDATE protocol_approval SET approved_as = 'clinician' WHERE user_id = ?",
      [approver.id],
      'protocol_approval',
      'user_id',
      approver.id,
      denied,
    );
    await refused(
      'DELETE FROM protocol_approval WHERE user_id = ?',
      [approver.id],
      'protocol_approval',
      'user_id',
      approver.id,
      denied,
    );

    const marker = `test.append-only-${randomUUID()}`;
    await createAuditRepository(ctx.dataSource).append({ actorUserId: null, action: marker });
    await refused(
      "UPDATE audit_event SET action = 'changed' WHERE action = ?",
      [marker],
      'audit_event',
      'action',
      marker,
      denied,
    );
    await refused(
      'DELETE FROM audit_event WHERE action = ?',
      [marker],
      'audit_event',
      'action',
      marker,
      denied,
    );
    await refused('DELETE FROM audit_chain_head', [], 'audit_chain_head', 'id', 1, denied);
  });
});

describe("a session's dose record and deviations, as the app's database user", () => {
  it('are never deleted, even while they may still change', async () => {
    const orderId = await finishedSession();
    await refused(
      'DELETE FROM dose_record WHERE order_id = ?',
      [orderId],
      'dose_record',
      'order_id',
      orderId,
      /A dose record cannot be deleted/,
    );
    const [[deviation]] = (await app.query('SELECT id FROM deviation WHERE order_id = ?', [
      orderId,
    ])) as unknown as [{ id: number }[]];
    expect(deviation, 'the short infusion is a deviation').toBeDefined();
    await refused(
      'DELETE FROM deviation WHERE id = ?',
      [deviation!.id],
      'deviation',
      'id',
      deviation!.id,
      /A deviation cannot be deleted/,
    );
  });

  it('are closed 12 hours after the session ended: facts refused by the database, late taps refused by the API with 409; review still works', async () => {
    const orderId = await finishedSession();
    // As if the session had ended 14 hours ago (the owner may move a record that is still open).
    await owner.query(
      'UPDATE dose_record SET ended_at = UTC_TIMESTAMP(3) - INTERVAL 14 HOUR WHERE order_id = ?',
      [orderId],
    );
    await refused(
      'UPDATE dose_record SET delivered_fluence_j_per_cm2 = 50 WHERE order_id = ?',
      [orderId],
      'dose_record',
      'order_id',
      orderId,
      /ended more than 12 hours ago cannot be changed/,
    );
    await refused(
      "UPDATE dose_record SET outcome = 'stopped' WHERE order_id = ?",
      [orderId],
      'dose_record',
      'order_id',
      orderId,
      /ended more than 12 hours ago cannot be changed/,
    );
    const [[deviation]] = (await app.query('SELECT id FROM deviation WHERE order_id = ?', [
      orderId,
    ])) as unknown as [{ id: number }[]];
    await refused(
      "UPDATE deviation SET severity = 'minor', message = 'nothing happened' WHERE id = ?",
      [deviation!.id],
      'deviation',
      'id',
      deviation!.id,
      /cannot be changed; review it instead/,
    );
    await refused(
      'UPDATE deviation SET withdrawn_at = UTC_TIMESTAMP(3) WHERE id = ?',
      [deviation!.id],
      'deviation',
      'id',
      deviation!.id,
      /cannot be changed; review it instead/,
    );

    // The API, 14 hours on (its clock moved; the session's end event is then 14 h old): a new tap is refused.
    const fourteenHoursMs = 14 * 3600_000;
    const later = createApp({
      config: ctx.config,
      dataSource: ctx.dataSource,
      mailer: { send: async () => undefined, close: () => undefined },
      clock: { now: () => new Date(Date.now() + fourteenHoursMs) },
    });
    const nurseLater = supertest.agent(later);
    expect(
      (
        await nurseLater
          .post('/api/auth/login')
          .send({ email: nurse.email, password: nurse.password })
      ).status,
    ).toBe(200);
    const eventsBefore = await row('dose_record', 'order_id', orderId);
    const late = await nurseLater.post(`/api/orders/${orderId}/session-events`).send({
      idempotencyKey: randomUUID(),
      clientTime: new Date(Date.now() + fourteenHoursMs).toISOString(),
      type: 'extravasation',
      volumeInfusedMl: 30,
    });
    expect(late.status, JSON.stringify(late.body)).toBe(409);
    expect(late.body.error).toMatchObject({ code: 'record_closed' });
    const [counted] = await app.query(
      'SELECT COUNT(*) AS n FROM session_event WHERE order_id = ?',
      [orderId],
    );
    const { n } = (counted as { n: number }[])[0]!;
    expect(Number(n)).toBe(8); // the eight taps of finishedSession, no more
    expect(await row('dose_record', 'order_id', orderId)).toEqual(eventsBefore);

    const auditor = await signedInAgent(ctx, await createTestPerson(ctx, ['auditor']));
    const closed = await auditor.post(`/api/deviations/${deviation!.id}/closure`).send({
      classification: 'acceptable',
      comment: 'Infusion pump checked; short by a timing slip.',
    });
    expect(closed.status, JSON.stringify(closed.body)).toBe(200);
    expect(await row('deviation', 'id', deviation!.id)).toMatchObject({
      review_status: 'closed',
      classification: 'acceptable',
      severity: expect.any(String),
    });
  });

  it('stay open to the events of a session that ended within the 12 hours: a late tap is stored and the record follows', async () => {
    const orderId = await finishedSession();
    const before = await row('dose_record', 'order_id', orderId);
    // A tap queued offline during the session, delivered after its end.
    const late = await nurseAgent.post(`/api/orders/${orderId}/session-events`).send({
      idempotencyKey: randomUUID(),
      clientTime: new Date(Date.now() - 30 * 60_000).toISOString(),
      type: 'extravasation',
      note: 'Noticed at the cannula.',
      volumeInfusedMl: 30,
    });
    expect(late.status, JSON.stringify(late.body)).toBe(201);
    const after = await row('dose_record', 'order_id', orderId);
    expect(after!.record).not.toEqual(before!.record);
  });
});
