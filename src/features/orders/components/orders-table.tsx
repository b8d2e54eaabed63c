import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { createColumnHelper, rowPaginationFeature, rowSortingFeature, tableFeatures, useTable, type PaginationState, type SortingState, type Updater } from '@tanstack/react-table';
import type { OrderListQuery, OrderSummary } from '../../../../shared/schemas/orders';
import { Button } from '../../../components/ui/button';
import { PageBackIcon, PageForwardIcon, SortIcon } from '../../../components/ui/icons';
import { paths } from '../../../config/paths';
import { OrderStatusBadge } from './order-status-badge';
import { eyeWords } from './order-words';
import { SelectField } from '../../../components/ui/select-field';
import { formatUnitDateTime } from './unit-dates';

const features = tableFeatures({ rowSortingFeature, rowPaginationFeature });
const helper = createColumnHelper<typeof features, OrderSummary>();
type SortKey = OrderListQuery['sort'];
const sortKeys: readonly string[] = ['createdAt', 'status', 'protocol', 'patient'];

const columns = helper.columns([
  helper.accessor('id', {
    id: 'order',
    header: 'Order',
    enableSorting: false,
    cell: ({ row }) => {
      const o = row.original;
      return (
        <Link to={paths.order.getHref(o.id)} className="font-semibold whitespace-nowrap text-iris-700 underline underline-offset-4 hover:text-iris-900">
          Order {o.id}
          {o.revision > 1 && <span className="font-normal"> (rev. {o.revision})</span>}
        </Link>
      );
    },
  }),
  helper.accessor((o) => `${o.patient.familyName}, ${o.patient.givenName}`, {
    id: 'patient',
    header: 'Patient',
    cell: ({ row }) => (
      <>
        <span className="block font-medium text-paper-950">
          {row.original.patient.familyName}, {row.original.patient.givenName}
        </span>
        <span className="text-sm text-paper-600">{row.original.patient.recordNumber}</span>
      </>
    ),
  }),
  helper.accessor('eye', { header: 'Eye', enableSorting: false, cell: ({ getValue }) => <span className="whitespace-nowrap">{eyeWords[getValue()]}</span> }),
  helper.accessor((o) => o.protocol.title, {
    id: 'protocol',
    header: 'Protocol',
    cell: ({ row }) => (
      <>
        <span className="block">{row.original.protocol.title}</span>
        <span className="text-sm text-paper-600">version {row.original.protocol.version}</span>
      </>
    ),
  }),
  helper.accessor('status', { header: 'Status', cell: ({ getValue }) => <OrderStatusBadge status={getValue()} /> }),
  helper.accessor('createdAt', {
    header: 'Created',
    sortDescFirst: true,
    cell: ({ row }) => (
      <>
        <span className="block whitespace-nowrap">{formatUnitDateTime(row.original.createdAt)}</span>
        {row.original.createdBy && <span className="text-sm text-paper-600">by {row.original.createdBy.displayName}</span>}
      </>
    ),
  }),
]);

type OrdersTableProps = {
  orders: OrderSummary[];
  total: number;
  query: OrderListQuery;
  onChange: (changes: Partial<OrderListQuery>) => void;
  busy: boolean;
};

function resolve<T>(updater: Updater<T>, current: T): T {
  return typeof updater === 'function' ? (updater as (old: T) => T)(current) : updater;
}

/** One page of orders. Sorting and paging are done by the server; the table only asks for them. */
export function OrdersTable({ orders, total, query, onChange, busy }: OrdersTableProps) {
  const sorting = useMemo<SortingState>(() => [{ id: query.sort, desc: query.direction === 'desc' }], [query.sort, query.direction]);
  const pagination = useMemo<PaginationState>(() => ({ pageIndex: query.page - 1, pageSize: query.pageSize }), [query.page, query.pageSize]);

  const table = useTable({
    features,
    columns,
    data: orders,
    getRowId: (o) => String(o.id),
    manualSorting: true,
    manualPagination: true,
    rowCount: total,
    enableSortingRemoval: false,
    state: { sorting, pagination },
    onSortingChange: (updater) => {
      const [next] = resolve(updater, sorting);
      if (next && sortKeys.includes(next.id)) onChange({ sort: next.id as SortKey, direction: next.desc ? 'desc' : 'asc' });
    },
    onPaginationChange: (updater) => {
      const next = resolve(updater, pagination);
      if (next.pageSize !== pagination.pageSize) onChange({ pageSize: next.pageSize });
      else onChange({ page: next.pageIndex + 1 });
    },
  });

  const pageCount = Math.max(1, table.getPageCount());
  const first = total === 0 ? 0 : (query.page - 1) * query.pageSize + 1;
  const last = Math.min(total, query.page * query.pageSize);

  return (
    <div className="space-y-3">
      <div className="overflow-x-auto rounded-2xl border border-paper-200 bg-white" aria-busy={busy || undefined}>
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">
            Orders {first} to {last} of {total}. Column headers with a button sort the list.
          </caption>
          <thead className="bg-paper-100 text-sm text-paper-700">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  const canSort = header.column.getCanSort();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={canSort ? (sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none') : undefined}
                      className="px-3 py-2 font-semibold first:pl-4 last:pr-4"
                    >
                      {header.isPlaceholder ? null : canSort ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className="-mx-2 inline-flex min-h-10 items-center gap-1 rounded-md px-2 hover:bg-paper-200"
                        >
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

      <nav aria-label="Pages of orders" className="flex flex-wrap items-end justify-between gap-4">
        <p role="status" className="text-paper-800">
          {total === 0 ? 'No orders' : `Orders ${first}–${last} of ${total}`} · page {query.page} of {pageCount}
        </p>
        <div className="flex flex-wrap items-end gap-3">
          <SelectField label="Orders per page" value={String(query.pageSize)} className="w-40" onChange={(e) => table.setPageSize(Number(e.target.value))}>
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
