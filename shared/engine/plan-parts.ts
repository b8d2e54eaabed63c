import type { ProtocolVersion } from '../protocol/protocol-schema';
import type { DosePlan, WorkingEntry } from '../schemas/calculation';
import { bsaFormulas, type BsaFormulaName } from './bsa';
import { engineVersion } from './engine-version';
import type { BodyMeasures } from './input-limits';
import { record } from './working';

/** A protocol reference as printed in working sources. */
export function protocolRef(protocol: ProtocolVersion): string {
  return `protocol ${protocol.key} v${protocol.version}`;
}

/** A plan with every kind-specific value null; the PDT and CXL planners fill in their own. */
export function emptyPlan(protocol: ProtocolVersion): DosePlan {
  return {
    engineVersion,
    protocol: { key: protocol.key, version: protocol.version },
    bsaFormula: null,
    bsaM2: null,
    bmiKgPerM2: null,
    doseMg: null,
    drugVolumeMl: null,
    diluentVolumeMl: null,
    drawnDoseMg: null,
    drawnDoseDifferencePct: null,
    vials: null,
    drugLeftOverMl: null,
    drugLeftOverMg: null,
    infusionRateMlPerMin: null,
    spotDiameterUm: null,
    deviceSpotDiameterUm: null,
    spotAreaCm2: null,
    powerMw: null,
    irradianceMwPerCm2: null,
    exposureS: null,
    fluenceJPerCm2: null,
    energyJ: null,
    lightStartAfterInfusionStartS: null,
    infusionEndAfterStartS: null,
    lightEndAfterInfusionStartS: null,
    uvTimeS: null,
    uvElapsedS: null,
    endothelialIrradianceMwPerCm2: null,
    endothelialDoseJPerCm2: null,
    thicknessOk: null,
    warnings: [],
    working: [],
  };
}

export function recordBsa(
  working: WorkingEntry[],
  protocol: ProtocolVersion,
  formula: BsaFormulaName,
  body: BodyMeasures,
): number {
  const chosen = bsaFormulas[formula];
  return record(working, {
    name: 'bsaM2',
    value: chosen.bsaM2(body.heightCm, body.weightKg),
    unit: 'm²',
    formula: `${chosen.label}: ${chosen.expression}`,
    inputs: {
      heightCm: { value: body.heightCm, unit: 'cm' },
      weightKg: { value: body.weightKg, unit: 'kg' },
    },
    source: chosen.source,
    step: protocol.rounding.bsaM2,
  });
}

/** Thrown for a protocol that skipped schema validation and lacks a block its kind needs. */
export function missingProtocolPart(protocol: ProtocolVersion, part: string): Error {
  return new Error(
    `${protocolRef(protocol)} is a ${protocol.kind} protocol without ${part}; validate it with protocolVersionSchema first`,
  );
}
