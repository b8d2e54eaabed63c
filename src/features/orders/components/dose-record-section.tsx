import type { ReactNode } from 'react';
import { formatUnitClock, formatUnitDateTime } from '../../../lib/unit-times';
import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import type { OrderDetail } from '../../../../shared/schemas/orders';
import { LinkButton } from '../../../components/ui/button';
import { paths } from '../../../config/paths';
import { formatDuration } from '../../../../shared/format/figures';
import {
  formatFigurePair,
  formatReading,
  type ReadingKind,
} from '../../../../shared/format/precision';
import { delayText, doseGivenText, volumeGivenText } from '../../../lib/dose-given-words';
import { eventWordsOf } from '../../../lib/session-event-words';
import { PrinterIcon } from '../../../components/ui/icons';
import { unitTimeZone, unitTimeZoneLabel } from '../../../config/unit-time-zone';
import type { GivenRecord, OrderSession } from '../api/order-response-schemas';
import { DeviationSeverityLabel } from './deviation-severity-label';
import { formatFigure } from './plan-numbers';
import { deviationSeverityOrder, sessionOutcomeWords } from './session-words';

type Row = { label: string; planned: ReactNode; given: ReactNode };

const none = <span className="text-paper-700">—</span>;
// Figures at the precision they are read at (shared/format/precision), the same as on paper.
const num = (value: number | null | undefined, kind: ReadingKind, graduationMl?: number) =>
  value == null ? none : formatReading(kind, value, { graduationMl });
const formatSeconds = (seconds: number) =>
  formatDuration(seconds, 'seconds-and-words', { maxDecimals: 0 });
const secs = (value: number | null | undefined) => (value == null ? none : formatSeconds(value));
const span = (from: string | null, to: string | null) =>
  from ? `${formatUnitClock(from)} to ${to ? formatUnitClock(to) : '(running)'}` : none;
const everyMin = (min: number | undefined) =>
  min === undefined ? none : `a drop every ${formatFigure(min)} min`;
const gap = (gapS: number | null) => (gapS == null ? none : `longest gap ${formatSeconds(gapS)}`);

const basisWords = {
  measured: 'measured',
  nominal: 'nominal, from the settings',
  planned: 'from the plan (no device named)',
} as const;

/** The device and lens used, what was set and measured, beside the plan's settings. */
function deviceRows(
  plan: NonNullable<OrderDetail['plan']>,
  record: GivenRecord,
  isPdt: boolean,
): Row[] {
  const used = record.deviceUsed;
  if (!used?.device)
    return [
      { label: 'Device', planned: none, given: 'not named (recorded before the device register)' },
    ];
  const rows: Row[] = [
    {
      label: 'Device',
      planned: none,
      given: `${used.device.name} (serial ${used.device.serialNumber})`,
    },
  ];
  if (isPdt) {
    rows.push(
      {
        label: 'Lens and laser-spot factor',
        planned: none,
        given: used.lens
          ? `${used.lens.name ?? 'factor typed on the order'}, × ${formatFigure(used.lens.laserSpotFactor)}`
          : none,
      },
      {
        label: 'Spot set on the laser',
        planned: num(plan.deviceSpotDiameterUm, 'spotUm'),
        given: num(used.spotSetUm, 'spotUm'),
      },
      {
        label: 'Power set on the laser',
        planned: num(plan.powerMw, 'powerMw'),
        given: num(used.powerSetMw, 'powerMw'),
      },
    );
  } else {
    rows.push(
      {
        label: 'Irradiance set',
        planned: num(plan.irradianceMwPerCm2, 'irradianceMwPerCm2'),
        given: num(used.irradianceSetMwPerCm2, 'irradianceMwPerCm2'),
      },
      {
        label: 'Irradiance measured',
        planned: none,
        given: num(used.measuredIrradianceMwPerCm2, 'irradianceMwPerCm2'),
      },
    );
  }
  rows.push({
    label: 'Fluence worked from',
    planned: none,
    given:
      used.fluenceIrradianceMwPerCm2 === null
        ? none
        : `${formatReading('irradianceMwPerCm2', used.fluenceIrradianceMwPerCm2)} (${basisWords[used.fluenceBasis]})`,
  });
  return rows;
}

