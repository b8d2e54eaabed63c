import {
  ClockIcon,
  CrossCircleIcon,
  ReloadIcon,
  SentPlaneIcon,
} from '../../../components/ui/icons';
import type { OutboxMessage } from '../api/get-outbox-messages';

type Look = 'waiting' | 'retrying' | 'sent' | 'refused';

const looks: Record<Look, { words: string; Icon: typeof ClockIcon; chip: string }> = {
  waiting: {
    words: 'Waiting to send',
    Icon: ClockIcon,
    chip: 'border-dashed border-paper-500 bg-paper-100 text-paper-800',
  },
  retrying: {
    words: 'Retrying',
    Icon: ReloadIcon,
    chip: 'border-dashed border-paper-800 bg-white text-paper-900',
  },
  sent: { words: 'Sent', Icon: SentPlaneIcon, chip: 'border-iris-200 bg-iris-50 text-iris-800' },
  refused: {
    words: 'Refused, not retried',
    Icon: CrossCircleIcon,
    chip: 'border-alarm-700 bg-alarm-50 text-alarm-800',
  },
};

export function messageLook(message: Pick<OutboxMessage, 'status' | 'attempts'>): Look {
  if (message.status === 'sent') return 'sent';
  if (message.status === 'failed') return 'refused';
  return message.attempts > 0 ? 'retrying' : 'waiting';
}

/** A message's state as words and an icon, with an outline that differs too, so colour is never the only cue. */
export function MessageStatus({
  message,
}: {
  message: Pick<OutboxMessage, 'status' | 'attempts'>;
}) {
  const { words, Icon, chip } = looks[messageLook(message)];
  return (
    <span
      className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border px-2.5 py-0.5 text-sm font-medium ${chip}`}
    >
      <Icon className="size-4" />
      {words}
    </span>
  );
}
