import { useQuery } from '@tanstack/react-query';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { AlertIcon, ReloadIcon, TrendBarsIcon } from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import type { TrendMonth } from '../api/trend-schemas';
import { trendQueries } from '../api/trend-queries';
import { useTrendParams } from '../hooks/use-trend-params';
import { MonthField } from './month-field';
import { SelectField } from '../../../components/ui/select-field';
import { TrendCharts, type TrendSeries } from './trend-chart';
import { monthsBetween } from './trend-words';
import { DeviationTypeTable, TrendTable } from './trend-table';

function seriesOf(rows: TrendMonth[]): TrendSeries[] {
  const byKey = new Map<string, TrendSeries>();
  for (const row of rows) {
    const id = `${row.protocolKey}@${row.protocolVersion}`;
    let series = byKey.get(id);
    if (!series) {
      series = {
        key: row.protocolKey,
        title: row.protocolTitle,
        version: row.protocolVersion,
        byMonth: new Map(),
      };
      byKey.set(id, series);
    }
    series.byMonth.set(row.month, row);
  }
  return [...byKey.values()].sort(
    (a, b) => a.title.localeCompare(b.title) || a.version - b.version,
  );
}

export function TrendsScreen() {
  const { filter, update, filtered } = useTrendParams();
  const trends = useQuery(trendQueries.months(filter));
  const protocols = useQuery(trendQueries.protocolChoices());
  const fieldErrors: Record<string, string> =
    isApiRequestError(trends.error) && trends.error.status === 400
      ? Object.fromEntries(trends.error.fields.map((f) => [f.path, f.message]))
      : {};
  const rangeError =
    filter.from && filter.to && filter.from > filter.to
      ? 'The first month is after the last, so nothing can match.'
      : undefined;

  const rows = trends.data?.months ?? [];
  const byType = trends.data?.byType ?? [];
  const present = rows.map((r) => r.month).sort();
  const months = monthsBetween(filter.from ?? present[0] ?? '', filter.to ?? present.at(-1) ?? '');

  return (
    <>
      <PageHeader
        title="Trends"
        lead={`Per month and protocol version: finished sessions, how many had at least one deviation, and that share. Months are the unit’s calendar months (${unitTimeZone}).`}
      />
      <form
        aria-label="Choose the months and protocol"
        onSubmit={(e) => e.preventDefault()}
        className="mb-5 grid gap-4 rounded-2xl border border-paper-200 bg-white p-4 sm:grid-cols-2 lg:grid-cols-[repeat(3,minmax(0,1fr))_auto] lg:items-end"
      >
        <MonthField
          label="First month"
          value={filter.from}
          error={rangeError ?? fieldErrors.from}
          onChange={(from) => update({ from })}
        />
        <MonthField
          label="Last month"
          value={filter.to}
          error={fieldErrors.to}
          onChange={(to) => update({ to })}
        />
        <SelectField
          label="Protocol"
          value={filter.protocol ?? ''}
          error={
            protocols.isError
              ? 'The protocol list could not be loaded; reload the page to try again.'
              : fieldErrors.protocol
          }
          onChange={(e) => update({ protocol: e.target.value || undefined })}
        >
          <option value="">Every protocol</option>
          {(protocols.data ?? []).map((p) => (
            <option key={p.key} value={p.key}>
              {p.title}
            </option>
          ))}
          {filter.protocol && !protocols.data?.some((p) => p.key === filter.protocol) && (
            <option value={filter.protocol}>{filter.protocol}</option>
          )}
        </SelectField>
        <Button
          variant="secondary"
          disabled={!filtered}
          onClick={() => update({ from: undefined, to: undefined, protocol: undefined })}
        >
          Clear
        </Button>
      </form>

      {trends.isPending ? (
        <LoadingPanel label="Loading the monthly figures…" />
      ) : trends.isError && !trends.data ? (
        <StatusPanel
          role="alert"
          icon={<AlertIcon className="size-6" />}
          title="The monthly figures could not be loaded"
          actions={
            <Button
              variant="secondary"
              icon={<ReloadIcon />}
              busy={trends.isFetching}
              onClick={() => void trends.refetch()}
            >
              Try again
            </Button>
          }
        >
          <p>
            {Object.keys(fieldErrors).length > 0
              ? 'Correct the fields marked above.'
              : describeError(trends.error)}
          </p>
        </StatusPanel>
      ) : rows.length === 0 ? (
        <StatusPanel
          icon={<TrendBarsIcon className="size-6" />}
          title={filtered ? 'No sessions in these months' : 'No finished sessions yet'}
        >
          <p>
            {filtered
              ? 'Choose other months or every protocol.'
              : 'Figures appear once sessions are completed or stopped.'}
          </p>
        </StatusPanel>
      ) : (
        <>
          {trends.isError && (
            <Alert tone="error" title="The figures may be out of date" className="mb-4">
              {describeError(trends.error)}
            </Alert>
          )}
          <div
            className="grid items-start gap-5 2xl:grid-cols-2"
            aria-busy={trends.isPlaceholderData || undefined}
          >
            <section aria-labelledby="trend-charts-heading" className="min-w-0">
              <h2 id="trend-charts-heading" className="mb-1 text-xl font-semibold text-paper-950">
                Share of sessions with a deviation
              </h2>
              <p className="mb-3 text-sm text-paper-700">
                One chart per protocol version on the same months. Each bar is labelled with its
                rate and with “sessions with a deviation of sessions”; “none” marks a month without
                sessions.
              </p>
              <TrendCharts series={seriesOf(rows)} months={months} />
            </section>
            <section aria-label="The figures as a table" className="min-w-0 2xl:sticky 2xl:top-4">
              <TrendTable rows={rows} />
            </section>
          </div>
          <section aria-labelledby="trend-types-heading" className="mt-6 min-w-0">
            <h2 id="trend-types-heading" className="mb-1 text-xl font-semibold text-paper-950">
              Deviations by type and severity
            </h2>
            <p className="mb-3 text-sm text-paper-700">
              Every standing deviation of the finished sessions above, counted by what departed and
              how much it weighs; a session can have several.
            </p>
            <DeviationTypeTable rows={byType} months={rows} />
          </section>
        </>
      )}
    </>
  );
}
