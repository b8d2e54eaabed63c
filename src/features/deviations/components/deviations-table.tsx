import { useMemo } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { createColumnHelper, rowPaginationFeature, rowSortingFeature, tableFeatures, useTable, type PaginationState, type SortingState, type Updater } from '@tanstack/react-table';
import type { AuditFilter } from '../../../../shared/schemas/reviews';
import { Button } from '../../../components/ui/button';
import { PageBackIcon, PageForwardIcon, SortIcon } from '../../../components/ui/icons';
import { paths } from '../../../config/paths';
import type { DeviationRow } from '../api/deviation-schemas';
import type { DeviationListParams } from '../hooks/use-deviation-list-params';
import { ClassificationLabel, ReviewStatusBadge, SeverityBadge } from './deviation-badges';
import { eyeWords, typeWords } from './deviation-words';
import { SelectField } from '../../../components/ui/select-field';
import { formatFigure, formatUnitDateTime } from '../../../lib/unit-times';

const features = tableFeatures({ rowSortingFeature, rowPaginationFeature });
const helper = createColumnHelper<typeof features, DeviationRow>();
const sortKeys: readonly string[] = ['detectedAt', 'severity', 'type', 'status'];

/** Where the review screen's "back to the queue" link returns to, with the queue's filter. */
export type QueueState = { queueSearch: string };

function columnsFor(queueSearch: string) {
  return helper.columns([
    helper.accessor('detectedAt', {
      header: 'Detected',
      sortDescFirst: true,
      cell: ({ getValue }) => <span className="whitespace-nowrap">{formatUnitDateTime(getValue())}</span>,
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
    helper.accessor('severity', { header: 'Severity', cell: ({ getValue }) => <SeverityBadge severity={getValue()} /> }),
    helper.display({
      id: 'figures',
      header: 'Expected → actual',
      cell: ({ row }) =>
        row.original.expected === null && row.original.actual === null ? (
          <span className="text-paper-600">no figure</span>
        ) : (
          <span className="whitespace-nowrap">
            <span className="sr-only">expected </span>
            {formatFigure(row.original.expected, row.original.unit)} <span aria-hidden="true">→</span>
            <span className="sr-only">, actual</span> <strong className="font-semibold">{formatFigure(row.original.actual, row.original.unit)}</strong>
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
            <Link to={paths.order.getHref(row.original.orderId)} className="text-iris-700 underline underline-offset-2 hover:text-iris-900">
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
          {row.original.classification && <ClassificationLabel classification={row.original.classification} />}
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

function resolve<T>(updater: Updater<T>, current: T): T {
  return typeof updater === 'function' ? (updater as (old: T) => T)(current) : updater;
}

/** One page of the queue. Sorting and paging are done by the server; the table only asks for them. */
export function DeviationsTable({ rows, total, params, queueSearch, onChange, busy }: DeviationsTableProps) {
  const navigate = useNavigate();
  const columns = useMemo(() => columnsFor(queueSearch), [queueSearch]);
  const sorting = useMemo<SortingState>(() => [{ id: params.sort, desc: params.direction === 'desc' }], [params.sort, params.direction]);
  const pagination = useMemo<PaginationState>(() => ({ pageIndex: params.page - 1, pageSize: params.pageSize }), [params.page, params.pageSize]);

  const table = useTable({
    features,
    columns,
    data: rows,
    getRowId: (d) => String(d.id),
    manualSorting: true,
    manualPagination: true,
    rowCount: total,
    enableSortingRemoval: false,
    state: { sorting, pagination },
    onSortingChange: (updater) => {
      const [next] = resolve(updater, sorting);
      if (next && sortKeys.includes(next.id)) onChange({ sort: next.id as AuditFilter['sort'], direction: next.desc ? 'desc' : 'asc' });
    },
    onPaginationChange: (updater) => {
      const next = resolve(updater, pagination);
      if (next.pageSize !== pagination.pageSize) onChange({ pageSize: next.pageSize });
      else onChange({ page: next.pageIndex + 1 });
    },
  });

  const pageCount = Math.max(1, table.getPageCount());
  const first = total === 0 ? 0 : (params.page - 1) * params.pageSize + 1;
  const last = Math.min(total, params.page * params.pageSize);

  return (
    <div className="space-y-3">
      <div className="relative overflow-x-auto rounded-2xl border border-paper-200 bg-white" aria-busy={busy || undefined}>
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">
            Deviations {first} to {last} of {total}. Column headers with a button sort the queue; the deviation’s name opens its review.
          </caption>
          <thead className="bg-paper-100 text-sm text-paper-700">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  const canSort = header.column.getCanSort() && sortKeys.includes(header.column.id);
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={canSort ? (sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none') : undefined}
                      className="px-3 py-2 font-semibold first:pl-4 last:pr-4"
                    >
                      {header.isPlaceholder ? null : canSort ? (
                        <button type="button" onClick={header.column.getToggleSortingHandler()} className="-mx-2 inline-flex min-h-10 items-center gap-1 rounded-md px-2 hover:bg-paper-200">
                          <table.FlexRender header={header} />
                          <SortIcon sortOrder={sorted} className="size-4" />
                        </button>
                      ) : (
                        <table.FlexRender header={header} />
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody className={busy ? 'opacity-60' : ''}>
            {table.getRowModel().rows.map((row) => (
              <tr
                key={row.id}
                // The link in the row is the keyboard's way in; a click anywhere else on the row does the same for a mouse.
                onClick={(event) => {
                  if ((event.target as HTMLElement).closest('a, button')) return;
                  navigate(paths.deviation.getHref(row.original.id), { state: { queueSearch } satisfies QueueState });
                }}
                className="cursor-pointer border-t border-paper-200 align-top hover:bg-paper-50"
              >
                {row.getAllCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-3 first:pl-4 last:pr-4">
                    <table.FlexRender cell={cell} />
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      <nav aria-label="Pages of deviations" className="flex flex-wrap items-end justify-between gap-4">
        <p role="status" className="text-paper-800">
          {total === 0 ? 'No deviations' : `Deviations ${first}–${last} of ${total}`} · page {params.page} of {pageCount}
        </p>
        <div className="flex flex-wrap items-end gap-3">
          <SelectField label="Deviations per page" value={String(params.pageSize)} className="w-44" onChange={(e) => table.setPageSize(Number(e.target.value))}>
            {[10, 25, 50, 100].map((size) => (
              <option key={size} value={size}>
                {size}
              </option>
            ))}
          </SelectField>
          <Button variant="secondary" icon={<PageBackIcon />} disabled={!table.getCanPreviousPage()} onClick={() => table.previousPage()}>
            Previous page
          </Button>
          <Button variant="secondary" disabled={!table.getCanNextPage()} onClick={() => table.nextPage()}>
            Next page
            <PageForwardIcon />
          </Button>
        </div>
      </nav>
    </div>
  );
}
