import type { ReactNode } from 'react';
import { SpinnerIcon } from './icons-start';

type StatusPanelProps = {
  icon: ReactNode;
  title: string;
  children?: ReactNode;
  actions?: ReactNode;
  /** `alert` for a failure the person should hear at once; `status` for waiting or empty states. */
  role?: 'alert' | 'status';
  headingLevel?: 'h1' | 'h2';
};

/** The calm centred message used for loading, empty and failed states across the app. */
export function StatusPanel({
  icon,
  title,
  children,
  actions,
  role = 'status',
  headingLevel = 'h2',
}: StatusPanelProps) {
  const Heading = headingLevel;
  return (
    <div
      role={role}
      className="mx-auto flex max-w-xl flex-col items-center gap-3 rounded-2xl border border-paper-200 bg-white px-6 py-10 text-center"
    >
      <div className="flex size-12 items-center justify-center rounded-full bg-paper-100 text-paper-700">
        {icon}
      </div>
      <Heading className="text-xl font-semibold text-paper-900">{title}</Heading>
      {children && <div className="max-w-prose text-paper-700">{children}</div>}
      {actions && <div className="mt-2 flex flex-wrap justify-center gap-3">{actions}</div>}
    </div>
  );
}

/** Something loading (a screen's file, an answer): a status named by its label, so a screen reader can find it. */
export function LoadingPanel({ label }: { label: string }) {
  return (
    <div
      role="status"
      aria-label={label}
      className="flex items-center justify-center gap-3 py-16 text-paper-700"
    >
      <SpinnerIcon className="size-6 text-iris-700" />
      <span>{label}</span>
    </div>
  );
}
