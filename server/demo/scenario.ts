import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import { computePlan } from '../../shared/engine/compute-plan';
import type { PlanInputs } from '../../shared/schemas/calculation';
import type { ChecklistAnswer } from '../../shared/schemas/orders';
import { deriveDoseRecord } from '../../shared/session/dose-record';
import { findDeviations } from '../../shared/session/deviations';
import type { SessionEventInput } from '../../shared/session/session-events';
import { createAuditRepository } from '../audit/repository';
import { ProtocolVersion } from '../db/entities/protocol-version';
import { SessionEventRow } from '../db/entities/session-event';
import { TreatmentOrder } from '../db/entities/treatment-order';
import { asTransaction } from '../db/unit-of-work';
import { createPatientRepository } from '../patients/repository';
import { createUserRepository } from '../people/repository';
import { addParticipant, createSessionRepository, recordOrderFacts } from '../sessions/repository';
import { demoDeviceStart, demoLensWithFactor } from './devices';
import { demoDomain, demoPatients } from './seed';

/**
 * The demo orders use each protocol's newest approved version, as a new order would: older
 * versions may refuse a plan (v1 of the PDT protocols rounds volumes too coarsely for the 1%
 * drawn-dose rule).
 */
export async function newestApprovedVersion(
  dataSource: DataSource,
  key: string,
): Promise<ProtocolVersion> {
  const [newest] = await dataSource
    .getRepository(ProtocolVersion)
    .find({ where: { key, status: 'approved' }, order: { version: 'DESC' }, take: 1 });
  if (!newest) throw new Error(`the demo needs an approved version of protocol ${key}`);
  return newest;
}

/** A script line: seconds from the session start, and the event as the tablet would send it. */
type ScriptEvent = {
  type: SessionEventInput['type'];
  stepId?: string;
  checks?: Record<string, true>;
  thicknessUm?: number;
  exposureS?: number;
  item?: string;
  reason?: string;
};
export type Step = [offsetS: number, event: ScriptEvent];
const checks = {
  patientIdentity: true,
  treatmentEye: true,
  consent: true,
  eyewear: true,
  deviceSettings: true,
} as const;

const identityChecked = { patientName: true, dateOfBirth: true, treatmentEye: true } as const;

/** The after-care checklist ticked in the minutes after the step starts. */
function aftercareDone(stepId: string, fromS: number): Step[] {
  return [
    [fromS + 60, { type: 'aftercare-checked', stepId, item: 'advice' }],
    [fromS + 120, { type: 'aftercare-checked', stepId, item: 'sheet-printed' }],
    [fromS + 150, { type: 'aftercare-checked', stepId, item: 'contact-number' }],
  ];
}

/** A standard PDT session; `lightLateS` moves the laser later, as when the laser room was busy. */
export function pdtScript(lightLateS = 0): Step[] {
  const light = 60 + 900 + lightLateS;
  return [
    [0, { type: 'session-started', checks }],
    [60, { type: 'step-started', stepId: 'infusion' }],
    [660, { type: 'step-ended', stepId: 'infusion' }],
    [660, { type: 'step-started', stepId: 'wait-for-light' }],
    [light - 30, { type: 'identity-confirmed', stepId: 'laser', checks: identityChecked }],
    [light, { type: 'step-ended', stepId: 'wait-for-light' }],
    [light, { type: 'step-started', stepId: 'laser' }],
    [light + 83, { type: 'step-ended', stepId: 'laser' }],
    // What the laser displayed, entered by the nurse at the end of the light step.
    [light + 88, { type: 'exposure-recorded', stepId: 'laser', exposureS: 83 }],
    [light + 90, { type: 'step-started', stepId: 'aftercare' }],
    ...aftercareDone('aftercare', light + 90),
    [light + 400, { type: 'step-ended', stepId: 'aftercare' }],
    [light + 410, { type: 'session-completed' }],
  ];
}

