import { LinkButton } from '../../components/ui/button';
import { LockIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { OutcomesScreen } from '../../features/follow-up/components/outcomes-screen';
import { useSignedInUser } from '../layout/signed-in-user';

export function OutcomesRoute() {
  const user = useSignedInUser();
  return (
    <>
      <title>Outcomes · Luxtempo</title>
      {hasCapability(user, 'outcomes.read') ? (
        <OutcomesScreen />
      ) : (
        <StatusPanel
          headingLevel="h1"
          icon={<LockIcon className="size-6" />}
          title="Outcomes are for auditors and clinicians"
          actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
        >
          <p>Ask an administrator if your roles need to change.</p>
        </StatusPanel>
      )}
    </>
  );
}
