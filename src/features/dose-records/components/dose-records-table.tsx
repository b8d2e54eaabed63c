import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { createColumnHelper, rowPaginationFeature, rowSortingFeature, tableFeatures, useTable, type PaginationState, type SortingState, type Updater } from '@tanstack/react-table';
import type { DoseRecordFilter } from '../../../../shared/schemas/reviews';
import { Button } from '../../../components/ui/button';
import { PageBackIcon, PageForwardIcon, PrinterIcon, SortIcon } from '../../../components/ui/icons';
import { paths } from '../../../config/paths';
import type { DoseRecordRow } from '../api/dose-record-schemas';
import { eyeWords, kindWords } from './dose-record-words';
import { DeviationCount, OutcomeLabel } from './outcome-label';
import { SelectField } from '../../../components/ui/select-field';
import { formatDurationS, formatFigure, formatUnitClock, formatUnitDate } from '../../../lib/unit-times';

const features = tableFeatures({ rowSortingFeature, rowPaginationFeature });
const helper = createColumnHelper<typeof features, DoseRecordRow>();
const sortKeys: readonly string[] = ['endedAt', 'fluence'];

function columnsFor(protocolTitle: (key: string) => string) {
  return helper.columns([
    helper.accessor('endedAt', {
      header: 'Ended',
      sortDescFirst: true,
      cell: ({ getValue }) => (
        <span className="numerals-steady whitespace-nowrap">
          {formatUnitDate(getValue())}
          <span className="block text-sm text-paper-700">{formatUnitClock(getValue())}</span>
        </span>
      ),
    }),
    helper.accessor('orderId', {
      header: 'Session',
      enableSorting: false,
      cell: ({ row }) => (
        <>
          <Link to={paths.order.getHref(row.original.orderId)} className="font-semibold whitespace-nowrap text-iris-700 underline underline-offset-4 hover:text-iris-900">
            Order {row.original.orderId}
          </Link>
          <span className="block">{protocolTitle(row.original.protocolKey)}</span>
          <span className="block text-sm text-paper-600">
            {kindWords[row.original.kind]} v{row.original.protocolVersion} · {row.original.recordNumber} · {eyeWords[row.original.eye]}
          </span>
        </>
      ),
    }),
    helper.accessor('outcome', {
      header: 'Outcome',
      enableSorting: false,
      cell: ({ row }) => (
        <span className="flex flex-col gap-1">
          <OutcomeLabel outcome={row.original.outcome} />
          <DeviationCount count={row.original.deviationCount} />
        </span>
      ),
    }),
    helper.accessor('onTimeS', {
      header: 'Given',
      enableSorting: false,
      cell: ({ row }) => (
        <span className="numerals-steady block text-sm whitespace-nowrap">
          {row.original.kind === 'pdt' ? (
            <>
              {formatFigure(row.original.doseMg, 'mg')} dose planned
              <span className="block">{formatFigure(row.original.volumeGivenMl, 'mL')} infused</span>
              <span className="block">light on {formatDurationS(row.original.onTimeS)}</span>
            </>
          ) : (
            <>
              riboflavin drops
              <span className="block">UV on {formatDurationS(row.original.onTimeS)}</span>
            </>
          )}
        </span>
      ),
    }),
    helper.accessor('deliveredFluenceJPerCm2', {
      id: 'fluence',
      header: 'Fluence',
      cell: ({ row }) => (
        <span className="numerals-steady block text-sm whitespace-nowrap">
          {formatFigure(row.original.plannedFluenceJPerCm2, 'J/cm²')} planned
          <strong className="block text-base font-semibold">{formatFigure(row.original.deliveredFluenceJPerCm2, 'J/cm²')} delivered</strong>
        </span>
      ),
    }),
    helper.display({
      id: 'print',
      header: () => <span className="sr-only">Print</span>,
      cell: ({ row }) => (
        <Link to={paths.doseRecordPrint.getHref(row.original.orderId)} className="inline-flex min-h-10 items-center gap-1.5 whitespace-nowrap text-iris-700 underline underline-offset-4 hover:text-iris-900">
          <PrinterIcon className="size-4" />
          Print<span className="sr-only"> the dose record of order {row.original.orderId}</span>
        </Link>
      ),
    }),
  ]);
}

type DoseRecordsTableProps = {
  rows: DoseRecordRow[];
  total: number;
  filter: DoseRecordFilter;
  protocolTitle: (key: string) => string;
  onChange: (changes: Partial<DoseRecordFilter>) => void;
  busy: boolean;
};

function resolve<T>(updater: Updater<T>, current: T): T {
  return typeof updater === 'function' ? (updater as (old: T) => T)(current) : updater;
}

/** One page of dose records. Sorting and paging are done by the server. */
export function DoseRecordsTable({ rows, total, filter, protocolTitle, onChange, busy }: DoseRecordsTableProps) {
  const columns = useMemo(() => columnsFor(protocolTitle), [protocolTitle]);
  const sorting = useMemo<SortingState>(() => [{ id: filter.sort, desc: filter.direction === 'desc' }], [filter.sort, filter.direction]);
  const pagination = useMemo<PaginationState>(() => ({ pageIndex: filter.page - 1, pageSize: filter.pageSize }), [filter.page, filter.pageSize]);

  const table = useTable({
    features,
    columns,
    data: rows,
    getRowId: (r) => String(r.orderId),
    manualSorting: true,
    manualPagination: true,
    rowCount: total,
    enableSortingRemoval: false,
    state: { sorting, pagination },
    onSortingChange: (updater) => {
      const [next] = resolve(updater, sorting);
      if (next && sortKeys.includes(next.id)) onChange({ sort: next.id as DoseRecordFilter['sort'], direction: next.desc ? 'desc' : 'asc' });
    },
    onPaginationChange: (updater) => {
      const next = resolve(updater, pagination);
      if (next.pageSize !== pagination.pageSize) onChange({ pageSize: next.pageSize });
      else onChange({ page: next.pageIndex + 1 });
    },
  });

  const pageCount = Math.max(1, table.getPageCount());
  const first = total === 0 ? 0 : (filter.page - 1) * filter.pageSize + 1;
  const last = Math.min(total, filter.page * filter.pageSize);

  return (
    <div className="space-y-3">
      <div className="relative overflow-x-auto rounded-2xl border border-paper-200 bg-white" aria-busy={busy || undefined}>
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">
            Dose records {first} to {last} of {total}. Column headers with a button sort the list.
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
                        <button type="button" onClick={header.column.getToggleSortingHandler()} className="-mx-2 inline-flex min-h-10 items-center gap-1 rounded-md px-2 text-left hover:bg-paper-200">
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
              <tr key={row.id} className="border-t border-paper-200 align-top hover:bg-paper-50">
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

      <nav aria-label="Pages of dose records" className="flex flex-wrap items-end justify-between gap-4">
        <p role="status" className="text-paper-800">
          {total === 0 ? 'No records' : `Records ${first}–${last} of ${total}`} · page {filter.page} of {pageCount}
        </p>
        <div className="flex flex-wrap items-end gap-3">
          <SelectField label="Records per page" value={String(filter.pageSize)} className="w-44" onChange={(e) => table.setPageSize(Number(e.target.value))}>
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
