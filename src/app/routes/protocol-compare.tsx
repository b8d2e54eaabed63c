import { useParams } from 'react-router-dom';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { CompareScreen } from '../../features/protocols/components/compare-screen';
import {
  NoSuchVersion,
  parseVersionNumber,
  ProtocolsLocked,
} from '../../features/protocols/components/protocol-route-states';
import { useSignedInUser } from '../layout/signed-in-user';

export function ProtocolCompareRoute() {
  const user = useSignedInUser();
  const { key = '', from: fromText, to: toText } = useParams();
  const from = parseVersionNumber(fromText);
  const to = parseVersionNumber(toText);
  const title = (
    <title>{`Compare ${key} v${fromText ?? ''} and v${toText ?? ''} · Luxtempo`}</title>
  );
  if (!hasCapability(user, 'protocols.read')) {
    return (
      <>
        {title}
        <ProtocolsLocked />
      </>
    );
  }
  if (from === null || to === null) {
    return (
      <>
        {title}
        <NoSuchVersion text="Both versions in the address must be whole numbers from 1." />
      </>
    );
  }
  return (
    <>
      {title}
      <CompareScreen key={`${key}-${from}-${to}`} protocolKey={key} from={from} to={to} />
    </>
  );
}
