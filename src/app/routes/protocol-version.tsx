import { useParams } from 'react-router-dom';
import { hasCapability } from '../../features/auth/hooks/use-session';
import {
  NoSuchVersion,
  parseVersionNumber,
  ProtocolsLocked,
} from '../../features/protocols/components/protocol-route-states';
import { VersionScreen } from '../../features/protocols/components/version-screen';
import { useSignedInUser } from '../layout/signed-in-user';

export function ProtocolVersionRoute() {
  const user = useSignedInUser();
  const { key = '', version: versionText } = useParams();
  const version = parseVersionNumber(versionText);
  const title = <title>{`${key} v${versionText ?? ''} · Protocols · Luxtempo`}</title>;
  if (!hasCapability(user, 'protocols.read')) {
    return (
      <>
        {title}
        <ProtocolsLocked />
      </>
    );
  }
  if (version === null) {
    return (
      <>
        {title}
        <NoSuchVersion
          text={`“${versionText ?? ''}” is not a version number; versions are whole numbers from 1.`}
        />
      </>
    );
  }
  return (
    <>
      {title}
      <VersionScreen
        // A fresh screen per version, so one version's dialogs and messages never show on another.
        key={`${key}-${version}`}
        protocolKey={key}
        version={version}
        user={user}
        can={{
          approve: hasCapability(user, 'protocols.approve'),
          retire: hasCapability(user, 'protocols.retire'),
          manage: hasCapability(user, 'protocols.import'),
        }}
      />
    </>
  );
}
