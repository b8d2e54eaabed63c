import { useQuery } from '@tanstack/react-query';
import { Alert } from '../../../components/ui/alert';
import { Button, LinkButton } from '../../../components/ui/button';
import { AlertIcon, OrderClipboardIcon, PlusIcon, ReloadIcon } from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { paths } from '../../../config/paths';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { describeError } from '../../../lib/api-client';
import { orderQueries } from '../api/order-queries';
import { useOrderListParams } from '../hooks/use-order-list-params';
import { OrderFilters } from './order-filters';
import { OrdersTable } from './orders-table';

export function OrdersScreen({ canWrite }: { canWrite: boolean }) {
  const { query, update, filtered } = useOrderListParams();
  const list = useQuery(orderQueries.list(query));

  return (
    <>
      <PageHeader
        title="Orders"
        lead={`Every treatment order, newest first unless you sort otherwise. Times are in the unit’s time zone (${unitTimeZone}).`}
        actions={
          canWrite && (
            <LinkButton variant="primary" to={paths.newOrder.getHref()} icon={<PlusIcon />}>
              New order
            </LinkButton>
          )
        }
      />
      <OrderFilters query={query} filtered={filtered} onChange={update} />

      {list.isPending ? (
        <LoadingPanel label="Loading orders…" />
      ) : list.isError && !list.data ? (
        <StatusPanel
          role="alert"
          icon={<AlertIcon className="size-6" />}
          title="The orders could not be loaded"
          actions={
            <Button
              variant="secondary"
              icon={<ReloadIcon />}
              busy={list.isFetching}
              onClick={() => void list.refetch()}
            >
              Try again
            </Button>
          }
        >
          <p>{describeError(list.error)}</p>
        </StatusPanel>
      ) : list.data.total === 0 ? (
        <StatusPanel
          icon={<OrderClipboardIcon className="size-6" />}
          title={filtered ? 'No order matches these filters' : 'No orders yet'}
        >
          <p>
            {filtered
              ? 'Widen the dates or clear the filters.'
              : canWrite
                ? 'Start one with “New order”, or from a patient’s page.'
                : 'Orders appear here once a clinician writes them.'}
          </p>
        </StatusPanel>
      ) : (
        <>
          {list.isError && (
            <Alert tone="error" title="The list may be out of date" className="mb-4">
              {describeError(list.error)}
            </Alert>
          )}
          <OrdersTable
            orders={list.data.orders}
            total={list.data.total}
            query={query}
            onChange={update}
            busy={list.isPlaceholderData}
          />
        </>
      )}
    </>
  );
}
