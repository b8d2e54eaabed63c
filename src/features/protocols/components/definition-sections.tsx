import type { ReactNode } from 'react';
import { bsaFormulas } from '../../../../shared/engine/bsa';
import type { InputLimit, ProtocolVersion, StepKind } from '../../../../shared/protocol/protocol-schema';
import { AlertIcon, InfoIcon } from '../../../components/ui/icons';
import { formatDurationS, formatFigure, kindLabels } from './protocol-labels';
import { NotUsed, ParameterList, ParameterSection, type Parameter } from './parameter-list';

const stepKindLabels: Record<StepKind, string> = {
  check: 'Check',
  infusion: 'Infusion',
  wait: 'Wait',
  light: 'Laser light',
  preparation: 'Preparation',
  soak: 'Riboflavin soak',
  thickness: 'Thickness measurement',
  swelling: 'Swelling drops',
  uv: 'UVA light',
  aftercare: 'Aftercare',
};

function figure(value: number | null | undefined, unit = ''): ReactNode {
  if (value === null || value === undefined) return <NotUsed />;
  return unit ? `${formatFigure(value)} ${unit}` : formatFigure(value);
}

function plusMinus(value: number | null, unit: string): ReactNode {
  return value === null ? <NotUsed /> : `± ${formatFigure(value)} ${unit}`;
}

function yesNo(value: boolean): string {
  return value ? 'Yes' : 'No';
}

function textOrNotUsed(value: string | null): ReactNode {
  return value === null ? <NotUsed /> : value;
}

