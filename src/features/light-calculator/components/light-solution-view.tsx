import type { LightSolution } from '../../../../shared/schemas/calculation';
import { PencilIcon, SigmaIcon } from '../../../components/ui/icons';
import { namesInWords, quantityText, type LightQuantity } from './light-fields';

const shownOrder: LightQuantity[] = [
  'powerMw',
  'spotDiameterUm',
  'spotAreaCm2',
  'irradianceMwPerCm2',
  'exposureS',
  'fluenceJPerCm2',
  'energyJ',
];

const headline = new Intl.NumberFormat('en-GB', {
  maximumSignificantDigits: 4,
  useGrouping: false,
});
const full = new Intl.NumberFormat('en-GB', { maximumSignificantDigits: 10, useGrouping: false });

/** Worked-out values to four significant figures; given values exactly as typed. */
function shown(value: number | null, given: boolean): string {
  if (value === null) return '—';
  return given ? full.format(value) : headline.format(value);
}

export function LightSolutionView({ solution }: { solution: LightSolution }) {
  const given = new Set(solution.given);
  const sources = [...new Set(solution.working.map((entry) => entry.source))];
  return (
    <section
      aria-labelledby="light-result-heading"
      className="space-y-5 rounded-2xl border border-paper-200 bg-white p-6"
    >
      <div>
        <h2 id="light-result-heading" className="text-xl font-semibold text-paper-950">
          Result
        </h2>
        <p className="mt-1 text-sm text-paper-700">
          Worked-out values are shown to 4 significant figures; the working below gives them in
          full.
        </p>
      </div>
      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">
            The six figures and the spot area, each marked as given by you or worked out
          </caption>
          <thead className="bg-paper-100 text-sm text-paper-700">
            <tr>
              <th scope="col" className="px-3 py-2 font-semibold">
                Figure
              </th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">
                Value
              </th>
              <th scope="col" className="px-3 py-2 font-semibold">
                Unit
              </th>
              <th scope="col" className="px-3 py-2 font-semibold">
                Where it came from
              </th>
            </tr>
          </thead>
          <tbody>
            {shownOrder.map((quantity) => {
              const isGiven = given.has(quantity);
              const { label, unit } = quantityText[quantity];
              return (
                <tr
                  key={quantity}
                  className={`border-t border-paper-200 ${isGiven ? '' : 'bg-iris-50/40'}`}
                >
                  <th scope="row" className="px-3 py-2.5 font-medium text-paper-900">
                    {label}
                  </th>
                  <td className="px-3 py-2.5 text-right text-lg font-semibold text-paper-950 numerals-steady">
                    {shown(solution[quantity], isGiven)}
                  </td>
                  <td className="px-3 py-2.5 text-paper-800">{unit}</td>
                  <td className="px-3 py-2.5">
                    {solution[quantity] === null ? (
                      <span className="text-paper-700">Not fixed by your figures</span>
                    ) : isGiven ? (
                      <span className="inline-flex items-center gap-1.5 text-paper-800">
                        <PencilIcon className="size-4" />
                        Given by you
                      </span>
                    ) : (
                      <span className="inline-flex items-center gap-1.5 font-medium text-iris-800">
                        <SigmaIcon className="size-4" />
                        Worked out
                      </span>
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>

      <div>
        <h3 className="text-lg font-semibold text-paper-950">Working</h3>
        <ol className="mt-2 space-y-3">
          {solution.working.map((entry, index) => {
            const { label, unit } = quantityText[entry.name as LightQuantity] ?? {
              label: entry.name,
              unit: entry.unit,
            };
            return (
              <li
                key={`${entry.name}-${index}`}
                className="rounded-lg border border-paper-200 bg-paper-50 px-4 py-3"
              >
                <p className="font-medium text-paper-950">
                  {index + 1}. {label} ={' '}
                  <span className="font-mono text-sm">{namesInWords(entry.formula)}</span>
                </p>
                <p className="mt-1 text-sm text-paper-800">
                  with{' '}
                  {Object.entries(entry.inputs)
                    .map(
                      ([name, quantity]) =>
                        `${namesInWords(name)} ${full.format(quantity.value)} ${quantity.unit}`,
                    )
                    .join(', ')}
                </p>
                <p className="mt-1 font-semibold text-paper-950 numerals-steady">
                  = {full.format(entry.value)} {entry.unit || unit}
                </p>
              </li>
            );
          })}
        </ol>
        {sources.length > 0 && (
          <p className="mt-3 text-sm text-paper-700">
            <span className="font-medium">Basis: </span>
            {sources.join('; ')}.
          </p>
        )}
        <p className="mt-1 text-sm text-paper-600">
          Calculated by engine {solution.engineVersion}.
        </p>
      </div>
    </section>
  );
}
