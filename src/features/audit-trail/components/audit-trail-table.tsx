import { Link } from 'react-router-dom';
import type { AuditTrailQuery } from '../../../../shared/schemas/reviews';
import { pageRange, TablePager } from '../../../components/ui/table-pager';
import { paths } from '../../../config/paths';
import type { AuditEvent } from '../api/audit-event-schemas';
import {
  actionLabel,
  detailEntries,
  recordTypeLabel,
  summariseDetails,
  type DetailEntry,
} from './audit-words';
import { formatUnitClock, formatUnitDate, formatUnitDateTime } from '../../../lib/unit-times';

/** A link to the record where a screen for it exists. */
function recordHref(type: string | null, id: string | null): string | null {
  if (id === null || !/^\d+$/.test(id)) return null;
  if (type === 'order') return paths.order.getHref(id);
  if (type === 'deviation') return paths.deviation.getHref(id);
  if (type === 'patient') return paths.patient.getHref(id);
  return null;
}

function RecordCell({ event }: { event: AuditEvent }) {
  if (event.entityType === null && event.entityId === null)
    return <span className="text-paper-600">—</span>;
  const id = event.entityId === null ? null : String(event.entityId);
  const label = `${recordTypeLabel(event.entityType)}${id ? ` ${id}` : ''}`;
  const href = recordHref(event.entityType, id);
  return href ? (
    <Link
      to={href}
      className="whitespace-nowrap text-iris-700 underline underline-offset-4 hover:text-iris-900"
    >
      {label}
    </Link>
  ) : (
    <span className="whitespace-nowrap">{label}</span>
  );
}

function DetailList({ entries }: { entries: DetailEntry[] }) {
  return (
    <dl className="grid grid-cols-[max-content_1fr] gap-x-3 gap-y-0.5 text-sm">
      {entries.map((entry, index) => (
        <div key={`${entry.label}-${index}`} className="contents">
          <dt className="text-paper-700">{entry.label}</dt>
          <dd className="wrap-anywhere text-paper-900">
            {entry.entries ? <DetailList entries={entry.entries} /> : entry.value}
          </dd>
        </div>
      ))}
    </dl>
  );
}

/** Details as labelled values: a one-line summary, the full list one click away. */
function Details({ details }: { details: unknown }) {
  const summary = summariseDetails(details, formatUnitDateTime);
  if (!summary) return <span className="text-paper-600">—</span>;
  return (
    <details className="max-w-md min-w-48">
      <summary className="cursor-pointer text-sm wrap-anywhere text-paper-900">{summary}</summary>
      <div className="mt-1 rounded-md bg-paper-100 p-2">
        <DetailList entries={detailEntries(details, formatUnitDateTime)} />
      </div>
    </details>
  );
}

type AuditTrailTableProps = {
  events: AuditEvent[];
  total: number;
  query: AuditTrailQuery;
  onChange: (changes: Partial<AuditTrailQuery>) => void;
  busy: boolean;
};

/** One page of the trail; read-only. */
export function AuditTrailTable({ events, total, query, onChange, busy }: AuditTrailTableProps) {
  const { first, last } = pageRange(query.page, query.pageSize, total);
  return (
    <div className="space-y-3">
      <div
        className="relative overflow-x-auto rounded-2xl border border-paper-200 bg-white"
        aria-busy={busy || undefined}
      >
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">
            Audit events {first} to {last} of {total},{' '}
            {query.direction === 'desc' ? 'newest' : 'oldest'} first.
          </caption>
          <thead className="bg-paper-100 text-sm text-paper-700">
            <tr>
              {['When', 'Who', 'Action', 'Record', 'Details'].map((h) => (
                <th key={h} scope="col" className="px-3 py-2 font-semibold first:pl-4 last:pr-4">
                  {h}
                </th>
              ))}
            </tr>
          </thead>
          <tbody className={busy ? 'opacity-60' : ''}>
            {events.map((event) => (
              <tr key={event.id} className="border-t border-paper-200 align-top">
                <td className="numerals-steady px-3 py-2.5 pl-4 whitespace-nowrap">
                  {formatUnitDate(event.occurredAt)}
                  <span className="block text-sm text-paper-700">
                    {formatUnitClock(event.occurredAt)}
                  </span>
                </td>
                <td className="min-w-40 px-3 py-2.5">
                  {event.actor ??
                    (event.actorUserId === null ? 'Luxtempo itself' : 'Unknown person')}
                  <span className="block text-sm text-paper-600">
                    {[
                      event.actorUserId !== null ? `person id ${event.actorUserId}` : null,
                      event.ipAddress ? `from ${event.ipAddress}` : null,
                    ]
                      .filter(Boolean)
                      .join(' · ')}
                  </span>
                </td>
                <td className="px-3 py-2.5">{actionLabel(event.action)}</td>
                <td className="px-3 py-2.5">
                  <RecordCell event={event} />
                </td>
                <td className="px-3 py-2.5 pr-4">
                  <Details details={event.details} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <TablePager
        words={{
          navLabel: 'Pages of the audit trail',
          items: 'Events',
          none: 'No events',
          perPage: 'Events per page',
        }}
        page={query.page}
        pageSize={query.pageSize}
        total={total}
        pageSizes={[25, 50, 100, 200]}
        perPageClassName="w-40"
        onPage={(page) => onChange({ page })}
        onPageSize={(pageSize) => onChange({ pageSize })}
      />
    </div>
  );
}
