import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import type { OrderSummary } from '../../../../shared/schemas/orders';
import { Button } from '../../../components/ui/button';
import { AlertIcon, ChevronRightIcon, ReloadIcon } from '../../../components/ui/icons';
import { OrderStatusLabel } from '../../../components/ui/order-status-label';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { paths } from '../../../config/paths';
import { describeError } from '../../../lib/api-client';
import { doseCheckQueries } from '../api/dose-check-queries';
import { usePharmacyNowMs } from '../hooks/use-server-now';
import { BeyondUseChip } from './beyond-use-countdown';
import { eyeWords, patientName, unitDateTime } from './display-format';

export function DoseCheckListScreen() {
  const worklists = useQuery(doseCheckQueries.worklists());

  return (
    <>
      <PageHeader
        title="Dose checks"
        lead="Signed PDT orders waiting for your independent dose check, and checked orders waiting for preparation. Open one to work on it."
        actions={
          <Button
            variant="secondary"
            icon={<ReloadIcon />}
            busy={worklists.isFetching && !worklists.isPending}
            onClick={() => void worklists.refetch()}
          >
            Refresh
          </Button>
        }
      />
      {worklists.isPending ? (
        <LoadingPanel label="Loading the dose checks…" />
      ) : worklists.isError && !worklists.data ? (
        <StatusPanel
          role="alert"
          icon={<AlertIcon className="size-6" />}
          title="The dose checks could not be loaded"
          actions={
            <Button
              variant="secondary"
              icon={<ReloadIcon />}
              busy={worklists.isFetching}
              onClick={() => void worklists.refetch()}
            >
              Try again
            </Button>
          }
        >
          <p>{describeError(worklists.error)}</p>
        </StatusPanel>
      ) : (
        <div className="space-y-8">
          {worklists.isError && (
            <p
              role="alert"
              className="flex items-center gap-2 rounded-lg border border-alarm-700 bg-alarm-50 px-4 py-3 text-alarm-800"
            >
              <AlertIcon className="size-5" />
              The lists may be out of date: {describeError(worklists.error)}
            </p>
          )}
          <OrderList
            id="waiting-for-check"
            title="Waiting for a dose check"
            empty="No orders are waiting for a dose check."
            orders={worklists.data.waitingForCheck}
            when={(order) =>
              order.signedAt
                ? `Signed ${unitDateTime(order.signedAt)}${order.signedBy ? ` by ${order.signedBy.displayName}` : ''}`
                : ''
            }
          />
          <OrderList
            id="waiting-for-preparation"
            title="Checked, waiting for preparation"
            empty="No checked orders are waiting for preparation."
            orders={worklists.data.waitingForPreparation}
          />
          <OrderList
            id="prepared"
            title="Prepared"
            empty="No prepared doses are waiting for treatment."
            orders={worklists.data.prepared}
            countdown
          />
        </div>
      )}
    </>
  );
}

type OrderListProps = {
  id: string;
  title: string;
  empty: string;
  orders: OrderSummary[];
  when?: (order: OrderSummary) => string;
  countdown?: boolean;
};

function OrderList({ id, title, empty, orders, when, countdown = false }: OrderListProps) {
  return (
    <section aria-labelledby={`${id}-heading`} className="space-y-3">
      <h2
        id={`${id}-heading`}
        className="flex items-baseline gap-3 text-xl font-semibold text-paper-900"
      >
        {title}
        <span className="numerals-steady rounded-full bg-paper-200 px-2.5 py-0.5 text-base font-medium text-paper-800">
          {orders.length}
          <span className="sr-only">{orders.length === 1 ? ' order' : ' orders'}</span>
        </span>
      </h2>
      {orders.length === 0 ? (
        <p className="rounded-xl border border-dashed border-paper-400 bg-paper-100 px-5 py-4 text-paper-800">
          {empty}
        </p>
      ) : (
        <ul className="divide-y divide-paper-200 overflow-hidden rounded-xl border border-paper-200 bg-white">
          {orders.map((order) => (
            <li
              key={order.id}
              className="relative flex flex-wrap items-center gap-x-6 gap-y-2 px-5 py-4 hover:bg-paper-100"
            >
              <span className="min-w-56 flex-1">
                {/* The name is the link; its ::after covers the whole row, so the row is one large target. */}
                <Link
                  to={paths.doseCheck.getHref(order.id)}
                  className="block font-semibold text-iris-800 underline-offset-4 after:absolute after:inset-0 hover:underline"
                >
                  {patientName(order.patient)}
                </Link>
                <span className="numerals-steady block text-sm text-paper-700">
                  Record {order.patient.recordNumber} · order {order.id}
                </span>
              </span>
              <span className="w-24 font-medium text-paper-900">{eyeWords[order.eye]}</span>
              <span className="min-w-48 flex-1 text-paper-800">
                {order.protocol.title}{' '}
                <span className="text-paper-700">v{order.protocol.version}</span>
                {when && <span className="block text-sm text-paper-700">{when(order)}</span>}
              </span>
              {countdown && order.beyondUseAt ? (
                <ListCountdown order={{ ...order, beyondUseAt: order.beyondUseAt }} />
              ) : (
                <OrderStatusLabel status={order.status} wording="long" />
              )}
              <ChevronRightIcon className="size-5 text-paper-600" />
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}

/** The chip with its own once-a-second clock, so only it re-renders as time passes. */
function ListCountdown({ order }: { order: OrderSummary & { beyondUseAt: string } }) {
  const nowMs = usePharmacyNowMs();
  return (
    <BeyondUseChip
      beyondUseAt={order.beyondUseAt}
      nowMs={nowMs}
      subject={`Order ${order.id}, ${patientName(order.patient)}`}
    />
  );
}