export function DefinitionSections({ definition }: { definition: ProtocolVersion }) {
  const { drug, light, timing, cxl, rounding, inputLimits, tolerances } = definition;
  return (
    <div className="space-y-5">
      <ParameterSection id="params-general" title="General">
        <ParameterList
          parameters={[
            { label: 'Title', value: definition.title },
            { label: 'Kind', value: `${kindLabels[definition.kind].short} — ${kindLabels[definition.kind].long}` },
            { label: 'Summary', value: definition.summary },
            { label: 'Default BSA formula', value: bsaFormulas[definition.bsaFormulaDefault].label },
            { label: 'Shortest interval before re-treatment (days)', value: figure(definition.retreatmentMinDays) },
          ]}
        />
      </ParameterSection>

      <ParameterSection id="params-drug" title="Drug">
        {drug === null ? (
          <p>
            <NotUsed>No drug is given in this protocol.</NotUsed>
          </p>
        ) : (
          <ParameterList
            parameters={[
              { label: 'Drug', value: drug.name },
              { label: 'Route', value: drug.route },
              { label: 'Dose (mg/m² of body surface area)', value: figure(drug.doseMgPerM2) },
              { label: 'Concentration after reconstitution (mg/mL)', value: figure(drug.concentrationMgPerMl) },
              { label: 'Content of one vial (mg)', value: figure(drug.vialContentMg) },
              { label: 'Fluid added to one vial (mL)', value: figure(drug.reconstitutionVolumeMl) },
              { label: 'Reconstitution fluid', value: drug.reconstitutionFluid },
              { label: 'Volume in the vial after reconstitution (mL)', value: figure(drug.reconstitutedVolumeMl) },
              { label: 'Final volume to infuse (mL)', value: figure(drug.finalVolumeMl) },
              { label: 'Diluent', value: drug.diluent },
              { label: 'Infusion time (min)', value: figure(drug.infusionMin) },
              { label: 'Use within, after reconstitution (h)', value: figure(drug.beyondUseH) },
              { label: 'Light precautions after the infusion (h)', value: figure(drug.lightPrecautionH) },
              { label: 'Light precaution period: source', value: drug.lightPrecautionSource },
              ...(drug.syringeGraduationMl !== undefined ? [{ label: 'Syringe graduation the drug volume is rounded to (mL)', value: figure(drug.syringeGraduationMl) }] : []),
              ...(drug.withdrawableVolumeMlPerVial !== undefined ? [{ label: 'Volume that can be drawn from one vial (mL)', value: figure(drug.withdrawableVolumeMlPerVial) }] : []),
            ]}
          />
        )}
      </ParameterSection>

      <ParameterSection id="params-light" title="Light">
        <ParameterList
          parameters={[
            { label: 'Wavelength (nm)', value: figure(light.wavelengthNm) },
            { label: 'Irradiance (mW/cm²)', value: figure(light.irradianceMwPerCm2) },
            { label: 'Target fluence (J/cm²)', value: figure(light.targetFluenceJPerCm2) },
            { label: 'Light-on time (s)', value: formatDurationS(light.exposureS) },
            { label: 'Margin added to the lesion GLD (µm)', value: figure(light.spotMarginUm) },
            { label: 'Largest spot allowed (µm)', value: figure(light.maxSpotUm) },
            {
              label: 'Pulsed cycle, on / off (s)',
              value: light.pulse === null ? <NotUsed>Continuous light (not pulsed)</NotUsed> : `${formatFigure(light.pulse.onS)} s on / ${formatFigure(light.pulse.offS)} s off`,
            },
          ]}
        />
      </ParameterSection>

      <ParameterSection id="params-timing" title="Timing">
        <ParameterList
          parameters={[{ label: 'Light starts after the start of the infusion (min)', value: figure(timing?.lightStartAfterInfusionStartMin) }]}
        />
      </ParameterSection>

      <ParameterSection id="params-cxl" title="Cross-linking">
        {cxl === null ? (
          <p>
            <NotUsed>No cross-linking settings: this is not a CXL protocol.</NotUsed>
          </p>
        ) : (
          <ParameterList
            parameters={[
              { label: 'Epithelium removed', value: yesNo(cxl.epitheliumOff) },
              { label: 'Riboflavin', value: cxl.riboflavin },
              { label: 'Soak time (min)', value: figure(cxl.soakMin) },
              { label: 'Drop every, during the soak (min)', value: figure(cxl.dropIntervalSoakMin) },
              { label: 'Drop every, during UV (min)', value: figure(cxl.dropIntervalUvMin) },
              { label: 'Minimum stromal thickness (µm)', value: figure(cxl.minStromalThicknessUm) },
              { label: 'Swelling of a thin cornea allowed', value: yesNo(cxl.swellingAllowed) },
              { label: 'Swelling drop every (s)', value: figure(cxl.swellingDropIntervalS) },
              { label: 'Swelling riboflavin', value: textOrNotUsed(cxl.swellingRiboflavin) },
            ]}
          />
        )}
      </ParameterSection>

      <ParameterSection id="params-rounding" title="Rounding" lead="Each figure of a plan is rounded to a multiple of these steps.">
        <ParameterList
          parameters={[
            { label: 'BSA (m²)', value: figure(rounding.bsaM2) },
            { label: 'Dose (mg)', value: figure(rounding.doseMg) },
            { label: 'Volumes (mL)', value: figure(rounding.volumesMl) },
            { label: 'Infusion rate (mL/min)', value: figure(rounding.rateMlPerMin) },
            { label: 'Spot diameter (µm)', value: figure(rounding.spotUm) },
            { label: 'Spot area (cm²)', value: figure(rounding.spotAreaCm2) },
            { label: 'Power (mW)', value: figure(rounding.powerMw) },
            { label: 'Fluence (J/cm²)', value: figure(rounding.fluenceJPerCm2) },
            { label: 'Energy (J)', value: figure(rounding.energyJ) },
            { label: 'Times (s)', value: figure(rounding.timeS) },
            { label: 'Endothelial irradiance (mW/cm²)', value: figure(rounding.endothelialIrradianceMwPerCm2) },
            { label: 'Endothelial dose (J/cm²)', value: figure(rounding.endothelialDoseJPerCm2) },
          ]}
        />
      </ParameterSection>

      <ParameterSection
        id="params-limits"
        title="Input limits"
        lead="A figure outside the soft range is allowed with a written reason; one outside the hard range is refused."
      >
        <LimitsTable
          rows={[
            ['Height (cm)', inputLimits.heightCm],
            ['Weight (kg)', inputLimits.weightKg],
            ['Lesion greatest linear dimension, GLD (µm)', inputLimits.lesionGldUm],
            ['Contact lens spot magnification (×)', inputLimits.lensMagnification],
            ['Stromal thickness (µm)', inputLimits.stromalThicknessUm],
          ]}
        />
      </ParameterSection>

      <ParameterSection id="params-tolerances" title="Tolerances" lead="A recorded figure further from the plan than this is a deviation, queued for review.">
        <ParameterList
          parameters={[
            { label: 'Light-on time (± s)', value: plusMinus(tolerances.exposureS, 's') },
            { label: 'Delivered fluence (± %)', value: plusMinus(tolerances.fluencePct, '%') },
            { label: 'Infusion duration (± min)', value: plusMinus(tolerances.infusionDurationMin, 'min') },
            { label: 'Light start (± min)', value: plusMinus(tolerances.lightStartMin, 'min') },
            { label: 'Drug volume prepared (± %)', value: plusMinus(tolerances.drugVolumePct, '%') },
            { label: 'Reconstitution to infusion, at most (h)', value: figure(tolerances.reconstitutionToInfusionMaxH, 'h') },
            ...doseCheckRows(tolerances.doseCheck),
            { label: 'Soak may fall short by (min)', value: figure(tolerances.soakShortfallMin, 'min') },
            { label: 'Gap between drops beyond the interval (%)', value: figure(tolerances.dropGapPct, '%') },
          ]}
        />
      </ParameterSection>

      <ParameterSection id="params-steps" title="Steps of the step clock" lead="In the order the nurse runs them.">
        <StepsTable steps={definition.steps} />
      </ParameterSection>

      <ParameterSection id="params-contraindications" title="Contraindication checklist">
        {definition.contraindications.length === 0 ? (
          <p>
            <NotUsed>This version asks no contraindication questions.</NotUsed>
          </p>
        ) : (
          <ul className="divide-y divide-paper-200">
            {definition.contraindications.map((item) => (
              <li key={item.id} className="flex flex-col gap-1 py-3 first:pt-0 last:pb-0 sm:flex-row sm:items-start sm:gap-4">
                <span className="sm:w-48 sm:shrink-0">
                  {item.severity === 'absolute' ? (
                    <span className="inline-flex items-center gap-1.5 font-semibold text-paper-950">
                      <AlertIcon className="size-4" />
                      Absolute: a yes stops the order
                    </span>
                  ) : (
                    <span className="inline-flex items-center gap-1.5 font-medium text-paper-800">
                      <InfoIcon className="size-4" />
                      Caution: a yes needs a reason of substance
                    </span>
                  )}
                </span>
                <span className="min-w-0">
                  <span className="block text-paper-950">{item.question}</span>
                  <span className="block text-sm text-paper-700">Source: {item.source}</span>
                  {item.measurement === 'stromal-thickness-below-minimum' && (
                    <span className="block text-sm text-paper-700">Checked against the stromal thickness entered in the order.</span>
                  )}
                </span>
              </li>
            ))}
          </ul>
        )}
      </ParameterSection>

      <ParameterSection id="params-cautions" title="Cautions">
        <ul className="list-disc space-y-1.5 pl-5 text-paper-950">
          {definition.cautions.map((caution) => (
            <li key={caution}>{caution}</li>
          ))}
        </ul>
      </ParameterSection>
    </div>
  );
}

