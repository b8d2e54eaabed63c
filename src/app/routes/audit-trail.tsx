import { LinkButton } from '../../components/ui/button';
import { LockIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { AuditTrailScreen } from '../../features/audit-trail/components/audit-trail-screen';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { useSignedInUser } from '../layout/signed-in-user';

export function AuditTrailRoute() {
  const user = useSignedInUser();
  return (
    <>
      <title>Audit trail · Luxtempo</title>
      {hasCapability(user, 'audit.read') ? (
        <AuditTrailScreen mayVerify={hasCapability(user, 'audit.verify')} />
      ) : (
        <StatusPanel
          headingLevel="h1"
          icon={<LockIcon className="size-6" />}
          title="The audit trail is for auditors"
          actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
        >
          <p>Ask an administrator if your roles need to change.</p>
        </StatusPanel>
      )}
    </>
  );
}
