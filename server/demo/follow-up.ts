import type { DataSource } from 'typeorm';
import { acuityFromEntry, type AcuityNotation } from '../../shared/engine/visual-acuity';
import type { RecordComplication } from '../../shared/schemas/follow-up';
import { createAuditRepository } from '../audit/repository';
import { systemClock } from '../clock';
import { TreatmentOrder } from '../db/entities/treatment-order';
import { createUnitOfWork } from '../db/unit-of-work';
import { createEndedTreatmentQueries, createFollowUpRepository } from '../follow-up/repository';
import { createFollowUpService } from '../follow-up/service';
import { createUserRepository } from '../people/repository';
import { demoDomain } from './seed';

type Acuity = [AcuityNotation, string];
type PdtVisit = {
  acuity: Acuity;
  cstUm: number;
  fluid: 'present' | 'resolved';
  leakage: 'none' | 'present' | 'not-done';
  decision: 'retreat' | 'observe' | 'discharge';
};
type CxlVisit = {
  acuity: Acuity;
  kmaxD: number;
  pachyUm: number;
  ecc: number | null;
  haze: number;
};

/**
 * Invented follow-up of the demo histories (server/demo/scenario.ts): fluid that resolves after
 * half-dose PDT, fluid that persists and is re-treated, corneas that flatten or hold after
 * cross-linking with transient haze, one visit left overdue, and two complications.
 */
const demoFollowUp: Record<
  string,
  {
    visits: Record<string, PdtVisit | CxlVisit>;
    complication?: Omit<RecordComplication, 'orderId' | 'onsetOn'> & { onsetAfterDays: number };
  }
> = {
  h01: {
    visits: {
      baseline: {
        acuity: ['snellen-m', '6/24'],
        cstUm: 420,
        fluid: 'present',
        leakage: 'present',
        decision: 'observe',
      },
      'week-6': {
        acuity: ['snellen-m', '6/18'],
        cstUm: 352,
        fluid: 'present',
        leakage: 'none',
        decision: 'observe',
      },
      'month-3': {
        acuity: ['snellen-m', '6/18'],
        cstUm: 371,
        fluid: 'present',
        leakage: 'present',
        decision: 'retreat',
      },
    },
  },
  h02: {
    visits: {
      baseline: {
        acuity: ['snellen-ft', '20/60'],
        cstUm: 365,
        fluid: 'present',
        leakage: 'present',
        decision: 'observe',
      },
    },
  },
  h03: {
    visits: {
      baseline: {
        acuity: ['snellen-m', '6/12'],
        cstUm: 388,
        fluid: 'present',
        leakage: 'present',
        decision: 'observe',
      },
      'week-6': {
        acuity: ['snellen-m', '6/9'],
        cstUm: 281,
        fluid: 'resolved',
        leakage: 'not-done',
        decision: 'observe',
      },
    },
  },
  // h04's 6-week visit is left unrecorded: it shows on the clinician's Today as overdue.
  h04: {
    visits: {
      baseline: {
        acuity: ['decimal', '0.4'],
        cstUm: 402,
        fluid: 'present',
        leakage: 'present',
        decision: 'observe',
      },
    },
  },
  h05: {
    visits: {
      baseline: {
        acuity: ['etdrs-letters', '58'],
        cstUm: 455,
        fluid: 'present',
        leakage: 'present',
        decision: 'observe',
      },
    },
    complication: {
      kind: 'infusion-back-pain',
      severity: 'mild',
      outcome: 'resolved',
      note: 'Lower back pain during the infusion; eased when the infusion finished (demo).',
      onsetAfterDays: 0,
    },
  },
  h06: {
    visits: {
      baseline: { acuity: ['snellen-m', '6/12'], kmaxD: 54.2, pachyUm: 452, ecc: 2650, haze: 0 },
      'month-1': { acuity: ['snellen-m', '6/18'], kmaxD: 55.0, pachyUm: 428, ecc: null, haze: 2 },
      'month-3': { acuity: ['snellen-m', '6/12'], kmaxD: 53.8, pachyUm: 441, ecc: 2590, haze: 1 },
    },
    complication: {
      kind: 'corneal-haze',
      severity: 'mild',
      outcome: 'resolving',
      note: 'Grade 2 stromal haze at one month, fading by three months (demo).',
      onsetAfterDays: 30,
    },
  },
  h07: {
    visits: {
      baseline: { acuity: ['decimal', '0.6'], kmaxD: 51.6, pachyUm: 470, ecc: 2810, haze: 0 },
      'month-1': { acuity: ['decimal', '0.5'], kmaxD: 52.1, pachyUm: 455, ecc: null, haze: 1 },
    },
  },
  h08: {
    visits: {
      baseline: { acuity: ['logmar', '0.20'], kmaxD: 49.3, pachyUm: 489, ecc: 2720, haze: 0 },
      'month-1': { acuity: ['logmar', '0.22'], kmaxD: 49.5, pachyUm: 476, ecc: null, haze: 1 },
    },
  },
  h09: {
    visits: {
      baseline: { acuity: ['snellen-m', '6/9'], kmaxD: 47.9, pachyUm: 468, ecc: 2900, haze: 0 },
    },
  },
  h10: {
    visits: {
      baseline: { acuity: ['snellen-m', '6/7.5'], kmaxD: 50.4, pachyUm: 458, ecc: 2760, haze: 0 },
    },
  },
  h11: {
    visits: {
      baseline: {
        acuity: ['counting-fingers', ''],
        cstUm: 512,
        fluid: 'present',
        leakage: 'present',
        decision: 'observe',
      },
    },
  },
};