function doseCheckRows(doseCheck: ProtocolVersion['tolerances']['doseCheck']): Parameter[] {
  if (doseCheck === null) return [{ label: 'Pharmacist’s blind dose check', value: <NotUsed /> }];
  return [
    { label: 'Blind dose check: BSA (± %)', value: plusMinus(doseCheck.bsaPct, '%') },
    { label: 'Blind dose check: dose (± %)', value: plusMinus(doseCheck.dosePct, '%') },
    { label: 'Blind dose check: drug volume (± %)', value: plusMinus(doseCheck.drugVolumePct, '%') },
  ];
}

function LimitsTable({ rows }: { rows: [label: string, limit: InputLimit | null][] }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-left">
        <thead className="text-sm text-paper-700">
          <tr className="border-b border-paper-200">
            <th scope="col" className="py-2 pr-3 font-semibold">
              Input
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Soft range (warns)
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Hard range (refuses outside)
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map(([label, limit]) => (
            <tr key={label} className="border-b border-paper-200 last:border-b-0">
              <th scope="row" className="py-2 pr-3 font-medium text-paper-900">
                {label}
              </th>
              {limit === null ? (
                <td colSpan={2} className="px-3 py-2">
                  <NotUsed />
                </td>
              ) : (
                <>
                  <td className="px-3 py-2 numerals-steady">
                    {formatFigure(limit.soft.min)} to {formatFigure(limit.soft.max)}
                  </td>
                  <td className="px-3 py-2 numerals-steady">
                    {formatFigure(limit.hard.min)} to {formatFigure(limit.hard.max)}
                  </td>
                </>
              )}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function StepsTable({ steps }: { steps: ProtocolVersion['steps'] }) {
  // A step that runs only in a condition is left out of the total, and the total says so.
  const timedS = steps.reduce((sum, step) => sum + (step.onlyIf ? 0 : (step.durationS ?? 0)), 0);
  const anyConditional = steps.some((step) => step.onlyIf !== undefined);
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-left">
        <thead className="text-sm text-paper-700">
          <tr className="border-b border-paper-200">
            <th scope="col" className="py-2 pr-3 font-semibold">
              #
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Step
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Kind
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Duration (s)
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Cue every (s)
            </th>
          </tr>
        </thead>
        <tbody>
          {steps.map((step, index) => (
            <tr key={step.id} className="border-b border-paper-200 align-top last:border-b-0">
              <td className="py-2 pr-3 numerals-steady text-paper-700">{index + 1}</td>
              <th scope="row" className="px-3 py-2 font-normal">
                <span className="block font-medium text-paper-950">{step.title}</span>
                <span className="block text-sm text-paper-600">
                  id <code className="font-mono">{step.id}</code>
                  {step.onlyIf === 'thickness-below-minimum' && ' · only when the cornea is thinner than the minimum'}
                </span>
              </th>
              <td className="px-3 py-2">{stepKindLabels[step.kind]}</td>
              <td className="px-3 py-2 numerals-steady">{step.durationS === null ? <NotUsed>Ends when confirmed</NotUsed> : formatDurationS(step.durationS)}</td>
              <td className="px-3 py-2 numerals-steady">{step.cueEveryS === undefined ? <NotUsed>No cue</NotUsed> : formatDurationS(step.cueEveryS)}</td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          <tr className="border-t-2 border-paper-300 text-sm">
            <td />
            <th scope="row" className="px-3 py-2 text-left font-semibold text-paper-800" colSpan={2}>
              {anyConditional ? 'Timed steps together, not counting conditional ones' : 'Timed steps together'}
            </th>
            <td className="px-3 py-2 font-semibold numerals-steady" colSpan={2}>
              {formatDurationS(timedS)}
            </td>
          </tr>
        </tfoot>
      </table>
    </div>
  );
}
