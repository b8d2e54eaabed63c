import type { ReactNode } from 'react';

type PageHeaderProps = {
  title: string;
  lead?: ReactNode;
  actions?: ReactNode;
};

/**
 * The heading block at the top of each screen. The h1 takes focus after navigation (see the
 * layout), so a screen reader starts reading at the new screen's name.
 */
export function PageHeader({ title, lead, actions }: PageHeaderProps) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b border-paper-200 pb-5">
      <div className="min-w-0 space-y-1.5">
        <h1
          tabIndex={-1}
          data-page-heading
          className="text-3xl font-semibold tracking-tight text-paper-950"
        >
          {title}
        </h1>
        {lead && <p className="max-w-prose text-paper-700">{lead}</p>}
      </div>
      {actions && <div className="flex flex-wrap gap-3">{actions}</div>}
    </div>
  );
}
