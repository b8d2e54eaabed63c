import type { ReactNode } from 'react';
import { bsaFormulas } from '../../../../shared/engine/bsa';
import type {
  InputLimit,
  ProtocolVersion,
  StepKind,
} from '../../../../shared/protocol/protocol-schema';
import { AlertIcon, InfoIcon } from '../../../components/ui/icons';
import { fieldLabel } from './protocol-field-labels';
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
            { label: fieldLabel('title'), value: definition.title },
            {
              label: fieldLabel('kind'),
              value: `${kindLabels[definition.kind].short} — ${kindLabels[definition.kind].long}`,
            },
            { label: fieldLabel('summary'), value: definition.summary },
            {
              label: fieldLabel('bsaFormulaDefault'),
              value: bsaFormulas[definition.bsaFormulaDefault].label,
            },
            {
              label: fieldLabel('retreatmentMinDays'),
              value: figure(definition.retreatmentMinDays),
            },
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
              { label: fieldLabel('drug.name'), value: drug.name },
              { label: fieldLabel('drug.route'), value: drug.route },
              { label: fieldLabel('drug.doseMgPerM2'), value: figure(drug.doseMgPerM2) },
              {
                label: fieldLabel('drug.concentrationMgPerMl'),
                value: figure(drug.concentrationMgPerMl),
              },
              { label: fieldLabel('drug.vialContentMg'), value: figure(drug.vialContentMg) },
              {
                label: fieldLabel('drug.reconstitutionVolumeMl'),
                value: figure(drug.reconstitutionVolumeMl),
              },
              { label: fieldLabel('drug.reconstitutionFluid'), value: drug.reconstitutionFluid },
              {
                label: fieldLabel('drug.reconstitutedVolumeMl'),
                value: figure(drug.reconstitutedVolumeMl),
              },
              { label: fieldLabel('drug.finalVolumeMl'), value: figure(drug.finalVolumeMl) },
              { label: fieldLabel('drug.diluent'), value: drug.diluent },
              { label: fieldLabel('drug.infusionMin'), value: figure(drug.infusionMin) },
              { label: fieldLabel('drug.beyondUseH'), value: figure(drug.beyondUseH) },
              { label: fieldLabel('drug.lightPrecautionH'), value: figure(drug.lightPrecautionH) },
              {
                label: fieldLabel('drug.lightPrecautionSource'),
                value: drug.lightPrecautionSource,
              },
              ...(drug.syringeGraduationMl !== undefined
                ? [
                    {
                      label: fieldLabel('drug.syringeGraduationMl'),
                      value: figure(drug.syringeGraduationMl),
                    },
                  ]
                : []),
              ...(drug.withdrawableVolumeMlPerVial !== undefined
                ? [
                    {
                      label: fieldLabel('drug.withdrawableVolumeMlPerVial'),
                      value: figure(drug.withdrawableVolumeMlPerVial),
                    },
                  ]
                : []),
            ]}
          />
        )}
      </ParameterSection>

      <ParameterSection id="params-light" title="Light">
        <ParameterList
          parameters={[
            { label: fieldLabel('light.wavelengthNm'), value: figure(light.wavelengthNm) },
            {
              label: fieldLabel('light.irradianceMwPerCm2'),
              value: figure(light.irradianceMwPerCm2),
            },
            {
              label: fieldLabel('light.targetFluenceJPerCm2'),
              value: figure(light.targetFluenceJPerCm2),
            },
            { label: fieldLabel('light.exposureS'), value: formatDurationS(light.exposureS) },
            { label: fieldLabel('light.spotMarginUm'), value: figure(light.spotMarginUm) },
            { label: fieldLabel('light.maxSpotUm'), value: figure(light.maxSpotUm) },
            {
              label: fieldLabel('light.pulse'),
              value:
                light.pulse === null ? (
                  <NotUsed>Continuous light (not pulsed)</NotUsed>
                ) : (
                  `${formatFigure(light.pulse.onS)} s on / ${formatFigure(light.pulse.offS)} s off`
                ),
            },
          ]}
        />
      </ParameterSection>

      <ParameterSection id="params-timing" title="Timing">
        <ParameterList
          parameters={[
            {
              label: fieldLabel('timing.lightStartAfterInfusionStartMin'),
              value: figure(timing?.lightStartAfterInfusionStartMin),
            },
          ]}
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
              { label: fieldLabel('cxl.epitheliumOff'), value: yesNo(cxl.epitheliumOff) },
              { label: fieldLabel('cxl.riboflavin'), value: cxl.riboflavin },
              { label: fieldLabel('cxl.soakMin'), value: figure(cxl.soakMin) },
              {
                label: fieldLabel('cxl.dropIntervalSoakMin'),
                value: figure(cxl.dropIntervalSoakMin),
              },
              { label: fieldLabel('cxl.dropIntervalUvMin'), value: figure(cxl.dropIntervalUvMin) },
              {
                label: fieldLabel('cxl.minStromalThicknessUm'),
                value: figure(cxl.minStromalThicknessUm),
              },
              { label: fieldLabel('cxl.swellingAllowed'), value: yesNo(cxl.swellingAllowed) },
              {
                label: fieldLabel('cxl.swellingDropIntervalS'),
                value: figure(cxl.swellingDropIntervalS),
              },
              {
                label: fieldLabel('cxl.swellingRiboflavin'),
                value: textOrNotUsed(cxl.swellingRiboflavin),
              },
            ]}
          />
        )}
      </ParameterSection>

      <ParameterSection
        id="params-rounding"
        title="Rounding"
        lead="Each figure of a plan is rounded to a multiple of these steps."
      >
        <ParameterList
          parameters={[
            { label: fieldLabel('rounding.bsaM2'), value: figure(rounding.bsaM2) },
            { label: fieldLabel('rounding.doseMg'), value: figure(rounding.doseMg) },
            { label: fieldLabel('rounding.volumesMl'), value: figure(rounding.volumesMl) },
            { label: fieldLabel('rounding.rateMlPerMin'), value: figure(rounding.rateMlPerMin) },
            { label: fieldLabel('rounding.spotUm'), value: figure(rounding.spotUm) },
            { label: fieldLabel('rounding.spotAreaCm2'), value: figure(rounding.spotAreaCm2) },
            { label: fieldLabel('rounding.powerMw'), value: figure(rounding.powerMw) },
            {
              label: fieldLabel('rounding.fluenceJPerCm2'),
              value: figure(rounding.fluenceJPerCm2),
            },
            { label: fieldLabel('rounding.energyJ'), value: figure(rounding.energyJ) },
            { label: fieldLabel('rounding.timeS'), value: figure(rounding.timeS) },
            {
              label: fieldLabel('rounding.endothelialIrradianceMwPerCm2'),
              value: figure(rounding.endothelialIrradianceMwPerCm2),
            },
            {
              label: fieldLabel('rounding.endothelialDoseJPerCm2'),
              value: figure(rounding.endothelialDoseJPerCm2),
            },
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
            [fieldLabel('inputLimits.heightCm'), inputLimits.heightCm],
            [fieldLabel('inputLimits.weightKg'), inputLimits.weightKg],
            [fieldLabel('inputLimits.lesionGldUm'), inputLimits.lesionGldUm],
            [fieldLabel('inputLimits.lensMagnification'), inputLimits.lensMagnification],
            [fieldLabel('inputLimits.stromalThicknessUm'), inputLimits.stromalThicknessUm],
          ]}
        />
      </ParameterSection>

      <ParameterSection
        id="params-tolerances"
        title="Tolerances"
        lead="A recorded figure further from the plan than this is a deviation, queued for review."
      >
        <ParameterList
          parameters={[
            {
              label: fieldLabel('tolerances.exposureS'),
              value: plusMinus(tolerances.exposureS, 's'),
            },
            {
              label: fieldLabel('tolerances.fluencePct'),
              value: plusMinus(tolerances.fluencePct, '%'),
            },
            {
              label: fieldLabel('tolerances.infusionDurationMin'),
              value: plusMinus(tolerances.infusionDurationMin, 'min'),
            },
            {
              label: fieldLabel('tolerances.lightStartMin'),
              value: plusMinus(tolerances.lightStartMin, 'min'),
            },
            {
              label: fieldLabel('tolerances.drugVolumePct'),
              value: plusMinus(tolerances.drugVolumePct, '%'),
            },
            {
              label: fieldLabel('tolerances.reconstitutionToInfusionMaxH'),
              value: figure(tolerances.reconstitutionToInfusionMaxH, 'h'),
            },
            ...doseCheckRows(tolerances.doseCheck),
            {
              label: fieldLabel('tolerances.soakShortfallMin'),
              value: figure(tolerances.soakShortfallMin, 'min'),
            },
            {
              label: fieldLabel('tolerances.dropGapPct'),
              value: figure(tolerances.dropGapPct, '%'),
            },
          ]}
        />
      </ParameterSection>

      <ParameterSection
        id="params-steps"
        title="Steps of the step clock"
        lead="In the order the nurse runs them."
      >
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
              <li
                key={item.id}
                className="flex flex-col gap-1 py-3 first:pt-0 last:pb-0 sm:flex-row sm:items-start sm:gap-4"
              >
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
                    <span className="block text-sm text-paper-700">
                      Checked against the stromal thickness entered in the order.
                    </span>
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
  if (doseCheck === null)
    return [{ label: fieldLabel('tolerances.doseCheck'), value: <NotUsed /> }];
  return [
    { label: fieldLabel('tolerances.doseCheck.bsaPct'), value: plusMinus(doseCheck.bsaPct, '%') },
    { label: fieldLabel('tolerances.doseCheck.dosePct'), value: plusMinus(doseCheck.dosePct, '%') },
    {
      label: fieldLabel('tolerances.doseCheck.drugVolumePct'),
      value: plusMinus(doseCheck.drugVolumePct, '%'),
    },
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
              {fieldLabel('steps[].durationS')}
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              {fieldLabel('steps[].cueEveryS')}
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
                  {step.onlyIf === 'thickness-below-minimum' &&
                    ' · only when the cornea is thinner than the minimum'}
                </span>
              </th>
              <td className="px-3 py-2">{stepKindLabels[step.kind]}</td>
              <td className="px-3 py-2 numerals-steady">
                {step.durationS === null ? (
                  <NotUsed>Ends when confirmed</NotUsed>
                ) : (
                  formatDurationS(step.durationS)
                )}
              </td>
              <td className="px-3 py-2 numerals-steady">
                {step.cueEveryS === undefined ? (
                  <NotUsed>No cue</NotUsed>
                ) : (
                  formatDurationS(step.cueEveryS)
                )}
              </td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          <tr className="border-t-2 border-paper-300 text-sm">
            <td />
            <th
              scope="row"
              className="px-3 py-2 text-left font-semibold text-paper-800"
              colSpan={2}
            >
              {anyConditional
                ? 'Timed steps together, not counting conditional ones'
                : 'Timed steps together'}
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