function pdtRows(
  plan: NonNullable<OrderDetail['plan']>,
  record: GivenRecord,
  graduationMl: number | undefined,
): Row[] {
  const rows: Row[] = [
    { label: 'Infusion', planned: none, given: span(record.infusionStartAt, record.infusionEndAt) },
    {
      label: 'Infusion duration',
      planned: secs(plan.infusionEndAfterStartS),
      given: secs(record.infusionDurationS),
    },
    {
      label: 'Volume infused',
      planned:
        plan.drugVolumeMl == null
          ? none
          : `${formatReading('volumeMl', plan.drugVolumeMl, { graduationMl })} drug + ${formatReading('volumeMl', plan.diluentVolumeMl ?? 0)} diluent`,
      given: volumeGivenText(record) ?? none,
    },
    {
      label: 'Verteporfin dose',
      planned: num(plan.doseMg, 'doseMg'),
      given: doseGivenText(record) ?? none,
    },
  ];
  if (record.extravasationAt)
    rows.push({
      label: 'Extravasation',
      planned: none,
      given: `at ${formatUnitClock(record.extravasationAt)}`,
    });
  rows.push(
    {
      label: 'Light start after infusion start',
      planned: secs(plan.lightStartAfterInfusionStartS),
      given: record.lightStartAt ? (
        <>
          {secs(record.lightStartAfterInfusionStartS)}, at {formatUnitClock(record.lightStartAt)}
        </>
      ) : (
        none
      ),
    },
    {
      label: 'Exposure on the laser',
      planned: secs(plan.exposureS),
      given:
        record.deviceExposureS == null
          ? none
          : `${formatSeconds(record.deviceExposureS)}${record.deviceEnergyJ == null ? '' : `, ${formatReading('energyJ', record.deviceEnergyJ)}`}`,
    },
    { label: 'Light on-time (taps)', planned: secs(plan.exposureS), given: secs(record.lightOnS) },
    {
      label: 'Fluence',
      planned: num(plan.fluenceJPerCm2, 'fluenceJPerCm2'),
      given: num(record.deliveredFluenceJPerCm2, 'fluenceJPerCm2'),
    },
  );
  return rows;
}

function cxlRows(
  plan: NonNullable<OrderDetail['plan']>,
  record: GivenRecord,
  cxl: ProtocolVersion['cxl'] | undefined,
): Row[] {
  const rows: Row[] = [
    {
      label: 'Riboflavin soak',
      planned: cxl ? `${formatFigure(cxl.soakMin)} min` : none,
      given: record.soakStartAt ? (
        <>
          {secs(record.soakDurationS)} ({span(record.soakStartAt, record.soakEndAt)})
        </>
      ) : (
        none
      ),
    },
    {
      label: 'Drops during the soak',
      planned: everyMin(cxl?.dropIntervalSoakMin),
      given: gap(record.longestDropGapSoakS),
    },
    {
      label: 'Stromal thickness before UV',
      planned: cxl ? `at least ${formatReading('thicknessUm', cxl.minStromalThicknessUm)}` : none,
      given: num(record.thicknessBeforeUvUm, 'thicknessUm'),
    },
  ];
  if (record.thicknessOverrideReason)
    rows.push({
      label: 'Thickness minimum overridden',
      planned: none,
      given: `Reason: ${record.thicknessOverrideReason}`,
    });
  rows.push(
    { label: 'UV', planned: none, given: span(record.uvStartAt, record.uvEndAt) },
    { label: 'UV on-time', planned: secs(plan.uvTimeS), given: secs(record.uvOnS) },
    { label: 'UV elapsed time', planned: secs(plan.uvElapsedS), given: secs(record.uvElapsedS) },
    {
      label: 'Drops during UV',
      planned: everyMin(cxl?.dropIntervalUvMin),
      given: gap(record.longestDropGapUvS),
    },
    {
      label: 'Fluence',
      planned: num(plan.fluenceJPerCm2, 'fluenceJPerCm2'),
      given: num(record.deliveredFluenceJPerCm2, 'fluenceJPerCm2'),
    },
  );
  return rows;
}

