import { unitTimeZoneLabel } from '../../../config/unit-time-zone';
import type { ProtocolSteps, StoredSessionEvent } from '../api/deviation-schemas';
import { formatOffset, formatUnitClock, formatUnitDate } from '../../../lib/unit-times';

function describe(event: StoredSessionEvent, stepTitle: (id: string | undefined) => string): string {
  switch (event.type) {
    case 'session-started':
      return 'Session started: the pre-treatment checks were confirmed';
    case 'step-started':
      return `Started: ${stepTitle(event.stepId)}`;
    case 'step-ended':
      return `Ended: ${stepTitle(event.stepId)}`;
    case 'paused':
      return `Paused: ${stepTitle(event.stepId)}`;
    case 'resumed':
      return `Resumed: ${stepTitle(event.stepId)}`;
    case 'drop-given':
      return `Drop given during: ${stepTitle(event.stepId)}`;
    case 'thickness-measured':
      return `Thickness measured: ${event.thicknessUm ?? '?'} µm`;
    case 'thickness-override':
      return `Thickness minimum overridden: ${event.reason ?? 'no reason recorded'}`;
    case 'extravasation':
      return `Extravasation${event.note ? `: ${event.note}` : ''}`;
    case 'session-stopped':
      return `Session stopped: ${event.reason ?? 'no reason recorded'}`;
    case 'session-completed':
      return 'Session completed';
    default:
      return event.type;
  }
}

const marked = new Set(['session-started', 'session-stopped', 'session-completed', 'extravasation', 'thickness-override']);

type SessionTimelineProps = { events: StoredSessionEvent[]; steps: ProtocolSteps | undefined };

/**
 * The session's taps, oldest first, at the unit's wall-clock time and as an offset from the start
 * of the session, with each step named as the step clock named it.
 */
export function SessionTimeline({ events, steps }: SessionTimelineProps) {
  if (events.length === 0) return <p className="text-paper-700">No events were recorded for this session.</p>;
  const titles = new Map((steps?.definition.steps ?? []).map((s) => [s.id, s.title]));
  const stepTitle = (id: string | undefined) => (id ? (titles.get(id) ?? `step “${id}”`) : 'a step');
  const ordered = [...events].sort((a, b) => Date.parse(a.clientTime) - Date.parse(b.clientTime) || a.id - b.id);
  const start = ordered.find((e) => e.type === 'session-started') ?? ordered[0]!;
  const startMs = Date.parse(start.clientTime);

  return (
    <>
      <p className="mb-3 text-sm text-paper-700">
        Clock times are {unitTimeZoneLabel}; the offset counts from the session start at {formatUnitClock(start.clientTime)} on {formatUnitDate(start.clientTime)}.
      </p>
      <ol className="relative ml-2 border-l-2 border-paper-300">
        {ordered.map((event) => {
          const strong = marked.has(event.type);
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
              <p className={strong ? 'font-semibold text-paper-950' : 'text-paper-900'}>{describe(event, stepTitle)}</p>
            </li>
          );
        })}
      </ol>
    </>
  );
}
