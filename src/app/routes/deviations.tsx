import { LinkButton } from '../../components/ui/button';
import { LockIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { DeviationsScreen } from '../../features/deviations/components/deviations-screen';
import { useSignedInUser } from '../layout/signed-in-user';

function AuditLocked({ what }: { what: string }) {
  return (
    <StatusPanel
      headingLevel="h1"
      icon={<LockIcon className="size-6" />}
      title={`${what} are for auditors`}
      actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
    >
      <p>Ask an administrator if your roles need to change.</p>
    </StatusPanel>
  );
}

export function DeviationsRoute() {
  const user = useSignedInUser();
  return (
    <>
      <title>Deviations · Luxtempo</title>
      {hasCapability(user, 'audit.read') ? <DeviationsScreen /> : <AuditLocked what="Deviations" />}
    </>
  );
}
