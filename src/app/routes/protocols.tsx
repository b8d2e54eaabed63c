import { hasCapability } from '../../features/auth/hooks/use-session';
import { ProtocolsLocked } from '../../features/protocols/components/protocol-route-states';
import { ProtocolsScreen } from '../../features/protocols/components/protocols-screen';
import { useSignedInUser } from '../layout/signed-in-user';

export function ProtocolsRoute() {
  const user = useSignedInUser();
  return (
    <>
      <title>Protocols · Luxtempo</title>
      {hasCapability(user, 'protocols.read') ? (
        <ProtocolsScreen canManage={hasCapability(user, 'protocols.import')} />
      ) : (
        <ProtocolsLocked />
      )}
    </>
  );
}
