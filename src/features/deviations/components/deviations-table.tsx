import { useMemo } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { createColumnHelper } from '@tanstack/react-table';
import type { AuditFilter } from '../../../../shared/schemas/reviews';
import { PagedTable, type PagedTableFeatures } from '../../../components/ui/paged-table';
import { paths } from '../../../config/paths';
import type { DeviationRow } from '../api/deviation-schemas';
import type { DeviationListParams } from '../hooks/use-deviation-list-params';
import { ClassificationLabel, ReviewStatusBadge, SeverityBadge } from './deviation-badges';
import { eyeWords, typeWords } from './deviation-words';
import { formatUnitDateTime } from '../../../lib/unit-times';
import { formatFigurePair } from '../../../../shared/format/precision';

const helper = createColumnHelper<PagedTableFeatures, DeviationRow>();
const sortKeys: readonly AuditFilter['sort'][] = ['detectedAt', 'severity', 'type', 'status'];

/** Where the review screen's "back to the queue" link returns to, with the queue's filter. */
export type QueueState = { queueSearch: string };

function columnsFor(queueSearch: string) {
  return helper.columns([
    helper.accessor('detectedAt', {
      header: 'Detected',
      sortDescFirst: true,
      cell: ({ getValue }) => (
        <span className="whitespace-nowrap">{formatUnitDateTime(getValue())}</span>
      ),
    }),
    helper.accessor('type', {
      header: 'Deviation',
      cell: ({ row }) => (
        <>
          <Link
            to={paths.deviation.getHref(row.original.id)}
            state={{ queueSearch } satisfies QueueState}
            className="font-semibold text-iris-700 underline underline-offset-4 hover:text-iris-900"
          >
            {typeWords(row.original.type)}
          </Link>
          <span className="block text-sm text-paper-600">Deviation {row.original.id}</span>
        </>
      ),
    }),
    helper.accessor('severity', {
      header: 'Severity',
      cell: ({ getValue }) => <SeverityBadge severity={getValue()} />,
    }),
    helper.display({
      id: 'figures',
      header: 'Expected → actual',
      cell: ({ row }) =>
        row.original.expected === null && row.original.actual === null ? (
          <span className="text-paper-600">no figure</span>
        ) : (
          <span className="whitespace-nowrap">
            <span className="sr-only">expected </span>
            {
              formatFigurePair(row.original.expected, row.original.actual, row.original.unit)
                .expected
            }{' '}
            <span aria-hidden="true">→</span>
            <span className="sr-only">, actual</span>{' '}
            <strong className="font-semibold">
              {
                formatFigurePair(row.original.expected, row.original.actual, row.original.unit)
                  .actual
              }
            </strong>
          </span>
        ),
    }),
    helper.display({
      id: 'session',
      header: 'Session',
      cell: ({ row }) => (
        <>
          <span className="block">
            {row.original.protocolTitle}, v{row.original.protocolVersion}
          </span>
          <span className="text-sm text-paper-600">
            {row.original.recordNumber} · {eyeWords[row.original.eye]} ·{' '}
            <Link
              to={paths.order.getHref(row.original.orderId)}
              className="text-iris-700 underline underline-offset-2 hover:text-iris-900"
            >
              order {row.original.orderId}
            </Link>
          </span>
        </>
      ),
    }),
    helper.accessor('reviewStatus', {
      id: 'status',
      header: 'Review',
      cell: ({ row }) => (
        <div className="flex flex-col items-start gap-1">
          <ReviewStatusBadge status={row.original.reviewStatus} />
          {row.original.classification && (
            <ClassificationLabel classification={row.original.classification} />
          )}
        </div>
      ),
    }),
  ]);
}

type DeviationsTableProps = {
  rows: DeviationRow[];
  total: number;
  params: DeviationListParams;
  queueSearch: string;
  onChange: (changes: Partial<DeviationListParams>) => void;
  busy: boolean;
};

/** One page of the queue. Sorting and paging are done by the server; the table only asks for them. */
export function DeviationsTable({
  rows,
  total,
  params,
  queueSearch,
  onChange,
  busy,
}: DeviationsTableProps) {
  const navigate = useNavigate();
  const columns = useMemo(() => columnsFor(queueSearch), [queueSearch]);
  return (
    <PagedTable
      columns={columns}
      rows={rows}
      getRowId={(d) => String(d.id)}
      total={total}
      paging={params}
      sortKeys={sortKeys}
      onChange={onChange}
      busy={busy}
      caption={({ first, last }) =>
        `Deviations ${first} to ${last} of ${total}. Column headers with a button sort the queue; the deviation’s name opens its review.`
      }
      pagerWords={{
        navLabel: 'Pages of deviations',
        items: 'Deviations',
        none: 'No deviations',
        perPage: 'Deviations per page',
      }}
      onRowClick={(row) =>
        navigate(paths.deviation.getHref(row.id), { state: { queueSearch } satisfies QueueState })
      }
    />
  );
}