/** A CXL session: soak with drops every interval, a thickness reading, UV with drops. */
export function cxlScript(opts: {
  soakS: number;
  dropEveryS: number;
  uvS: number;
  uvDropEveryS: number;
  thicknessUm: number;
  missedDropAtS?: number;
}): Step[] {
  const steps: Step[] = [
    [0, { type: 'session-started', checks }],
    [30, { type: 'step-started', stepId: 'epithelium-removal' }],
    [330, { type: 'step-ended', stepId: 'epithelium-removal' }],
    [330, { type: 'step-started', stepId: 'riboflavin-soak' }],
  ];
  for (let t = opts.dropEveryS; t <= opts.soakS; t += opts.dropEveryS) {
    if (opts.missedDropAtS !== undefined && t === opts.missedDropAtS) continue;
    steps.push([330 + t, { type: 'drop-given', stepId: 'riboflavin-soak' }]);
  }
  const soakEnd = 330 + opts.soakS;
  steps.push(
    [
      soakEnd,
      {
        type: 'step-ended',
        stepId: 'riboflavin-soak',
        // The demo's short soak (the protocols soak 30 min) is ended with the reason it was cut short.
        ...(opts.soakS < 1800 ? { reason: 'Patient could not keep still any longer.' } : {}),
      },
    ],
    [soakEnd, { type: 'step-started', stepId: 'thickness-check' }],
    [
      soakEnd + 40,
      { type: 'thickness-measured', stepId: 'thickness-check', thicknessUm: opts.thicknessUm },
    ],
    [soakEnd + 50, { type: 'identity-confirmed', stepId: 'uv-exposure', checks: identityChecked }],
    [soakEnd + 60, { type: 'step-ended', stepId: 'thickness-check' }],
    [soakEnd + 60, { type: 'step-started', stepId: 'uv-exposure' }],
  );
  for (let t = opts.uvDropEveryS; t < opts.uvS; t += opts.uvDropEveryS)
    steps.push([soakEnd + 60 + t, { type: 'drop-given', stepId: 'uv-exposure' }]);
  const uvEnd = soakEnd + 60 + opts.uvS;
  steps.push(
    [uvEnd, { type: 'step-ended', stepId: 'uv-exposure' }],
    [uvEnd + 10, { type: 'step-started', stepId: 'aftercare' }],
    ...aftercareDone('aftercare', uvEnd + 10),
    [uvEnd + 300, { type: 'step-ended', stepId: 'aftercare' }],
    [uvEnd + 310, { type: 'session-completed' }],
  );
  return steps;
}

interface HistoryItem {
  key: string;
  recordNumber: string;
  eye: 'right' | 'left';
  protocol: string;
  daysAgo: number;
  /** Local hour of the session start (the unit works days). */
  hour: number;
  inputs: PlanInputs;
  script: Step[];
}

const adult = (
  p: (typeof demoPatients)[number],
  imperial = false,
): Pick<PlanInputs, 'height' | 'weight'> =>
  imperial
    ? {
        height: { value: Math.round((p.heightCm / 2.54) * 10) / 10, unit: 'in' },
        weight: { value: Math.round((p.weightKg / 0.45359237) * 10) / 10, unit: 'lb' },
      }
    : { height: { value: p.heightCm, unit: 'cm' }, weight: { value: p.weightKg, unit: 'kg' } };
const patient = (recordNumber: string) =>
  demoPatients.find((p) => p.recordNumber === recordNumber)!;

