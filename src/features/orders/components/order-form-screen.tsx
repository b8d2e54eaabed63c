import { useQuery } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { Button, LinkButton } from '../../../components/ui/button';
import { AlertIcon, ArrowLeftIcon, LockIcon, ReloadIcon } from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { paths } from '../../../config/paths';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { orderQueries } from '../api/order-queries';
import { OrderForm } from './order-form';
import { emptyOrderForm, orderToForm, type OrderFormMode } from './order-form-values';
import { amendableStatuses } from '../../../../shared/orders/lifecycle';
import { eyeWords } from './order-words';
import { orderStatusWords } from '../../../components/ui/order-status-words';

function Failed({
  title,
  error,
  onRetry,
  busy,
}: {
  title: string;
  error: unknown;
  onRetry: () => void;
  busy: boolean;
}) {
  const missing = isApiRequestError(error) && error.status === 404;
  return (
    <StatusPanel
      role="alert"
      headingLevel="h1"
      icon={<AlertIcon className="size-6" />}
      title={missing ? 'There is no such order' : title}
      actions={
        <>
          <LinkButton to={paths.orders.getHref()} icon={<ArrowLeftIcon />}>
            All orders
          </LinkButton>
          {!missing && (
            <Button variant="primary" icon={<ReloadIcon />} busy={busy} onClick={onRetry}>
              Try again
            </Button>
          )}
        </>
      }
    >
      <p>{describeError(error)}</p>
    </StatusPanel>
  );
}

/** A new order (optionally for a given patient). */
export function NewOrderScreen({ patientId }: { patientId: number | null }) {
  const navigate = useNavigate();
  const protocols = useQuery(orderQueries.protocolChoices());
  return (
    <>
      <PageHeader
        title="New order"
        lead="Choose the patient, the eye and an approved protocol version; the plan appears as you type."
      />
      {protocols.isPending ? (
        <LoadingPanel label="Loading the approved protocol versions…" />
      ) : protocols.isError ? (
        <Failed
          title="The protocol versions could not be loaded"
          error={protocols.error}
          onRetry={() => void protocols.refetch()}
          busy={protocols.isFetching}
        />
      ) : (
        <OrderForm
          mode="new"
          initialValues={emptyOrderForm(patientId ?? undefined)}
          protocolChoices={protocols.data}
          cancelHref={patientId ? paths.patient.getHref(patientId) : paths.orders.getHref()}
          onSaved={(order) =>
            navigate(paths.order.getHref(order.id), {
              state: { outcome: `Order ${order.id} was saved as a draft.` },
            })
          }
        />
      )}
    </>
  );
}

/** Editing a draft, or amending a signed order into a new revision. */
export function ChangeOrderScreen({
  orderId,
  mode,
}: {
  orderId: number;
  mode: Exclude<OrderFormMode, 'new'>;
}) {
  const navigate = useNavigate();
  const order = useQuery(orderQueries.detail(orderId));
  const protocols = useQuery(orderQueries.protocolChoices());
  const title = mode === 'edit' ? `Edit draft order ${orderId}` : `Amend order ${orderId}`;

  if (order.isPending || protocols.isPending) return <LoadingPanel label="Loading the order…" />;
  if (order.isError)
    return (
      <Failed
        title="The order could not be loaded"
        error={order.error}
        onRetry={() => void order.refetch()}
        busy={order.isFetching}
      />
    );
  if (protocols.isError)
    return (
      <Failed
        title="The protocol versions could not be loaded"
        error={protocols.error}
        onRetry={() => void protocols.refetch()}
        busy={protocols.isFetching}
      />
    );

  const detail = order.data;
  const allowed =
    mode === 'edit'
      ? detail.status === 'draft'
      : amendableStatuses.includes(detail.status) && detail.nextRevisionId === null;
  if (!allowed) {
    return (
      <StatusPanel
        headingLevel="h1"
        icon={<LockIcon className="size-6" />}
        title={
          mode === 'edit'
            ? `Order ${orderId} can no longer be edited`
            : `Order ${orderId} cannot be amended`
        }
        actions={<LinkButton to={paths.order.getHref(orderId)}>Open the order</LinkButton>}
      >
        <p>
          It is {orderStatusWords(detail.status).toLowerCase()}.{' '}
          {mode === 'edit'
            ? 'A signed order is amended instead; the signed revision stays readable.'
            : detail.nextRevisionId !== null
              ? `Revision ${detail.revision + 1} replaces it already; work on that one.`
              : 'Only a signed order that has not reached the session can be amended.'}
        </p>
      </StatusPanel>
    );
  }

  return (
    <>
      <PageHeader
        title={title}
        lead={
          <>
            {detail.patient.familyName}, {detail.patient.givenName} · {detail.patient.recordNumber}{' '}
            · <strong className="font-semibold text-paper-950">{eyeWords[detail.eye]}</strong>
            {mode === 'amend' && (
              <> · the amendment becomes revision {detail.revision + 1}, a draft to sign again</>
            )}
          </>
        }
      />
      <OrderForm
        key={`${mode}-${detail.id}`}
        mode={mode}
        source={detail}
        initialValues={orderToForm(detail)}
        protocolChoices={protocols.data}
        cancelHref={paths.order.getHref(orderId)}
        onSaved={(saved) =>
          navigate(paths.order.getHref(saved.id), {
            state: {
              outcome:
                mode === 'edit'
                  ? `The changes to order ${saved.id} were saved.`
                  : `Revision ${saved.revision} was saved as a draft; sign it to replace revision ${detail.revision}.`,
            },
          })
        }
      />
    </>
  );
}
