import { useQuery } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { Button, LinkButton } from '../../../components/ui/button';
import { AlertIcon, ArrowLeftIcon, PrinterIcon, ReloadIcon } from '../../../components/ui/icons';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { paths } from '../../../config/paths';
import { unitTimeZone, unitTimeZoneLabel } from '../../../config/unit-time-zone';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import type { GivenRecord } from '../api/dose-record-schemas';
import { doseRecordQueries } from '../api/dose-record-queries';
import { eyeWords, severityWords, typeWords } from './dose-record-words';
import { formatDuration } from '../../../../shared/format/figures';
import { formatFigurePair, formatReading } from '../../../../shared/format/precision';
import type { SessionState } from '../api/dose-record-schemas';
import type { DosePlan } from '../../../../shared/schemas/calculation';
import { PlanAndGiven } from '../../../components/plan-and-given';
import { bmiText } from '../../../../shared/engine/body-mass-index';
import { formatMeasureWithConversion } from '../../../../shared/engine/units';
import { delayText } from '../../../lib/dose-given-words';
import { eventWordsOf } from '../../../lib/session-event-words';
import { AcceptedCautionsBanner } from '../../../components/ui/accepted-cautions-banner';
import {
  formatFigure,
  formatOffset,
  formatUnitClock,
  formatCalendarDate,
  formatUnitDate,
  formatUnitDateTime,
} from '../../../lib/unit-times';

function Part({ id, title, children }: { id: string; title: string; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className="break-inside-avoid border-t border-paper-300 pt-4">
      <h2 id={id} className="mb-3 text-lg font-semibold text-paper-950">
        {title}
      </h2>
      {children}
    </section>
  );
}

/** The moments of the session that a chart needs, in time order. */
function moments(record: GivenRecord): { label: string; at: string }[] {
  const all: [string, string | null][] = [
    ['Session started', record.sessionStartedAt],
    ['Infusion started', record.infusionStartAt],
    ['Infusion ended', record.infusionEndAt],
    ['Extravasation', record.extravasationAt],
    ['Light started', record.lightStartAt],
    ['Light ended', record.lightEndAt],
    ['Soak started', record.soakStartAt],
    ['Soak ended', record.soakEndAt],
    ['UV started', record.uvStartAt],
    ['UV ended', record.uvEndAt],
    [record.outcome === 'stopped' ? 'Session stopped' : 'Session ended', record.endedAt],
  ];
  return all
    .filter((m): m is [string, string] => m[1] !== null)
    .map(([label, at]) => ({ label, at }));
}

/** The light's pauses, from the taps that still count: each pause with its resume, if any. */
function pausesOf(
  session: SessionState,
): { stepId: string | null; from: string; to: string | null }[] {
  const withdrawn = new Set(session.record?.withdrawnTaps.map((tap) => tap.idempotencyKey) ?? []);
  const pauses: { stepId: string | null; from: string; to: string | null }[] = [];
  const taps = session.events
    .filter((event) => !withdrawn.has(event.idempotencyKey))
    .sort((a, b) => Date.parse(a.clientTime) - Date.parse(b.clientTime));
  for (const event of taps) {
    if (event.type === 'paused')
      pauses.push({ stepId: event.stepId ?? null, from: event.clientTime, to: null });
    if (event.type === 'resumed') {
      const open = pauses.find((p) => p.to === null && p.stepId === (event.stepId ?? null));
      if (open) open.to = event.clientTime;
    }
  }
  return pauses;
}

/** What was set on the laser or the UV device, from the plan. */
function deviceSettings(plan: DosePlan | null, kind: 'pdt' | 'cxl'): [string, string][] {
  if (!plan) return [];
  const time = (s: number | null) => formatDuration(s, 'seconds-and-words', { maxDecimals: 0 });
  return kind === 'pdt'
    ? [
        ['Spot set on the laser', formatReading('spotUm', plan.deviceSpotDiameterUm)],
        ['Power', formatReading('powerMw', plan.powerMw)],
        ['Irradiance', formatReading('irradianceMwPerCm2', plan.irradianceMwPerCm2)],
        ['Exposure', time(plan.exposureS)],
        ['Fluence', formatReading('fluenceJPerCm2', plan.fluenceJPerCm2)],
      ]
    : [
        ['Irradiance', formatReading('irradianceMwPerCm2', plan.irradianceMwPerCm2)],
        ['UV on-time', time(plan.uvTimeS)],
        ['UV elapsed time', time(plan.uvElapsedS)],
        ['Fluence', formatReading('fluenceJPerCm2', plan.fluenceJPerCm2)],
      ];
}

