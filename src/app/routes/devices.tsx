import { useParams } from 'react-router-dom';
import { LinkButton } from '../../components/ui/button';
import { LockIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { DeviceDetailScreen } from '../../features/devices/components/device-detail-screen';
import { DevicesScreen } from '../../features/devices/components/devices-screen';
import { useSignedInUser } from '../layout/signed-in-user';

function NotOpen() {
  return (
    <StatusPanel
      headingLevel="h1"
      icon={<LockIcon className="size-6" />}
      title="The device register is not open to your roles"
      actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
    >
      <p>Ask an administrator if your roles need to change.</p>
    </StatusPanel>
  );
}

export function DevicesRoute() {
  const user = useSignedInUser();
  return (
    <>
      <title>Devices · Luxtempo</title>
      {hasCapability(user, 'devices.read') ? <DevicesScreen /> : <NotOpen />}
    </>
  );
}

export function DeviceRoute() {
  const user = useSignedInUser();
  const { deviceId = '' } = useParams();
  const id = /^[1-9]\d{0,9}$/.test(deviceId) ? Number(deviceId) : null;
  return (
    <>
      <title>{`Device ${deviceId} · Luxtempo`}</title>
      {!hasCapability(user, 'devices.read') ? (
        <NotOpen />
      ) : id === null ? (
        <StatusPanel
          headingLevel="h1"
          icon={<LockIcon className="size-6" />}
          title="No such device"
        >
          <p>The address does not name a device.</p>
        </StatusPanel>
      ) : (
        <DeviceDetailScreen deviceId={id} />
      )}
    </>
  );
}
