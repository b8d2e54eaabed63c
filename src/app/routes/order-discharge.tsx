import { useParams } from 'react-router-dom';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { DischargeScreen } from '../../features/discharge/components/discharge-screen';
import {
  NoSuchOrder,
  OrdersLocked,
  parseOrderId,
} from '../../features/orders/components/orders-locked';
import { useSignedInUser } from '../layout/signed-in-user';

export function OrderDischargeRoute() {
  const user = useSignedInUser();
  const { id } = useParams();
  const orderId = parseOrderId(id);
  if (!hasCapability(user, 'orders.read') || orderId === null) {
    return (
      <>
        <title>{`Discharge sheet · order ${id ?? ''} · Luxtempo`}</title>
        {orderId === null && hasCapability(user, 'orders.read') ? (
          <NoSuchOrder text={id} />
        ) : (
          <OrdersLocked />
        )}
      </>
    );
  }
  return (
    <DischargeScreen
      key={orderId}
      orderId={orderId}
      canRunSessions={hasCapability(user, 'sessions.run')}
    />
  );
}
