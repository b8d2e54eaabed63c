import type { Ref } from 'react';
import { withoutSourceMarks } from '../../../../shared/protocol/source-marks';
import type { DosePlan, WorkingEntry } from '../../../../shared/schemas/calculation';
import type { OrderDetail } from '../../../../shared/schemas/orders';
import { CheckCircleIcon } from '../../../components/ui/icons';
import type { ProtocolDrugParameters } from '../api/get-protocol-drug';
import { numberText, quantity, unitDateTime } from './display-format';
import { checkedFigures, figureLabels, figureTolerance, figureUnits } from './dose-figures';

const workingOrder = [
  'bsaM2',
  'doseMg',
  'drugVolumeMl',
  'vials',
  'diluentVolumeMl',
  'infusionRateMlPerMin',
] as const;

const workingLabels: Record<(typeof workingOrder)[number], string> = {
  bsaM2: 'BSA',
  doseMg: 'Dose',
  drugVolumeMl: 'Drug volume',
  vials: 'Vials',
  diluentVolumeMl: 'Diluent volume',
  infusionRateMlPerMin: 'Infusion rate',
};

type CheckOutcomeProps = {
  order: OrderDetail;
  plan: DosePlan;
  protocol: ProtocolDrugParameters | undefined;
  headingRef?: Ref<HTMLHeadingElement>;
};

/** After a match: the pharmacist's figures beside the plan's, and the plan's working step by step. */
export function CheckOutcome({ order, plan, protocol, headingRef }: CheckOutcomeProps) {
  const match = order.doseChecks.findLast((check) => check.outcome === 'match');
  const tolerances = protocol?.definition.tolerances.doseCheck ?? null;
  const working = workingOrder
    .map((name) => plan.working.find((entry) => entry.name === name))
    .filter((entry): entry is WorkingEntry => entry !== undefined);

  return (
    <section
      aria-labelledby="check-outcome-heading"
      className="space-y-5 rounded-2xl border border-paper-200 bg-white p-6"
    >
      <div>
        <h2
          ref={headingRef}
          tabIndex={-1}
          id="check-outcome-heading"
          className="flex items-center gap-2 text-xl font-semibold text-paper-950"
        >
          <CheckCircleIcon className="size-6 text-iris-700" />
          Dose check: figures agree
        </h2>
        {match && (
          <p className="mt-1 text-paper-700">
            Checked {unitDateTime(match.createdAt)}
            {match.pharmacist ? ` by ${match.pharmacist.displayName}` : ''}.
            {match.comment ? ` Comment: “${match.comment}”` : ''}
          </p>
        )}
      </div>

      <div className="overflow-x-auto">
        <table className="w-full min-w-[36rem] border-collapse text-left">
          <caption className="sr-only">Your figures beside the plan’s</caption>
          <thead>
            <tr className="border-b-2 border-paper-300 text-sm text-paper-700">
              <th scope="col" className="py-2 pr-4 font-medium">
                Figure
              </th>
              <th scope="col" className="py-2 pr-4 font-medium">
                Yours
              </th>
              <th scope="col" className="py-2 pr-4 font-medium">
                Plan
              </th>
              <th scope="col" className="py-2 font-medium">
                Comparison
              </th>
            </tr>
          </thead>
          <tbody className="numerals-steady [&_td:nth-child(2)]:whitespace-nowrap [&_td:nth-child(3)]:whitespace-nowrap">
            {checkedFigures.map((field) => (
              <tr key={field} className="border-b border-paper-200">
                <th scope="row" className="py-2.5 pr-4 font-medium text-paper-900">
                  {figureLabels[field]}
                </th>
                <td className="py-2.5 pr-4 text-paper-950">
                  {match ? quantity(match.entered[field], figureUnits[field]) : '—'}
                </td>
                <td className="py-2.5 pr-4 font-semibold text-paper-950">
                  {quantity(plan[field], figureUnits[field])}
                </td>
                <td className="py-2.5">
                  <span className="inline-flex items-center gap-1.5 text-paper-800">
                    <CheckCircleIcon className="size-4 text-iris-700" />
                    Agrees
                    {tolerances
                      ? `, within ±${numberText(tolerances[figureTolerance[field]])} %`
                      : ''}
                  </span>
                </td>
              </tr>
            ))}
            <tr className="border-b border-paper-200">
              <th scope="row" className="py-2.5 pr-4 font-medium text-paper-900">
                Diluent volume
              </th>
              <td className="py-2.5 pr-4 text-paper-600">not checked</td>
              <td className="py-2.5 pr-4 font-semibold text-paper-950">
                {quantity(plan.diluentVolumeMl, 'mL')}
              </td>
              <td className="py-2.5 text-paper-800">
                {protocol?.definition.drug
                  ? withoutSourceMarks(protocol.definition.drug.diluent)
                  : ''}
              </td>
            </tr>
            <tr className="border-b border-paper-200">
              <th scope="row" className="py-2.5 pr-4 font-medium text-paper-900">
                Vials
              </th>
              <td className="py-2.5 pr-4 text-paper-600">not checked</td>
              <td className="py-2.5 pr-4 font-semibold text-paper-950">
                {quantity(plan.vials, plan.vials === 1 ? 'vial' : 'vials')}
              </td>
              <td className="py-2.5 text-paper-800">
                {protocol?.definition.drug
                  ? `${quantity(protocol.definition.drug.vialContentMg, 'mg')} each`
                  : ''}
              </td>
            </tr>
            <tr>
              <th scope="row" className="py-2.5 pr-4 font-medium text-paper-900">
                Infusion rate
              </th>
              <td className="py-2.5 pr-4 text-paper-600">not checked</td>
              <td className="py-2.5 pr-4 font-semibold text-paper-950">
                {quantity(plan.infusionRateMlPerMin, 'mL/min')}
              </td>
              <td className="py-2.5 text-paper-800">
                {protocol?.definition.drug
                  ? `over ${quantity(protocol.definition.drug.infusionMin, 'min')}`
                  : ''}
              </td>
            </tr>
          </tbody>
        </table>
      </div>

      <details open className="rounded-lg border border-paper-200 bg-paper-50 px-4 py-3">
        <summary className="cursor-pointer font-medium text-iris-800">
          The plan’s working, step by step
        </summary>
        <ol className="mt-3 space-y-3">
          {working.map((entry) => (
            <li key={entry.name} className="text-sm leading-relaxed text-paper-900">
              <p className="font-semibold">
                {workingLabels[entry.name as keyof typeof workingLabels]} ={' '}
                <span className="font-mono font-normal">{entry.formula}</span>
              </p>
              {Object.keys(entry.inputs).length > 0 && (
                <p className="numerals-steady">
                  with{' '}
                  {Object.entries(entry.inputs)
                    .map(([name, q]) => `${name} = ${quantity(q.value, q.unit)}`)
                    .join(', ')}
                </p>
              )}
              <p className="numerals-steady">
                gives {quantity(entry.value, entry.unit)}
                {entry.rounded &&
                  `, rounded to the nearest ${quantity(entry.rounded.step, entry.unit)}: ${quantity(entry.rounded.value, entry.unit)}`}
              </p>
              <p className="text-paper-700">Source: {entry.source}</p>
            </li>
          ))}
        </ol>
      </details>
    </section>
  );
}