/** The unit's recent past: mostly on-protocol sessions, and a few realistic departures. */
export const demoHistory: HistoryItem[] = [
  {
    key: 'h01',
    recordNumber: 'MP-100201',
    eye: 'right',
    protocol: 'pdt-standard',
    daysAgo: 118,
    hour: 9,
    inputs: { ...adult(patient('MP-100201')), lesionGldUm: 2600, lensMagnification: 1.05 },
    script: pdtScript(),
  },
  {
    key: 'h02',
    recordNumber: 'MP-100201',
    eye: 'right',
    protocol: 'pdt-standard',
    daysAgo: 24,
    hour: 10,
    inputs: { ...adult(patient('MP-100201')), lesionGldUm: 2200, lensMagnification: 1.05 },
    script: pdtScript(180),
  },
  {
    key: 'h03',
    recordNumber: 'MP-100202',
    eye: 'left',
    protocol: 'pdt-half-dose',
    daysAgo: 75,
    hour: 11,
    inputs: { ...adult(patient('MP-100202'), true), lesionGldUm: 1800, lensMagnification: 0.94 },
    script: pdtScript(),
  },
  {
    key: 'h04',
    recordNumber: 'MP-100205',
    eye: 'right',
    protocol: 'pdt-half-fluence',
    daysAgo: 52,
    hour: 9,
    inputs: { ...adult(patient('MP-100205')), lesionGldUm: 3100, lensMagnification: 1.6 },
    script: pdtScript(),
  },
  {
    key: 'h05',
    recordNumber: 'MP-100211',
    eye: 'left',
    protocol: 'pdt-standard',
    daysAgo: 33,
    hour: 14,
    inputs: { ...adult(patient('MP-100211'), true), lesionGldUm: 4000, lensMagnification: 0.94 },
    script: pdtScript(150),
  },
  {
    key: 'h06',
    recordNumber: 'MP-100207',
    eye: 'right',
    protocol: 'cxl-standard',
    daysAgo: 96,
    hour: 9,
    inputs: { stromalThicknessUm: 452 },
    script: cxlScript({
      soakS: 1800,
      dropEveryS: 120,
      uvS: 1800,
      uvDropEveryS: 300,
      thicknessUm: 446,
    }),
  },
  {
    key: 'h07',
    recordNumber: 'MP-100208',
    eye: 'left',
    protocol: 'cxl-accelerated',
    daysAgo: 61,
    hour: 10,
    inputs: { stromalThicknessUm: 470 },
    script: cxlScript({
      soakS: 1500,
      dropEveryS: 120,
      uvS: 600,
      uvDropEveryS: 120,
      thicknessUm: 462,
    }),
  },
  {
    key: 'h08',
    recordNumber: 'MP-100209',
    eye: 'right',
    protocol: 'cxl-accelerated-pulsed',
    daysAgo: 40,
    hour: 11,
    inputs: { stromalThicknessUm: 489 },
    script: cxlScript({
      soakS: 1800,
      dropEveryS: 120,
      uvS: 480,
      uvDropEveryS: 120,
      thicknessUm: 480,
    }),
  },
  {
    key: 'h09',
    recordNumber: 'MP-100212',
    eye: 'left',
    protocol: 'cxl-standard',
    daysAgo: 19,
    hour: 9,
    inputs: { stromalThicknessUm: 468 },
    script: cxlScript({
      soakS: 1800,
      dropEveryS: 120,
      uvS: 1800,
      uvDropEveryS: 300,
      thicknessUm: 455,
      missedDropAtS: 840,
    }),
  },
  {
    key: 'h10',
    recordNumber: 'MP-100207',
    eye: 'left',
    protocol: 'cxl-accelerated',
    daysAgo: 9,
    hour: 13,
    inputs: { stromalThicknessUm: 458 },
    script: cxlScript({
      soakS: 1800,
      dropEveryS: 120,
      uvS: 600,
      uvDropEveryS: 120,
      thicknessUm: 449,
    }),
  },
  {
    key: 'h11',
    recordNumber: 'MP-100203',
    eye: 'left',
    protocol: 'pdt-standard',
    daysAgo: 5,
    hour: 10,
    inputs: { ...adult(patient('MP-100203')), lesionGldUm: 2900, lensMagnification: 0.94 },
    script: pdtScript(),
  },
];

const noAnswers = (definition: ProtocolVersion['definition']): ChecklistAnswer[] =>
  definition.contraindications.map((c) => ({ id: c.id, answer: 'no' }));

/**
 * Loads the demo unit's history of treatments (sessions with events, dose records and a few
 * deviations) and today's open orders. Each item is written once: a rerun finds it by its note.
 */
