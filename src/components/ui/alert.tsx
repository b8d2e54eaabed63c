import type { ReactNode } from 'react';
import { AlertIcon, InfoIcon } from './icons-start';

type AlertProps = {
  tone: 'error' | 'info';
  title?: string;
  children?: ReactNode;
  /** `alert` interrupts the screen reader (errors after an action); `status` waits politely. */
  live?: 'alert' | 'status' | 'none';
  className?: string;
};

const tones = {
  error: { box: 'border-alarm-700 bg-alarm-50 text-alarm-800', Icon: AlertIcon, word: 'Problem' },
  info: { box: 'border-iris-300 bg-iris-50 text-iris-900', Icon: InfoIcon, word: 'Note' },
};

/** A boxed message with an icon and, when there is no title, a spoken kind ("Problem:"). */
export function Alert({
  tone,
  title,
  children,
  live = tone === 'error' ? 'alert' : 'status',
  className = '',
}: AlertProps) {
  const { box, Icon, word } = tones[tone];
  return (
    <div
      role={live === 'none' ? undefined : live}
      className={`flex gap-3 rounded-lg border-l-4 border px-4 py-3 ${box} ${className}`}
    >
      <Icon className="mt-0.5 size-5" />
      <div className="min-w-0 space-y-1">
        {title ? (
          <p className="font-semibold">{title}</p>
        ) : (
          <span className="sr-only">{word}: </span>
        )}
        {children && <div className="text-sm leading-relaxed text-paper-900">{children}</div>}
      </div>
    </div>
  );
}
