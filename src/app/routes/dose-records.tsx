import { useParams } from 'react-router-dom';
import { LinkButton } from '../../components/ui/button';
import { AlertIcon, LockIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { DoseRecordPrintScreen } from '../../features/dose-records/components/dose-record-print-screen';
import { DoseRecordsScreen } from '../../features/dose-records/components/dose-records-screen';
import { useSignedInUser } from '../layout/signed-in-user';

function Locked({ what }: { what: 'list' | 'record' }) {
  return (
    <StatusPanel
      headingLevel="h1"
      icon={<LockIcon className="size-6" />}
      title={
        what === 'list'
          ? 'The list of every dose record is not open to your roles'
          : 'Dose records are not open to your roles'
      }
      actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
    >
      <p>
        {what === 'list' ? 'Each order’s page links to its own printable dose record. ' : ''}
        Ask an administrator if your roles need to change.
      </p>
    </StatusPanel>
  );
}

export function DoseRecordsRoute() {
  const user = useSignedInUser();
  return (
    <>
      <title>Dose records · Luxtempo</title>
      {hasCapability(user, 'audit.read') ? <DoseRecordsScreen /> : <Locked what="list" />}
    </>
  );
}

/** One record for the chart; everyone who may read the order and its session may print it. */
export function DoseRecordPrintRoute() {
  const user = useSignedInUser();
  const { orderId } = useParams();
  const id = orderId && /^[1-9]\d{0,9}$/.test(orderId) ? Number(orderId) : null;
  return (
    <>
      <title>{id ? `Dose record, order ${id} · Luxtempo` : 'Dose record · Luxtempo'}</title>
      {!hasCapability(user, 'orders.read') ? (
        <Locked what="record" />
      ) : id === null ? (
        <StatusPanel
          headingLevel="h1"
          icon={<AlertIcon className="size-6" />}
          title="There is no such order"
          actions={<LinkButton to={paths.doseRecords.getHref()}>All dose records</LinkButton>}
        >
          <p>“{orderId ?? ''}” is not an order number; order numbers are whole numbers from 1.</p>
        </StatusPanel>
      ) : (
        <DoseRecordPrintScreen orderId={id} canListRecords={hasCapability(user, 'audit.read')} />
      )}
    </>
  );
}
