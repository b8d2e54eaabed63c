import { useParams } from 'react-router-dom';
import { LinkButton } from '../../components/ui/button';
import { AlertIcon, LockIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { StepClockScreen } from '../../features/step-clock/components/step-clock-screen';
import { useSignedInUser } from '../layout/signed-in-user';

export function StepClockRoute() {
  const user = useSignedInUser();
  const { orderId: orderIdText = '' } = useParams();
  const orderId = /^[1-9]\d{0,9}$/.test(orderIdText) ? Number(orderIdText) : null;
  const title = <title>{`Step clock, order ${orderIdText} · Luxtempo`}</title>;

  // Anyone who may read orders may watch a session; only 'sessions.run' records taps (the server refuses the rest).
  if (!hasCapability(user, 'orders.read')) {
    return (
      <>
        {title}
        <StatusPanel
          headingLevel="h1"
          icon={<LockIcon className="size-6" />}
          title="Sessions are not open to your roles"
          actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
        >
          <p>Watching or running the step clock needs a role that may read orders.</p>
        </StatusPanel>
      </>
    );
  }
  if (orderId === null) {
    return (
      <>
        {title}
        <StatusPanel
          headingLevel="h1"
          icon={<AlertIcon className="size-6" />}
          title="There is no such order"
          actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
        >
          <p>“{orderIdText}” is not an order number; order numbers are whole numbers from 1.</p>
        </StatusPanel>
      </>
    );
  }
  return (
    <>
      {title}
      {/* A fresh screen per order, so one order's ticks and typed figures never show on another. */}
      <StepClockScreen
        key={orderId}
        orderId={orderId}
        canRecord={hasCapability(user, 'sessions.run')}
      />
    </>
  );
}
