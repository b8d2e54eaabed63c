import { useId } from 'react';
import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import { LinkButton } from '../../../components/ui/button';
import {
  CheckCircleIcon,
  OrderClipboardIcon,
  StatusStoppedIcon,
} from '../../../components/ui/icons';
import { paths } from '../../../config/paths';
import { doseGivenText, volumeGivenText } from '../../../lib/dose-given-words';
import { eventWordsOf } from '../../../lib/session-event-words';
import type { SessionDeviation, SessionRecordSummary } from '../api/session-state-schema';
import { formatDuration } from '../../../../shared/format/figures';
import { formatFigure } from './clock-format';
import { DeviationList } from './deviation-list';

function recordLines(
  protocol: ProtocolVersion,
  record: SessionRecordSummary,
): { label: string; value: string }[] {
  const duration = (seconds: number | null) =>
    seconds === null
      ? 'not recorded'
      : formatDuration(seconds, 'seconds-and-words', { maxDecimals: 1 });
  const lines =
    protocol.kind === 'pdt'
      ? [
          { label: 'Infusion', value: duration(record.infusionDurationS) },
          { label: 'Volume given', value: volumeGivenText(record) ?? 'not recorded' },
          { label: 'Verteporfin given', value: doseGivenText(record) ?? 'not recorded' },
          {
            label: 'Light start after the infusion start',
            value: duration(record.lightStartAfterInfusionStartS),
          },
          {
            label: 'Exposure on the laser',
            value:
              record.deviceExposureS === null
                ? 'not entered'
                : `${formatFigure(record.deviceExposureS, 1)} s${record.deviceEnergyJ === null ? '' : `, ${formatFigure(record.deviceEnergyJ, 2)} J`}`,
          },
          { label: 'Light on by the taps', value: duration(record.lightOnS) },
        ]
      : [
          { label: 'Soak', value: duration(record.soakDurationS) },
          {
            label: 'Thickness before UV',
            value:
              record.thicknessBeforeUvUm === null
                ? 'not recorded'
                : `${formatFigure(record.thicknessBeforeUvUm, 0)} µm`,
          },
          { label: 'UV elapsed', value: duration(record.uvElapsedS) },
          { label: 'UV on', value: duration(record.uvOnS) },
        ];
  return [
    ...lines,
    {
      label: 'Delivered fluence',
      value:
        record.deliveredFluenceJPerCm2 === null
          ? 'not recorded'
          : `${formatFigure(record.deliveredFluenceJPerCm2, 2)} J/cm²`,
    },
  ];
}

/** After the session: how it ended, the server's dose record, the deviations, and the way on to the order. */
export function SessionOutcome({
  orderId,
  protocol,
  stopped,
  stopReason,
  record,
  deviations,
  waitingForTaps,
}: {
  orderId: number;
  protocol: ProtocolVersion;
  stopped: boolean;
  stopReason: string | null;
  record: SessionRecordSummary | null;
  deviations: readonly SessionDeviation[];
  waitingForTaps: boolean;
}) {
  const recordHeading = useId();
  const deviationsHeading = useId();
  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,1.2fr)_minmax(0,1fr)]">
      <section
        aria-labelledby={recordHeading}
        className="flex flex-col gap-4 rounded-2xl border border-paper-300 bg-white px-6 py-5"
      >
        <p className="flex items-center gap-3 text-3xl font-semibold text-paper-950">
          {stopped ? (
            <StatusStoppedIcon className="size-9" />
          ) : (
            <CheckCircleIcon className="size-9" />
          )}
          {stopped ? 'Session stopped' : 'Session completed'}
        </p>
        {stopped && stopReason && <p className="text-lg text-paper-900">Reason: {stopReason}</p>}
        <h2 id={recordHeading} className="text-xl font-semibold text-paper-950">
          Dose record
        </h2>
        {waitingForTaps ? (
          <p className="text-paper-800">
            The record is worked out by the server once every tap is stored.
          </p>
        ) : record ? (
          <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-1.5">
            {recordLines(protocol, record).map((line) => (
              <div key={line.label} className="contents">
                <dt className="text-paper-700">{line.label}</dt>
                <dd className="numerals-steady text-lg font-semibold text-paper-950">
                  {line.value}
                </dd>
              </div>
            ))}
          </dl>
        ) : (
          <p className="text-paper-800">No dose record yet.</p>
        )}
        {record && record.lateEntries.length > 0 && (
          <div>
            <h3 className="font-semibold text-paper-950">Late entries</h3>
            <ul className="list-disc pl-5 text-paper-900">
              {record.lateEntries.map((entry) => (
                <li key={entry.idempotencyKey}>
                  <span className="mr-1.5 rounded border border-paper-500 px-1 text-xs font-semibold tracking-wide uppercase">
                    Late entry
                  </span>
                  {eventWordsOf(entry.type)}: {entry.reason}
                </li>
              ))}
            </ul>
          </div>
        )}
        <div>
          <LinkButton
            to={paths.order.getHref(orderId)}
            variant="primary"
            icon={<OrderClipboardIcon />}
          >
            Open the order for the dose record and discharge
          </LinkButton>
        </div>
      </section>
      <DeviationList deviations={deviations} headingId={deviationsHeading} />
    </div>
  );
}
