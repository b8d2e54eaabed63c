import type { ReactNode } from 'react';

export type Parameter = { label: string; value: ReactNode };

/** A labelled group of a version's figures; the unit sits in each label. */
export function ParameterSection({
  id,
  title,
  lead,
  children,
}: {
  id: string;
  title: string;
  lead?: ReactNode;
  children: ReactNode;
}) {
  return (
    <section aria-labelledby={id} className="rounded-2xl border border-paper-200 bg-white p-5">
      <h2 id={id} className="text-lg font-semibold text-paper-950">
        {title}
      </h2>
      {lead && <p className="mt-1 max-w-prose text-sm text-paper-700">{lead}</p>}
      <div className="mt-3">{children}</div>
    </section>
  );
}

export function ParameterList({ parameters }: { parameters: Parameter[] }) {
  return (
    <dl className="grid gap-x-6 gap-y-3 sm:grid-cols-[minmax(12rem,18rem)_1fr]">
      {parameters.map(({ label, value }) => (
        <div key={label} className="contents">
          <dt className="text-sm font-medium text-paper-700 sm:pt-0.5">{label}</dt>
          <dd className="text-paper-950 [overflow-wrap:anywhere]">{value}</dd>
        </div>
      ))}
    </dl>
  );
}

/** Shown where a figure does not apply to this kind of protocol (the file holds null). */
export function NotUsed({ children = 'Not used in this protocol' }: { children?: ReactNode }) {
  return <span className="text-paper-600 italic">{children}</span>;
}
