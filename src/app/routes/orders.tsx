import { hasCapability } from '../../features/auth/hooks/use-session';
import { OrdersLocked } from '../../features/orders/components/orders-locked';
import { OrdersScreen } from '../../features/orders/components/orders-screen';
import { useSignedInUser } from '../layout/signed-in-user';

export function OrdersRoute() {
  const user = useSignedInUser();
  return (
    <>
      <title>Orders · Luxtempo</title>
      {hasCapability(user, 'orders.read') ? (
        <OrdersScreen canWrite={hasCapability(user, 'orders.write')} />
      ) : (
        <OrdersLocked />
      )}
    </>
  );
}
