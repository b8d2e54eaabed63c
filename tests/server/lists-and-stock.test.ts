import { randomUUID } from 'node:crypto';
import type supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { recallSql } from '../../server/stock/repository';
import {
  createTestPatient,
  createTestPerson,
  pdtOrder,
  signOrder,
  signedInAgent,
  startTestApp,
  type TestContext,
  type TestPerson,
} from '../support/api';

type Agent = ReturnType<typeof supertest.agent>;

let ctx: TestContext;
let sharing: TestContext;
let clinician: TestPerson;
let pharmacist: TestPerson;
let clinicianAgent: Agent;
let pharmacistAgent: Agent;
let nurseAgent: Agent;
let sharingPharmacist: Agent;

const unique = () => randomUUID().slice(0, 6).toUpperCase();
// Far enough ahead to hold its own rooms; each run names its rooms afresh.
const listDate = '2027-01-12';
const inAYear = new Date(Date.now() + 365 * 86_400_000).toISOString().slice(0, 10);

beforeAll(async () => {
  ctx = await startTestApp();
  sharing = await startTestApp({ VIAL_SHARING_ALLOWED: 'true' });
  clinician = await createTestPerson(ctx, ['clinician']);
  pharmacist = await createTestPerson(ctx, ['pharmacist']);
  const nurse = await createTestPerson(ctx, ['nurse']);
  [clinicianAgent, pharmacistAgent, nurseAgent, sharingPharmacist] = await Promise.all([
    signedInAgent(ctx, clinician),
    signedInAgent(ctx, pharmacist),
    signedInAgent(ctx, nurse),
    signedInAgent(sharing, pharmacist),
  ]);
});
afterAll(async () => {
  await ctx.close();
  await sharing.close();
});

/**
 * A half-dose PDT order (3 mg/m², PLACE trial, van Dijk et al., Ophthalmology 2018) for a patient of
 * this height and weight: Mosteller BSA (N Engl J Med 1987) 180 cm × 64.8 kg → 1.80 m² → 5.40 mg;
 * 160 × 60 → 1.63 m² → 4.89 mg; 180 × 82.4 → 2.03 m² → 6.09 mg.
 */
async function halfDoseOrder(
  heightCm: number,
  weightKg: number,
  patientId?: number,
  eye = 'right',
  extra: object = {},
) {
  const patient = patientId ?? (await createTestPatient(ctx)).id;
  return signOrder(
    clinicianAgent,
    clinician,
    pdtOrder(patient, {
      eye,
      protocol: { key: 'pdt-half-dose', version: 2 },
      inputs: {
        height: { value: heightCm, unit: 'cm' },
        weight: { value: weightKg, unit: 'kg' },
        bsaFormula: 'mosteller',
        lesionGldUm: 2500,
        lensMagnification: 1,
      },
      ...extra,
    }),
  );
}

