import { useQuery } from '@tanstack/react-query';
import { useEffect, useId, useMemo, useState } from 'react';
import { readyForSessionStatuses } from '../../../../shared/orders/lifecycle';
import { sessionClock, type SessionClock } from '../../../../shared/session/session-clock';
import { preTreatmentChecks } from '../../../../shared/session/session-events';
import { Button, LinkButton } from '../../../components/ui/button';
import {
  AlertIcon,
  EyeIcon,
  HourglassIcon,
  PlugOffIcon,
  ReloadIcon,
} from '../../../components/ui/icons';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { paths } from '../../../config/paths';
import { describeError } from '../../../lib/api-client';
import { formatCalendarDate } from '../../../lib/unit-times';
import { stepClockQueries } from '../api/step-clock-queries';
import { useAnnouncer } from '../hooks/use-announcer';
import { useNowMs } from '../hooks/use-now-ms';
import { useServerOffsetMs } from '../hooks/use-server-offset';
import { useSessionEvents } from '../hooks/use-session-events';
import { msUntilCountdownTicks, msUntilCountupTicks } from './clock-format';
import { ClockView } from './clock-view';
import { EyeBadge } from './eye-badge';
import { LiveRegions } from './live-regions';
import { PreTreatmentChecks } from './pre-treatment-checks';
import { sessionFacts } from './session-facts';
import { SessionOutcome } from './session-outcome';
import { RefusedTaps, SyncMarker, UnsentTaps, WatchedAsOf } from './sync-status';

/**
 * The bedside step clock of one order: the pre-treatment checks, then the protocol's steps timed
 * from the stored and queued events, then the outcome. Without `canRecord` the same clock is only
 * watched: it follows the stored events as they are fetched again and offers nothing to tap.
 */
