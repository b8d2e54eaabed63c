import { useQuery } from '@tanstack/react-query';
import { formatPlainNumber, formatUnitMonth, noFigure } from '../../../../shared/format/figures';
import { Alert } from '../../../components/ui/alert';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel } from '../../../components/ui/status-panel';
import { describeError } from '../../../lib/api-client';
import { drugUseReportQuery, type MonthUse } from '../../../lib/queries/stock';

const monthWords = (month: string) => formatUnitMonth(month);
const figure = (n: number | null, unit = '') =>
  n === null ? noFigure : `${formatPlainNumber(n, 2)}${unit}`;

/** Per month: vials issued, drug given versus discarded (mg and %), doses prepared and never infused. */
export function DrugUseScreen() {
  const report = useQuery(drugUseReportQuery());
  return (
    <div className="space-y-6">
      <PageHeader
        title="Drug use"
        lead="Verteporfin per month over the last twelve: given is the dose of each preparation whose session started; discarded is what was recorded as discarded plus every dose made up and never infused."
      />
      {report.isPending ? (
        <LoadingPanel label="Loading the report…" />
      ) : report.isError ? (
        <Alert tone="error">{describeError(report.error)}</Alert>
      ) : (
        <>
          <UseChart months={report.data.months} />
          <table className="w-full border-collapse bg-white text-left">
            <caption className="mb-2 text-left text-lg font-semibold text-paper-900">
              Figures per month
            </caption>
            <thead>
              <tr className="border-b border-paper-300 text-sm text-paper-700">
                <th scope="col" className="p-2">
                  Month
                </th>
                <th scope="col" className="p-2 text-right">
                  Vials issued
                </th>
                <th scope="col" className="p-2 text-right">
                  Given
                </th>
                <th scope="col" className="p-2 text-right">
                  Discarded
                </th>
                <th scope="col" className="p-2 text-right">
                  Prepared, never infused
                </th>
              </tr>
            </thead>
            <tbody>
              {report.data.months.map((m) => (
                <tr key={m.month} className="numerals-steady border-b border-paper-200">
                  <th scope="row" className="p-2">
                    {monthWords(m.month)}
                  </th>
                  <td className="p-2 text-right">{m.vialsIssued}</td>
                  <td className="p-2 text-right">
                    {figure(m.givenMg, ' mg')} ({figure(m.givenPct, ' %')})
                  </td>
                  <td className="p-2 text-right">
                    {figure(m.discardedMg, ' mg')} ({figure(m.discardedPct, ' %')})
                  </td>
                  <td className="p-2 text-right">{m.preparedNeverInfused}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </>
      )}
    </div>
  );
}

const slotPx = 56;
const plotPx = 160;
const left = 56;
const top = 16;
const bottom = 36;

/** Stacked bars: drug given (solid) and discarded (hatched) per month, in mg. */
function UseChart({ months }: { months: MonthUse[] }) {
  const highest = Math.max(10, ...months.map((m) => m.givenMg + m.discardedMg));
  const scale = Math.ceil(highest / 10) * 10;
  const width = left + months.length * slotPx + 8;
  const height = top + plotPx + bottom;
  const y = (mg: number) => top + plotPx - (mg / scale) * plotPx;
  return (
    <figure className="overflow-x-auto rounded-2xl border border-paper-200 bg-white p-4">
      <figcaption className="mb-2 flex flex-wrap gap-4 text-sm text-paper-800">
        <span className="font-semibold text-paper-950">
          Verteporfin given and discarded, mg per month
        </span>
        <span className="inline-flex items-center gap-1.5">
          <span aria-hidden="true" className="inline-block size-3 bg-iris-700" /> given
        </span>
        <span className="inline-flex items-center gap-1.5">
          <span
            aria-hidden="true"
            className="inline-block size-3 border border-paper-700 bg-paper-300"
          />{' '}
          discarded
        </span>
      </figcaption>
      <svg
        width={width}
        height={height}
        role="img"
        aria-label="Drug given and discarded per month; the table below gives every figure."
      >
        {[0, 0.5, 1].map((t) => (
          <g key={t}>
            <line x1={left} x2={width - 8} y1={y(scale * t)} y2={y(scale * t)} stroke="#e6e1d9" />
            <text
              x={left - 6}
              y={y(scale * t)}
              dy="0.32em"
              textAnchor="end"
              fontSize="12"
              fill="#4e473e"
            >
              {scale * t} mg
            </text>
          </g>
        ))}
        {months.map((m, i) => {
          const x = left + i * slotPx + 12;
          return (
            <g key={m.month}>
              <rect x={x} width={28} y={y(m.givenMg)} height={y(0) - y(m.givenMg)} fill="#4338ca" />
              <rect
                x={x}
                width={28}
                y={y(m.givenMg + m.discardedMg)}
                height={y(0) - y(m.discardedMg)}
                fill="#d6d0c6"
                stroke="#5b544a"
              />
              <text x={x + 14} y={height - 14} textAnchor="middle" fontSize="11" fill="#4e473e">
                {monthWords(m.month).slice(0, 3)}
              </text>
            </g>
          );
        })}
      </svg>
    </figure>
  );
}