/** The pharmacist's matching blind check, from the plan the clinician's copy shows. */
async function checked(order: {
  id: number;
  plan: { bsaM2: number; doseMg: number; drugVolumeMl: number };
}) {
  const res = await pharmacistAgent.post(`/api/orders/${order.id}/dose-checks`).send({
    bsaM2: order.plan.bsaM2,
    doseMg: order.plan.doseMg,
    drugVolumeMl: order.plan.drugVolumeMl,
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return order;
}

async function receive(lot: string, quantity: number, expiry = inAYear) {
  const res = await pharmacistAgent
    .post('/api/stock')
    .send({ product: 'verteporfin', lot, expiry, quantity });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.lot as { id: number; quantityOnHand: number };
}

async function createList(room: string, startTime = '09:00', extra: object = {}) {
  const res = await clinicianAgent.post('/api/lists').send({
    listDate,
    room,
    startTime,
    sessionLengthMin: 180,
    slotMin: 30,
    ...extra,
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.list as { id: number; slots: { startsAt: string }[] };
}

const countRows = async (sql: string, params: unknown[]) =>
  Number((await ctx.dataSource.query(sql, params))[0].n);
const quantityOf = async (lotId: number) =>
  Number(
    (
      await ctx.dataSource.query('SELECT quantity_on_hand AS q FROM stock_lot WHERE id = ?', [
        lotId,
      ])
    )[0].q,
  );
const preparationsOf = (orderId: number) =>
  countRows('SELECT COUNT(*) AS n FROM preparation WHERE order_id = ?', [orderId]);

describe('booking orders into lists', () => {
  it('refuses the same patient at an overlapping time in another room, naming the clashing slot, and stores nothing', async () => {
    const roomA = `Laser room ${unique()}`;
    const roomB = `Laser room ${unique()}`;
    const listA = await createList(roomA, '09:00');
    const listB = await createList(roomB, '09:15');
    const patient = await createTestPatient(ctx);
    const right = await halfDoseOrder(180, 64.8, patient.id, 'right');
    const left = await halfDoseOrder(180, 64.8, patient.id, 'left');

    const first = await clinicianAgent
      .post(`/api/lists/${listA.id}/bookings`)
      .send({ orderId: right.id, slotIndex: 0 });
    expect(first.status, JSON.stringify(first.body)).toBe(201);

    // 09:15–09:45 in room B overlaps 09:00–09:30 in room A (Lisbon is on UTC in January).
    const clash = await clinicianAgent
      .post(`/api/lists/${listB.id}/bookings`)
      .send({ orderId: left.id, slotIndex: 0 });
    expect(clash.status).toBe(409);
    expect(clash.body.error.code).toBe('patient_double_booked');
    expect(clash.body.error.message).toContain(`${roomA}, slot 1 at 09:00`);
    expect(clash.body.error.message).toContain(`order ${right.id}`);
    expect(
      await countRows('SELECT COUNT(*) AS n FROM list_booking WHERE order_id = ?', [left.id]),
    ).toBe(0);

    // The same order at 09:30 in room B no longer overlaps: the other eye may be treated after.
    const after = await clinicianAgent
      .post(`/api/lists/${listB.id}/bookings`)
      .send({ orderId: left.id, slotIndex: 1 });
    expect(after.status, JSON.stringify(after.body)).toBe(201);
  });

  it('refuses one eye twice on one day, naming the slot it is booked in', async () => {
    const room = `Laser room ${unique()}`;
    const list = await createList(room);
    const patient = await createTestPatient(ctx);
    const first = await halfDoseOrder(160, 60, patient.id, 'left');
    const second = await halfDoseOrder(160, 60, patient.id, 'left', {
      duplicateOrderReason: 'Second order kept to test the booking rule',
      retreatmentReason: 'Second order kept to test the booking rule',
    });
    expect(
      (
        await clinicianAgent
          .post(`/api/lists/${list.id}/bookings`)
          .send({ orderId: first.id, slotIndex: 0 })
      ).status,
    ).toBe(201);
    const again = await clinicianAgent
      .post(`/api/lists/${list.id}/bookings`)
      .send({ orderId: second.id, slotIndex: 4 });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('eye_booked_same_day');
    expect(again.body.error.message).toContain(`${room}, slot 1 at 09:00 WET on ${listDate}`);
    expect(
      await countRows('SELECT COUNT(*) AS n FROM list_booking WHERE order_id = ?', [second.id]),
    ).toBe(0);
  });

  it('refuses a taken slot, a slot beyond the list, a draft, and a nurse booking', async () => {
    const list = await createList(`Laser room ${unique()}`);
    const a = await halfDoseOrder(180, 64.8);
    const b = await halfDoseOrder(180, 64.8);
    await clinicianAgent
      .post(`/api/lists/${list.id}/bookings`)
      .send({ orderId: a.id, slotIndex: 2 });
    const taken = await clinicianAgent
      .post(`/api/lists/${list.id}/bookings`)
      .send({ orderId: b.id, slotIndex: 2 });
    expect(taken.status).toBe(409);
    expect(taken.body.error.code).toBe('slot_taken');
    const beyond = await clinicianAgent
      .post(`/api/lists/${list.id}/bookings`)
      .send({ orderId: b.id, slotIndex: 6 });
    expect(beyond.status).toBe(400);
    expect(beyond.body.error.fields[0].message).toContain('slotIndex must be 0 to 5');
    const patient = await createTestPatient(ctx);
    const draft = await clinicianAgent.post('/api/orders').send(pdtOrder(patient.id));
    const notSigned = await clinicianAgent
      .post(`/api/lists/${list.id}/bookings`)
      .send({ orderId: draft.body.order.id, slotIndex: 3 });
    expect(notSigned.status).toBe(409);
    expect(notSigned.body.error.code).toBe('order_not_bookable');
    const byNurse = await nurseAgent
      .post(`/api/lists/${list.id}/bookings`)
      .send({ orderId: b.id, slotIndex: 3 });
    expect(byNurse.status).toBe(403);
    expect(
      await countRows('SELECT COUNT(*) AS n FROM list_booking WHERE order_id = ?', [b.id]),
    ).toBe(0);
  });

  it('refuses a list whose slot is longer than its session, naming the field', async () => {
    const res = await clinicianAgent.post('/api/lists').send({
      listDate,
      room: `Laser room ${unique()}`,
      startTime: '09:00',
      sessionLengthMin: 20,
      slotMin: 30,
    });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual([
      expect.objectContaining({
        path: 'slotMin',
        message: 'SlotMin must be at most sessionLengthMin',
      }),
    ]);
  });
});

describe('issuing from stock', () => {
  it('takes the lot that expires first, decrements it, and records the vial’s remainder as discarded', async () => {
    const later = await receive(`LATE-${unique()}`, 3, inAYear);
    const sooner = await receive(
      `SOON-${unique()}`,
      2,
      new Date(Date.now() + 20 * 86_400_000).toISOString().slice(0, 10),
    );
    // The first-expiring lot of all verteporfin held is the one picked: make this test's the earliest.
    await ctx.dataSource.query(
      "UPDATE stock_lot SET quantity_on_hand = 0 WHERE product = 'verteporfin' AND id NOT IN (?, ?)",
      [later.id, sooner.id],
    );
    const order = await checked(await halfDoseOrder(180, 64.8));
    const res = await pharmacistAgent
      .post(`/api/orders/${order.id}/preparation`)
      .send({ volumeDrawnMl: order.plan.drugVolumeMl });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(await quantityOf(sooner.id)).toBe(1);
    expect(await quantityOf(later.id)).toBe(3);
    const [stockRow] = await ctx.dataSource.query(
      'SELECT stock_lot_id AS lotId, vials_opened AS vials, discarded_mg AS discardedMg FROM preparation_stock WHERE order_id = ?',
      [order.id],
    );
    // One 15 mg vial (DOMAIN.md, from memory) for 5.40 mg: 9.6 mg discarded.
    expect({ ...stockRow, lotId: Number(stockRow.lotId), vials: Number(stockRow.vials) }).toEqual({
      lotId: sooner.id,
      vials: 1,
      discardedMg: 9.6,
    });
  });

  it('refuses an expired lot and an empty one, and stores neither preparation nor movement', async () => {
    const lot = `EXP-${unique()}`;
    // Received while in date; it has since expired (written as it would stand today).
    await ctx.dataSource.query(
      "INSERT INTO stock_lot (product, lot, expiry, quantity_on_hand, received_quantity) VALUES ('verteporfin', ?, '2026-01-31', 5, 5)",
      [lot],
    );
    const [{ id: expiredId }] = await ctx.dataSource.query(
      'SELECT id FROM stock_lot WHERE lot = ?',
      [lot],
    );
    const order = await checked(await halfDoseOrder(160, 60));
    const expired = await pharmacistAgent
      .post(`/api/orders/${order.id}/preparation`)
      .send({ stockLotId: Number(expiredId), volumeDrawnMl: order.plan.drugVolumeMl });
    expect(expired.status).toBe(409);
    expect(expired.body.error.code).toBe('stock_expired');
    expect(expired.body.error.message).toContain('expired on 2026-01-31');
    // Typing the expired lot's number instead is the same refusal.
    const typed = await pharmacistAgent
      .post(`/api/orders/${order.id}/preparation`)
      .send({ vialLot: lot, volumeDrawnMl: order.plan.drugVolumeMl });
    expect(typed.status).toBe(409);
    expect(typed.body.error.code).toBe('stock_expired');

    const empty = await receive(`EMPTY-${unique()}`, 1);
    await pharmacistAgent
      .post(`/api/stock/${empty.id}/adjustments`)
      .send({ countedQuantity: 0, reason: 'Vial found cracked at the weekly count' });
    const none = await pharmacistAgent
      .post(`/api/orders/${order.id}/preparation`)
      .send({ stockLotId: empty.id, volumeDrawnMl: order.plan.drugVolumeMl });
    expect(none.status).toBe(409);
    expect(none.body.error.code).toBe('stock_empty');

    expect(await preparationsOf(order.id)).toBe(0);
    expect(await quantityOf(Number(expiredId))).toBe(5);
    expect(
      await countRows(
        "SELECT COUNT(*) AS n FROM stock_movement WHERE kind = 'issued' AND order_id = ?",
        [order.id],
      ),
    ).toBe(0);
    const status = await ctx.dataSource.query('SELECT status FROM treatment_order WHERE id = ?', [
      order.id,
    ]);
    expect(status[0].status).toBe('checked');
  });

  it('never takes the quantity below zero when two preparations race for the last vial', async () => {
    const lot = await receive(`RACE-${unique()}`, 1);
    const [a, b] = await Promise.all([
      halfDoseOrder(180, 64.8).then(checked),
      halfDoseOrder(160, 60).then(checked),
    ]);
    const results = await Promise.all(
      [a, b].map((o) =>
        pharmacistAgent
          .post(`/api/orders/${o.id}/preparation`)
          .send({ stockLotId: lot.id, volumeDrawnMl: o.plan.drugVolumeMl }),
      ),
    );
    expect(results.map((r) => r.status).sort()).toEqual([201, 409]);
    expect(results.find((r) => r.status === 409)!.body.error.code).toBe('stock_empty');
    expect(await quantityOf(lot.id)).toBe(0);
    expect((await preparationsOf(a.id)) + (await preparationsOf(b.id))).toBe(1);
    expect(
      await countRows(
        "SELECT COUNT(*) AS n FROM stock_movement WHERE lot_id = ? AND kind = 'issued'",
        [lot.id],
      ),
    ).toBe(1);
  });

  it('keeps who adjusted a count and why, and refuses an adjustment without a reason', async () => {
    const lot = await receive(`ADJ-${unique()}`, 4);
    const noReason = await pharmacistAgent
      .post(`/api/stock/${lot.id}/adjustments`)
      .send({ countedQuantity: 3 });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields[0].path).toBe('reason');
    expect(await quantityOf(lot.id)).toBe(4);
    const adjusted = await pharmacistAgent
      .post(`/api/stock/${lot.id}/adjustments`)
      .send({ countedQuantity: 3, reason: 'One vial dropped and broken' });
    expect(adjusted.status).toBe(201);
    expect(await quantityOf(lot.id)).toBe(3);
    const [movement] = await ctx.dataSource.query(
      "SELECT actor_id AS actorId, quantity_change AS qc, reason FROM stock_movement WHERE lot_id = ? AND kind = 'adjusted'",
      [lot.id],
    );
    expect({ ...movement, actorId: Number(movement.actorId) }).toEqual({
      actorId: pharmacist.id,
      qc: -1,
      reason: 'One vial dropped and broken',
    });
    const [audit] = await ctx.dataSource.query(
      "SELECT actor_user_id AS actor, details FROM audit_event WHERE action = 'stock.adjusted' AND entity_id = ?",
      [String(lot.id)],
    );
    expect(Number(audit.actor)).toBe(pharmacist.id);
    expect(JSON.stringify(audit.details)).toContain('One vial dropped and broken');
    // A clinician may not receive or adjust stock.
    expect(
      (
        await clinicianAgent
          .post(`/api/stock/${lot.id}/adjustments`)
          .send({ countedQuantity: 9, reason: 'Counted again' })
      ).status,
    ).toBe(403);
  });

  it('refuses fewer vials than the plan where the unit does not allow sharing', async () => {
    const lot = await receive(`SHR-${unique()}`, 2);
    const order = await checked(await halfDoseOrder(180, 64.8));
    const res = await pharmacistAgent
      .post(`/api/orders/${order.id}/preparation`)
      .send({ stockLotId: lot.id, vialsOpened: 0, volumeDrawnMl: order.plan.drugVolumeMl });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0]).toEqual({
      path: 'vialsOpened',
      message: 'vialsOpened must be 1',
    });
    expect(await preparationsOf(order.id)).toBe(0);
    expect(await quantityOf(lot.id)).toBe(2);
  });
});

describe('the vial plan of a list', () => {
  it('books three half-dose patients: 3 vials unshared, 2 where the policy allows sharing within the beyond-use time', async () => {
    const list = await createList(`PDT room ${unique()}`, '09:15');
    // 5.40, 4.89 and 6.09 mg: the nearest the half-dose protocol's 0.01 m² BSA rounding comes to
    // the worked 5.4, 4.9 and 6.1 mg (tests/shared/vial-plan.test.ts works those exactly).
    const orders = [
      await halfDoseOrder(180, 64.8),
      await halfDoseOrder(160, 60),
      await halfDoseOrder(180, 82.4),
    ];
    expect(orders.map((o) => o.plan.doseMg)).toEqual([5.4, 4.89, 6.09]);
    for (const [slotIndex, o] of orders.entries()) {
      const res = await clinicianAgent
        .post(`/api/lists/${list.id}/bookings`)
        .send({ orderId: o.id, slotIndex });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
    }
    const unshared = await pharmacistAgent.get(`/api/lists/${list.id}/vial-plan`);
    expect(unshared.status).toBe(200);
    expect(unshared.body.sharingAllowed).toBe(false);
    expect(unshared.body.vialsPlanned).toBe(3);
    expect(unshared.body.totalDoseMg).toBe(16.38);

    const shared = await sharingPharmacist.get(`/api/lists/${list.id}/vial-plan`);
    expect(shared.body.sharingAllowed).toBe(true);
    expect(shared.body.vialsUnshared).toBe(3);
    expect(shared.body.vialsPlanned).toBe(2);
    expect(
      shared.body.steps.map((s: { orderId: number; vials: number[] }) => [s.orderId, s.vials]),
    ).toEqual([
      [orders[0]!.id, [1]],
      [orders[1]!.id, [1]],
      [orders[2]!.id, [2]],
    ]);
    // Ready 15 min before each light slot (TAP Study Group, Arch Ophthalmol 1999): 09:00 first.
    expect(shared.body.steps[0].readyBy).toBe(`${listDate}T09:00:00.000Z`);
    expect(shared.body.caution).toContain('local policy prevail');
  });

  it('does not share a vial with a patient whose infusion would end past the beyond-use limit', async () => {
    const list = await createList(`PDT room ${unique()}`, '09:15', {
      sessionLengthMin: 300,
      slotMin: 30,
    });
    const early = await halfDoseOrder(180, 64.8);
    const late = await halfDoseOrder(160, 60);
    await clinicianAgent
      .post(`/api/lists/${list.id}/bookings`)
      .send({ orderId: early.id, slotIndex: 0 });
    // Slot 8 is 13:15: ready 13:00, infusion ends 13:10, after the 4 h limit of a vial made up by 09:00
    // (Drug Discov Today 2008;13:124–134).
    await clinicianAgent
      .post(`/api/lists/${list.id}/bookings`)
      .send({ orderId: late.id, slotIndex: 8 });
    const plan = await sharingPharmacist.get(`/api/lists/${list.id}/vial-plan`);
    expect(plan.body.vialsPlanned).toBe(2);
    expect(plan.body.steps[1].fromSharedVial).toBe(false);
  });
});

describe('recall', () => {
  it('finds every patient, eye, date and dose of a lot, as JSON and CSV, and e-mails their clinicians', async () => {
    const lotName = `RCL-${unique()}`;
    const lot = await receive(lotName, 3);
    const other = await receive(`OTH-${unique()}`, 3);
    const used = [
      await checked(await halfDoseOrder(180, 64.8)),
      await checked(await halfDoseOrder(160, 60)),
    ];
    for (const o of used) {
      const res = await pharmacistAgent
        .post(`/api/orders/${o.id}/preparation`)
        .send({ stockLotId: lot.id, volumeDrawnMl: o.plan.drugVolumeMl });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
    }
    const notUsed = await checked(await halfDoseOrder(180, 82.4));
    await pharmacistAgent
      .post(`/api/orders/${notUsed.id}/preparation`)
      .send({ stockLotId: other.id, volumeDrawnMl: notUsed.plan.drugVolumeMl });

    const found = await pharmacistAgent.get('/api/recall').query({ lot: lotName });
    expect(found.status).toBe(200);
    expect(found.body.rows.map((r: { orderId: number }) => r.orderId).sort()).toEqual(
      used.map((o) => o.id).sort(),
    );
    expect(found.body.rows[0]).toMatchObject({ eye: 'right', doseMg: used[0]!.plan.doseMg });
    expect(found.body.rows[0].date).toMatch(/^\d{4}-\d{2}-\d{2}$/);

    const csv = await pharmacistAgent.get('/api/recall.csv').query({ lot: lotName });
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toContain('text/csv');
    const lines = csv.text.trim().split('\r\n');
    expect(lines).toHaveLength(3);
    expect(lines[0]).toContain('record number');
    expect(csv.text).toContain(String(used[1]!.id));
    expect(csv.text).not.toContain(`,${notUsed.id},`);

    const mail = await pharmacistAgent.post('/api/recall/notifications').send({ lot: lotName });
    expect(mail.status).toBe(201);
    expect(mail.body).toEqual({ lot: lotName, messages: 1, patients: 2 });
    const [message] = await ctx.dataSource.query(
      "SELECT recipients, body FROM outbox_message WHERE kind = 'lot-recall' AND related_id = ?",
      [lotName],
    );
    expect(JSON.stringify(message.recipients)).toContain(clinician.email);
    expect(message.body).toContain(`order ${used[0]!.id}`);

    // The nurse has no recall; a lot that was never used is said so, and no message is written.
    expect((await nurseAgent.get('/api/recall').query({ lot: lotName })).status).toBe(403);
    const nobody = await pharmacistAgent
      .post('/api/recall/notifications')
      .send({ lot: `NONE-${unique()}` });
    expect(nobody.status).toBe(409);
  });

  it('searches preparations through the index on the lot', async () => {
    const plan: { table: string; key: string | null }[] = await ctx.dataSource.query(
      `EXPLAIN ${recallSql}`,
      ['ANY-LOT'],
    );
    expect(plan.find((row) => row.table === 'p')?.key).toBe('ix_preparation_vial_lot');
  });

  it('the monthly report counts the vials issued and the drug given and discarded', async () => {
    const res = await pharmacistAgent.get('/api/reports/drug-use');
    expect(res.status).toBe(200);
    expect(res.body.months).toHaveLength(12);
    const month = res.body.months.at(-1);
    expect(month.vialsIssued).toBeGreaterThanOrEqual(4);
    expect(month.discardedMg).toBeGreaterThan(0);
  });
});
