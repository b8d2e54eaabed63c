import type { ProtocolVersion } from '../protocol/protocol-schema';
import type { DosePlan, PlanInputs } from '../schemas/calculation';
import {
  attenuationSource,
  belowMinimumThickness,
  endothelialCytotoxicDoseJPerCm2,
  endothelialEstimateLabel,
  endothelialIrradianceLimitMwPerCm2,
  irradianceAtDepthMwPerCm2,
  reciprocityLimitMwPerCm2,
  stromaAttenuationPerCm,
} from './corneal-uv';
import { newInputReport, readBodyMeasures, readLimitedNumber, refuseInputs } from './input-limits';
import {
  exposureSForFluence,
  fluenceJPerCm2,
  lightArithmeticSource,
  pulsedElapsedS,
} from './light-arithmetic';
import { PlanInputError } from './plan-input-error';
import { emptyPlan, missingProtocolPart, protocolRef, recordBsa } from './plan-parts';
import { formatNumber } from './rounding';
import { record } from './working';

/**
 * Riboflavin/UVA cross-linking: UV on-time and elapsed time from the fluence, the thickness
 * check, and a Beer–Lambert estimate of what reaches the endothelium.
 */
export function computeCxlPlan(protocol: ProtocolVersion, inputs: PlanInputs): DosePlan {
  const { cxl, rounding, light } = protocol;
  const thicknessLimit = protocol.inputLimits.stromalThicknessUm;
  if (cxl === null) throw missingProtocolPart(protocol, 'a cxl block');
  if (thicknessLimit === null) throw missingProtocolPart(protocol, 'a stromalThicknessUm limit');

  const report = newInputReport();
  refuseInputs(report, inputs, ['lesionGldUm', 'lensMagnification', 'lensId'], 'cxl');
  // Height and weight are optional here; when given they are checked and a BSA is recorded.
  const body = readBodyMeasures(report, protocol, inputs, false);
  const stromalThicknessUm = readLimitedNumber(
    report,
    'stromalThicknessUm',
    'stromal thickness',
    'µm',
    inputs.stromalThicknessUm,
    thicknessLimit,
    'cxl',
  );
  if (report.problems.length > 0 || stromalThicknessUm === undefined)
    throw new PlanInputError(report.problems);

  const ref = protocolRef(protocol);
  const working = report.working;
  const plan = emptyPlan(protocol);
  plan.warnings = report.warnings;
  plan.working = working;

  if (body !== undefined) {
    plan.bsaFormula = inputs.bsaFormula ?? protocol.bsaFormulaDefault;
    plan.bmiKgPerM2 = body.bmiKgPerM2;
    plan.bsaM2 = recordBsa(working, protocol, plan.bsaFormula, body);
  }

  plan.irradianceMwPerCm2 = record(working, {
    name: 'irradianceMwPerCm2',
    value: light.irradianceMwPerCm2,
    unit: 'mW/cm²',
    formula: 'protocol value',
    inputs: {},
    source: ref,
  });
  plan.uvTimeS = record(working, {
    name: 'uvTimeS',
    value: exposureSForFluence(light.targetFluenceJPerCm2, plan.irradianceMwPerCm2),
    unit: 's',
    formula: 'targetFluenceJPerCm2 × 1000 ÷ irradianceMwPerCm2',
    inputs: {
      targetFluenceJPerCm2: { value: light.targetFluenceJPerCm2, unit: 'J/cm²' },
      irradianceMwPerCm2: { value: plan.irradianceMwPerCm2, unit: 'mW/cm²' },
    },
    source: `Bunsen–Roscoe reciprocity (fluence = irradiance × time); target fluence from ${ref}`,
    step: rounding.timeS,
  });
  plan.fluenceJPerCm2 = record(working, {
    name: 'fluenceJPerCm2',
    value: fluenceJPerCm2(plan.irradianceMwPerCm2, plan.uvTimeS),
    unit: 'J/cm²',
    formula: 'irradianceMwPerCm2 × uvTimeS ÷ 1000',
    inputs: {
      irradianceMwPerCm2: { value: plan.irradianceMwPerCm2, unit: 'mW/cm²' },
      uvTimeS: { value: plan.uvTimeS, unit: 's' },
    },
    source: lightArithmeticSource,
    step: rounding.fluenceJPerCm2,
  });
  const pulse = light.pulse;
  plan.uvElapsedS = record(working, {
    name: 'uvElapsedS',
    value: pulsedElapsedS(plan.uvTimeS, pulse),
    unit: 's',
    formula:
      pulse === null ? 'uvTimeS (continuous light)' : 'uvTimeS × (pulseOnS + pulseOffS) ÷ pulseOnS',
    inputs:
      pulse === null
        ? { uvTimeS: { value: plan.uvTimeS, unit: 's' } }
        : {
            uvTimeS: { value: plan.uvTimeS, unit: 's' },
            pulseOnS: { value: pulse.onS, unit: 's' },
            pulseOffS: { value: pulse.offS, unit: 's' },
          },
    source: pulse === null ? ref : `on/off cycle from ${ref}`,
    step: rounding.timeS,
  });

  const minUm = cxl.minStromalThicknessUm;
  record(working, {
    name: 'thicknessMarginUm',
    value: stromalThicknessUm - minUm,
    unit: 'µm',
    formula: 'stromalThicknessUm − minStromalThicknessUm (thicknessOk when at least 0)',
    inputs: {
      stromalThicknessUm: { value: stromalThicknessUm, unit: 'µm' },
      minStromalThicknessUm: { value: minUm, unit: 'µm' },
    },
    source: `minimum stromal thickness from ${ref}`,
  });
  plan.thicknessOk = !belowMinimumThickness(stromalThicknessUm, minUm);
  if (!plan.thicknessOk) {
    plan.warnings.push({
      code: 'thickness-below-minimum',
      field: 'inputs.stromalThicknessUm',
      message: `stromal thickness ${formatNumber(stromalThicknessUm)} µm is below the minimum of ${formatNumber(minUm)} µm in ${ref}: do not start UV at this thickness (Spoerl E et al. Cornea 2007)`,
    });
    plan.warnings.push(
      cxl.swellingAllowed
        ? {
            code: 'swelling-step-needed',
            field: 'inputs.stromalThicknessUm',
            message: `the swelling step is needed: ${cxl.swellingRiboflavin ?? 'hypo-osmolar riboflavin'} every ${formatNumber(cxl.swellingDropIntervalS ?? Number.NaN)} s, re-measuring until the stroma reaches ${formatNumber(minUm)} µm, before UV`,
          }
        : {
            code: 'no-swelling-step',
            field: 'inputs.stromalThicknessUm',
            message: `${ref} has no swelling step: choose a protocol that allows one, or do not treat`,
          },
    );
  }

  // Beer–Lambert estimate at the measured thickness, before any swelling.
  const alphaPerCm = record(working, {
    name: 'stromaAttenuationPerCm',
    value: stromaAttenuationPerCm,
    unit: 'cm⁻¹',
    formula: 'ln(3 ÷ 0.18) ÷ 0.040 cm',
    inputs: {
      surfaceIrradiance: { value: 3, unit: 'mW/cm²' },
      endothelialIrradiance: { value: 0.18, unit: 'mW/cm²' },
      depth: { value: 0.04, unit: 'cm' },
    },
    source: attenuationSource,
  });
  plan.endothelialIrradianceMwPerCm2 = record(working, {
    name: 'endothelialIrradianceMwPerCm2',
    value: irradianceAtDepthMwPerCm2(plan.irradianceMwPerCm2, stromalThicknessUm),
    unit: 'mW/cm²',
    formula: `irradianceMwPerCm2 × e^(−stromaAttenuationPerCm × stromalThicknessUm ÷ 10 000), ${endothelialEstimateLabel}`,
    inputs: {
      irradianceMwPerCm2: { value: plan.irradianceMwPerCm2, unit: 'mW/cm²' },
      stromaAttenuationPerCm: { value: alphaPerCm, unit: 'cm⁻¹' },
      stromalThicknessUm: { value: stromalThicknessUm, unit: 'µm' },
    },
    // Information only: Spoerl's 0.35 mW/cm² was found for the 30-minute standard exposure, so an
    // accelerated protocol passes it on every normal cornea; harm is judged on the dose below.
    source: `${attenuationSource}; ${endothelialEstimateLabel}; for information: ${endothelialIrradianceLimitMwPerCm2} mW/cm² is the damage threshold for a 30-minute exposure (Spoerl E et al. Cornea 2007), the warning is judged on the dose`,
    step: rounding.endothelialIrradianceMwPerCm2,
  });
  plan.endothelialDoseJPerCm2 = record(working, {
    name: 'endothelialDoseJPerCm2',
    value: fluenceJPerCm2(plan.endothelialIrradianceMwPerCm2, plan.uvTimeS),
    unit: 'J/cm²',
    formula: `endothelialIrradianceMwPerCm2 × uvTimeS ÷ 1000, ${endothelialEstimateLabel}`,
    inputs: {
      endothelialIrradianceMwPerCm2: { value: plan.endothelialIrradianceMwPerCm2, unit: 'mW/cm²' },
      uvTimeS: { value: plan.uvTimeS, unit: 's' },
    },
    source: `${attenuationSource}; ${endothelialEstimateLabel}`,
    step: rounding.endothelialDoseJPerCm2,
  });

  if (plan.irradianceMwPerCm2 > reciprocityLimitMwPerCm2) {
    plan.warnings.push({
      code: 'reciprocity-limit',
      message: `irradiance ${formatNumber(plan.irradianceMwPerCm2)} mW/cm² is above about ${reciprocityLimitMwPerCm2} mW/cm², where Bunsen–Roscoe reciprocity is reported to fail (Wernli J et al. Invest Ophthalmol Vis Sci 2013; threshold from memory): the same fluence may cross-link less`,
    });
  }
  if (plan.endothelialDoseJPerCm2 >= endothelialCytotoxicDoseJPerCm2) {
    plan.warnings.push({
      code: 'endothelial-dose',
      field: 'inputs.stromalThicknessUm',
      message: `estimated endothelial dose ${formatNumber(plan.endothelialDoseJPerCm2)} J/cm² reaches the ${endothelialCytotoxicDoseJPerCm2} J/cm² cytotoxic dose of Wollensak G et al. (J Cataract Refract Surg 2003); ${endothelialEstimateLabel}`,
    });
  }
  return plan;
}
