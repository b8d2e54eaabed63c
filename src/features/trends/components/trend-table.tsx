import { deviationSeverities } from '../../../../shared/session/session-events';
import { severityWords, typeWords } from '../../../lib/deviation-words';
import type { TrendByType, TrendMonth } from '../api/trend-schemas';
import { formatRate, monthWords } from './trend-words';

/** Every figure behind the charts, one row per month and protocol version. */
export function TrendTable({ rows }: { rows: TrendMonth[] }) {
  return (
    <div className="relative overflow-x-auto rounded-2xl border border-paper-200 bg-white">
      <table className="w-full border-collapse text-left">
        <caption className="px-4 pt-3 pb-2 text-left font-semibold text-paper-950">
          The figures
        </caption>
        <thead className="bg-paper-100 text-sm text-paper-700">
          <tr>
            <th scope="col" className="px-3 py-2 pl-4 font-semibold">
              Month
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Protocol
            </th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">
              Sessions
            </th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">
              With a deviation
            </th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">
              Rate
            </th>
            <th scope="col" className="px-3 py-2 pr-4 font-semibold">
              3-sigma limits and reading
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr
              key={`${r.month}-${r.protocolKey}-${r.protocolVersion}`}
              className="border-t border-paper-200"
            >
              <th scope="row" className="px-3 py-2 pl-4 font-medium whitespace-nowrap">
                {monthWords(r.month)}
              </th>
              <td className="px-3 py-2">
                {r.protocolTitle}
                <span className="block text-sm text-paper-600">version {r.protocolVersion}</span>
              </td>
              <td className="numerals-steady px-3 py-2 text-right">{r.sessions}</td>
              <td className="numerals-steady px-3 py-2 text-right">{r.sessionsWithDeviation}</td>
              <td className="numerals-steady px-3 py-2 text-right font-semibold whitespace-nowrap">
                {formatRate(r.ratePct)}
              </td>
              <td
                className={`px-3 py-2 pr-4 text-sm ${r.signal ? 'font-semibold text-alarm-800' : ''}`}
              >
                {r.upperLimitPct !== null && r.upperLimitPct !== undefined && (
                  <span className="block whitespace-nowrap">
                    {formatRate(r.lowerLimitPct ?? 0)} to {formatRate(r.upperLimitPct)}
                  </span>
                )}
                {r.signal && <span aria-hidden="true">◆ </span>}
                {r.reading}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** The deviations split by type and severity over the months shown: a row per type, a column per severity. */
export function DeviationTypeTable({
  rows,
  months,
}: {
  rows: TrendByType[];
  months: TrendMonth[];
}) {
  const sessions = months.reduce((sum, m) => sum + m.sessions, 0);
  const byType = new Map<string, Record<string, number>>();
  for (const row of rows) {
    const counts = byType.get(row.type) ?? {};
    counts[row.severity] = (counts[row.severity] ?? 0) + row.deviations;
    byType.set(row.type, counts);
  }
  const types = [...byType.entries()]
    .map(([type, counts]) => ({
      type,
      counts,
      total: Object.values(counts).reduce((a, b) => a + b, 0),
    }))
    .sort((a, b) => b.total - a.total || typeWords(a.type).localeCompare(typeWords(b.type)));
  if (types.length === 0) return <p className="text-paper-800">No deviation in these months.</p>;
  return (
    <div className="relative overflow-x-auto rounded-2xl border border-paper-200 bg-white">
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">
          Deviations by type and severity over {sessions} finished sessions
        </caption>
        <thead className="bg-paper-100 text-sm text-paper-700">
          <tr>
            <th scope="col" className="px-3 py-2 pl-4 font-semibold">
              Type
            </th>
            {deviationSeverities.map((severity) => (
              <th key={severity} scope="col" className="px-3 py-2 text-right font-semibold">
                {severityWords[severity]}
              </th>
            ))}
            <th scope="col" className="px-3 py-2 pr-4 text-right font-semibold">
              All
            </th>
          </tr>
        </thead>
        <tbody>
          {types.map(({ type, counts, total }) => (
            <tr key={type} className="border-t border-paper-200">
              <th scope="row" className="px-3 py-2 pl-4 font-medium">
                {typeWords(type)}
              </th>
              {deviationSeverities.map((severity) => (
                <td key={severity} className="numerals-steady px-3 py-2 text-right">
                  {counts[severity] ?? 0}
                </td>
              ))}
              <td className="numerals-steady px-3 py-2 pr-4 text-right font-semibold">{total}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
