import type { DoseRecord } from '../session/dose-record';
import {
  fhirSystems,
  loincCodes,
  localCodes,
  snomedCodes,
  type Coding,
  type UcumUnit,
} from './codes';

/** A FHIR resource as plain JSON; the tests hold every bundle to the official R4 JSON schema. */
export type FhirJson = { resourceType: string; id?: string; [key: string]: unknown };

export interface FhirBundleEntry {
  fullUrl?: string;
  resource?: FhirJson;
  request: { method: 'POST' | 'PUT' | 'DELETE'; url: string; ifNoneExist?: string };
}

export interface FhirBundle {
  resourceType: 'Bundle';
  type: 'transaction';
  identifier: { system: string; value: string };
  timestamp: string;
  entry: FhirBundleEntry[];
}

/** One deviation as the bundle reports it. */
export interface DeviationFact {
  type: string;
  severity: string;
  expected: number | null;
  actual: number | null;
  unit: string | null;
  message: string;
  detectedAt: string;
}

/** Everything a treatment's bundle says, read by the server; the builder does no I/O. */
export interface TreatmentFacts {
  orderId: number;
  /** The bundle's version for this order: 1 at the session's end, one more for each later change. */
  version: number;
  builtAt: string;
  kind: 'pdt' | 'cxl';
  protocol: { key: string; version: number; title: string };
  eye: 'right' | 'left';
  patient: {
    recordNumber: string;
    givenName: string;
    familyName: string;
    dateOfBirth: string;
  };
  /** The nurses who ran the session, then the clinician who signed the order. */
  performers: { id: number; name: string; role: 'nurse' | 'clinician' }[];
  /** When height and weight were recorded (the order's signature). */
  measuredAt: string;
  heightCm: number | null;
  weightKg: number | null;
  bsaM2: number | null;
  bsaFormula: string | null;
  /** The pump rate the plan set (mL/min), and the drug as the protocol names it. */
  plannedRateMlPerMin: number | null;
  drug: { name: string } | null;
  preparation: { vialLot: string; vialExpiry: string } | null;
  record: DoseRecord;
  deviations: DeviationFact[];
  /** Resource ids an earlier version of this bundle wrote, so one the new version drops is deleted. */
  previousResourceIds?: readonly string[];
}

const quantity = (value: number, unit: UcumUnit) => ({
  value,
  unit,
  system: fhirSystems.ucum,
  code: unit,
});

const concept = (coding: Coding, text?: string) => ({
  coding: [coding],
  text: text ?? coding.display,
});

/** Deviation units as the session rules write them, in UCUM; a unit not listed gets no quantity. */
const deviationUnits: Record<string, UcumUnit> = {
  min: 'min',
  h: 'h',
  mL: 'mL',
  s: 's',
  'J/cm²': 'J/cm2',
  µm: 'um',
};

/** A resource id FHIR accepts ([A-Za-z0-9-.]{1,64}) from a deviation's type. */
const idPart = (text: string) =>
  text
    .replace(/[^A-Za-z0-9-]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 40) || 'x';

/**
 * The treatment record of one session as a FHIR R4 transaction: the patient (created only if the
 * server lacks that record number), the procedure, the drug given (PDT), the body measures, the
 * light delivered and each deviation. Resources carry ids made from the order, so a later version
 * updates the same resources (PUT) instead of adding copies.
 */
