import { useParams } from 'react-router-dom';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { OrderDetailScreen } from '../../features/orders/components/order-detail-screen';
import {
  NoSuchOrder,
  OrdersLocked,
  parseOrderId,
} from '../../features/orders/components/orders-locked';
import { useSignedInUser } from '../layout/signed-in-user';

export function OrderDetailRoute() {
  const user = useSignedInUser();
  const { id } = useParams();
  const orderId = parseOrderId(id);
  return (
    <>
      {(!hasCapability(user, 'orders.read') || orderId === null) && (
        <title>{`Order ${id ?? ''} · Luxtempo`}</title>
      )}
      {!hasCapability(user, 'orders.read') ? (
        <OrdersLocked />
      ) : orderId === null ? (
        <NoSuchOrder text={id} />
      ) : (
        <OrderDetailScreen
          key={orderId}
          orderId={orderId}
          canWrite={hasCapability(user, 'orders.write')}
          canRunSessions={hasCapability(user, 'sessions.run')}
          canCancel={hasCapability(user, 'orders.cancel')}
          viewer={{ id: user.id, admin: user.roles.includes('admin') }}
        />
      )}
    </>
  );
}
