import { LinkButton } from '../../../components/ui/button';
import { AlertIcon, LockIcon } from '../../../components/ui/icons';
import { StatusPanel } from '../../../components/ui/status-panel';
import { paths } from '../../../config/paths';

/** Order ids in addresses are whole numbers from 1; anything else is not an order. */
export function parseOrderId(text: string | undefined): number | null {
  return text && /^[1-9]\d{0,9}$/.test(text) ? Number(text) : null;
}

export function OrdersLocked({ write = false }: { write?: boolean }) {
  return (
    <StatusPanel
      headingLevel="h1"
      icon={<LockIcon className="size-6" />}
      title={
        write ? 'Writing orders is not part of your roles' : 'Orders are not part of your roles'
      }
      actions={
        <LinkButton to={write ? paths.orders.getHref() : paths.today.getHref()}>
          {write ? 'See the orders' : 'Go to Today'}
        </LinkButton>
      }
    >
      <p>
        {write
          ? 'Orders are written and signed by clinicians.'
          : 'Orders are seen by clinical staff and auditors.'}{' '}
        Ask an administrator if your roles need to change.
      </p>
    </StatusPanel>
  );
}

export function NoSuchOrder({ text }: { text: string | undefined }) {
  return (
    <StatusPanel
      headingLevel="h1"
      icon={<AlertIcon className="size-6" />}
      title="There is no such order"
      actions={<LinkButton to={paths.orders.getHref()}>All orders</LinkButton>}
    >
      <p>“{text ?? ''}” is not an order number; order numbers are whole numbers from 1.</p>
    </StatusPanel>
  );
}
