import type { TrendMonth } from '../api/trend-schemas';
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
            <th scope="col" className="px-3 py-2 pr-4 text-right font-semibold">
              Rate
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
              <td className="numerals-steady px-3 py-2 pr-4 text-right font-semibold whitespace-nowrap">
                {formatRate(r.ratePct)}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
