import { useQuery } from '@tanstack/react-query';
import { Button, LinkButton } from '../../../components/ui/button';
import {
  AlertIcon,
  ArrowLeftIcon,
  ClockIcon,
  HourglassIcon,
  PrinterIcon,
  ReloadIcon,
} from '../../../components/ui/icons';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { paths } from '../../../config/paths';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { dischargeQueries } from '../api/discharge-queries';
import { DischargeSheet } from './discharge-sheet';
import { EmailToPatient } from './email-to-patient';
import { printCss } from '../../../components/ui/print-frame';
import { StaffNotes } from './staff-notes';

type DischargeScreenProps = {
  orderId: number;
  /** Nurses (sessions.run) may e-mail the advice and open the step clock. */
  canRunSessions: boolean;
};

export function DischargeScreen({ orderId, canRunSessions }: DischargeScreenProps) {
  const sheet = useQuery(dischargeQueries.sheet(orderId));
  const title = <title>{`Discharge sheet · order ${orderId} · Luxtempo`}</title>;
  const backToOrder = (
    <LinkButton to={paths.order.getHref(orderId)} icon={<ArrowLeftIcon />}>
      Order {orderId}
    </LinkButton>
  );

  if (sheet.isPending) {
    return (
      <>
        {title}
        <LoadingPanel label="Loading the discharge sheet…" />
      </>
    );
  }

  if (sheet.isError) {
    const error = sheet.error;
    const noSession = isApiRequestError(error) && error.code === 'no_session';
    const missing = isApiRequestError(error) && error.status === 404;
    if (noSession) {
      return (
        <>
          {title}
          <StatusPanel
            headingLevel="h1"
            icon={<HourglassIcon className="size-6" />}
            title="No session yet"
            actions={
              <>
                {backToOrder}
                {canRunSessions && (
                  <LinkButton
                    variant="primary"
                    to={paths.stepClock.getHref(orderId)}
                    icon={<ClockIcon />}
                  >
                    Open step clock
                  </LinkButton>
                )}
              </>
            }
          >
            <p>
              The discharge sheet is made from what the step clock records. Order {orderId} has no
              session yet; the sheet is ready once the session has started.
            </p>
          </StatusPanel>
        </>
      );
    }
    return (
      <>
        {title}
        <StatusPanel
          role="alert"
          headingLevel="h1"
          icon={<AlertIcon className="size-6" />}
          title={missing ? 'There is no such order' : 'The discharge sheet could not be loaded'}
          actions={
            <>
              {missing ? (
                <LinkButton to={paths.orders.getHref()} icon={<ArrowLeftIcon />}>
                  All orders
                </LinkButton>
              ) : (
                backToOrder
              )}
              {!missing && (
                <Button
                  variant="primary"
                  icon={<ReloadIcon />}
                  busy={sheet.isFetching}
                  onClick={() => void sheet.refetch()}
                >
                  Try again
                </Button>
              )}
            </>
          }
        >
          <p>{describeError(error)}</p>
        </StatusPanel>
      </>
    );
  }

  const discharge = sheet.data;
  return (
    <>
      {title}
      <style>{printCss}</style>
      <div className="mb-6 flex flex-wrap items-start justify-between gap-4 print:hidden">
        <div className="flex flex-wrap gap-3">
          {backToOrder}
          <Button variant="primary" icon={<PrinterIcon />} onClick={() => window.print()}>
            Print
          </Button>
        </div>
        {canRunSessions && (
          <div className="max-w-md">
            <EmailToPatient discharge={discharge} />
          </div>
        )}
      </div>
      <div className="grid items-start gap-6 xl:grid-cols-[minmax(0,1fr)_18rem] print:block">
        <div className="mx-auto w-full max-w-4xl print:max-w-none">
          <DischargeSheet discharge={discharge} />
        </div>
        <StaffNotes discharge={discharge} />
      </div>
    </>
  );
}