/** Plans and records the demo follow-up once; a rerun records nothing twice. Returns visits recorded. */
export async function seedDemoFollowUp(
  dataSource: DataSource,
  unitTimeZone: string,
): Promise<number> {
  const clinician = await createUserRepository(dataSource).findByEmail(`clinician@${demoDomain}`);
  if (!clinician) return 0;
  const followUps = createFollowUpRepository(dataSource);
  const service = createFollowUpService({
    unitOfWork: createUnitOfWork(dataSource),
    clock: systemClock,
    followUps,
    treatments: createEndedTreatmentQueries(dataSource),
    audit: createAuditRepository(dataSource),
    unitTimeZone,
    unitName: 'Marram Point Eye Unit',
    uploadDir: '.data/uploads',
  });
  await service.planMissing();
  const orders = dataSource.getRepository(TreatmentOrder);
  let recorded = 0;
  for (const [key, plan] of Object.entries(demoFollowUp)) {
    const order = await orders.findOne({
      where: { note: `Demo history ${key}` },
      select: { id: true },
    });
    if (!order) continue;
    const visits = await followUps.visitsOfOrders([order.id]);
    for (const visit of visits) {
      const findings = plan.visits[visit.visitKey];
      if (!findings || visit.recordedAt || visit.dueOn > service.today()) continue;
      const acuity = acuityFromEntry({ notation: findings.acuity[0], value: findings.acuity[1] });
      const pdt = 'cstUm' in findings ? findings : null;
      const cxl = 'kmaxD' in findings ? findings : null;
      const done = await followUps.recordVisit(
        visit.id,
        {
          seenOn: visit.dueOn,
          acuityNotation: acuity.notation,
          acuityEntry: acuity.entry,
          acuityLogMar: acuity.logMar,
          centralSubfieldThicknessUm: pdt?.cstUm ?? null,
          subretinalFluid: pdt?.fluid ?? null,
          leakage: pdt?.leakage ?? null,
          retreatmentDecision: pdt?.decision ?? null,
          kmaxD: cxl?.kmaxD ?? null,
          thinnestPachymetryUm: cxl?.pachyUm ?? null,
          endothelialCellsPerMm2: cxl?.ecc ?? null,
          hazeGrade: cxl?.haze ?? null,
          note: null,
        },
        clinician.id,
        new Date(),
      );
      if (done) recorded += 1;
    }
    const complication = plan.complication;
    if (complication) {
      const existing = await followUps.complicationsOfOrders([order.id]);
      if (existing.length === 0) {
        const treatment = await service.mustFindTreatment(order.id);
        const treatedOn = visits.find((v) => v.visitKey === 'baseline')?.dueOn ?? service.today();
        const onset = new Date(`${treatedOn}T12:00:00Z`);
        onset.setUTCDate(onset.getUTCDate() + complication.onsetAfterDays);
        const { onsetAfterDays: _days, ...fields } = complication;
        await service.addComplication(
          { id: clinician.id, roles: ['clinician'] },
          {
            ...fields,
            orderId: treatment.orderId,
            onsetOn: onset.toISOString().slice(0, 10),
            followUpVisitId:
              complication.onsetAfterDays > 0
                ? (visits.find((v) => v.offsetDays === complication.onsetAfterDays)?.id ?? null)
                : null,
          },
        );
      }
    }
  }
  return recorded;
}