export async function seedDemoScenario(
  dataSource: DataSource,
  unitTimeZone: string,
): Promise<number> {
  const { DateTime } = await import('luxon');
  const users = createUserRepository(dataSource);
  const patients = createPatientRepository(dataSource);
  const sessions = createSessionRepository(dataSource);
  const audit = createAuditRepository(dataSource);
  const clinician = await users.findByEmail(`clinician@${demoDomain}`);
  const pharmacist = await users.findByEmail(`pharmacist@${demoDomain}`);
  const nurse = await users.findByEmail(`nurse@${demoDomain}`);
  if (!clinician || !pharmacist || !nurse) return 0;
  const orderRepo = dataSource.getRepository(TreatmentOrder);
  let added = 0;

  for (const item of demoHistory) {
    const note = `Demo history ${item.key}`;
    if (await orderRepo.exists({ where: { note } })) continue;
    const pv = await newestApprovedVersion(dataSource, item.protocol);
    const who = await patients.findByRecordNumber(item.recordNumber);
    if (!who) continue;
    const plan = computePlan(pv.definition, item.inputs);
    const start = DateTime.now()
      .setZone(unitTimeZone)
      .minus({ days: item.daysAgo })
      .set({ hour: item.hour, minute: 5, second: 0, millisecond: 0 });
    const startMs = start.toMillis();
    const signedAt = new Date(startMs - 3 * 3600_000);

    await dataSource.transaction(async (manager) => {
      const order = await manager.getRepository(TreatmentOrder).save({
        patientId: who.id,
        eye: item.eye,
        protocolVersionId: pv.id,
        protocolSha256: pv.sha256,
        status: 'completed',
        revision: 1,
        previousRevisionId: null,
        amendmentReason: null,
        inputs: item.inputs,
        plan,
        engineVersion: plan.engineVersion,
        checklist: noAnswers(pv.definition),
        softLimitReasons: {},
        retreatmentReason: null,
        note,
        createdById: clinician.id,
        signedById: clinician.id,
        signedAt,
        signatureMeaning: 'ordered',
        returnComment: null,
        beyondUseAt: null,
      });
      await manager.query('UPDATE treatment_order SET created_at = ? WHERE id = ?', [
        new Date(signedAt.getTime() - 600_000),
        order.id,
      ]);
      await patients.recordMeasurement(
        asTransaction(manager),
        { patientId: who.id, orderId: order.id, measuredAt: signedAt },
        item.inputs,
      );
      let preparation = null;
      if (pv.definition.drug) {
        // Dated that morning, not when the demo was loaded (dose checks are append-only, so set at insert).
        await manager.query(
          "INSERT INTO dose_check (order_id, pharmacist_id, bsa_m2, dose_mg, drug_volume_ml, outcome, differing, created_at) VALUES (?, ?, ?, ?, ?, 'match', '[]', ?)",
          [
            order.id,
            pharmacist.id,
            plan.bsaM2,
            plan.doseMg,
            plan.drugVolumeMl,
            new Date(signedAt.getTime() + 45 * 60_000),
          ],
        );
        const reconstitutedAt = new Date(startMs - 30 * 60_000);
        const beyondUseAt = new Date(
          reconstitutedAt.getTime() + pv.definition.drug.beyondUseH * 3600_000,
        );
        // Preparations are append-only too: dated at insert.
        await manager.query(
          'INSERT INTO preparation (order_id, pharmacist_id, vial_lot, vial_expiry, reconstituted_at, volume_drawn_ml, beyond_use_at, created_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?)',
          [
            order.id,
            pharmacist.id,
            `DEMO-${item.key.toUpperCase()}`,
            start.plus({ months: 8 }).toISODate()!,
            reconstitutedAt,
            plan.drugVolumeMl!,
            beyondUseAt,
            reconstitutedAt,
          ],
        );
        await manager.update(TreatmentOrder, { id: order.id }, { beyondUseAt });
        preparation = {
          reconstitutedAt: reconstitutedAt.toISOString(),
          beyondUseAt: beyondUseAt.toISOString(),
        };
      }
      // The session names its device (server/demo/devices.ts), as a start on the app would.
      const deviceStart = await demoDeviceStart(
        dataSource,
        pv.definition,
        plan,
        (item.inputs as { lensMagnification?: number }).lensMagnification,
      );
      const rows = item.script.map(([offsetS, event]) => ({
        orderId: order.id,
        idempotencyKey: randomUUID(),
        type: event.type,
        stepId: event.stepId ?? null,
        clientTime: new Date(startMs + offsetS * 1000),
        serverTime: new Date(startMs + offsetS * 1000 + 150),
        recordedBy: nurse.id,
        payload: {
          ...event,
          ...(event.type === 'session-started' && deviceStart ? deviceStart : {}),
          idempotencyKey: '',
          clientTime: new Date(startMs + offsetS * 1000).toISOString(),
        } as unknown as SessionEventRow['payload'] & object,
      }));
      for (const row of rows)
        (row.payload as { idempotencyKey: string }).idempotencyKey = row.idempotencyKey;
      await manager.getRepository(SessionEventRow).insert(rows);
      const events = await sessions.eventsFor(order.id, asTransaction(manager));
      const record = deriveDoseRecord({ protocol: pv.definition, plan, events });
      const found = findDeviations({
        protocol: pv.definition,
        plan,
        record,
        checklist: noAnswers(pv.definition),
        preparation,
        unitTimeZone,
      });
      await sessions.reconcileDeviations(
        asTransaction(manager),
        order.id,
        pv.id,
        found,
        new Date(startMs + 3600_000),
      );
      // Deviations belong to the session's day, for the monthly figures; dated before the record
      // exists, because an ended session's deviations are closed to change (migration DatabaseIntegrity).
      await manager.query('UPDATE deviation SET detected_at = ? WHERE order_id = ?', [
        new Date(startMs + 3600_000),
        order.id,
      ]);
      await sessions.saveRecord(asTransaction(manager), order.id, record, {
        protocolVersionId: pv.id,
        unitTimeZone,
        deviationCount: found.length,
        order: recordOrderFacts({ eye: item.eye, patientId: who.id, plan }),
      });
      await addParticipant(asTransaction(manager), order.id, clinician.id, 'ordered');
      await addParticipant(asTransaction(manager), order.id, nurse.id, 'nursed');
      if (preparation) {
        await addParticipant(asTransaction(manager), order.id, pharmacist.id, 'checked');
        await addParticipant(asTransaction(manager), order.id, pharmacist.id, 'prepared');
      }
    });
    added++;
  }

  // Today's open work: a ready CXL order for the nurse, a signed PDT order for the pharmacist.
  const today: {
    note: string;
    recordNumber: string;
    eye: 'right' | 'left';
    protocol: string;
    inputs: PlanInputs;
    status: 'ready' | 'signed' | 'draft';
  }[] = [
    {
      note: 'Demo today: ready CXL',
      recordNumber: 'MP-100212',
      eye: 'right',
      protocol: 'cxl-standard',
      inputs: { stromalThicknessUm: 474 },
      status: 'ready',
    },
    {
      note: 'Demo today: PDT for check',
      recordNumber: 'MP-100206',
      eye: 'right',
      protocol: 'pdt-standard',
      inputs: { ...adult(patient('MP-100206')), lesionGldUm: 2400, lensMagnification: 1.05 },
      status: 'signed',
    },
    {
      note: 'Demo today: PDT draft',
      recordNumber: 'MP-100210',
      eye: 'left',
      protocol: 'pdt-half-fluence',
      inputs: { ...adult(patient('MP-100210'), true), lesionGldUm: 1900, lensMagnification: 1.05 },
      status: 'draft',
    },
  ];
  for (const item of today) {
    if (await orderRepo.exists({ where: { note: item.note } })) continue;
    const pv = await newestApprovedVersion(dataSource, item.protocol);
    const who = await patients.findByRecordNumber(item.recordNumber);
    if (!who) continue;
    // Today's PDT orders pick their lens from the register, as the order form does.
    const factor = item.inputs.lensMagnification;
    const lens = factor === undefined ? null : await demoLensWithFactor(dataSource, factor);
    const inputs: PlanInputs = lens ? { ...item.inputs, lensId: lens.id } : item.inputs;
    const plan = computePlan(pv.definition, inputs);
    const signed = item.status !== 'draft';
    const signedAt = new Date();
    const saved = await orderRepo.save({
      patientId: who.id,
      eye: item.eye,
      protocolVersionId: pv.id,
      protocolSha256: pv.sha256,
      status: item.status,
      revision: 1,
      inputs,
      plan,
      engineVersion: plan.engineVersion,
      checklist: noAnswers(pv.definition),
      softLimitReasons: {},
      retreatmentReason: null,
      note: item.note,
      createdById: clinician.id,
      signedById: signed ? clinician.id : null,
      signedAt: signed ? signedAt : null,
      signatureMeaning: signed ? 'ordered' : null,
    });
    if (signed)
      await patients.recordMeasurement(
        asTransaction(dataSource.manager),
        { patientId: who.id, orderId: saved.id, measuredAt: signedAt },
        inputs,
      );
    added++;
  }
  if (added > 0)
    await audit.append({ actorUserId: null, action: 'demo.scenario-loaded', details: { added } });
  return added;
}
