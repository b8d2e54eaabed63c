import { useId } from 'react';
import type { TrendMonth } from '../api/trend-schemas';
import { formatRate, monthWords } from './trend-words';

export type TrendSeries = {
  key: string;
  title: string;
  version: number;
  byMonth: Map<string, TrendMonth>;
};

// Geometry in CSS pixels: the chart keeps its size and scrolls sideways, so labels never shrink.
const slotPx = 54;
const barPx = 28;
const plotPx = 120;
const left = 46;
const top = 40;
const bottom = 40;
const ticks = [0, 25, 50, 75, 100];

type PanelProps = { series: TrendSeries; months: string[] };

/** One protocol version: a bar per month for the share of its sessions that had a deviation. */
function TrendPanel({ series, months }: PanelProps) {
  const titleId = useId();
  const descId = useId();
  const width = left + months.length * slotPx + 8;
  const height = top + plotPx + bottom;
  const y = (pct: number) => top + plotPx - (pct / 100) * plotPx;
  const withSessions = months
    .map((m) => series.byMonth.get(m))
    .filter((m): m is TrendMonth => m !== undefined && m.sessions > 0);
  const sessions = withSessions.reduce((n, m) => n + m.sessions, 0);
  const withDeviation = withSessions.reduce((n, m) => n + m.sessionsWithDeviation, 0);
  const signals = withSessions.filter((m) => m.signal);
  const highest = withSessions.reduce<TrendMonth | null>(
    (best, m) => (best === null || m.ratePct > best.ratePct ? m : best),
    null,
  );

  return (
    <figure className="min-w-0 rounded-2xl border border-paper-200 bg-white p-4">
      <figcaption className="mb-2">
        <span className="block font-semibold text-paper-950">
          {series.title}, version {series.version}
        </span>
        <span className="text-sm text-paper-700">
          {sessions} {sessions === 1 ? 'session' : 'sessions'}, {withDeviation} with a deviation
          {sessions > 0
            ? ` (${formatRate(Math.round((withDeviation / sessions) * 1000) / 10)} overall)`
            : ''}
          .{' '}
          {signals.length === 0
            ? 'No month outside its 3-sigma limits (dashed): common-cause variation.'
            : `Special-cause variation (◆): ${signals.map((m) => `${monthWords(m.month, 'long')} ${m.signal === 'below-lower-limit' ? 'below' : 'above'} its 3-sigma limit`).join('; ')}.`}
        </span>
      </figcaption>
      <div className="overflow-x-auto">
        <svg
          width={width}
          height={height}
          viewBox={`0 0 ${width} ${height}`}
          role="img"
          aria-labelledby={`${titleId} ${descId}`}
          className="block text-paper-900"
        >
          <title id={titleId}>
            Sessions with a deviation per month, {series.title}, version {series.version}
          </title>
          <desc id={descId}>
            {withSessions.length === 0
              ? 'No sessions in these months.'
              : `${withSessions.length} months with sessions; the highest share was ${formatRate(highest!.ratePct)} in ${monthWords(highest!.month, 'long')}. The table of figures beside the charts gives every value.`}
          </desc>
          {ticks.map((t) => (
            <g key={t}>
              <line
                x1={left}
                x2={width - 8}
                y1={y(t)}
                y2={y(t)}
                stroke={t === 0 ? '#837a6d' : '#e6e1d9'}
                strokeWidth={t === 0 ? 1.5 : 1}
              />
              <text x={left - 6} y={y(t)} dy="0.32em" textAnchor="end" fontSize="12" fill="#4e473e">
                {t} %
              </text>
            </g>
          ))}
          {months.map((m, i) => {
            const cell = series.byMonth.get(m);
            const cx = left + i * slotPx + slotPx / 2;
            const [year, monthNumber] = m.split('-');
            const showYear = i === 0 || monthNumber === '01';
            return (
              <g key={m}>
                {cell && cell.sessions > 0 ? (
                  <>
                    <rect
                      x={cx - barPx / 2}
                      y={y(cell.ratePct)}
                      width={barPx}
                      height={Math.max(0, (cell.ratePct / 100) * plotPx)}
                      rx={3}
                      fill={cell.signal ? '#a3140c' : '#6139ad'}
                    />
                    {cell.upperLimitPct !== null && cell.upperLimitPct !== undefined && (
                      // The month's upper 3-sigma limit (p-chart; Benneyan JC et al. 2003).
                      <line
                        x1={cx - barPx / 2 - 4}
                        x2={cx + barPx / 2 + 4}
                        y1={y(cell.upperLimitPct)}
                        y2={y(cell.upperLimitPct)}
                        stroke="#a3470c"
                        strokeWidth={2}
                        strokeDasharray="4 2"
                      />
                    )}
                    {cell.signal && (
                      <text
                        x={cx}
                        y={y(0) + 1}
                        dy="-0.4em"
                        textAnchor="middle"
                        fontSize="14"
                        fill="#ffffff"
                      >
                        ◆
                      </text>
                    )}
                    <text
                      x={cx}
                      y={y(cell.ratePct) - 20}
                      textAnchor="middle"
                      fontSize="13"
                      fontWeight="600"
                      fill="#26221d"
                    >
                      {formatRate(cell.ratePct)}
                    </text>
                    <text
                      x={cx}
                      y={y(cell.ratePct) - 6}
                      textAnchor="middle"
                      fontSize="11"
                      fill="#4e473e"
                    >
                      {cell.sessionsWithDeviation} of {cell.sessions}
                    </text>
                  </>
                ) : (
                  <text x={cx} y={y(0) - 8} textAnchor="middle" fontSize="11" fill="#655d52">
                    none
                  </text>
                )}
                <text x={cx} y={top + plotPx + 16} textAnchor="middle" fontSize="12" fill="#37322b">
                  {monthWords(m).split(' ')[0]}
                </text>
                {showYear && (
                  <text
                    x={cx}
                    y={top + plotPx + 31}
                    textAnchor="middle"
                    fontSize="11"
                    fill="#655d52"
                  >
                    {year}
                  </text>
                )}
              </g>
            );
          })}
        </svg>
      </div>
    </figure>
  );
}

/** Small multiples on one month axis, so protocols can be compared month by month at a glance. */
export function TrendCharts({ series, months }: { series: TrendSeries[]; months: string[] }) {
  return (
    <div className="flex min-w-0 flex-col gap-4">
      {series.map((s) => (
        <TrendPanel key={`${s.key}-v${s.version}`} series={s} months={months} />
      ))}
    </div>
  );
}
