import { formatDuration } from '../../../../shared/format/figures';
import { useCallback } from 'react';
import { beyondUseState, type BeyondUseState } from '../../../../shared/orders/beyond-use';
import { useStateAnnouncement } from '../../../lib/use-state-announcement';
import {
  CheckCircleIcon,
  CrossCircleIcon,
  HourglassIcon,
} from '../../../components/ui/icons-first';
import { useServerNowMs } from '../../../lib/server-now';

const states = {
  usable: {
    words: 'Usable',
    Icon: CheckCircleIcon,
    chip: 'border-iris-300 bg-iris-50 text-iris-900',
  },
  closing: {
    words: 'Under 30 minutes left',
    Icon: HourglassIcon,
    chip: 'border-dashed border-paper-800 bg-paper-100 text-paper-950',
  },
  past: {
    words: 'Past beyond-use time — do not use',
    Icon: CrossCircleIcon,
    chip: 'border-alarm-700 bg-alarm-50 text-alarm-800',
  },
} as const;

function clockText(ms: number): string {
  return formatDuration(Math.max(0, ms) / 1000, 'hours-clock', { rounding: 'down' });
}

type BeyondUseChipProps = {
  beyondUseAt: string;
  clockOffsetMs: number;
  /** Names the order in the announcement, e.g. "Order 12, Ambervale". */
  subject: string;
};

/**
 * Time left before a prepared dose must not be used, worked out from the clock each second. The
 * ticking figure is not live; only a change of state (under 30 minutes, past) is announced.
 */
export function BeyondUseChip({ beyondUseAt, clockOffsetMs, subject }: BeyondUseChipProps) {
  const nowMs = useServerNowMs(clockOffsetMs);
  const remainingMs = Date.parse(beyondUseAt) - nowMs;
  const state = beyondUseState(remainingMs);
  const { words, Icon, chip } = states[state];
  const announcement = useStateAnnouncement(
    state,
    useCallback((s: BeyondUseState) => `${subject}: ${states[s].words}.`, [subject]),
  );

  return (
    <span
      className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border px-2.5 py-0.5 text-sm font-medium ${chip}`}
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
