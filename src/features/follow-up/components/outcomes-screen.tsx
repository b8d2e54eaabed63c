import { useQuery } from '@tanstack/react-query';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { PageHeader } from '../../../components/ui/page-header';
import { SelectField } from '../../../components/ui/select-field';
import { LoadingPanel } from '../../../components/ui/status-panel';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { describeError } from '../../../lib/api-client';
import { MonthField } from '../../trends/components/month-field';
import { trendQueries } from '../../trends/api/trend-queries';
import { useTrendParams } from '../../trends/hooks/use-trend-params';
import {
  followUpQueries,
  searchQuery,
  type OutcomesAnswer,
  type PChartPoint,
  type ShareWithInterval,
} from '../api/follow-up-queries';

const pct = (value: number | null) => (value === null ? '—' : `${(value * 100).toFixed(1)} %`);

function shareText(s: ShareWithInterval, none = 'no eyes'): string {
  if (s.share === null) return none;
  return `${pct(s.share)} (${s.count} of ${s.total}; 95 % CI ${pct(s.lower)} to ${pct(s.upper)})`;
}

const signed = (value: number | null, digits: number) =>
  value === null
    ? '—'
    : `${value > 0 ? '+' : value < 0 ? '−' : ''}${Math.abs(value).toFixed(digits)}`;

