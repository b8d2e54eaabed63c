import type { DosePlan } from '../../shared/schemas/calculation';
import { doseGivenText } from '../lib/dose-given-words';
import type { GivenRecord, ProtocolSteps } from '../lib/session-record-schemas';
import { formatDurationS, formatUnitClock } from '../lib/unit-times';
import { formatReading } from '../../shared/format/precision';

const bsaFormulaWords: Record<string, string> = {
  mosteller: 'Mosteller',
  'du-bois': 'Du Bois',
  haycock: 'Haycock',
  'gehan-george': 'Gehan–George',
  boyd: 'Boyd',
};

type Row = { label: string; planned: string; given: string; note?: string };

const sum = (a: number | null, b: number | null) => (a === null || b === null ? null : a + b);

/** Plan figures beside the figures the session's events give, for the kind of treatment. */
function rowsFor(
  plan: DosePlan,
  record: GivenRecord | null,
  steps: ProtocolSteps | undefined,
): Row[] {
  const given = record;
  const stepOfKind = (kind: string) => steps?.definition.steps.find((s) => s.kind === kind);
  if ((record?.kind ?? (plan.doseMg !== null ? 'pdt' : 'cxl')) === 'pdt') {
    return [
      {
        label: 'BSA',
        planned: formatReading('bsaM2', plan.bsaM2),
        given: '—',
        note: plan.bsaFormula
          ? `${bsaFormulaWords[plan.bsaFormula] ?? plan.bsaFormula} formula`
          : undefined,
      },
      {
        label: 'Verteporfin dose',
        planned: formatReading('doseMg', plan.doseMg),
        given: (given && doseGivenText(given)) ?? '—',
        note: 'Given = the share of the dose in the volume infused.',
      },
      {
        label: 'Infusion volume',
        planned: formatReading('volumeMl', sum(plan.drugVolumeMl, plan.diluentVolumeMl)),
        given: formatReading('volumeMl', given?.volumeGivenMl),
        note:
          given?.volumeGivenSource === 'entered'
            ? 'Given = read off the pump by the nurse.'
            : 'Given = planned rate × infusion time, not a pump reading.',
      },
      {
        label: 'Infusion time',
        planned: formatDurationS(plan.infusionEndAfterStartS),
        given: formatDurationS(given?.infusionDurationS),
      },
      {
        label: 'Light start after infusion start',
        planned: formatDurationS(plan.lightStartAfterInfusionStartS),
        given: formatDurationS(given?.lightStartAfterInfusionStartS),
      },
      {
        label: 'Irradiance',
        planned: formatReading('irradianceMwPerCm2', plan.irradianceMwPerCm2),
        given: formatReading('irradianceMwPerCm2', given?.irradianceMwPerCm2),
        note: 'Set on the laser; taken from the plan.',
      },
      {
        label: 'Exposure on the laser',
        planned: formatDurationS(plan.exposureS),
        given: formatDurationS(given?.deviceExposureS),
        note:
          given?.deviceEnergyJ != null
            ? `Energy on the laser ${formatReading('energyJ', given.deviceEnergyJ)}.`
            : 'As the nurse read it off the laser; the exposure is judged on it.',
      },
      {
        label: 'Light on-time by the taps',
        planned: formatDurationS(plan.exposureS),
        given: formatDurationS(given?.lightOnS),
        note: 'Information: the taps’ difference.',
      },
      {
        label: 'Fluence',
        planned: formatReading('fluenceJPerCm2', plan.fluenceJPerCm2),
        given: formatReading('fluenceJPerCm2', given?.deliveredFluenceJPerCm2),
      },
      {
        label: 'Spot diameter (retina)',
        planned: formatReading('spotUm', plan.spotDiameterUm),
        given: '—',
      },
      {
        label: 'Spot set on the laser',
        planned: formatReading('spotUm', plan.deviceSpotDiameterUm),
        given: '—',
        note: 'Device setting: retinal spot ÷ the contact lens’s magnification.',
      },
      { label: 'Laser power', planned: formatReading('powerMw', plan.powerMw), given: '—' },
    ];
  }
  const soak = stepOfKind('soak');
  const uv = stepOfKind('uv');
  return [
    {
      label: 'Riboflavin soak',
      planned: formatDurationS(soak?.durationS),
      given: formatDurationS(given?.soakDurationS),
    },
    {
      label: 'Longest gap between drops, soak',
      planned: soak?.cueEveryS ? `every ${formatDurationS(soak.cueEveryS)}` : '—',
      given: formatDurationS(given?.longestDropGapSoakS),
    },
    {
      label: 'Stromal thickness before UV',
      planned: steps?.definition.cxl
        ? `at least ${formatReading('thicknessUm', steps.definition.cxl.minStromalThicknessUm)}`
        : '—',
      given: formatReading('thicknessUm', given?.thicknessBeforeUvUm),
      note: given?.thicknessOverrideReason
        ? `Minimum overridden: ${given.thicknessOverrideReason}`
        : undefined,
    },
    {
      label: 'Irradiance',
      planned: formatReading('irradianceMwPerCm2', plan.irradianceMwPerCm2),
      given: formatReading('irradianceMwPerCm2', given?.irradianceMwPerCm2),
      note: 'Set on the device; taken from the plan.',
    },
    {
      label: 'UV on-time',
      planned: formatDurationS(plan.uvTimeS),
      given: formatDurationS(given?.uvOnS),
    },
    {
      label: 'UV elapsed time',
      planned: formatDurationS(plan.uvElapsedS),
      given: formatDurationS(given?.uvElapsedS),
    },
    {
      label: 'Longest gap between drops, UV',
      planned: uv?.cueEveryS ? `every ${formatDurationS(uv.cueEveryS)}` : '—',
      given: formatDurationS(given?.longestDropGapUvS),
    },
    {
      label: 'Fluence',
      planned: formatReading('fluenceJPerCm2', plan.fluenceJPerCm2),
      given: formatReading('fluenceJPerCm2', given?.deliveredFluenceJPerCm2),
    },
  ];
}

