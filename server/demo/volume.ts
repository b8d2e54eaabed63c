import { randomUUID } from 'node:crypto';
import { DateTime } from 'luxon';
import type { DataSource, EntityManager } from 'typeorm';
import { computePlan } from '../../shared/engine/compute-plan';
import type { DosePlan, PlanInputs } from '../../shared/schemas/calculation';
import { deriveDoseRecord } from '../../shared/session/dose-record';
import { findDeviations } from '../../shared/session/deviations';
import type { SessionEvent } from '../../shared/session/session-events';
import { type ProtocolVersion } from '../db/entities/protocol-version';
import { createUserRepository } from '../people/repository';
import { recordOrderFacts } from '../sessions/repository';
import { cxlScript, newestApprovedVersion, pdtScript, type Step } from './scenario';
import { demoDomain } from './seed';

/** A small seeded generator (mulberry32), so two runs with one seed make the same data. */
function random(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

async function insertMany(
  manager: EntityManager,
  table: string,
  columns: string[],
  rows: unknown[][],
  chunk = 500,
) {
  for (let i = 0; i < rows.length; i += chunk) {
    const part = rows.slice(i, i + chunk);
    const placeholders = part.map(() => `(${columns.map(() => '?').join(',')})`).join(',');
    await manager.query(
      `INSERT INTO \`${table}\` (${columns.map((c) => `\`${c}\``).join(',')}) VALUES ${placeholders}`,
      part.flat(),
    );
  }
}

const protocolMix: [key: string, weight: number][] = [
  ['pdt-standard', 30],
  ['pdt-half-dose', 15],
  ['pdt-half-fluence', 10],
  ['pdt-half-time', 5],
  ['cxl-standard', 15],
  ['cxl-accelerated', 15],
  ['cxl-accelerated-pulsed', 10],
];

/**
 * Fills the database with `count` fictitious completed sessions (with their events, dose records,
 * deviations and participants) spread over the last 18 months, for measuring. Patients are
 * invented as "Volume Test" records. Runs in batches; prints progress when asked.
 */
export async function seedVolume(
  dataSource: DataSource,
  count: number,
  options: { unitTimeZone: string; seed?: number; onProgress?: (done: number) => void },
) {
  const rand = random(options.seed ?? 20261201);
  const users = createUserRepository(dataSource);
  const [clinician, pharmacist, nurse, chargeNurse] = await Promise.all(
    ['clinician', 'pharmacist', 'nurse', 'charge-nurse'].map((r) =>
      users.findByEmail(`${r}@${demoDomain}`),
    ),
  );
  if (!clinician || !pharmacist || !nurse || !chargeNurse)
    throw new Error('seed the demo people first (npm start does)');
  const versions = new Map<string, ProtocolVersion>();
  for (const [key] of protocolMix) versions.set(key, await newestApprovedVersion(dataSource, key));
  const totalWeight = protocolMix.reduce((s, [, w]) => s + w, 0);
  const pick = () => {
    let r = rand() * totalWeight;
    for (const [key, w] of protocolMix) if ((r -= w) < 0) return key;
    return protocolMix[0]![0];
  };
  const plans = new Map<string, { inputs: PlanInputs; plan: DosePlan; planJson: string }>();
  for (const [key, pv] of versions) {
    const inputs: PlanInputs =
      pv.kind === 'pdt'
        ? {
            height: { value: 170, unit: 'cm' },
            weight: { value: 72, unit: 'kg' },
            lesionGldUm: 2500,
            lensMagnification: 1,
          }
        : { stromalThicknessUm: 460 };
    const plan = computePlan(pv.definition, inputs);
    plans.set(key, { inputs, plan, planJson: JSON.stringify(plan) });
  }

  const patientCount = Math.max(1, Math.ceil(count / 20));
  const run = `${Date.now().toString(36)}`;
  const firstPatient =
    Number((await dataSource.query('SELECT COALESCE(MAX(id), 0) AS m FROM patient'))[0].m) + 1;
  await dataSource.transaction((m) =>
    insertMany(
      m,
      'patient',
      [
        'id',
        'record_number',
        'given_name',
        'family_name',
        'date_of_birth',
        'email',
        'email_consent',
      ],
      Array.from({ length: patientCount }, (_, i) => [
        firstPatient + i,
        `VT${run.slice(-6)}${String(i).padStart(6, '0')}`.slice(0, 20),
        'Volume',
        `Test ${i + 1}`,
        '1960-01-01',
        null,
        0,
      ]),
    ),
  );

  const now = Date.now();
  const batch = 1000;
  for (let done = 0; done < count; done += batch) {
    const size = Math.min(batch, count - done);
    const firstOrder =
      Number(
        (await dataSource.query('SELECT COALESCE(MAX(id), 0) AS m FROM treatment_order'))[0].m,
      ) + 1;
    const orders: unknown[][] = [];
    const events: unknown[][] = [];
    const records: unknown[][] = [];
    const deviations: unknown[][] = [];
    const participants: unknown[][] = [];
    const checks: unknown[][] = [];
    const preparations: unknown[][] = [];
    for (let i = 0; i < size; i++) {
      const id = firstOrder + i;
      const key = pick();
      const pv = versions.get(key)!;
      const { inputs, plan, planJson } = plans.get(key)!;
      const startMs = now - Math.floor(rand() * 540 * 86_400_000) - 3_600_000;
      const roll = rand();
      let script: Step[];
      if (pv.kind === 'pdt') {
        script = pdtScript(roll < 0.07 ? 120 + Math.floor(rand() * 180) : 0);
      } else {
        const uvS = pv.definition.steps.find((s) => s.kind === 'uv')!.durationS!;
        script = cxlScript({
          soakS: roll < 0.05 ? 1500 : 1800,
          dropEveryS: 120,
          uvS,
          uvDropEveryS: 120,
          thicknessUm: 440 + Math.floor(rand() * 60),
          missedDropAtS: roll > 0.95 ? 840 : undefined,
        });
      }
      const nurseId = rand() < 0.7 ? nurse.id : chargeNurse.id;
      const sessionEvents: SessionEvent[] = script.map(
        ([offsetS, e], n) =>
          ({
            ...(e as object),
            idempotencyKey: randomUUID(),
            clientTime: new Date(startMs + offsetS * 1000).toISOString(),
            id: n + 1,
            serverTime: new Date(startMs + offsetS * 1000).toISOString(),
            recordedBy: nurseId,
          }) as SessionEvent,
      );
      const reconstitutedAt = new Date(startMs - 30 * 60_000);
      const preparation = pv.definition.drug
        ? {
            reconstitutedAt: reconstitutedAt.toISOString(),
            beyondUseAt: new Date(
              reconstitutedAt.getTime() + pv.definition.drug.beyondUseH * 3_600_000,
            ).toISOString(),
          }
        : null;
      const record = deriveDoseRecord({ protocol: pv.definition, plan, events: sessionEvents });
      const found = findDeviations({
        protocol: pv.definition,
        plan,
        record,
        checklist: [],
        preparation,
        unitTimeZone: options.unitTimeZone,
      });
      const signedAt = new Date(startMs - 2 * 3_600_000);
      const patientId = firstPatient + Math.floor(rand() * patientCount);
      const eye = rand() < 0.5 ? 'right' : 'left';
      const facts = recordOrderFacts({ eye, patientId, plan });
      orders.push([
        id,
        patientId,
        eye,
        pv.id,
        pv.sha256,
        found.length ? 'completed' : 'completed',
        1,
        JSON.stringify(inputs),
        planJson,
        plan.engineVersion,
        '[]',
        '{}',
        `Volume ${run}`,
        clinician.id,
        clinician.id,
        signedAt,
        'ordered',
        preparation ? new Date(preparation.beyondUseAt) : null,
        signedAt,
        signedAt,
      ]);
      for (const e of sessionEvents)
        events.push([
          id,
          e.idempotencyKey,
          e.type,
          'stepId' in e ? e.stepId : null,
          new Date(e.clientTime),
          new Date(e.clientTime),
          nurseId,
          JSON.stringify({ ...e, id: undefined, serverTime: undefined, recordedBy: undefined }),
        ]);
      const endedAt = record.endedAt ? new Date(record.endedAt) : null;
      records.push([
        id,
        record.outcome,
        record.sessionStartedAt ? new Date(record.sessionStartedAt) : null,
        endedAt,
        pv.kind === 'pdt' ? record.lightOnS : record.uvOnS,
        record.deliveredFluenceJPerCm2,
        pv.kind === 'pdt' ? record.volumeGivenMl : null,
        JSON.stringify(record),
        pv.id,
        endedAt
          ? DateTime.fromJSDate(endedAt).setZone(options.unitTimeZone).toFormat('yyyy-MM')
          : null,
        found.length,
        facts.eye,
        facts.patientId,
        facts.plannedDoseMg,
        facts.plannedFluenceJPerCm2,
      ]);
      for (const d of found) {
        const reviewed = rand() < 0.6;
        deviations.push([
          id,
          d.type,
          d.severity,
          d.expected,
          d.actual,
          d.unit,
          d.message.slice(0, 600),
          new Date(startMs + 3_600_000),
          pv.id,
          reviewed ? 'closed' : 'open',
          reviewed ? 'acceptable' : null,
        ]);
      }
      participants.push([id, clinician.id, 'ordered'], [id, nurseId, 'nursed']);
      if (preparation) {
        participants.push([id, pharmacist.id, 'checked'], [id, pharmacist.id, 'prepared']);
        checks.push([id, pharmacist.id, plan.bsaM2, plan.doseMg, plan.drugVolumeMl, 'match', '[]']);
        preparations.push([
          id,
          pharmacist.id,
          // About forty orders in a row share a lot, as vials of one delivery would.
          `VOL-L${Math.floor(id / 40)}`,
          '2030-01-01',
          reconstitutedAt,
          plan.drugVolumeMl,
          new Date(preparation.beyondUseAt),
        ]);
      }
    }
    await dataSource.transaction(async (m) => {
      await insertMany(
        m,
        'treatment_order',
        [
          'id',
          'patient_id',
          'eye',
          'protocol_version_id',
          'protocol_sha256',
          'status',
          'revision',
          'inputs',
          'plan',
          'engine_version',
          'checklist',
          'soft_limit_reasons',
          'note',
          'created_by',
          'signed_by',
          'signed_at',
          'signature_meaning',
          'beyond_use_at',
          'created_at',
          'updated_at',
        ],
        orders,
        200,
      );
      await insertMany(
        m,
        'session_event',
        [
          'order_id',
          'idempotency_key',
          'type',
          'step_id',
          'client_time',
          'server_time',
          'recorded_by',
          'payload',
        ],
        events,
        1000,
      );
      await insertMany(
        m,
        'dose_record',
        [
          'order_id',
          'outcome',
          'started_at',
          'ended_at',
          'on_time_s',
          'delivered_fluence_j_per_cm2',
          'volume_given_ml',
          'record',
          'protocol_version_id',
          'local_month',
          'deviation_count',
          'eye',
          'patient_id',
          'planned_dose_mg',
          'planned_fluence_j_per_cm2',
        ],
        records,
        500,
      );
      await insertMany(
        m,
        'deviation',
        [
          'order_id',
          'type',
          'severity',
          'expected',
          'actual',
          'unit',
          'message',
          'detected_at',
          'protocol_version_id',
          'review_status',
          'classification',
        ],
        deviations,
      );
      await insertMany(
        m,
        'session_participant',
        ['order_id', 'user_id', 'part'],
        participants,
        1000,
      );
      await insertMany(
        m,
        'dose_check',
        [
          'order_id',
          'pharmacist_id',
          'bsa_m2',
          'dose_mg',
          'drug_volume_ml',
          'outcome',
          'differing',
        ],
        checks,
      );
      await insertMany(
        m,
        'preparation',
        [
          'order_id',
          'pharmacist_id',
          'vial_lot',
          'vial_expiry',
          'reconstituted_at',
          'volume_drawn_ml',
          'beyond_use_at',
        ],
        preparations,
      );
      // The lots in stock and what each preparation took from them, for recall and drug use.
      await m.query(
        `INSERT INTO stock_lot (product, lot, expiry, quantity_on_hand, received_quantity)
         SELECT 'verteporfin', p.vial_lot, '2030-01-01', 0, SUM(JSON_VALUE(o.plan, '$.vials'))
           FROM preparation p JOIN treatment_order o ON o.id = p.order_id
          WHERE p.order_id BETWEEN ? AND ? GROUP BY p.vial_lot
         ON DUPLICATE KEY UPDATE received_quantity = received_quantity + VALUES(received_quantity)`,
        [firstOrder, firstOrder + size - 1],
      );
      await m.query(
        `INSERT INTO preparation_stock (preparation_id, order_id, stock_lot_id, vials_opened, dose_mg, discarded_mg, discard_reason, created_at)
         SELECT p.id, p.order_id, l.id, JSON_VALUE(o.plan, '$.vials'), JSON_VALUE(o.plan, '$.doseMg'),
                COALESCE(JSON_VALUE(o.plan, '$.drugLeftOverMg'), 0), 'Vial remainder (volume seed)', p.reconstituted_at
           FROM preparation p JOIN treatment_order o ON o.id = p.order_id
           JOIN stock_lot l ON l.product = 'verteporfin' AND l.lot = p.vial_lot
          WHERE p.order_id BETWEEN ? AND ?`,
        [firstOrder, firstOrder + size - 1],
      );
    });
    options.onProgress?.(done + size);
  }
  // Fresh statistics, so the optimiser plans the queue with the real sizes at once.
  await dataSource.query(
    'ANALYZE TABLE deviation, dose_record, session_participant, treatment_order',
  );
}
