import { useParams } from 'react-router-dom';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { ChangeOrderScreen } from '../../features/orders/components/order-form-screen';
import {
  NoSuchOrder,
  OrdersLocked,
  parseOrderId,
} from '../../features/orders/components/orders-locked';
import { useSignedInUser } from '../layout/signed-in-user';

export function OrderAmendRoute() {
  const user = useSignedInUser();
  const { id } = useParams();
  const orderId = parseOrderId(id);
  return (
    <>
      <title>{`Amend order ${id ?? ''} · Luxtempo`}</title>
      {!hasCapability(user, 'orders.write') ? (
        <OrdersLocked write />
      ) : orderId === null ? (
        <NoSuchOrder text={id} />
      ) : (
        <ChangeOrderScreen key={orderId} orderId={orderId} mode="amend" />
      )}
    </>
  );
}