/** One order's dose record laid out for A4: plan against what was given, the times, the deviations. */
export function DoseRecordPrintScreen({
  orderId,
  canListRecords,
}: {
  orderId: number;
  /** Reviewers also get the way back to the list of every dose record. */
  canListRecords: boolean;
}) {
  const order = useQuery(doseRecordQueries.order(orderId));
  const session = useQuery(doseRecordQueries.session(orderId));
  const protocol = order.data?.protocol;
  const steps = useQuery({
    ...doseRecordQueries.protocolSteps(protocol?.key ?? '', protocol?.version ?? 0),
    enabled: protocol !== undefined,
  });

  const back = (
    <>
      <LinkButton to={paths.order.getHref(orderId)} icon={<ArrowLeftIcon />}>
        Order {orderId}
      </LinkButton>
      {canListRecords && (
        <LinkButton variant="secondary" to={paths.doseRecords.getHref()}>
          All dose records
        </LinkButton>
      )}
    </>
  );

  if (order.isPending || session.isPending)
    return <LoadingPanel label="Loading the dose record…" />;
  if (order.isError || session.isError) {
    const error = order.error ?? session.error;
    const missing = isApiRequestError(error) && error.status === 404;
    return (
      <StatusPanel
        role="alert"
        headingLevel="h1"
        icon={<AlertIcon className="size-6" />}
        title={missing ? 'There is no such order' : 'The dose record could not be loaded'}
        actions={
          <>
            {back}
            {!missing && (
              <Button
                icon={<ReloadIcon />}
                busy={order.isFetching || session.isFetching}
                onClick={() => {
                  void order.refetch();
                  void session.refetch();
                }}
              >
                Try again
              </Button>
            )}
          </>
        }
      >
        <p>{describeError(error)}</p>
      </StatusPanel>
    );
  }

  const o = order.data;
  const { record, deviations, nurses } = session.data;
  // Light times read from the infusion start, as the protocol states them (TAP Study Group
  // 1999: light 15 min after the START of the infusion); without an infusion, from the session start.
  const fromInfusion = record?.infusionStartAt ?? null;
  const startAt = fromInfusion ?? record?.sessionStartedAt ?? null;
  const startMs = startAt ? Date.parse(startAt) : null;
  const pauses = pausesOf(session.data);
  const settings = deviceSettings(order.data.plan, order.data.kind);
  const stepTitle = (stepId: string | null) =>
    stepId ? (steps.data?.definition.steps.find((s) => s.id === stepId)?.title ?? stepId) : null;
  const printedAt = formatUnitDateTime(new Date().toISOString());
  const lastCheck = o.doseChecks.at(-1);

  return (
    <div className="mx-auto max-w-4xl print:max-w-none">
      {/* A4 with a margin a hole punch and a chart clip leave readable. */}
      <style>{'@page { size: A4; margin: 14mm 14mm 16mm 20mm; }'}</style>
      <div className="mb-5 flex flex-wrap gap-3 print:hidden">
        {back}
        <Button icon={<PrinterIcon />} onClick={() => window.print()}>
          Print
        </Button>
      </div>

      <article
        aria-labelledby="dose-record-title"
        className="flex flex-col gap-5 rounded-2xl border border-paper-200 bg-white p-6 print:gap-4 print:rounded-none print:border-0 print:p-0 print:text-[11pt]"
      >
        <header>
          <p className="text-sm font-medium tracking-wide text-paper-700 uppercase">
            Luxtempo · dose record
          </p>
          <h1
            id="dose-record-title"
            tabIndex={-1}
            data-page-heading
            className="text-2xl font-semibold text-paper-950"
          >
            {o.patient.familyName}, {o.patient.givenName} · {o.patient.recordNumber}
          </h1>
          <p className="text-paper-800">Born {formatCalendarDate(o.patient.dateOfBirth)}</p>
          <p className="text-paper-800">
            Order {o.id}
            {o.revision > 1 ? ` (revision ${o.revision})` : ''} · {eyeWords[o.eye]} ·{' '}
            {o.protocol.title}, version {o.protocol.version}
          </p>
          {record?.sessionStartedAt && (
            <p className="text-paper-800">Session on {formatUnitDate(record.sessionStartedAt)}</p>
          )}
        </header>

        <AcceptedCautionsBanner cautions={o.answeredCautions} />

        <Part id="record-people" title="Order and preparation">
          <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-1">
            {(o.inputs.height || o.inputs.weight) && (
              <>
                <dt className="text-paper-700">Measured</dt>
                <dd>
                  {[
                    o.inputs.height
                      ? `height ${formatMeasureWithConversion(o.inputs.height)}`
                      : null,
                    o.inputs.weight
                      ? `weight ${formatMeasureWithConversion(o.inputs.weight)}`
                      : null,
                    typeof o.plan?.bmiKgPerM2 === 'number'
                      ? `BMI ${bmiText(o.plan.bmiKgPerM2)}`
                      : null,
                  ]
                    .filter(Boolean)
                    .join(', ')}
                </dd>
              </>
            )}
            <dt className="text-paper-700">Session run by</dt>
            <dd>{nurses.length > 0 ? nurses.join(', ') : '—'}</dd>
            <dt className="text-paper-700">Signed</dt>
            <dd>
              {o.signedBy?.displayName ?? '—'}
              {o.signedAt ? `, ${formatUnitDateTime(o.signedAt)}` : ''}
            </dd>
            {lastCheck && (
              <>
                <dt className="text-paper-700">Dose check</dt>
                <dd>
                  {lastCheck.outcome === 'match' ? 'Figures agreed' : 'Figures differed'},{' '}
                  {lastCheck.pharmacist?.displayName ?? '—'},{' '}
                  {formatUnitDateTime(lastCheck.createdAt)}
                </dd>
              </>
            )}
            {o.preparation && (
              <>
                <dt className="text-paper-700">Preparation</dt>
                <dd>
                  Lot {o.preparation.vialLot} (expires {o.preparation.vialExpiry}),{' '}
                  {formatFigure(o.preparation.volumeDrawnMl, 'mL')} drawn, reconstituted{' '}
                  {formatUnitDateTime(o.preparation.reconstitutedAt)} by{' '}
                  {o.preparation.pharmacist?.displayName ?? '—'}; use before{' '}
                  {formatUnitDateTime(o.preparation.beyondUseAt)}
                </dd>
              </>
            )}
          </dl>
        </Part>

        <Part id="record-figures" title="Plan and what was given">
          <PlanAndGiven
            plan={o.plan}
            record={record}
            steps={steps.data}
            headingId="record-figures"
          />
        </Part>

        {settings.length > 0 && (
          <Part id="record-device" title="Device settings">
            <p className="mb-2 text-sm text-paper-700">
              As planned and set on the {o.kind === 'pdt' ? 'laser' : 'UV device'}; the checks
              before the light confirmed them.
            </p>
            <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-1">
              {settings.map(([label, value]) => (
                <div key={label} className="contents">
                  <dt className="text-paper-700">{label}</dt>
                  <dd className="numerals-steady">{value}</dd>
                </div>
              ))}
            </dl>
          </Part>
        )}

        <Part id="record-times" title="Times">
          {record === null ? (
            <p>No session was recorded for this order.</p>
          ) : (
            <table
              className="w-full max-w-xl border-collapse text-left"
              aria-labelledby="record-times"
            >
              <thead className="text-sm text-paper-700">
                <tr>
                  <th scope="col" className="py-1 pr-4 font-semibold">
                    Moment
                  </th>
                  <th scope="col" className="py-1 pr-4 font-semibold">
                    Clock ({unitTimeZoneLabel})
                  </th>
                  <th scope="col" className="py-1 font-semibold">
                    {fromInfusion ? 'From infusion start' : 'From session start'}
                  </th>
                </tr>
              </thead>
              <tbody>
                {moments(record).map((m) => (
                  <tr key={m.label} className="border-t border-paper-200">
                    <th scope="row" className="py-1 pr-4 font-medium">
                      {m.label}
                    </th>
                    <td className="numerals-steady py-1 pr-4">{formatUnitClock(m.at)}</td>
                    <td className="numerals-steady py-1">
                      {startMs === null ? '—' : formatOffset((Date.parse(m.at) - startMs) / 1000)}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
          {record?.stopReason && <p className="mt-2">Stopped because: {record.stopReason}</p>}
        </Part>

        <Part id="record-pauses" title="Pauses">
          {pauses.length === 0 ? (
            <p>No pause was tapped.</p>
          ) : (
            <ul className="flex flex-col gap-1">
              {pauses.map((pause) => (
                <li key={pause.from} className="numerals-steady">
                  {stepTitle(pause.stepId) ?? 'Paused'}: paused {formatUnitClock(pause.from)},{' '}
                  {pause.to
                    ? `resumed ${formatUnitClock(pause.to)} (${formatDuration((Date.parse(pause.to) - Date.parse(pause.from)) / 1000, 'words')})`
                    : 'not resumed'}
                </li>
              ))}
            </ul>
          )}
        </Part>

        {record && record.withdrawnTaps.length > 0 && (
          <Part id="record-withdrawn" title="Taps withdrawn as mistakes">
            <p className="mb-2 text-sm text-paper-700">
              Kept here as tapped; none of the figures and times above counts them.
            </p>
            <ul className="flex flex-col gap-2">
              {record.withdrawnTaps.map((tap) => {
                const stepTitle = tap.stepId
                  ? (steps.data?.definition.steps.find((s) => s.id === tap.stepId)?.title ??
                    tap.stepId)
                  : null;
                return (
                  <li key={tap.idempotencyKey}>
                    <span className="font-semibold">
                      Withdrawn: <s>{eventWordsOf(tap.type)}</s>
                      {stepTitle ? ` (${stepTitle})` : ''}
                    </span>{' '}
                    <span className="numerals-steady">
                      tapped {formatUnitClock(tap.at)}, withdrawn {formatUnitClock(tap.withdrawnAt)}
                    </span>
                    <span className="block text-paper-800">Reason: {tap.reason}</span>
                  </li>
                );
              })}
            </ul>
          </Part>
        )}

        {record && record.lateEntries.length > 0 && (
          <Part id="record-late" title="Late entries">
            <p className="mb-2 text-sm text-paper-700">
              Taps entered after the session ended, each with the reason it was late.
            </p>
            <ul className="flex flex-col gap-2">
              {record.lateEntries.map((entry) => (
                <li key={entry.idempotencyKey}>
                  <span className="font-semibold">Late entry: {eventWordsOf(entry.type)}</span>{' '}
                  <span className="numerals-steady">
                    timed {formatUnitClock(entry.at)}
                    {entry.receivedAt ? `, received ${formatUnitClock(entry.receivedAt)}` : ''}
                  </span>
                  <span className="block text-paper-800">Reason: {entry.reason}</span>
                </li>
              ))}
            </ul>
          </Part>
        )}

        {record && record.receiptDelays.length > 0 && (
          <Part id="record-delays" title="Taps received late">
            <p className="mb-2 text-sm text-paper-700">
              Taps that reached the server more than a minute after they were made (a tablet
              offline); their own time counts.
            </p>
            <ul className="flex flex-col gap-1">
              {record.receiptDelays.map((delay) => (
                <li key={delay.idempotencyKey} className="numerals-steady">
                  {eventWordsOf(delay.type)} tapped {formatUnitClock(delay.at)}, received{' '}
                  {formatUnitClock(delay.receivedAt)}: {delayText(delay.delayS)} later
                </li>
              ))}
            </ul>
          </Part>
        )}

        <Part id="record-deviations" title="Deviations from protocol">
          {deviations.length === 0 ? (
            <p>None found.</p>
          ) : (
            <ul className="flex flex-col gap-2">
              {deviations.map((d) => (
                <li key={d.id}>
                  <span className="font-semibold">
                    {severityWords[d.severity]}: {typeWords(d.type)}
                  </span>{' '}
                  <span className="numerals-steady">
                    (expected {formatFigurePair(d.expected, d.actual, d.unit).expected}, actual{' '}
                    {formatFigurePair(d.expected, d.actual, d.unit).actual})
                  </span>
                  <span className="block text-paper-800">{d.message}</span>
                </li>
              ))}
            </ul>
          )}
        </Part>

        <Part id="record-verification" title="Verification">
          <p className="mb-4 text-sm text-paper-700">
            Checked against the session and filed by the person who signs below.
          </p>
          <dl className="grid grid-cols-[max-content_1fr] items-end gap-x-4 gap-y-6">
            {['Name', 'Signature', 'Date'].map((label) => (
              <div key={label} className="contents">
                <dt className="text-paper-700">{label}</dt>
                <dd className="h-7 border-b border-paper-950">
                  <span className="sr-only">left blank for a handwritten entry</span>
                </dd>
              </div>
            ))}
          </dl>
        </Part>

        <footer className="border-t border-paper-300 pt-3 text-sm text-paper-700">
          Times are {unitTimeZoneLabel} ({unitTimeZone}). Printed {printedAt} from Luxtempo; the
          record in Luxtempo is the reference if this copy differs.
        </footer>
      </article>
    </div>
  );
}