export function StepClockScreen({ orderId, canRecord }: { orderId: number; canRecord: boolean }) {
  const order = useQuery(stepClockQueries.order(orderId));
  const protocolKey = order.data?.protocol.key ?? '';
  const protocolVersion = order.data?.protocol.version ?? 0;
  const protocol = useQuery({
    ...stepClockQueries.protocol(protocolKey, protocolVersion),
    enabled: order.data !== undefined,
  });
  const {
    session,
    events,
    tapsReady,
    unsent,
    refused,
    held,
    syncState,
    storageIsPersistent,
    record,
    sendAgain,
    discard,
  } = useSessionEvents(orderId, { records: canRecord });
  const [tapListOpen, setTapListOpen] = useState(false);
  const tapListId = useId();
  const { polite, assertive, announce } = useAnnouncer();
  const offsetMs = useServerOffsetMs();
  const { nowMs, wakeAt } = useNowMs(250);
  const serverNowMs = nowMs + offsetMs;

  const plan = order.data?.plan ?? null;
  const definition = protocol.data ?? null;
  const clock = useMemo(
    () =>
      definition && plan
        ? sessionClock({ protocol: definition, plan, events, nowMs: serverNowMs })
        : null,
    [definition, plan, events, serverNowMs],
  );
  const facts = useMemo(
    () => (definition && clock ? sessionFacts(definition, events, clock) : null),
    [definition, events, clock],
  );
  useEffect(() => {
    const waitMs = clock ? msUntilShownChange(clock) : null;
    wakeAt(waitMs === null ? null : nowMs + waitMs);
  }, [clock, nowMs, wakeAt]);

  const failed = [order, protocol, session].find(
    (query) => query.isError && query.data === undefined,
  );
  if (failed) {
    return (
      <StatusPanel
        role="alert"
        headingLevel="h1"
        icon={<PlugOffIcon className="size-6" />}
        title="The step clock cannot load this order"
        actions={
          <Button
            icon={<ReloadIcon />}
            busy={failed.isFetching}
            onClick={() => void failed.refetch()}
          >
            Try again
          </Button>
        }
      >
        <p>{describeError(failed.error)}</p>
        {unsent.length > 0 && (
          <p className="mt-2 font-medium">
            Unsent: {unsent.length}. They are kept on this tablet and go out when the server
            answers.
          </p>
        )}
      </StatusPanel>
    );
  }
  if (order.data && !plan) {
    return (
      <StatusPanel
        headingLevel="h1"
        icon={<AlertIcon className="size-6" />}
        title="This order has no dose plan to show"
        actions={<LinkButton to={paths.order.getHref(orderId)}>Open the order</LinkButton>}
      >
        <p>The plan is not available to you for this order, so the clock cannot time it.</p>
      </StatusPanel>
    );
  }
  // The stored events and the taps kept on this tablet must both be known before anything is
  // shown: either alone could put the clock in the wrong step.
  if (!order.data || !plan || !definition || !clock || !facts || !session.data || !tapsReady) {
    return <LoadingPanel label="Loading the session…" />;
  }

  const data = order.data;
  const status = session.data.status;
  const deviations = session.data.deviations;
  const patientName = `${data.patient.givenName} ${data.patient.familyName}`;
  const notReady = clock.phase === 'not-started' && !readyForSessionStatuses.includes(status);

  return (
    <div className="flex flex-col gap-3">
      <LiveRegions polite={polite} assertive={assertive} />
      <header className="flex flex-wrap items-center gap-x-5 gap-y-1 border-b border-paper-200 pb-2">
        <EyeBadge eye={data.eye} />
        <div className="min-w-0 flex-1">
          <div className="flex min-w-0 flex-wrap items-baseline gap-x-3">
            <h1
              tabIndex={-1}
              data-page-heading
              className="truncate text-xl font-semibold text-paper-950"
            >
              <span className="sr-only">Step clock: </span>
              {patientName}
            </h1>
            {/* The identity checks ask for it, so it is read here as the wristband writes it. */}
            <p className="shrink-0 text-lg text-paper-950">
              Date of birth{' '}
              <strong className="numerals-steady font-semibold">
                {formatCalendarDate(data.patient.dateOfBirth)}
              </strong>
            </p>
          </div>
          <p className="truncate text-sm text-paper-700">
            Record {data.patient.recordNumber} · {data.protocol.title} (version{' '}
            {data.protocol.version}) · order {data.id}
          </p>
        </div>
        {canRecord ? (
          <SyncMarker
            unsent={unsent.length}
            refused={refused.length}
            held={held}
            sync={syncState}
            persistent={storageIsPersistent}
            listId={tapListId}
            listOpen={tapListOpen}
            onToggleList={() => setTapListOpen(!tapListOpen)}
          />
        ) : (
          <WatchedAsOf updatedAtMs={session.dataUpdatedAt} />
        )}
      </header>
      {!canRecord && (
        <p className="flex items-start gap-2 rounded-xl border-2 border-paper-900 bg-white px-4 py-2.5 text-paper-950">
          <EyeIcon className="mt-0.5 size-5 shrink-0" />
          <span>
            <strong className="font-semibold">Watching only.</strong> A nurse at the bedside records
            the taps; this page shows what they have stored and looks again every 15 seconds.
          </span>
        </p>
      )}
      {session.isError && session.data && (
        <p role="status" className="flex items-center gap-2 text-sm font-medium text-paper-900">
          <PlugOffIcon className="size-4" />
          The server did not answer the last update ({describeError(session.error)}). The clock runs
          on; deviations may be out of date until it answers.
        </p>
      )}
      {canRecord && tapListOpen && unsent.length + refused.length > 0 && (
        <UnsentTaps
          id={tapListId}
          unsent={unsent}
          refused={refused}
          protocol={definition}
          sync={syncState}
        />
      )}
      <RefusedTaps
        refused={refused}
        protocol={definition}
        onSendAgain={sendAgain}
        onDiscard={discard}
      />

      {notReady ? (
        <StatusPanel
          icon={<AlertIcon className="size-6" />}
          title="This order is not ready for its session"
          actions={<LinkButton to={paths.order.getHref(orderId)}>Open the order</LinkButton>}
        >
          <p>
            Its status is “{status}”. A session starts from a prepared PDT order (dose checked and
            prepared by the pharmacy) or a ready CXL order.
          </p>
        </StatusPanel>
      ) : clock.phase === 'not-started' && !canRecord ? (
        <StatusPanel
          icon={<HourglassIcon className="size-6" />}
          title="The session has not started yet"
        >
          <p>
            The clock appears here once the nurse has confirmed the pre-treatment checks and started
            the session.
          </p>
        </StatusPanel>
      ) : clock.phase === 'not-started' ? (
        <PreTreatmentChecks
          order={data}
          protocol={definition}
          plan={plan}
          serverNowMs={serverNowMs}
          onStart={(device) => {
            const checks = Object.fromEntries(
              preTreatmentChecks.map((check) => [check, true]),
            ) as Record<(typeof preTreatmentChecks)[number], true>;
            // The protocol's own first step is the same bedside check: it is done with this tap.
            const first = definition.steps[0];
            const checkStep = first?.kind === 'check' ? first.id : null;
            record([
              { type: 'session-started', checks, device },
              ...(checkStep
                ? [
                    { type: 'step-started' as const, stepId: checkStep },
                    { type: 'step-ended' as const, stepId: checkStep },
                  ]
                : []),
            ]);
            announce('Session started.');
          }}
        />
      ) : clock.phase === 'running' ? (
        <ClockView
          order={data}
          protocol={definition}
          plan={plan}
          clock={clock}
          facts={facts}
          serverNowMs={serverNowMs}
          deviceNowMs={nowMs}
          deviations={deviations}
          events={events}
          onRecord={record}
          announce={announce}
          watching={!canRecord}
        />
      ) : (
        <SessionOutcome
          orderId={orderId}
          protocol={definition}
          stopped={clock.phase === 'stopped'}
          stopReason={facts.replay.stopReason}
          record={session.data.record}
          deviations={deviations}
          waitingForTaps={unsent.length > 0}
        />
      )}
    </div>
  );
}

/** When the next of the numbers on screen changes its whole second, so the screen redraws right then. */
function msUntilShownChange(clock: SessionClock): number | null {
  const waits: number[] = [];
  const current = clock.current;
  if (current && !current.paused) {
    if (current.remainingS !== null && current.remainingS > 0)
      waits.push(msUntilCountdownTicks(current.remainingS));
    else waits.push(msUntilCountupTicks(current.overrunS ?? current.elapsedS));
  }
  if (clock.lightStartInS !== null)
    waits.push(
      clock.lightStartInS > 0
        ? msUntilCountdownTicks(clock.lightStartInS)
        : msUntilCountupTicks(-clock.lightStartInS),
    );
  if (clock.nextCueInS !== null) waits.push(msUntilCountdownTicks(clock.nextCueInS));
  if (clock.pulse?.phaseLeftS) waits.push(msUntilCountdownTicks(clock.pulse.phaseLeftS));
  return waits.length > 0 ? Math.min(...waits) : null;
}
