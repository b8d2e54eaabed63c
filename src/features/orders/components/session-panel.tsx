import type { UseQueryResult } from '@tanstack/react-query';
import { Button } from '../../../components/ui/button';
import {
  AlertIcon,
  CheckCircleIcon,
  CrossCircleIcon,
  HourglassIcon,
  ReloadIcon,
} from '../../../components/ui/icons';
import { describeError } from '../../../lib/api-client';
import { isSessionRunning } from '../../../../shared/orders/lifecycle';
import type { OrderSession } from '../api/order-response-schemas';
import { DeviationSeverityLabel } from './deviation-severity-label';
import {
  deviationSeverityOrder,
  deviationSeverityWords,
  sessionOutcomeWords,
} from './session-words';
import { formatUnitClock, formatUnitDateTime } from '../../../lib/unit-times';

const outcomeIcons = {
  'not-started': HourglassIcon,
  'in-progress': HourglassIcon,
  completed: CheckCircleIcon,
  stopped: CrossCircleIcon,
} as const;

/** How many of each severity, most severe first: "1 major, 2 minor". */
function severityCounts(deviations: OrderSession['deviations']): string {
  return deviationSeverityOrder
    .map(
      (severity) => [severity, deviations.filter((d) => d.severity === severity).length] as const,
    )
    .filter(([, count]) => count > 0)
    .map(([severity, count]) => `${count} ${deviationSeverityWords[severity].toLowerCase()}`)
    .join(', ');
}

/** The session at a glance: where it stands and the departures from protocol found so far (live while it runs). */
export function SessionPanel({ session }: { session: UseQueryResult<OrderSession> }) {
  if (session.isPending) {
    return (
      <section
        aria-label="Session"
        className="rounded-2xl border border-paper-200 bg-white px-5 py-4 text-paper-700"
      >
        Loading the session…
      </section>
    );
  }
  if (session.isError) {
    return (
      <section
        aria-labelledby="session-heading"
        role="alert"
        className="rounded-2xl border border-alarm-700 bg-alarm-50 px-5 py-4"
      >
        <h2
          id="session-heading"
          className="flex items-center gap-2 text-lg font-semibold text-alarm-800"
        >
          <AlertIcon className="size-5" />
          The session could not be loaded
        </h2>
        <p className="mt-1 text-paper-900">{describeError(session.error)}</p>
        <Button
          variant="secondary"
          size="sm"
          className="mt-2"
          icon={<ReloadIcon className="size-4" />}
          busy={session.isFetching}
          onClick={() => void session.refetch()}
        >
          Try again
        </Button>
      </section>
    );
  }

  const { record, deviations, status } = session.data;
  if (!record || record.outcome === 'not-started') return null;
  const live = isSessionRunning(status);
  const OutcomeIcon = outcomeIcons[record.outcome];
  const sorted = [...deviations].sort(
    (a, b) =>
      deviationSeverityOrder.indexOf(a.severity) - deviationSeverityOrder.indexOf(b.severity),
  );

  return (
    <section
      aria-labelledby="session-heading"
      className={`space-y-3 rounded-2xl border-2 bg-white px-5 py-4 ${live ? 'border-iris-700' : 'border-paper-300'}`}
    >
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 id="session-heading" className="text-xl font-semibold text-paper-950">
          Session
        </h2>
        <span className="inline-flex items-center gap-1.5 rounded-full border border-paper-500 px-3 py-0.5 font-semibold text-paper-900">
          <OutcomeIcon className="size-5" />
          {sessionOutcomeWords[record.outcome]}
        </span>
      </div>
      <p className="text-paper-900">
        {record.sessionStartedAt && <>Started {formatUnitDateTime(record.sessionStartedAt)}</>}
        {record.endedAt && (
          <>
            ; {record.outcome === 'stopped' ? 'stopped' : 'ended'} at{' '}
            {formatUnitClock(record.endedAt)}
          </>
        )}
        .{record.stopReason && <> Reason: {record.stopReason}</>}
      </p>
      <div role="status">
        {deviations.length === 0 ? (
          <p className="flex items-center gap-2 font-medium text-paper-900">
            <CheckCircleIcon className="size-5" />
            {live ? 'No deviations from protocol so far.' : 'No deviations from protocol.'}
          </p>
        ) : (
          <div className="space-y-2">
            <p className="flex items-center gap-2 font-semibold text-alarm-800">
              <AlertIcon className="size-5" />
              {deviations.length} {deviations.length === 1 ? 'deviation' : 'deviations'} from
              protocol{live ? ' so far' : ''}: {severityCounts(deviations)}
            </p>
            <ul className="space-y-1.5">
              {sorted.map((d) => (
                <li key={d.id} className="flex flex-wrap items-start gap-2 text-sm text-paper-900">
                  <DeviationSeverityLabel severity={d.severity} />
                  <span className="min-w-0 flex-1">{d.message}</span>
                </li>
              ))}
            </ul>
          </div>
        )}
      </div>
      {live && (
        <p className="text-sm text-paper-700">
          Live: checked again every 10 seconds while the session runs
          {session.dataUpdatedAt > 0 && (
            <> (last at {formatUnitClock(new Date(session.dataUpdatedAt).toISOString())})</>
          )}
          .
        </p>
      )}
    </section>
  );
}
