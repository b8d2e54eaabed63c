import { LinkButton } from '../../components/ui/button';
import { LockIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { PeopleScreen } from '../../features/people/components/people-screen';
import { useSignedInUser } from '../layout/signed-in-user';

export function PeopleRoute() {
  const user = useSignedInUser();
  if (!hasCapability(user, 'people.manage')) {
    // Someone can reach this address by a saved link; the server refuses them too.
    return (
      <>
        <title>People · Luxtempo</title>
        <StatusPanel
          headingLevel="h1"
          icon={<LockIcon className="size-6" />}
          title="Managing staff accounts is not part of your roles"
          actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
        >
          <p>
            The People page is for those who look after accounts and roles. Ask an administrator if
            your roles need to change.
          </p>
        </StatusPanel>
      </>
    );
  }
  return (
    <>
      <title>People · Luxtempo</title>
      <PeopleScreen currentUserId={user.id} />
    </>
  );
}
