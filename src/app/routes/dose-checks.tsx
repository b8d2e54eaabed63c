import { LinkButton } from '../../components/ui/button';
import { LockIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { DoseCheckListScreen } from '../../features/dose-checks/components/dose-check-list-screen';
import { useSignedInUser } from '../layout/signed-in-user';

export function DoseChecksRoute() {
  const user = useSignedInUser();
  return (
    <>
      <title>Dose checks · Luxtempo</title>
      {hasCapability(user, 'dose-checks.perform') ? (
        <DoseCheckListScreen />
      ) : (
        <StatusPanel
          headingLevel="h1"
          icon={<LockIcon className="size-6" />}
          title="Dose checks are done by pharmacists"
          actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
        >
          <p>
            Checking and preparing doses is not part of your roles. Ask an administrator if your
            roles need to change.
          </p>
        </StatusPanel>
      )}
    </>
  );
}
