import { LinkButton } from '../../components/ui/button';
import { LockIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { TrendsScreen } from '../../features/trends/components/trends-screen';
import { useSignedInUser } from '../layout/signed-in-user';

export function TrendsRoute() {
  const user = useSignedInUser();
  return (
    <>
      <title>Trends · Luxtempo</title>
      {hasCapability(user, 'audit.read') ? (
        <TrendsScreen />
      ) : (
        <StatusPanel
          headingLevel="h1"
          icon={<LockIcon className="size-6" />}
          title="Trends are for auditors"
          actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
        >
          <p>Ask an administrator if your roles need to change.</p>
        </StatusPanel>
      )}
    </>
  );
}