/** A p-chart drawn as points with the centre line and each month's own upper 3-sigma limit. */
function PChartFigure({
  id,
  title,
  centre,
  points,
}: {
  id: string;
  title: string;
  centre: number | null;
  points: PChartPoint[];
}) {
  const width = 560;
  const height = 200;
  const pad = { left: 44, right: 36, top: 12, bottom: 36 };
  const shown = points.filter((p) => p.share !== null);
  const top = Math.min(
    1,
    Math.max(0.1, ...shown.map((p) => Math.max(p.share ?? 0, p.upperLimit ?? 0))) * 1.1,
  );
  const x = (i: number) =>
    pad.left +
    (points.length <= 1 ? 0.5 : i / (points.length - 1)) * (width - pad.left - pad.right);
  const y = (v: number) => pad.top + (1 - v / top) * (height - pad.top - pad.bottom);
  const signals = points.filter((p) => p.signal);
  const headingId = `chart-${id}`;
  return (
    <section
      aria-labelledby={headingId}
      className="rounded-2xl border border-paper-200 bg-white p-4"
    >
      <h3 id={headingId} className="font-semibold text-paper-950">
        {title}
      </h3>
      <p className="mb-2 text-sm text-paper-700">
        Centre line p̄ = {pct(centre)}; each month’s limits are p̄ ± 3√(p̄(1−p̄)/n) from its own count.{' '}
        {signals.length === 0
          ? 'No month is outside its limits: the variation is common-cause.'
          : signals.map((p) => p.words).join('; ') + '.'}
      </p>
      {points.length === 0 ? (
        <p className="text-paper-700">No treatments in these months.</p>
      ) : (
        <svg
          viewBox={`0 0 ${width} ${height}`}
          className="h-auto w-full max-w-[560px]"
          role="img"
          aria-label={`${title}: p-chart by month; details in the table below.`}
        >
          <line
            x1={pad.left}
            x2={pad.left}
            y1={pad.top}
            y2={height - pad.bottom}
            stroke="#6b6660"
          />
          <line
            x1={pad.left}
            x2={width - pad.right}
            y1={height - pad.bottom}
            y2={height - pad.bottom}
            stroke="#6b6660"
          />
          {[0, top / 2, top].map((v) => (
            <text
              key={v}
              x={pad.left - 6}
              y={y(v) + 4}
              fontSize="11"
              textAnchor="end"
              fill="#3f3b37"
            >
              {Math.round(v * 100)}%
            </text>
          ))}
          {centre !== null && (
            <line
              x1={pad.left}
              x2={width - pad.right}
              y1={y(centre)}
              y2={y(centre)}
              stroke="#3f3b37"
              strokeDasharray="6 4"
            />
          )}
          {points.map((p, i) =>
            p.upperLimit === null ? null : (
              <line
                key={`u-${p.label}`}
                x1={x(i) - 10}
                x2={x(i) + 10}
                y1={y(p.upperLimit)}
                y2={y(p.upperLimit)}
                stroke="#a3470c"
                strokeWidth="2"
              />
            ),
          )}
          {points.map((p, i) =>
            p.share === null ? null : p.signal ? (
              <rect
                key={p.label}
                x={x(i) - 6}
                y={y(p.share) - 6}
                width="12"
                height="12"
                transform={`rotate(45 ${x(i)} ${y(p.share)})`}
                fill="#a3140c"
              />
            ) : (
              <circle key={p.label} cx={x(i)} cy={y(p.share)} r="5" fill="#2f3f8f" />
            ),
          )}
          {points.map((p, i) => (
            <text
              key={`l-${p.label}`}
              x={x(i)}
              y={height - pad.bottom + 16}
              fontSize="11"
              textAnchor="middle"
              fill="#3f3b37"
            >
              {p.label}
            </text>
          ))}
        </svg>
      )}
      <table className="mt-3 w-full border-collapse text-left text-sm">
        <caption className="sr-only">{title} by month</caption>
        <thead className="text-paper-700">
          <tr>
            <th scope="col" className="py-1 pr-3 font-medium">
              Month
            </th>
            <th scope="col" className="py-1 pr-3 font-medium">
              Events / n
            </th>
            <th scope="col" className="py-1 pr-3 font-medium">
              Share
            </th>
            <th scope="col" className="py-1 pr-3 font-medium">
              3-sigma limits
            </th>
            <th scope="col" className="py-1 font-medium">
              Reading
            </th>
          </tr>
        </thead>
        <tbody>
          {points.map((p) => (
            <tr key={p.label} className="border-t border-paper-200">
              <th scope="row" className="py-1 pr-3 font-medium">
                {p.label}
              </th>
              <td className="py-1 pr-3">
                {p.count} / {p.total}
              </td>
              <td className="py-1 pr-3">{pct(p.share)}</td>
              <td className="py-1 pr-3">
                {p.lowerLimit === null ? '—' : `${pct(p.lowerLimit)} to ${pct(p.upperLimit)}`}
              </td>
              <td className={`py-1 ${p.signal ? 'font-semibold text-alarm-800' : ''}`}>
                {p.signal && <span aria-hidden="true">◆ </span>}
                {p.words}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}

function OutcomesTable({ answer }: { answer: OutcomesAnswer }) {
  return (
    <div className="overflow-x-auto rounded-2xl border border-paper-200 bg-white">
      <table className="w-full border-collapse text-left">
        <caption className="px-4 py-3 text-left text-lg font-semibold text-paper-950">
          Outcomes per protocol
        </caption>
        <thead className="text-sm text-paper-700">
          <tr>
            <th scope="col" className="px-4 py-2 font-medium">
              Protocol and outcome
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Treated eyes
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Reached the outcome (of eyes assessed)
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Lost to follow-up
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Mean acuity change
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Eyes with a complication
            </th>
          </tr>
        </thead>
        <tbody>
          {answer.protocols.map((p) => (
            <tr key={p.protocolKey} className="border-t border-paper-200 align-top">
              <th scope="row" className="px-4 py-3 font-medium text-paper-950">
                {p.protocolTitle}
                <span className="block text-sm font-normal text-paper-700">
                  {p.outcomeLabel ?? 'No outcome defined'}
                </span>
              </th>
              <td className="px-3 py-3">
                {p.treatedEyes}
                <span className="block text-sm text-paper-700">
                  {p.pending} pending · {p.notAssessable} not assessable
                </span>
              </td>
              <td className="px-3 py-3">
                {shareText(p.share, 'none assessed yet')}
                <span className="block text-sm text-paper-700">
                  Counting the lost as not reached: {pct(p.shareIfLostFailed.share)}
                </span>
              </td>
              <td className="px-3 py-3 font-medium">{p.lostToFollowUp}</td>
              <td className="px-3 py-3">
                {p.acuityPairs === 0 ? (
                  'no pairs yet'
                ) : (
                  <>
                    {signed(p.meanAcuityChangeLogMar, 2)} logMAR
                    <span className="block text-sm text-paper-700">
                      {signed(p.meanAcuityChangeLetters, 1)} letters · {p.acuityPairs} eyes
                    </span>
                  </>
                )}
              </td>
              <td className="px-3 py-3">{shareText(p.complicationRate)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** The auditor's outcomes: each protocol's results with intervals, monthly p-charts, CSV. */
export function OutcomesScreen() {
  const { filter, update, filtered } = useTrendParams();
  const protocols = useQuery(trendQueries.protocolChoices());
  const outcomes = useQuery(followUpQueries.outcomes(filter));
  return (
    <>
      <PageHeader
        title="Outcomes"
        lead={`What the treatments achieved, by the month of treatment (${unitTimeZone}). Shares come with Wilson score 95 % intervals; eyes lost to follow-up are counted, never dropped.`}
        actions={
          <a
            className="inline-flex min-h-tap items-center rounded-lg border border-paper-500 bg-white px-4 py-2 font-medium text-paper-950 underline-offset-2 hover:underline focus-visible:outline focus-visible:outline-3"
            href={`/api/exports/outcomes.csv${searchQuery(filter)}`}
          >
            Download CSV
          </a>
        }
      />
      <form
        aria-label="Choose the months and protocol"
        onSubmit={(e) => e.preventDefault()}
        className="mb-5 grid gap-4 rounded-2xl border border-paper-200 bg-white p-4 sm:grid-cols-2 lg:grid-cols-[repeat(3,minmax(0,1fr))_auto] lg:items-end"
      >
        <MonthField label="First month" value={filter.from} onChange={(from) => update({ from })} />
        <MonthField label="Last month" value={filter.to} onChange={(to) => update({ to })} />
        <SelectField
          label="Protocol"
          value={filter.protocol ?? ''}
          onChange={(e) => update({ protocol: e.target.value || undefined })}
        >
          <option value="">Every protocol</option>
          {(protocols.data ?? []).map((p) => (
            <option key={p.key} value={p.key}>
              {p.title}
            </option>
          ))}
        </SelectField>
        <Button
          variant="secondary"
          disabled={!filtered}
          onClick={() => update({ from: undefined, to: undefined, protocol: undefined })}
        >
          Clear
        </Button>
      </form>
      {outcomes.isPending ? (
        <LoadingPanel label="Working out the outcomes…" />
      ) : outcomes.isError ? (
        <Alert tone="error" title="The outcomes could not be loaded">
          {describeError(outcomes.error)}
        </Alert>
      ) : outcomes.data.protocols.length === 0 ? (
        <p className="text-paper-700">No completed treatments in these months.</p>
      ) : (
        <div className="grid gap-6">
          <OutcomesTable answer={outcomes.data} />
          <h2 className="text-xl font-semibold text-paper-950">Monthly rates as p-charts</h2>
          <div className="grid gap-6 xl:grid-cols-2">
            {outcomes.data.charts.map((c) => (
              <PChartFigure
                key={c.id}
                id={c.id}
                title={c.title}
                centre={c.centre}
                points={c.points}
              />
            ))}
          </div>
        </div>
      )}
    </>
  );
}
