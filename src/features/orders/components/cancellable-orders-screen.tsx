import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import type { CancellableOrder } from '../../../../shared/schemas/orders';
import { Button } from '../../../components/ui/button';
import {
  AlertIcon,
  CheckCircleIcon,
  CrossCircleIcon,
  OrderClipboardIcon,
  ReloadIcon,
} from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { unitTimeZoneLabel } from '../../../config/unit-time-zone';
import { describeError } from '../../../lib/api-client';
import { cancellableOrdersQuery } from '../../../lib/queries/orders';
import { formatUnitDateTime } from '../../../lib/unit-times';
import { CancelOrderDialog } from './cancel-order-dialog';
import { eyeWords, kindWords } from './order-words';

/**
 * The administrator's way to cancel an order before its session: open orders by identity only
 * (number, patient, eye, kind, who signed and when). No figures and no link to the order's page,
 * which an administrator may not read; the server gives nothing more.
 */
export function CancellableOrdersScreen() {
  const listQuery = useQuery(cancellableOrdersQuery());
  const [chosen, setChosen] = useState<CancellableOrder | null>(null);
  const [outcome, setOutcome] = useState<string | null>(null);
  const orders = listQuery.data?.orders;

  return (
    <>
      <PageHeader
        title="Cancel orders"
        lead={`Orders whose session has not started, newest first, with only what identifies them. A cancelled order leaves every worklist; it stays on record with your name, the time and your reason. Times are ${unitTimeZoneLabel}.`}
        actions={
          <Button
            variant="secondary"
            icon={<ReloadIcon />}
            busy={listQuery.isFetching && !listQuery.isPending}
            onClick={() => void listQuery.refetch()}
          >
            Refresh
          </Button>
        }
      />
      {outcome && (
        <p
          role="status"
          className="mb-4 flex items-center gap-2 rounded-lg border border-iris-200 bg-iris-50 px-4 py-3 font-medium text-iris-900"
        >
          <CheckCircleIcon className="size-5" />
          {outcome}
        </p>
      )}
      {listQuery.isPending ? (
        <LoadingPanel label="Loading open orders…" />
      ) : listQuery.isError && !orders ? (
        <StatusPanel
          role="alert"
          icon={<AlertIcon className="size-6" />}
          title="The open orders could not be loaded"
          actions={
            <Button
              variant="secondary"
              icon={<ReloadIcon />}
              onClick={() => void listQuery.refetch()}
            >
              Try again
            </Button>
          }
        >
          <p>{describeError(listQuery.error)}</p>
        </StatusPanel>
      ) : !orders || orders.length === 0 ? (
        <StatusPanel icon={<OrderClipboardIcon className="size-6" />} title="No open orders">
          <p>Every order has reached its session, or been cancelled.</p>
        </StatusPanel>
      ) : (
        <ul aria-label="Open orders" className="flex flex-col gap-3">
          {orders.map((order) => (
            <li
              key={order.id}
              className="flex flex-wrap items-center justify-between gap-4 rounded-xl border border-paper-200 bg-white px-4 py-3"
            >
              <div className="min-w-0 space-y-0.5">
                <p className="font-medium text-paper-950">
                  Order {order.id} · {order.patient.familyName}, {order.patient.givenName} ·{' '}
                  {order.patient.recordNumber}
                </p>
                <p className="text-paper-800">
                  <strong>{eyeWords[order.eye]}</strong> · {kindWords[order.kind]}
                </p>
                <p className="numerals-steady text-sm text-paper-700">
                  {order.signedBy
                    ? `Signed by ${order.signedBy.displayName}, ${formatUnitDateTime(order.signedAt)}`
                    : `Draft by ${order.createdBy?.displayName ?? 'a former colleague'}, ${formatUnitDateTime(order.createdAt)}; not signed`}
                </p>
              </div>
              <Button
                variant="danger"
                icon={<CrossCircleIcon />}
                onClick={() => {
                  setOutcome(null);
                  setChosen(order);
                }}
              >
                Cancel order {order.id}
              </Button>
            </li>
          ))}
        </ul>
      )}
      {chosen && (
        <CancelOrderDialog
          order={chosen}
          treatment={kindWords[chosen.kind]}
          open
          onDismiss={() => setChosen(null)}
          onCancelled={(cancelled) => {
            setChosen(null);
            setOutcome(`Order ${cancelled.id} is cancelled. It is on no worklist any more.`);
          }}
        />
      )}
    </>
  );
}