type PlanAndGivenProps = {
  plan: DosePlan | null;
  record: GivenRecord | null;
  steps: ProtocolSteps | undefined;
  headingId: string;
};

/** The plan's key figures beside what the session gave, as one table. */
export function PlanAndGiven({ plan, record, steps, headingId }: PlanAndGivenProps) {
  if (!plan)
    return (
      <p className="text-paper-700">
        The order’s plan is not available to you, so only what was given is shown below.
      </p>
    );
  const rows = rowsFor(plan, record, steps);
  return (
    <div className="relative overflow-x-auto rounded-xl border border-paper-200">
      <table className="w-full border-collapse text-left" aria-labelledby={headingId}>
        <thead className="bg-paper-100 text-sm text-paper-700">
          <tr>
            <th scope="col" className="px-3 py-2 font-semibold">
              Figure
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Planned
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Given
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={row.label} className="border-t border-paper-200 align-top">
              <th scope="row" className="px-3 py-2 font-medium text-paper-900">
                {row.label}
                {row.note && (
                  <span className="block text-sm font-normal text-paper-600">{row.note}</span>
                )}
              </th>
              <td className="numerals-steady px-3 py-2 whitespace-nowrap">{row.planned}</td>
              <td className="numerals-steady px-3 py-2 font-semibold whitespace-nowrap">
                {row.given}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** When the session ran and how it ended. */
export function SessionTimes({ record }: { record: GivenRecord | null }) {
  if (!record)
    return <p className="text-paper-700">No dose record was derived for this session.</p>;
  const outcome =
    record.outcome === 'completed'
      ? 'Completed'
      : record.outcome === 'stopped'
        ? 'Stopped early'
        : record.outcome === 'in-progress'
          ? 'Still running'
          : 'Not started';
  return (
    <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1">
      <dt className="text-paper-700">Outcome</dt>
      <dd className="font-medium">
        {outcome}
        {record.stopReason && <span className="font-normal">: {record.stopReason}</span>}
      </dd>
      <dt className="text-paper-700">Started</dt>
      <dd className="numerals-steady">{formatUnitClock(record.sessionStartedAt)}</dd>
      <dt className="text-paper-700">Ended</dt>
      <dd className="numerals-steady">{formatUnitClock(record.endedAt)}</dd>
      {record.extravasationAt && (
        <>
          <dt className="text-paper-700">Extravasation</dt>
          <dd className="numerals-steady">{formatUnitClock(record.extravasationAt)}</dd>
        </>
      )}
    </dl>
  );
}
