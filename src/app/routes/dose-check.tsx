import { useParams } from 'react-router-dom';
import { LinkButton } from '../../components/ui/button';
import { AlertIcon, LockIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { DoseCheckScreen } from '../../features/dose-checks/components/dose-check-screen';
import { useSignedInUser } from '../layout/signed-in-user';

export function DoseCheckRoute() {
  const user = useSignedInUser();
  const { orderId: orderIdText = '' } = useParams();
  const orderId = /^[1-9]\d{0,9}$/.test(orderIdText) ? Number(orderIdText) : null;
  const title = <title>{`Dose check, order ${orderIdText} · Luxtempo`}</title>;

  if (!hasCapability(user, 'dose-checks.perform')) {
    return (
      <>
        {title}
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
          actions={<LinkButton to={paths.doseChecks.getHref()}>Go to dose checks</LinkButton>}
        >
          <p>“{orderIdText}” is not an order number; order numbers are whole numbers from 1.</p>
        </StatusPanel>
      </>
    );
  }
  return (
    <>
      {title}
      {/* A fresh screen per order, so one order's typed figures never show on another. */}
      <DoseCheckScreen
        key={orderId}
        orderId={orderId}
        userId={user.id}
        canPrepare={hasCapability(user, 'preparations.record')}
      />
    </>
  );
}