export function buildTreatmentBundle(facts: TreatmentFacts): FhirBundle {
  const { record, orderId } = facts;
  const id = (part: string) => `luxtempo-o${orderId}-${part}`;
  const patientUrl = `urn:uuid:${patientUuid(facts.patient.recordNumber)}`;
  const subject = {
    reference: patientUrl,
    display: `${facts.patient.givenName} ${facts.patient.familyName}`,
  };
  const identifier = (part: string) => [
    { system: fhirSystems.treatmentRecord, value: `order-${orderId}-${part}` },
  ];
  const performers = facts.performers.map((p) => ({
    actor: {
      identifier: { system: fhirSystems.staff, value: String(p.id) },
      display: `${p.name} (${p.role})`,
    },
  }));
  const entries: FhirBundleEntry[] = [];
  const put = (resource: FhirJson & { id: string }) =>
    entries.push({
      resource,
      request: { method: 'PUT', url: `${resource.resourceType}/${resource.id}` },
    });

  entries.push({
    fullUrl: patientUrl,
    resource: {
      resourceType: 'Patient',
      identifier: [{ system: fhirSystems.recordNumber, value: facts.patient.recordNumber }],
      name: [{ family: facts.patient.familyName, given: [facts.patient.givenName] }],
      birthDate: facts.patient.dateOfBirth,
    },
    request: {
      method: 'POST',
      url: 'Patient',
      ifNoneExist: `identifier=${fhirSystems.recordNumber}|${facts.patient.recordNumber}`,
    },
  });

  const eyeSite = facts.eye === 'right' ? snomedCodes.rightEye : snomedCodes.leftEye;
  const laterality = facts.eye === 'right' ? snomedCodes.right : snomedCodes.left;
  const stopped = record.outcome === 'stopped';
  put({
    resourceType: 'BodyStructure',
    id: id('eye'),
    identifier: identifier('eye'),
    active: true,
    location: concept(snomedCodes.eye, 'Eye'),
    locationQualifier: [concept(laterality)],
    patient: subject,
  });
  const procedureRef = { reference: `Procedure/${id('procedure')}` };
  put({
    resourceType: 'Procedure',
    id: id('procedure'),
    identifier: identifier('procedure'),
    extension: [
      {
        url: 'http://hl7.org/fhir/StructureDefinition/procedure-targetBodyStructure',
        valueReference: { reference: `BodyStructure/${id('eye')}` },
      },
    ],
    status: stopped ? 'stopped' : 'completed',
    code: concept(facts.kind === 'pdt' ? localCodes.pdt : localCodes.cxl, facts.protocol.title),
    subject,
    ...(record.sessionStartedAt
      ? {
          performedPeriod: {
            start: record.sessionStartedAt,
            ...(record.endedAt ? { end: record.endedAt } : {}),
          },
        }
      : {}),
    performer: performers,
    bodySite: [concept(eyeSite, facts.eye === 'right' ? 'Right eye' : 'Left eye')],
    outcome: concept(
      stopped ? localCodes.stopped : localCodes.completed,
      stopped ? `Stopped early: ${record.stopReason ?? 'no reason given'}` : 'Completed',
    ),
    note: [
      {
        text: `Protocol ${facts.protocol.key} version ${facts.protocol.version}; Luxtempo order ${orderId}, record version ${facts.version}.`,
      },
    ],
  });

  if (facts.kind === 'pdt' && facts.drug && record.infusionStartAt) {
    const dosage: Record<string, unknown> = {
      route: concept(snomedCodes.intravenous),
      ...(record.doseGivenMg !== null ? { dose: quantity(record.doseGivenMg, 'mg') } : {}),
      ...(facts.plannedRateMlPerMin !== null
        ? { rateQuantity: quantity(facts.plannedRateMlPerMin, 'mL/min') }
        : {}),
    };
    if (record.volumeGivenMl !== null)
      dosage.text = `${record.volumeGivenMl} mL infused (${record.volumeGivenSource === 'entered' ? 'read off the pump' : 'planned rate × infusion time'})`;
    put({
      resourceType: 'MedicationAdministration',
      id: id('drug'),
      identifier: identifier('drug'),
      contained: [
        {
          resourceType: 'Medication',
          id: 'drug',
          code: { text: facts.drug.name },
          ...(facts.preparation
            ? {
                batch: {
                  lotNumber: facts.preparation.vialLot,
                  expirationDate: facts.preparation.vialExpiry,
                },
              }
            : {}),
        },
      ],
      status: record.extravasationAt || stopped ? 'stopped' : 'completed',
      medicationReference: { reference: '#drug', display: facts.drug.name },
      subject,
      effectivePeriod: {
        start: record.infusionStartAt,
        ...(record.infusionEndAt ? { end: record.infusionEndAt } : {}),
      },
      partOf: [procedureRef],
      performer: performers
        .filter((_, i) => facts.performers[i]!.role === 'nurse')
        .map((p) => ({ actor: p.actor })),
      dosage,
    });
  }

  const measure = (part: string, coding: Coding, value: number | null, unit: UcumUnit) => {
    if (value === null) return;
    put({
      resourceType: 'Observation',
      id: id(part),
      identifier: identifier(part),
      status: 'final',
      category: [
        {
          coding: [
            {
              system: fhirSystems.observationCategory,
              code: 'vital-signs',
              display: 'Vital Signs',
            },
          ],
        },
      ],
      code: concept(coding),
      subject,
      effectiveDateTime: facts.measuredAt,
      valueQuantity: quantity(value, unit),
    });
  };
  measure('height', loincCodes.bodyHeight, facts.heightCm, 'cm');
  measure('weight', loincCodes.bodyWeight, facts.weightKg, 'kg');
  measure('bsa', loincCodes.bodySurfaceArea, facts.bsaM2, 'm2');
  if (facts.bsaM2 !== null && facts.bsaFormula) {
    const bsa = entries.at(-1)!.resource!;
    bsa.method = { text: `${facts.bsaFormula} formula` };
  }

  const exposureS =
    facts.kind === 'pdt' ? (record.deviceExposureS ?? record.lightOnS) : record.uvOnS;
  if (record.deliveredFluenceJPerCm2 !== null || exposureS !== null) {
    const component: Record<string, unknown>[] = [];
    if (exposureS !== null)
      component.push({
        code: concept(localCodes.exposure),
        valueQuantity: quantity(exposureS, 's'),
      });
    // The irradiance the delivered fluence was worked out from: measured (UV), from the power set
    // (laser), or the plan's when no device figure exists.
    const irradianceMwPerCm2 =
      record.deviceUsed?.fluenceIrradianceMwPerCm2 ?? record.irradianceMwPerCm2;
    if (irradianceMwPerCm2 !== null)
      component.push({
        code: concept(localCodes.irradiance),
        valueQuantity: quantity(irradianceMwPerCm2, 'mW/cm2'),
      });
    if (facts.kind === 'cxl' && record.thicknessBeforeUvUm !== null)
      component.push({
        code: concept(localCodes.thicknessBeforeUv),
        valueQuantity: quantity(record.thicknessBeforeUvUm, 'um'),
      });
    const lightStart = facts.kind === 'pdt' ? record.lightStartAt : record.uvStartAt;
    const lightEnd = facts.kind === 'pdt' ? record.lightEndAt : record.uvEndAt;
    put({
      resourceType: 'Observation',
      id: id('light'),
      identifier: identifier('light'),
      status: 'final',
      code: concept(localCodes.deliveredLight),
      subject,
      partOf: [procedureRef],
      ...(lightStart
        ? { effectivePeriod: { start: lightStart, ...(lightEnd ? { end: lightEnd } : {}) } }
        : { effectiveDateTime: record.endedAt ?? facts.builtAt }),
      ...(record.deliveredFluenceJPerCm2 !== null
        ? { valueQuantity: quantity(record.deliveredFluenceJPerCm2, 'J/cm2') }
        : {}),
      component,
    });
  }

  const seen = new Map<string, number>();
  for (const deviation of facts.deviations) {
    const base = `deviation-${idPart(deviation.type)}`;
    const n = (seen.get(base) ?? 0) + 1;
    seen.set(base, n);
    const part = n === 1 ? base : `${base}-${n}`;
    const unit = deviation.unit ? deviationUnits[deviation.unit] : undefined;
    const component: Record<string, unknown>[] = [];
    if (unit && deviation.expected !== null)
      component.push({
        code: concept(localCodes.expected),
        valueQuantity: quantity(deviation.expected, unit),
      });
    if (unit && deviation.actual !== null)
      component.push({
        code: concept(localCodes.actual),
        valueQuantity: quantity(deviation.actual, unit),
      });
    put({
      resourceType: 'Observation',
      id: id(part),
      identifier: identifier(part),
      status: 'final',
      code: concept(localCodes.deviation, `Deviation from protocol: ${deviation.type}`),
      subject,
      partOf: [procedureRef],
      effectiveDateTime: deviation.detectedAt,
      interpretation: [{ text: deviation.severity }],
      valueString: deviation.message,
      ...(component.length ? { component } : {}),
    });
  }

  const written = new Set(entries.flatMap((e) => (e.resource?.id ? [e.resource.id] : [])));
  for (const earlier of facts.previousResourceIds ?? []) {
    if (written.has(earlier.split('/')[1] ?? '')) continue;
    entries.push({ request: { method: 'DELETE', url: earlier } });
  }

  return {
    resourceType: 'Bundle',
    type: 'transaction',
    identifier: {
      system: fhirSystems.treatmentRecord,
      value: `order-${orderId}-version-${facts.version}`,
    },
    timestamp: facts.builtAt,
    entry: entries,
  };
}

/** The `Type/id` of every resource a bundle writes with PUT, for the next version's clean-up. */
export function resourceIdsOf(bundle: FhirBundle): string[] {
  return bundle.entry.flatMap((e) => (e.request.method === 'PUT' ? [e.request.url] : []));
}

/**
 * A stable UUID-shaped name for the patient inside one bundle (FNV-1a over the record number):
 * the same record number gives the same urn:uuid, so two versions of a bundle read alike.
 */
function patientUuid(recordNumber: string): string {
  const hex: string[] = [];
  for (let seed = 0; seed < 4; seed++) {
    let h = 0x811c9dc5 ^ seed;
    for (const ch of recordNumber) {
      h ^= ch.charCodeAt(0);
      h = Math.imul(h, 0x01000193) >>> 0;
    }
    hex.push(h.toString(16).padStart(8, '0'));
  }
  const s = hex.join('');
  return `${s.slice(0, 8)}-${s.slice(8, 12)}-4${s.slice(13, 16)}-8${s.slice(17, 20)}-${s.slice(20, 32)}`;
}
