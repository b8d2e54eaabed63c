import { useSearchParams } from 'react-router-dom';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { NewOrderScreen } from '../../features/orders/components/order-form-screen';
import { OrdersLocked } from '../../features/orders/components/orders-locked';
import { useSignedInUser } from '../layout/signed-in-user';

export function NewOrderRoute() {
  const user = useSignedInUser();
  const [search] = useSearchParams();
  const raw = search.get('patientId') ?? '';
  const patientId = /^[1-9]\d{0,9}$/.test(raw) ? Number(raw) : null;
  return (
    <>
      <title>New order · Luxtempo</title>
      {hasCapability(user, 'orders.write') ? (
        <NewOrderScreen key={patientId ?? 'none'} patientId={patientId} />
      ) : (
        <OrdersLocked write />
      )}
    </>
  );
}