type DoseRecordSectionProps = {
  order: OrderDetail;
  definition: ProtocolVersion | null;
  session: OrderSession;
};

/** The chart's record of one session: the frozen plan against what the step clock recorded, and the deviations. */
export function DoseRecordSection({ order, definition, session }: DoseRecordSectionProps) {
  const { record, deviations } = session;
  if (!record || record.outcome === 'not-started') return null;
  const plan = order.plan;
  const rows = plan
    ? [
        ...deviceRows(plan, record, order.kind === 'pdt'),
        ...(order.kind === 'pdt'
          ? pdtRows(plan, record, definition?.drug?.syringeGraduationMl)
          : cxlRows(plan, record, definition?.cxl)),
      ]
    : [];
  const sorted = [...deviations].sort(
    (a, b) =>
      deviationSeverityOrder.indexOf(a.severity) - deviationSeverityOrder.indexOf(b.severity),
  );

  return (
    <section
      id="dose-record"
      aria-labelledby="dose-record-heading"
      className="space-y-4 rounded-2xl border border-paper-200 bg-white p-5 print:border-0 print:p-0"
    >
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 id="dose-record-heading" className="text-xl font-semibold text-paper-950">
          Dose record
        </h2>
        {/* The record's own print layout: the dose record alone, not the whole order page. */}
        <LinkButton
          variant="secondary"
          icon={<PrinterIcon />}
          to={paths.doseRecordPrint.getHref(order.id)}
        >
          Print dose record
        </LinkButton>
      </div>
      <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-3 print:grid-cols-3">
        <div>
          <dt className="text-sm text-paper-600">Session</dt>
          <dd className="font-semibold text-paper-950">{sessionOutcomeWords[record.outcome]}</dd>
        </div>
        <div>
          <dt className="text-sm text-paper-600">Started</dt>
          <dd className="text-paper-950">
            {record.sessionStartedAt ? formatUnitDateTime(record.sessionStartedAt) : '—'}
          </dd>
        </div>
        <div>
          <dt className="text-sm text-paper-600">
            {record.outcome === 'stopped' ? 'Stopped' : 'Ended'}
          </dt>
          <dd className="text-paper-950">
            {record.endedAt ? formatUnitDateTime(record.endedAt) : 'Still running'}
          </dd>
        </div>
      </dl>
      {record.stopReason && (
        <p className="text-paper-900">
          <span className="font-medium">Reason for stopping: </span>
          {record.stopReason}
        </p>
      )}

      {!plan ? (
        <p className="text-paper-800">
          The plan is hidden from you for now, so it cannot be set beside what was given.
        </p>
      ) : (
        <div className="overflow-x-auto">
          <table className="w-full border-collapse text-left">
            <caption className="mb-2 text-left text-sm text-paper-700">
              The plan as frozen at signing, and what was given as the step clock recorded it
              {record.outcome === 'in-progress'
                ? `; running figures up to ${formatUnitClock(session.serverTime)}`
                : ''}
              . Times are {unitTimeZoneLabel} ({unitTimeZone}).
            </caption>
            <thead>
              <tr className="border-b-2 border-paper-400 text-sm text-paper-700">
                <th scope="col" className="py-1.5 pr-4 font-medium">
                  <span className="sr-only">Figure</span>
                </th>
                <th scope="col" className="py-1.5 pr-4 font-medium">
                  Planned
                </th>
                <th scope="col" className="py-1.5 font-medium">
                  Given
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map((row) => (
                <tr key={row.label} className="border-b border-paper-200 align-top">
                  <th scope="row" className="py-1.5 pr-4 font-medium text-paper-900">
                    {row.label}
                  </th>
                  <td className="numerals-steady py-1.5 pr-4 text-paper-950">{row.planned}</td>
                  <td className="numerals-steady py-1.5 font-semibold text-paper-950">
                    {row.given}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          {order.kind === 'pdt' && (
            <p className="mt-2 text-sm text-paper-700">
              Laser settings from the plan: spot {num(plan.deviceSpotDiameterUm, 'spotUm')} on the
              laser, power {num(plan.powerMw, 'powerMw')}, irradiance{' '}
              {num(plan.irradianceMwPerCm2, 'irradianceMwPerCm2')}. The delivered fluence is worked
              out from the planned irradiance and the recorded light time; the dose given is not
              measured separately.
            </p>
          )}
          {order.kind === 'cxl' && (
            <p className="mt-2 text-sm text-paper-700">
              UV irradiance from the plan: {num(plan.irradianceMwPerCm2, 'irradianceMwPerCm2')}. The
              delivered fluence is worked out from it and the recorded UV on-time.
            </p>
          )}
        </div>
      )}

      {record.withdrawnTaps.length > 0 && (
        <div className="space-y-2">
          <h3 className="text-lg font-semibold text-paper-950">Taps withdrawn as mistakes</h3>
          <p className="text-sm text-paper-700">
            Kept as tapped; none of the figures above counts them.
          </p>
          <ul className="space-y-1">
            {record.withdrawnTaps.map((tap) => {
              const stepTitle = tap.stepId
                ? (definition?.steps.find((s) => s.id === tap.stepId)?.title ?? tap.stepId)
                : null;
              return (
                <li key={tap.idempotencyKey} className="text-paper-950">
                  <span className="font-semibold">Withdrawn:</span> <s>{eventWordsOf(tap.type)}</s>
                  {stepTitle ? ` (${stepTitle})` : ''}, tapped {formatUnitClock(tap.at)}, withdrawn{' '}
                  {formatUnitClock(tap.withdrawnAt)}
                  <span className="block text-sm text-paper-800">Reason: {tap.reason}</span>
                </li>
              );
            })}
          </ul>
        </div>
      )}

      {record.lateEntries.length > 0 && (
        <div className="space-y-2">
          <h3 className="text-lg font-semibold text-paper-950">Late entries</h3>
          <ul className="space-y-1">
            {record.lateEntries.map((entry) => (
              <li key={entry.idempotencyKey} className="text-paper-950">
                <span className="font-semibold">Late entry:</span> {eventWordsOf(entry.type)}, timed{' '}
                {formatUnitClock(entry.at)}
                {entry.receivedAt ? `, received ${formatUnitClock(entry.receivedAt)}` : ''}
                <span className="block text-sm text-paper-800">Reason: {entry.reason}</span>
              </li>
            ))}
          </ul>
        </div>
      )}

      {record.receiptDelays.length > 0 && (
        <div className="space-y-2">
          <h3 className="text-lg font-semibold text-paper-950">Taps received late</h3>
          <p className="text-sm text-paper-700">
            Reached the server more than a minute after they were made; their own time counts.
          </p>
          <ul className="space-y-1">
            {record.receiptDelays.map((delay) => (
              <li key={delay.idempotencyKey} className="text-paper-950">
                {eventWordsOf(delay.type)} tapped {formatUnitClock(delay.at)}, received{' '}
                {formatUnitClock(delay.receivedAt)}: {delayText(delay.delayS)} later
              </li>
            ))}
          </ul>
        </div>
      )}

      <div className="space-y-2">
        <h3 className="text-lg font-semibold text-paper-950">Deviations from protocol</h3>
        {sorted.length === 0 ? (
          <p className="text-paper-900">
            {record.outcome === 'in-progress' ? 'None so far.' : 'None.'}
          </p>
        ) : (
          <ul className="space-y-2">
            {sorted.map((d) => (
              <li
                key={d.id}
                className="flex flex-wrap items-start gap-2 border-b border-paper-200 pb-2"
              >
                <DeviationSeverityLabel severity={d.severity} />
                <span className="min-w-0 flex-1 text-paper-950">
                  {d.message}
                  <span className="block text-sm text-paper-700">
                    Expected {formatFigurePair(d.expected, d.actual, d.unit).expected}, recorded{' '}
                    {formatFigurePair(d.expected, d.actual, d.unit).actual}
                  </span>
                </span>
              </li>
            ))}
          </ul>
        )}
      </div>
    </section>
  );
}
