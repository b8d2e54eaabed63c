import { LinkButton } from '../../components/ui/button';
import { LockIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { CancellableOrdersScreen } from '../../features/orders/components/cancellable-orders-screen';
import { useSignedInUser } from '../layout/signed-in-user';

export function OrderCancellingRoute() {
  const user = useSignedInUser();
  return (
    <>
      <title>Cancel orders · Luxtempo</title>
      {hasCapability(user, 'orders.list-cancellable') ? (
        <CancellableOrdersScreen />
      ) : (
        <StatusPanel
          headingLevel="h1"
          icon={<LockIcon className="size-6" />}
          title="This list is for administrators"
          actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
        >
          <p>
            A clinician cancels an order they signed from the order&rsquo;s own page. Ask an
            administrator if your roles need to change.
          </p>
        </StatusPanel>
      )}
    </>
  );
}
