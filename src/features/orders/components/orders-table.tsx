import { Link } from 'react-router-dom';
import { formatUnitDateTime } from '../../../lib/unit-times';
import { createColumnHelper } from '@tanstack/react-table';
import type { OrderListQuery, OrderSummary } from '../../../../shared/schemas/orders';
import { PagedTable, type PagedTableFeatures } from '../../../components/ui/paged-table';
import { paths } from '../../../config/paths';
import { OrderStatusBadge } from '../../../components/ui/order-status-badge';
import { eyeWords } from './order-words';

const helper = createColumnHelper<PagedTableFeatures, OrderSummary>();
const sortKeys: readonly OrderListQuery['sort'][] = ['createdAt', 'status', 'protocol', 'patient'];

const columns = helper.columns([
  helper.accessor('id', {
    id: 'order',
    header: 'Order',
    enableSorting: false,
    cell: ({ row }) => {
      const o = row.original;
      return (
        <Link
          to={paths.order.getHref(o.id)}
          className="font-semibold whitespace-nowrap text-iris-700 underline underline-offset-4 hover:text-iris-900"
        >
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
  helper.accessor('eye', {
    header: 'Eye',
    enableSorting: false,
    cell: ({ getValue }) => <span className="whitespace-nowrap">{eyeWords[getValue()]}</span>,
  }),
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
  helper.accessor('status', {
    header: 'Status',
    cell: ({ getValue }) => <OrderStatusBadge status={getValue()} />,
  }),
  helper.accessor('createdAt', {
    header: 'Created',
    sortDescFirst: true,
    cell: ({ row }) => (
      <>
        <span className="block whitespace-nowrap">
          {formatUnitDateTime(row.original.createdAt)}
        </span>
        {row.original.createdBy && (
          <span className="text-sm text-paper-600">by {row.original.createdBy.displayName}</span>
        )}
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

/** One page of orders. Sorting and paging are done by the server; the table only asks for them. */
export function OrdersTable({ orders, total, query, onChange, busy }: OrdersTableProps) {
  return (
    <PagedTable
      columns={columns}
      rows={orders}
      getRowId={(o) => String(o.id)}
      total={total}
      paging={query}
      sortKeys={sortKeys}
      onChange={onChange}
      busy={busy}
      caption={({ first, last }) =>
        `Orders ${first} to ${last} of ${total}. Column headers with a button sort the list.`
      }
      pagerWords={{
        navLabel: 'Pages of orders',
        items: 'Orders',
        none: 'No orders',
        perPage: 'Orders per page',
      }}
      perPageClassName="w-40"
    />
  );
}
