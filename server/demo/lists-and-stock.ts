import type { DataSource } from 'typeorm';
import { computePlan } from '../../shared/engine/compute-plan';
import { listSlots } from '../../shared/lists/slots';
import type { PlanInputs } from '../../shared/schemas/calculation';
import { createAuditRepository } from '../audit/repository';
import { TreatmentOrder } from '../db/entities/treatment-order';
import { demoLensWithFactor } from './devices';
import { newestApprovedVersion } from './scenario';
import { demoDomain, demoPatients } from './seed';

/**
 * The demo unit's week of treatment lists and its pharmacy stock (all invented): a PDT list in
 * Laser room 1 every weekday and a cross-linking list on Thursdays; two verteporfin lots, one
 * expiring within the month (two of today's doses were made up from it, so a recall of it finds
 * patients) and a riboflavin lot. Each row is written once: a rerun finds it and leaves it.
 */
export const demoLots = [
  { product: 'verteporfin', lot: 'MPV-2611A', expiryInDays: 21, quantity: 6 },
  { product: 'verteporfin', lot: 'MPV-2705C', expiryInDays: 180, quantity: 12 },
  { product: 'riboflavin 0.1% with dextran', lot: 'MPR-0412', expiryInDays: 120, quantity: 8 },
];
export const demoRecallLot = 'MPV-2611A';

const pdtRoom = 'Laser room 1 (demo)';
const cxlRoom = 'Cross-linking room (demo)';

