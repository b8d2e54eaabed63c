import { useParams } from 'react-router-dom';
import { LinkButton } from '../../components/ui/button';
import { AlertIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { FollowUpPanel } from '../../features/follow-up/components/follow-up-panel';
import { PatientRecordScreen } from '../../features/patients/components/patient-record-screen';
import { useSignedInUser } from '../layout/signed-in-user';
import { PatientsLocked } from './patients';

export function PatientRecordRoute() {
  const user = useSignedInUser();
  const { id = '' } = useParams();
  const patientId = /^[1-9]\d{0,9}$/.test(id) ? Number(id) : null;
  if (!hasCapability(user, 'patients.read')) {
    return (
      <>
        <title>Patient · Luxtempo</title>
        <PatientsLocked />
      </>
    );
  }
  if (patientId === null) {
    return (
      <>
        <title>Patient · Luxtempo</title>
        <StatusPanel
          headingLevel="h1"
          icon={<AlertIcon className="size-6" />}
          title="There is no such patient"
          actions={<LinkButton to={paths.patients.getHref()}>All patients</LinkButton>}
        >
          <p>“{id}” is not a patient number.</p>
        </StatusPanel>
      </>
    );
  }
  return (
    <>
      <PatientRecordScreen
        key={patientId}
        patientId={patientId}
        canOrder={hasCapability(user, 'orders.write')}
      />
      <FollowUpPanel
        key={`follow-up-${patientId}`}
        patientId={patientId}
        canRecord={hasCapability(user, 'follow-up.record')}
      />
    </>
  );
}
