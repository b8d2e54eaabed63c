import { unitTimeZoneLabel } from '../../../config/unit-time-zone';
import type { WithdrawnTap } from '../../../lib/session-record-schemas';
import { eventWordsOf } from '../../../lib/session-event-words';
import type { ProtocolSteps, StoredSessionEvent } from '../api/deviation-schemas';
import {
  formatFigure,
  formatOffset,
  formatUnitClock,
  formatUnitDate,
} from '../../../lib/unit-times';

const aftercareWords: Record<string, string> = {
  advice: 'advice given',
  'sheet-printed': 'discharge sheet printed',
  'sheet-emailed': 'discharge sheet e-mailed',
  'contact-number': 'contact number given',
};

function describe(
  event: StoredSessionEvent,
  stepTitle: (id: string | undefined) => string,
  byKey: Map<string, StoredSessionEvent>,
): string {
  switch (event.type) {
    case 'session-started':
      return 'Session started: the pre-treatment checks were confirmed';
    case 'step-started':
      return `Started: ${stepTitle(event.stepId)}`;
    case 'step-ended':
      return `Ended: ${stepTitle(event.stepId)}${event.reason ? ` (early: ${event.reason})` : ''}`;
    case 'paused':
      return `Paused: ${stepTitle(event.stepId)}`;
    case 'resumed':
      return `Resumed: ${stepTitle(event.stepId)}`;
    case 'drop-given':
      return `Drop given during: ${stepTitle(event.stepId)}`;
    case 'thickness-measured':
      return `Thickness measured: ${formatFigure(event.thicknessUm, 'µm')}`;
    case 'thickness-override':
      return `Thickness minimum overridden${event.authorisedByName ? `, authorised by ${event.authorisedByName}` : ''}: ${event.reason ?? 'no reason recorded'}`;
    case 'extravasation':
      return `Extravasation${event.volumeInfusedMl !== undefined ? ` (${formatFigure(event.volumeInfusedMl, 'mL')} infused, read off the pump)` : ''}${event.note ? `: ${event.note}` : ''}`;
    case 'exposure-recorded':
      return `Exposure on the laser entered: ${formatFigure(event.exposureS, 's')}${event.energyJ !== undefined ? `, ${formatFigure(event.energyJ, 'J')}` : ''}`;
    case 'session-stopped':
      return `Session stopped${event.volumeInfusedMl !== undefined ? ` (${formatFigure(event.volumeInfusedMl, 'mL')} infused, read off the pump)` : ''}: ${event.reason ?? 'no reason recorded'}`;
    case 'session-completed':
      return 'Session completed';
    case 'identity-confirmed':
      return `Patient name, date of birth and eye confirmed again before: ${stepTitle(event.stepId)}`;
    case 'aftercare-checked':
      return `After-care: ${aftercareWords[event.item ?? ''] ?? event.item ?? 'item'} done`;
    case 'tap-withdrawn': {
      const target = event.withdrawnKey ? byKey.get(event.withdrawnKey) : undefined;
      const what = target
        ? `the ${eventWordsOf(target.type)}${target.stepId ? ` (${stepTitle(target.stepId)})` : ''} tapped at ${formatUnitClock(target.clientTime)}`
        : 'a tap';
      return `Withdrew ${what} as a mistake: ${event.reason ?? 'no reason recorded'}`;
    }
    default:
      return event.type;
  }
}

const marked = new Set([
  'session-started',
  'session-stopped',
  'session-completed',
  'extravasation',
  'thickness-override',
  'tap-withdrawn',
]);

type SessionTimelineProps = {
  events: StoredSessionEvent[];
  steps: ProtocolSteps | undefined;
  /** From the server's dose record, which decides which withdrawals count. */
  withdrawnTaps: readonly WithdrawnTap[];
};

/**
 * The session's taps, oldest first, at the unit's wall-clock time and as an offset from the start
 * of the session, with each step named as the step clock named it.
 */
export function SessionTimeline({ events, steps, withdrawnTaps }: SessionTimelineProps) {
  if (events.length === 0)
    return <p className="text-paper-700">No events were recorded for this session.</p>;
  const titles = new Map((steps?.definition.steps ?? []).map((s) => [s.id, s.title]));
  const stepTitle = (id: string | undefined) =>
    id ? (titles.get(id) ?? `step “${id}”`) : 'a step';
  const ordered = [...events].sort(
    (a, b) => Date.parse(a.clientTime) - Date.parse(b.clientTime) || a.id - b.id,
  );
  const start = ordered.find((e) => e.type === 'session-started') ?? ordered[0]!;
  const startMs = Date.parse(start.clientTime);
  const byKey = new Map(events.map((e) => [e.idempotencyKey, e]));
  const withdrawn = new Map(withdrawnTaps.map((tap) => [tap.idempotencyKey, tap]));

  return (
    <>
      <p className="mb-3 text-sm text-paper-700">
        Clock times are {unitTimeZoneLabel}; the offset counts from the session start at{' '}
        {formatUnitClock(start.clientTime)} on {formatUnitDate(start.clientTime)}.
      </p>
      <ol className="relative ml-2 border-l-2 border-paper-300">
        {ordered.map((event) => {
          const strong = marked.has(event.type);
          const withdrawal = withdrawn.get(event.idempotencyKey);
          return (
            <li key={event.id} className="relative mb-3 pl-5 last:mb-0">
              <span
                aria-hidden="true"
                className={`absolute top-1.5 -left-[7px] size-3 rounded-full border-2 ${strong ? 'border-iris-700 bg-iris-700' : 'border-paper-500 bg-white'}`}
              />
              <p className="numerals-steady flex flex-wrap gap-x-3 text-sm text-paper-700">
                <span>
                  <span className="sr-only">At </span>
                  {formatUnitClock(event.clientTime)}
                </span>
                <span>
                  <span className="sr-only">, session time </span>
                  {formatOffset((Date.parse(event.clientTime) - startMs) / 1000)}
                </span>
              </p>
              {event.lateEntryReason && (
                <p className="text-paper-900">
                  <span className="mr-1.5 rounded border border-paper-500 px-1 text-xs font-semibold tracking-wide uppercase">
                    Late entry
                  </span>
                  {/* A missed tap entered at its real time, during the session or after it. */}
                  Entered late
                  {event.serverTime ? `, at ${formatUnitClock(event.serverTime)}` : ''}:{' '}
                  {event.lateEntryReason}
                </p>
              )}
              {withdrawal ? (
                <p className="text-paper-800">
                  <span className="mr-1.5 rounded border border-paper-500 px-1 text-xs font-semibold tracking-wide uppercase">
                    Withdrawn
                  </span>
                  <s>{describe(event, stepTitle, byKey)}</s>
                  <span className="block text-sm">
                    Not counted in the record. Reason, given at{' '}
                    {formatUnitClock(withdrawal.withdrawnAt)}: {withdrawal.reason}
                  </span>
                </p>
              ) : (
                <p className={strong ? 'font-semibold text-paper-950' : 'text-paper-900'}>
                  {describe(event, stepTitle, byKey)}
                </p>
              )}
            </li>
          );
        })}
      </ol>
    </>
  );
}
