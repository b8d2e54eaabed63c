import { LinkButton } from '../../components/ui/button';
import { LockIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { OutboxScreen } from '../../features/outbox/components/outbox-screen';
import { useSignedInUser } from '../layout/signed-in-user';

export function OutboxRoute() {
  const user = useSignedInUser();
  return (
    <>
      <title>Outbox · Luxtempo</title>
      {hasCapability(user, 'outbox.read') ? (
        <OutboxScreen />
      ) : (
        <StatusPanel
          headingLevel="h1"
          icon={<LockIcon className="size-6" />}
          title="The outbox is for administrators"
          actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
        >
          <p>Ask an administrator if your roles need to change.</p>
        </StatusPanel>
      )}
    </>
  );
}