export async function seedDemoListsAndStock(
  dataSource: DataSource,
  unitTimeZone: string,
): Promise<number> {
  const { DateTime } = await import('luxon');
  const [clinician] = await dataSource.query('SELECT id FROM user WHERE email = ?', [
    `clinician@${demoDomain}`,
  ]);
  const [pharmacist] = await dataSource.query('SELECT id FROM user WHERE email = ?', [
    `pharmacist@${demoDomain}`,
  ]);
  if (!clinician || !pharmacist) return 0;
  const clinicianId = Number(clinician.id);
  const pharmacistId = Number(pharmacist.id);
  const now = DateTime.now().setZone(unitTimeZone);
  let added = 0;

  // Stock.
  for (const lot of demoLots) {
    const [held] = await dataSource.query(
      'SELECT id FROM stock_lot WHERE product = ? AND lot = ?',
      [lot.product, lot.lot],
    );
    if (held) continue;
    await dataSource.transaction(async (manager) => {
      const result = await manager.query(
        'INSERT INTO stock_lot (product, lot, expiry, quantity_on_hand, received_quantity) VALUES (?, ?, ?, ?, ?)',
        [
          lot.product,
          lot.lot,
          now.plus({ days: lot.expiryInDays }).toISODate(),
          lot.quantity,
          lot.quantity,
        ],
      );
      await manager.query(
        "INSERT INTO stock_movement (lot_id, kind, quantity_change, quantity_after, actor_id) VALUES (?, 'received', ?, ?, ?)",
        [result.insertId, lot.quantity, lot.quantity, pharmacistId],
      );
    });
    added++;
  }

  // The week's lists: PDT every weekday, cross-linking on Thursday and today.
  const monday = now.startOf('week');
  const todayIndex = Math.min(4, Math.max(0, now.weekday - 1));
  const listIds = new Map<string, { id: number; date: string; room: string }>();
  for (let day = 0; day < 5; day++) {
    const date = monday.plus({ days: day }).toISODate()!;
    const wanted = [
      {
        room: pdtRoom,
        device: 'Diode laser 689 nm, bay A (demo)',
        start: '08:30',
        length: 240,
        slot: 30,
      },
      ...(day === 3 || day === todayIndex
        ? [
            {
              room: cxlRoom,
              device: 'UVA source, bay C (demo)',
              start: '09:00',
              length: 240,
              slot: 60,
            },
          ]
        : []),
    ];
    for (const w of wanted) {
      let [row] = await dataSource.query(
        'SELECT id FROM treatment_list WHERE list_date = ? AND room = ? AND start_time = ?',
        [date, w.room, w.start],
      );
      if (!row) {
        const result = await dataSource.query(
          'INSERT INTO treatment_list (list_date, room, device_label, start_time, session_length_min, slot_min, created_by) VALUES (?, ?, ?, ?, ?, ?, ?)',
          [date, w.room, w.device, w.start, w.length, w.slot, clinicianId],
        );
        row = { id: result.insertId };
        added++;
      }
      listIds.set(`${day}:${w.room}`, { id: Number(row.id), date, room: w.room });
    }
  }

  // Half-dose PDT orders booked into this week's PDT lists (two a day from today on), signed.
  // Today's first two are made up from the lot that expires first.
  const orderRepo = dataSource.getRepository(TreatmentOrder);
  const pv = await newestApprovedVersion(dataSource, 'pdt-half-dose');
  const patients = demoPatients.filter((p) => p.recordNumber >= 'MP-100203');
  let pick = 0;
  const lens = await demoLensWithFactor(dataSource, 1.05);
  for (let day = todayIndex; day < 5; day++) {
    const list = listIds.get(`${day}:${pdtRoom}`)!;
    for (let n = 0; n < 2; n++) {
      const note = `Demo list ${list.date} slot ${n * 2 + 1}`;
      const p = patients[pick++ % patients.length]!;
      if (await orderRepo.exists({ where: { note } })) continue;
      const [who] = await dataSource.query('SELECT id FROM patient WHERE record_number = ?', [
        p.recordNumber,
      ]);
      if (!who) continue;
      const inputs: PlanInputs = {
        height: { value: p.heightCm, unit: 'cm' },
        weight: { value: p.weightKg, unit: 'kg' },
        bsaFormula: 'mosteller',
        lesionGldUm: 1800 + 200 * n,
        // The order picks the unit's standard-field lens from the register.
        ...(lens
          ? { lensId: lens.id, lensMagnification: lens.laserSpotFactor }
          : { lensMagnification: 1 }),
      };
      const plan = computePlan(pv.definition, inputs);
      const madeUp = day === todayIndex;
      const slot = listSlots(
        { listDate: list.date, startTime: '08:30', sessionLengthMin: 240, slotMin: 30 },
        unitTimeZone,
      )[n * 2 + 1]!;
      const signedAt = now.minus({ days: 1 }).toJSDate();
      await dataSource.transaction(async (manager) => {
        const eye = n === 0 ? 'left' : 'right';
        const order = await manager.getRepository(TreatmentOrder).save({
          patientId: Number(who.id),
          eye,
          protocolVersionId: pv.id,
          protocolSha256: pv.sha256,
          status: madeUp ? 'prepared' : 'signed',
          revision: 1,
          inputs,
          plan,
          engineVersion: plan.engineVersion,
          checklist: pv.definition.contraindications.map((c) => ({
            id: c.id,
            answer: 'no' as const,
          })),
          softLimitReasons: {},
          retreatmentReason: null,
          note,
          createdById: clinicianId,
          signedById: clinicianId,
          signedAt,
          signatureMeaning: 'ordered',
        });
        await manager.query(
          'INSERT INTO list_booking (list_id, slot_index, order_id, patient_id, eye, booking_date, starts_at, ends_at, booked_by) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)',
          [
            list.id,
            n * 2 + 1,
            order.id,
            Number(who.id),
            eye,
            list.date,
            slot.startsAt,
            slot.endsAt,
            clinicianId,
          ],
        );
        if (!madeUp || !pv.definition.drug) return;
        await manager.query(
          "INSERT INTO dose_check (order_id, pharmacist_id, bsa_m2, dose_mg, drug_volume_ml, outcome, differing) VALUES (?, ?, ?, ?, ?, 'match', '[]')",
          [order.id, pharmacistId, plan.bsaM2, plan.doseMg, plan.drugVolumeMl],
        );
        const [lot] = await manager.query(
          'SELECT id, expiry, quantity_on_hand AS q FROM stock_lot WHERE product = ? AND lot = ? FOR UPDATE',
          ['verteporfin', demoRecallLot],
        );
        const reconstitutedAt = now.minus({ minutes: 20 }).toJSDate();
        const beyondUseAt = new Date(
          reconstitutedAt.getTime() + pv.definition.drug.beyondUseH * 3600_000,
        );
        const prep = await manager.query(
          'INSERT INTO preparation (order_id, pharmacist_id, vial_lot, vial_expiry, reconstituted_at, volume_drawn_ml, beyond_use_at) VALUES (?, ?, ?, ?, ?, ?, ?)',
          [
            order.id,
            pharmacistId,
            demoRecallLot,
            lot.expiry,
            reconstitutedAt,
            plan.drugVolumeMl,
            beyondUseAt,
          ],
        );
        const vials = plan.vials ?? 1;
        await manager.query(
          'UPDATE stock_lot SET quantity_on_hand = quantity_on_hand - ? WHERE id = ?',
          [vials, lot.id],
        );
        await manager.query(
          "INSERT INTO stock_movement (lot_id, kind, quantity_change, quantity_after, order_id, actor_id) VALUES (?, 'issued', ?, ?, ?, ?)",
          [lot.id, -vials, Number(lot.q) - vials, order.id, pharmacistId],
        );
        await manager.query(
          'INSERT INTO preparation_stock (preparation_id, order_id, stock_lot_id, vials_opened, dose_mg, discarded_mg, discard_reason) VALUES (?, ?, ?, ?, ?, ?, ?)',
          [
            prep.insertId,
            order.id,
            lot.id,
            vials,
            plan.doseMg,
            Number((vials * pv.definition.drug.vialContentMg - (plan.doseMg ?? 0)).toFixed(2)),
            'What the opened vial held beyond the dose (demo)',
          ],
        );
        await manager.update(TreatmentOrder, { id: order.id }, { beyondUseAt });
      });
      added++;
    }
  }
  // Today's open orders of the demo scenario join today's lists: the ready cross-linking in its
  // room, the PDT waiting for its check in the last PDT slot.
  for (const [note, room, slotIndex] of [
    ['Demo today: ready CXL', cxlRoom, 1],
    ['Demo today: PDT for check', pdtRoom, 7],
  ] as const) {
    const list = listIds.get(`${todayIndex}:${room}`);
    const [order] = await dataSource.query(
      'SELECT o.id, o.patient_id AS patientId, o.eye FROM treatment_order o WHERE o.note = ? AND NOT EXISTS (SELECT 1 FROM list_booking b WHERE b.order_id = o.id)',
      [note],
    );
    if (!list || !order) continue;
    const shape =
      room === cxlRoom
        ? { listDate: list.date, startTime: '09:00', sessionLengthMin: 240, slotMin: 60 }
        : { listDate: list.date, startTime: '08:30', sessionLengthMin: 240, slotMin: 30 };
    const slot = listSlots(shape, unitTimeZone)[slotIndex]!;
    await dataSource.query(
      'INSERT IGNORE INTO list_booking (list_id, slot_index, order_id, patient_id, eye, booking_date, starts_at, ends_at, booked_by) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)',
      [
        list.id,
        slotIndex,
        order.id,
        order.patientId,
        order.eye,
        list.date,
        slot.startsAt,
        slot.endsAt,
        clinicianId,
      ],
    );
    added++;
  }
  if (added > 0)
    await createAuditRepository(dataSource).append({
      actorUserId: null,
      action: 'demo.lists-and-stock-loaded',
      details: { added },
    });
  return added;
}
