import { formatDuration } from '../../../../shared/format/figures';
import { useCallback } from 'react';
import { beyondUseState, type BeyondUseState } from '../../../../shared/orders/beyond-use';
import { useStateAnnouncement } from '../../../lib/use-state-announcement';
import { CheckCircleIcon, CrossCircleIcon, HourglassIcon } from '../../../components/ui/icons';
import { unitTimeZoneLabel } from '../../../config/unit-time-zone';
import { unitTimeNear } from './display-format';

type UseState = BeyondUseState;

const states: Record<UseState, { words: string; Icon: typeof CheckCircleIcon; box: string }> = {
  usable: {
    words: 'Usable',
    Icon: CheckCircleIcon,
    box: 'border-iris-300 bg-iris-50 text-iris-900',
  },
  closing: {
    words: 'Under 30 minutes left',
    Icon: HourglassIcon,
    box: 'border-paper-800 border-dashed bg-paper-100 text-paper-950',
  },
  past: {
    words: 'Past beyond-use time — do not use',
    Icon: CrossCircleIcon,
    box: 'border-alarm-700 bg-alarm-50 text-alarm-800',
  },
};

/** hh:mm:ss from whole seconds, so 4 h reads 04:00:00; past the time, how long past. */
export function clockText(totalMs: number): string {
  return formatDuration(Math.abs(totalMs) / 1000, 'hours-clock', { rounding: 'down' });
}

/**
 * The state of a prepared dose at `nowMs`, and a sentence to announce when that state changes
 * while the page is open. The ticking figure itself is never put in a live region: a screen
 * reader would read it out every second.
 */
function useBeyondUse(beyondUseAt: string, nowMs: number, subject: string) {
  const remainingMs = Date.parse(beyondUseAt) - nowMs;
  const state = beyondUseState(remainingMs);
  const announcement = useStateAnnouncement(
    state,
    useCallback((s: UseState) => `${subject}: ${states[s].words}.`, [subject]),
  );
  return { remainingMs, state, announcement, ...states[state] };
}

type CountdownProps = {
  beyondUseAt: string;
  /** The server's now, in ms (this device's clock corrected by the server offset). */
  nowMs: number;
};

/** The large countdown on the order's screen. */
export function BeyondUseCountdown({ beyondUseAt, nowMs }: CountdownProps) {
  const { remainingMs, state, announcement, words, Icon, box } = useBeyondUse(
    beyondUseAt,
    nowMs,
    'Beyond-use countdown',
  );
  return (
    <div
      className={`flex flex-wrap items-center gap-x-8 gap-y-3 rounded-2xl border-2 px-6 py-5 ${box}`}
    >
      <div>
        <p className="text-sm font-medium uppercase tracking-wider">
          {state === 'past' ? 'Over by' : 'Time left'}
        </p>
        <p className="numerals-steady text-clock-sm">{clockText(remainingMs)}</p>
      </div>
      <div className="space-y-1.5">
        <p className="flex items-center gap-2 text-xl font-semibold">
          <Icon className="size-7" />
          {words}
        </p>
        <p className="text-paper-800">
          Beyond-use time {unitTimeNear(beyondUseAt, nowMs)} ({unitTimeZoneLabel})
        </p>
      </div>
      <p role="status" className="sr-only">
        {announcement}
      </p>
    </div>
  );
}

/** A one-line countdown for a list row. */
export function BeyondUseChip({
  beyondUseAt,
  nowMs,
  subject,
}: CountdownProps & { subject: string }) {
  const { remainingMs, state, announcement, words, Icon, box } = useBeyondUse(
    beyondUseAt,
    nowMs,
    subject,
  );
  return (
    <span
      className={`inline-flex items-center gap-1.5 rounded-full border px-2.5 py-0.5 text-sm font-medium ${box}`}
    >
      <Icon className="size-4" />
      {words}
      {state !== 'past' && <span className="numerals-steady">· {clockText(remainingMs)} left</span>}
      <span role="status" className="sr-only">
        {announcement}
      </span>
    </span>
  );
}
