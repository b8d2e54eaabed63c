import { LinkButton } from '../../components/ui/button';
import { LockIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { PatientsScreen } from '../../features/patients/components/patients-screen';
import { useSignedInUser } from '../layout/signed-in-user';

export function PatientsLocked() {
  return (
    <StatusPanel
      headingLevel="h1"
      icon={<LockIcon className="size-6" />}
      title="Patient records are not part of your roles"
      actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
    >
      <p>
        Patients are seen by clinical staff and auditors. Ask an administrator if your roles need to
        change.
      </p>
    </StatusPanel>
  );
}

export function PatientsRoute() {
  const user = useSignedInUser();
  return (
    <>
      <title>Patients · Luxtempo</title>
      {hasCapability(user, 'patients.read') ? (
        <PatientsScreen canAdd={hasCapability(user, 'patients.manage')} />
      ) : (
        <PatientsLocked />
      )}
    </>
  );
}
