import type { ProtocolVersion } from '../protocol/protocol-schema';
import type { DosePlan, PlanInputs } from '../schemas/calculation';
import { newInputReport, readBodyMeasures, readLimitedNumber, refuseInputs } from './input-limits';
import { energyJ, fluenceJPerCm2, lightArithmeticSource, spotAreaCm2 } from './light-arithmetic';
import { PlanInputError } from './plan-input-error';
import { emptyPlan, missingProtocolPart, protocolRef, recordBsa } from './plan-parts';
import {
  drawnDoseShiftPct,
  drugMgInVolume,
  drugVolumeMlForDose,
  maxDrawnDoseShiftPct,
} from './drawn-volume';
import { formatNumber } from './rounding';
import { record } from './working';

/**
 * Verteporfin PDT: BSA → dose → volumes and rate; lesion GLD → spot → power, fluence, energy;
 * and the plan's time offsets from the start of the infusion.
 */
export function computePdtPlan(protocol: ProtocolVersion, inputs: PlanInputs): DosePlan {
  const { drug, timing, rounding } = protocol;
  const { spotMarginUm, maxSpotUm } = protocol.light;
  const { lesionGldUm: gldLimit, lensMagnification: lensLimit } = protocol.inputLimits;
  if (drug === null) throw missingProtocolPart(protocol, 'a drug block');
  if (timing === null) throw missingProtocolPart(protocol, 'a timing block');
  if (spotMarginUm === null || maxSpotUm === null)
    throw missingProtocolPart(protocol, 'light.spotMarginUm and light.maxSpotUm');
  if (gldLimit === null || lensLimit === null)
    throw missingProtocolPart(protocol, 'lesionGldUm and lensMagnification limits');

  const report = newInputReport();
  refuseInputs(report, inputs, ['stromalThicknessUm'], 'pdt');
  const body = readBodyMeasures(report, protocol, inputs, true);
  const lesionGldUm = readLimitedNumber(
    report,
    'lesionGldUm',
    'lesion GLD',
    'µm',
    inputs.lesionGldUm,
    gldLimit,
    'pdt',
  );
  const lensMagnification = readLimitedNumber(
    report,
    'lensMagnification',
    'lens magnification factor',
    '',
    inputs.lensMagnification,
    lensLimit,
    'pdt',
  );
  // A lesion whose spot would pass the largest spot is refused with that reason, beside the other
  // problems of the form: the range alone ("at most 5400 µm") does not say why.
  const typedGldUm = inputs.lesionGldUm;
  if (typeof typedGldUm === 'number' && typedGldUm + spotMarginUm > maxSpotUm) {
    const ranged = report.problems.find((p) => p.path === 'inputs.lesionGldUm');
    if (ranged)
      ranged.message = `${ranged.message}: ${spotWouldPass(typedGldUm, spotMarginUm, maxSpotUm)}`;
    else report.problems.push(spotTooLarge(protocol, typedGldUm, spotMarginUm, maxSpotUm));
  }
  if (
    report.problems.length > 0 ||
    body === undefined ||
    lesionGldUm === undefined ||
    lensMagnification === undefined
  ) {
    throw new PlanInputError(report.problems);
  }

  const ref = protocolRef(protocol);
  const working = report.working;
  const plan = emptyPlan(protocol);
  plan.warnings = report.warnings;
  plan.working = working;

  // Drug. Each line uses the rounded figure of the line before, as the pharmacist would.
  const bsaFormula = inputs.bsaFormula ?? protocol.bsaFormulaDefault;
  plan.bsaFormula = bsaFormula;
  plan.bmiKgPerM2 = body.bmiKgPerM2;
  plan.bsaM2 = recordBsa(working, protocol, bsaFormula, body);
  plan.doseMg = record(working, {
    name: 'doseMg',
    value: drug.doseMgPerM2 * plan.bsaM2,
    unit: 'mg',
    formula: 'doseMgPerM2 × bsaM2',
    inputs: {
      doseMgPerM2: { value: drug.doseMgPerM2, unit: 'mg/m²' },
      bsaM2: { value: plan.bsaM2, unit: 'm²' },
    },
    source: `dose per body surface area; doseMgPerM2 from ${ref}`,
    step: rounding.doseMg,
  });
  // The volume to draw, rounded to the syringe's graduation (versions written before that field
  // round to their general volume step).
  const graduationMl = drug.syringeGraduationMl ?? rounding.volumesMl;
  plan.drugVolumeMl = record(working, {
    name: 'drugVolumeMl',
    value: drugVolumeMlForDose(plan.doseMg, drug.concentrationMgPerMl),
    unit: 'mL',
    formula: 'doseMg ÷ concentrationMgPerMl, rounded to the syringe graduation',
    inputs: {
      doseMg: { value: plan.doseMg, unit: 'mg' },
      concentrationMgPerMl: { value: drug.concentrationMgPerMl, unit: 'mg/mL' },
    },
    source:
      drug.syringeGraduationMl === undefined
        ? `concentration after reconstitution from ${ref}; ${ref} gives no syringe graduation, so its volume step ${formatNumber(graduationMl)} mL is used`
        : `concentration after reconstitution and syringe graduation (${formatNumber(graduationMl)} mL) from ${ref}`,
    step: graduationMl,
  });
  // The dose the drawn volume really holds, and how far rounding moved it.
  const drawnDoseExactMg = drugMgInVolume(plan.drugVolumeMl, drug.concentrationMgPerMl);
  plan.drawnDoseMg = record(working, {
    name: 'drawnDoseMg',
    value: drawnDoseExactMg,
    unit: 'mg',
    formula: 'drugVolumeMl × concentrationMgPerMl (dose in the drawn volume)',
    inputs: {
      drugVolumeMl: { value: plan.drugVolumeMl, unit: 'mL' },
      concentrationMgPerMl: { value: drug.concentrationMgPerMl, unit: 'mg/mL' },
    },
    source: `concentration after reconstitution from ${ref}`,
    step: rounding.doseMg,
  });
  const shiftPct = drawnDoseShiftPct(drawnDoseExactMg, plan.doseMg);
  plan.drawnDoseDifferencePct = record(working, {
    name: 'drawnDoseDifferencePct',
    value: shiftPct,
    unit: '%',
    formula: `(drawnDoseMg − doseMg) ÷ doseMg × 100; at most ±${maxDrawnDoseShiftPct}%`,
    inputs: {
      drawnDoseMg: { value: drawnDoseExactMg, unit: 'mg' },
      doseMg: { value: plan.doseMg, unit: 'mg' },
    },
    source: `engine rule: rounding the drawn volume may move the dose by at most ${maxDrawnDoseShiftPct}% (common practice)`,
    step: 0.01,
  });
  if (Math.abs(shiftPct) > maxDrawnDoseShiftPct + 1e-9) {
    throw new PlanInputError([
      {
        path: 'protocol',
        message: `rounding the drug volume to ${formatNumber(graduationMl)} mL in ${ref} moves the dose in the syringe by ${formatNumber(Number(shiftPct.toFixed(2)))}% (${formatNumber(plan.drawnDoseMg)} mg drawn for ${formatNumber(plan.doseMg)} mg prescribed); at most ${maxDrawnDoseShiftPct}% is allowed — use a protocol version with a finer syringe graduation`,
      },
    ]);
  }
  // Vials come from the volume to draw and what one vial really gives up.
  const withdrawableMl = drug.withdrawableVolumeMlPerVial ?? drug.reconstitutedVolumeMl;
  plan.vials = record(working, {
    name: 'vials',
    value: Math.ceil(plan.drugVolumeMl / withdrawableMl - 1e-9),
    unit: 'vial',
    formula: 'ceil(drugVolumeMl ÷ withdrawableVolumeMlPerVial)',
    inputs: {
      drugVolumeMl: { value: plan.drugVolumeMl, unit: 'mL' },
      withdrawableVolumeMlPerVial: { value: withdrawableMl, unit: 'mL' },
    },
    source:
      drug.withdrawableVolumeMlPerVial === undefined
        ? `whole vials; ${ref} gives no withdrawable volume, so the whole reconstituted volume (${formatNumber(withdrawableMl)} mL) is assumed`
        : `whole vials; withdrawable volume per vial from ${ref}`,
  });
  plan.drugLeftOverMl = record(working, {
    name: 'drugLeftOverMl',
    value: plan.vials * drug.reconstitutedVolumeMl - plan.drugVolumeMl,
    unit: 'mL',
    formula: 'vials × reconstitutedVolumeMl − drugVolumeMl',
    inputs: {
      vials: { value: plan.vials, unit: 'vial' },
      reconstitutedVolumeMl: { value: drug.reconstitutedVolumeMl, unit: 'mL' },
      drugVolumeMl: { value: plan.drugVolumeMl, unit: 'mL' },
    },
    source: `reconstituted volume per vial from ${ref}; what is left is discarded under local policy`,
    step: graduationMl,
  });
  plan.drugLeftOverMg = record(working, {
    name: 'drugLeftOverMg',
    value: plan.vials * drug.vialContentMg - drawnDoseExactMg,
    unit: 'mg',
    formula: 'vials × vialContentMg − drawnDoseMg',
    inputs: {
      vials: { value: plan.vials, unit: 'vial' },
      vialContentMg: { value: drug.vialContentMg, unit: 'mg' },
      drawnDoseMg: { value: drawnDoseExactMg, unit: 'mg' },
    },
    source: `vial content from ${ref}`,
    step: rounding.doseMg,
  });
  const diluentVolumeMl = drug.finalVolumeMl - plan.drugVolumeMl;
  if (diluentVolumeMl < 0) {
    // The schema rules this out for validated protocols; an unvalidated one must still not
    // yield a negative volume.
    throw new PlanInputError([
      {
        path: 'inputs.weight.value',
        message: `the drug volume ${formatNumber(plan.drugVolumeMl)} mL exceeds the final volume of ${formatNumber(drug.finalVolumeMl)} mL in ${ref}`,
      },
    ]);
  }
  plan.diluentVolumeMl = record(working, {
    name: 'diluentVolumeMl',
    value: diluentVolumeMl,
    unit: 'mL',
    formula: 'finalVolumeMl − drugVolumeMl',
    inputs: {
      finalVolumeMl: { value: drug.finalVolumeMl, unit: 'mL' },
      drugVolumeMl: { value: plan.drugVolumeMl, unit: 'mL' },
    },
    source: `final volume and diluent (${drug.diluent}) from ${ref}`,
    step: rounding.volumesMl,
  });
  plan.infusionRateMlPerMin = record(working, {
    name: 'infusionRateMlPerMin',
    value: drug.finalVolumeMl / drug.infusionMin,
    unit: 'mL/min',
    formula: 'finalVolumeMl ÷ infusionMin',
    inputs: {
      finalVolumeMl: { value: drug.finalVolumeMl, unit: 'mL' },
      infusionMin: { value: drug.infusionMin, unit: 'min' },
    },
    source: `final volume and infusion time from ${ref}`,
    step: rounding.rateMlPerMin,
  });

  // Light.
  const spotDiameterUm = lesionGldUm + spotMarginUm;
  if (spotDiameterUm > maxSpotUm) {
    throw new PlanInputError([spotTooLarge(protocol, lesionGldUm, spotMarginUm, maxSpotUm)]);
  }
  plan.spotDiameterUm = record(working, {
    name: 'spotDiameterUm',
    value: spotDiameterUm,
    unit: 'µm',
    formula: 'lesionGldUm + spotMarginUm',
    inputs: {
      lesionGldUm: { value: lesionGldUm, unit: 'µm' },
      spotMarginUm: { value: spotMarginUm, unit: 'µm' },
    },
    source: `spot = lesion GLD + margin; margin from ${ref}`,
    step: rounding.spotUm,
  });
  plan.deviceSpotDiameterUm = record(working, {
    name: 'deviceSpotDiameterUm',
    value: plan.spotDiameterUm / lensMagnification,
    unit: 'µm',
    formula: 'spotDiameterUm ÷ lensMagnification',
    inputs: {
      spotDiameterUm: { value: plan.spotDiameterUm, unit: 'µm' },
      lensMagnification: { value: lensMagnification, unit: '×' },
    },
    source:
      'common practice: the laser is set to the retinal spot divided by the contact lens spot magnification factor',
    step: rounding.spotUm,
  });
  plan.spotAreaCm2 = record(working, {
    name: 'spotAreaCm2',
    value: spotAreaCm2(plan.spotDiameterUm),
    unit: 'cm²',
    formula: 'π × (spotDiameterUm ÷ 10 000)² ÷ 4',
    inputs: { spotDiameterUm: { value: plan.spotDiameterUm, unit: 'µm' } },
    source: lightArithmeticSource,
    step: rounding.spotAreaCm2,
  });
  plan.irradianceMwPerCm2 = record(working, {
    name: 'irradianceMwPerCm2',
    value: protocol.light.irradianceMwPerCm2,
    unit: 'mW/cm²',
    formula: 'protocol value',
    inputs: {},
    source: ref,
  });
  plan.exposureS = record(working, {
    name: 'exposureS',
    value: protocol.light.exposureS,
    unit: 's',
    formula: 'protocol value',
    inputs: {},
    source: ref,
  });
  plan.powerMw = record(working, {
    name: 'powerMw',
    value: plan.irradianceMwPerCm2 * plan.spotAreaCm2,
    unit: 'mW',
    formula: 'irradianceMwPerCm2 × spotAreaCm2',
    inputs: {
      irradianceMwPerCm2: { value: plan.irradianceMwPerCm2, unit: 'mW/cm²' },
      spotAreaCm2: { value: plan.spotAreaCm2, unit: 'cm²' },
    },
    source: lightArithmeticSource,
    step: rounding.powerMw,
  });
  plan.fluenceJPerCm2 = record(working, {
    name: 'fluenceJPerCm2',
    value: fluenceJPerCm2(plan.irradianceMwPerCm2, plan.exposureS),
    unit: 'J/cm²',
    formula: 'irradianceMwPerCm2 × exposureS ÷ 1000',
    inputs: {
      irradianceMwPerCm2: { value: plan.irradianceMwPerCm2, unit: 'mW/cm²' },
      exposureS: { value: plan.exposureS, unit: 's' },
    },
    source: `${lightArithmeticSource}; target ${formatNumber(protocol.light.targetFluenceJPerCm2)} J/cm² in ${ref}`,
    step: rounding.fluenceJPerCm2,
  });
  plan.energyJ = record(working, {
    name: 'energyJ',
    value: energyJ(plan.powerMw, plan.exposureS),
    unit: 'J',
    formula: 'powerMw × exposureS ÷ 1000',
    inputs: {
      powerMw: { value: plan.powerMw, unit: 'mW' },
      exposureS: { value: plan.exposureS, unit: 's' },
    },
    source: lightArithmeticSource,
    step: rounding.energyJ,
  });

  // Offsets from the start of the infusion; the server turns them into clock times.
  plan.infusionEndAfterStartS = record(working, {
    name: 'infusionEndAfterStartS',
    value: drug.infusionMin * 60,
    unit: 's',
    formula: 'infusionMin × 60',
    inputs: { infusionMin: { value: drug.infusionMin, unit: 'min' } },
    source: ref,
  });
  plan.lightStartAfterInfusionStartS = record(working, {
    name: 'lightStartAfterInfusionStartS',
    value: timing.lightStartAfterInfusionStartMin * 60,
    unit: 's',
    formula: 'lightStartAfterInfusionStartMin × 60',
    inputs: {
      lightStartAfterInfusionStartMin: {
        value: timing.lightStartAfterInfusionStartMin,
        unit: 'min',
      },
    },
    source: `light start after the start of the infusion from ${ref}`,
  });
  plan.lightEndAfterInfusionStartS = record(working, {
    name: 'lightEndAfterInfusionStartS',
    value: plan.lightStartAfterInfusionStartS + plan.exposureS,
    unit: 's',
    formula: 'lightStartAfterInfusionStartS + exposureS',
    inputs: {
      lightStartAfterInfusionStartS: { value: plan.lightStartAfterInfusionStartS, unit: 's' },
      exposureS: { value: plan.exposureS, unit: 's' },
    },
    source: ref,
  });
  return plan;
}

/** Why a lesion is too large: its spot (GLD + margin) would pass the largest spot the protocol allows. */
function spotWouldPass(lesionGldUm: number, spotMarginUm: number, maxSpotUm: number): string {
  return `its spot (GLD + ${formatNumber(spotMarginUm)} µm margin = ${formatNumber(lesionGldUm + spotMarginUm)} µm) would pass the largest spot of ${formatNumber(maxSpotUm)} µm`;
}

function spotTooLarge(
  protocol: ProtocolVersion,
  lesionGldUm: number,
  spotMarginUm: number,
  maxSpotUm: number,
) {
  return {
    path: 'inputs.lesionGldUm',
    message: `lesion GLD must be at most ${formatNumber(maxSpotUm - spotMarginUm)} µm for ${protocolRef(protocol)} (got ${formatNumber(lesionGldUm)} µm): ${spotWouldPass(lesionGldUm, spotMarginUm, maxSpotUm)}`,
  };
}
