import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { Link, useLocation } from 'react-router-dom';
import type { OrderDetail } from '../../../../shared/schemas/orders';
import { Alert } from '../../../components/ui/alert';
import { Button, LinkButton } from '../../../components/ui/button';
import {
  AlertIcon,
  ArrowLeftIcon,
  CheckCircleIcon,
  ClockIcon,
  CrossCircleIcon,
  DischargeSheetIcon,
  LockIcon,
  PencilIcon,
  ReloadIcon,
  SignatureIcon,
  StatusReturnedIcon,
} from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { paths } from '../../../config/paths';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { orderQueries } from '../api/order-queries';
import { AttachmentsPanel } from './attachments-panel';
import { DoseRecordSection } from './dose-record-section';
import {
  ChecklistAnswers,
  OrderFacts,
  OrderInputs,
  OrderReasons,
  PharmacyRecord,
} from './order-record-sections';
import { OrderStatusBadge } from '../../../components/ui/order-status-badge';
import { orderStatusMeaning } from '../../../components/ui/order-status-words';
import {
  amendableStatuses,
  awaitsDoseCheck,
  cancellableStatuses,
  hasSessionStarted,
  isSessionEnded,
  isSessionRunning,
  stepClockStatuses,
} from '../../../../shared/orders/lifecycle';
import { eyeWords, fieldWords, kindWords } from './order-words';
import { PlanFigures, PlanWarnings, PlanWorking } from './plan-view';
import { printCss, PrintFrame } from '../../../components/ui/print-frame';
import { SessionPanel } from './session-panel';
import { SignOrderDialog } from './sign-order-dialog';
import { CancelOrderDialog } from './cancel-order-dialog';
import { formatUnitTime } from '../../../../shared/format/figures';
import { TreatmentCautions } from './treatment-cautions';
import { AcceptedCautionsBanner } from '../../../components/ui/accepted-cautions-banner';

type OrderDetailScreenProps = {
  orderId: number;
  canWrite: boolean;
  /** Nurses (sessions.run) get the way to the step clock. */
  canRunSessions: boolean;
  /** orders.cancel: the signer of an order (or a draft's author) and administrators. */
  canCancel?: boolean;
  viewer?: { id: number; admin: boolean };
};

export function OrderDetailScreen({
  orderId,
  canWrite,
  canRunSessions,
  canCancel = false,
  viewer,
}: OrderDetailScreenProps) {
  const queryClient = useQueryClient();
  const order = useQuery(orderQueries.detail(orderId));
  const hasSession = order.data !== undefined && hasSessionStarted(order.data.status);
  const session = useQuery({ ...orderQueries.session(orderId), enabled: hasSession });
  // Printing only the dose record hides the rest of the order on paper; a plain print shows it all.
  const [printPart, setPrintPart] = useState<'dose-record' | null>(null);
  useEffect(() => {
    const reset = () => setPrintPart(null);
    window.addEventListener('afterprint', reset);
    return () => window.removeEventListener('afterprint', reset);
  }, []);
  // The session ending (on the tablet) changes the order's status: read the order again.
  const sessionStatus = session.data?.status;
  const orderStatus = order.data?.status;
  useEffect(() => {
    if (sessionStatus && orderStatus && sessionStatus !== orderStatus)
      void queryClient.invalidateQueries({
        queryKey: orderQueries.detail(orderId).queryKey,
        exact: true,
      });
  }, [sessionStatus, orderStatus, orderId, queryClient]);
  const location = useLocation();
  const [outcome, setOutcome] = useState<string>(
    () => (location.state as { outcome?: string } | null)?.outcome ?? '',
  );
  const [signing, setSigning] = useState(false);
  const [cancelling, setCancelling] = useState(false);
  const protocol = order.data?.protocol;
  const definitionQuery = useQuery({
    ...orderQueries.protocolDefinition(protocol?.key ?? '', protocol?.version ?? 0),
    enabled: protocol !== undefined,
  });
  const definition = definitionQuery.data?.definition ?? null;

  if (order.isPending) {
    return (
      <>
        <title>{`Order ${orderId} · Luxtempo`}</title>
        <LoadingPanel label="Loading the order…" />
      </>
    );
  }
  if (order.isError) {
    const missing = isApiRequestError(order.error) && order.error.status === 404;
    return (
      <>
        <title>{`Order ${orderId} · Luxtempo`}</title>
        <StatusPanel
          role="alert"
          headingLevel="h1"
          icon={<AlertIcon className="size-6" />}
          title={missing ? 'There is no such order' : 'The order could not be loaded'}
          actions={
            <>
              <LinkButton to={paths.orders.getHref()} icon={<ArrowLeftIcon />}>
                All orders
              </LinkButton>
              {!missing && (
                <Button
                  variant="primary"
                  icon={<ReloadIcon />}
                  busy={order.isFetching}
                  onClick={() => void order.refetch()}
                >
                  Try again
                </Button>
              )}
            </>
          }
        >
          <p>{describeError(order.error)}</p>
        </StatusPanel>
      </>
    );
  }

  const detail = order.data;
  const isDraft = detail.status === 'draft';
  const canAmend =
    canWrite && amendableStatuses.includes(detail.status) && detail.nextRevisionId === null;

  // The server decides; the button is offered to the signer (or a draft's author) and admins.
  const responsible = detail.signedBy?.id ?? detail.createdBy?.id;
  const mayCancel =
    canCancel &&
    cancellableStatuses.includes(detail.status) &&
    viewer !== undefined &&
    (viewer.admin || responsible === viewer.id);
  // The server works out what the signature would refuse with the same function it signs by.
  const knownProblems = isDraft ? (detail.beforeSigning ?? []).map((p) => p.message) : [];

  /** Parts that stay off paper when only the dose record is printed. */
  const notInDoseRecord = printPart === 'dose-record' ? 'print:hidden' : '';
  const sessionRecord = session.data?.record ?? null;
  // Once the session has ended the patient can be discharged.
  const showsDischarge =
    isSessionEnded(detail.status) &&
    sessionRecord !== null &&
    sessionRecord.outcome !== 'not-started';

  const describePath = (path: string) => {
    const [head, ...rest] = path.split('.');
    if (head === 'checklist') return 'Checklist';
    if (head === 'softLimitReasons')
      return `Reason for the ${fieldWords[rest.join('.')] ?? rest.join('.')}`;
    if (head === 'retreatmentReason') return 'Retreatment reason';
    if (head === 'weightChangeReason') return 'Reason for the change in weight';
    if (head === 'inputs') return 'Measurements';
    if (head === 'swellingAcknowledged') return 'Swelling acknowledgement';
    if (head === 'protocol') return 'Protocol version';
    return head ?? path;
  };

  const runningHead = (
    <p className="flex flex-wrap justify-between gap-x-4 border-b border-paper-950 pb-1 text-[9pt]">
      <span>
        <span className="font-semibold">
          {detail.patient.familyName}, {detail.patient.givenName}
        </span>{' '}
        · record {detail.patient.recordNumber}
      </span>
      <span className="font-bold uppercase">{eyeWords[detail.eye]}</span>
      <span>
        {printPart === 'dose-record' ? 'Dose record' : 'Order'} {detail.id}
        {detail.revision > 1 ? ` (revision ${detail.revision})` : ''} · {detail.protocol.title},
        version {detail.protocol.version}
      </span>
    </p>
  );

  return (
    <div data-print-sheet className="print:text-[10.5pt]">
      <title>{`Order ${detail.id} · Luxtempo`}</title>
      <style>{printCss}</style>
      <PrintFrame runningHead={runningHead}>
        <PageHeader
          title={`Order ${detail.id}${detail.revision > 1 ? ` · revision ${detail.revision}` : ''}`}
          lead={`${kindWords[detail.kind]}. Times are in the unit’s time zone (${unitTimeZone}).`}
          actions={
            <>
              <LinkButton to={paths.orders.getHref()} icon={<ArrowLeftIcon />}>
                All orders
              </LinkButton>
              {canWrite && isDraft && (
                <>
                  <LinkButton to={paths.orderEdit.getHref(detail.id)} icon={<PencilIcon />}>
                    Edit
                  </LinkButton>
                  <Button
                    icon={<SignatureIcon />}
                    onClick={() => {
                      setOutcome('');
                      setSigning(true);
                    }}
                  >
                    Sign
                  </Button>
                </>
              )}
              {canAmend && (
                <LinkButton
                  variant={
                    canRunSessions && stepClockStatuses.includes(detail.status)
                      ? 'secondary'
                      : 'primary'
                  }
                  to={paths.orderAmend.getHref(detail.id)}
                  icon={<PencilIcon />}
                >
                  Amend
                </LinkButton>
              )}
              {canRunSessions && stepClockStatuses.includes(detail.status) && (
                <LinkButton
                  variant="primary"
                  to={paths.stepClock.getHref(detail.id)}
                  icon={<ClockIcon />}
                >
                  Open step clock
                </LinkButton>
              )}
              {!canRunSessions && isSessionRunning(detail.status) && (
                <LinkButton
                  variant="secondary"
                  to={paths.stepClock.getHref(detail.id)}
                  icon={<ClockIcon />}
                >
                  Watch session
                </LinkButton>
              )}
              {mayCancel && (
                <Button
                  variant="secondary"
                  icon={<CrossCircleIcon />}
                  onClick={() => {
                    setOutcome('');
                    setCancelling(true);
                  }}
                >
                  Cancel order
                </Button>
              )}
              {showsDischarge && (
                <LinkButton
                  variant="primary"
                  to={paths.orderDischarge.getHref(detail.id)}
                  icon={<DischargeSheetIcon />}
                >
                  Discharge sheet
                </LinkButton>
              )}
            </>
          }
        />

        {/* Kept in the page at all times so screen readers announce each outcome as it changes. */}
        <div role="status" className={outcome ? `mb-6 ${notInDoseRecord}` : 'sr-only'}>
          {outcome && (
            <p className="flex items-center gap-2 rounded-lg border border-iris-200 bg-iris-50 px-4 py-3 font-medium text-iris-900">
              <CheckCircleIcon className="size-5" />
              {outcome}
            </p>
          )}
        </div>

        {/* Signed orders carry their accepted cautions on every view, the printed dose record included. */}
        {!isDraft && <AcceptedCautionsBanner cautions={detail.answeredCautions} className="mb-6" />}

        {detail.status === 'returned' && (
          <div
            role="alert"
            className={`mb-6 rounded-2xl border-2 border-alarm-700 bg-alarm-50 px-5 py-4 ${notInDoseRecord}`}
          >
            <p className="flex items-center gap-2 text-lg font-semibold text-alarm-800">
              <StatusReturnedIcon className="size-6" />
              Sent back by the pharmacist
            </p>
            <p className="mt-1 text-paper-950">
              <span className="font-medium">Comment: </span>
              {detail.returnComment ?? 'No comment was given.'}
            </p>
            {canAmend && (
              <p className="mt-1 text-sm text-paper-800">
                Amend the order to correct it; the amended revision is checked again from the start.
              </p>
            )}
          </div>
        )}
        {detail.cancellation && (
          <div
            role="note"
            className={`mb-6 rounded-2xl border-2 border-paper-400 bg-paper-100 px-5 py-4 ${notInDoseRecord}`}
          >
            <p className="flex items-center gap-2 text-lg font-semibold text-paper-950">
              <CrossCircleIcon className="size-6" />
              Cancelled{detail.cancellation.by
                ? ` by ${detail.cancellation.by.displayName}`
                : ''}{' '}
              on {formatUnitTime(detail.cancellation.at, unitTimeZone, 'sheet')}
            </p>
            <p className="mt-1 text-paper-950">
              <span className="font-medium">Reason: </span>
              {detail.cancellation.reason}
            </p>
          </div>
        )}
        {detail.nextRevisionId !== null && (
          <Alert
            tone="info"
            title={`Revision ${detail.revision + 1} amends this order`}
            className={`mb-6 ${notInDoseRecord}`}
          >
            <Link
              to={paths.order.getHref(detail.nextRevisionId)}
              className="font-medium text-iris-700 underline underline-offset-4"
            >
              Open order {detail.nextRevisionId}
            </Link>
            {detail.status === 'superseded'
              ? ' — it replaced this revision when it was signed.'
              : ' — it replaces this one once it is signed.'}
          </Alert>
        )}

        <section
          aria-label="Patient and eye"
          className="mb-6 flex flex-wrap items-center justify-between gap-4 rounded-2xl border-2 border-paper-300 bg-white px-5 py-4"
        >
          <div>
            <p className="text-sm text-paper-600">Patient</p>
            <p className="text-xl font-semibold text-paper-950">
              <Link
                to={paths.patient.getHref(detail.patient.id)}
                className="underline-offset-4 hover:underline"
              >
                {detail.patient.familyName}, {detail.patient.givenName}
              </Link>
            </p>
            <p className="text-paper-800">Record number {detail.patient.recordNumber}</p>
          </div>
          <div className="text-right">
            <p className="text-sm text-paper-600">Treatment eye</p>
            <p className="text-3xl font-bold tracking-tight text-paper-950 uppercase">
              {eyeWords[detail.eye]}
            </p>
          </div>
          <div className="w-full border-t border-paper-200 pt-3 sm:w-auto sm:border-0 sm:pt-0">
            <p className="text-sm text-paper-600">Status</p>
            <OrderStatusBadge status={detail.status} size="lg" />
            <p className="mt-1 max-w-xs text-sm text-paper-700">
              {orderStatusMeaning(detail.status)}
            </p>
          </div>
        </section>

        {hasSession && (
          <div className={`mb-6 ${notInDoseRecord}`}>
            <SessionPanel session={session} />
          </div>
        )}

        <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,1fr)_20rem] print:block">
          <div className="min-w-0 space-y-6">
            {session.data && (
              <DoseRecordSection order={detail} definition={definition} session={session.data} />
            )}

            {isDraft && canWrite && (
              <section
                aria-labelledby="readiness-heading"
                className="rounded-2xl border border-iris-200 bg-iris-50 px-5 py-4"
              >
                <h2 id="readiness-heading" className="mb-1 text-lg font-semibold text-paper-950">
                  Before it can be signed
                </h2>
                {knownProblems.length === 0 ? (
                  <p className="flex items-center gap-2 text-paper-900">
                    <CheckCircleIcon className="size-5" /> Nothing missing. Check the plan below,
                    then sign.
                  </p>
                ) : (
                  <ul className="list-disc space-y-1 pl-5 text-paper-900">
                    {knownProblems.map((p) => (
                      <li key={p}>{p.charAt(0).toUpperCase() + p.slice(1)}</li>
                    ))}
                  </ul>
                )}
              </section>
            )}

            <section
              aria-labelledby="plan-heading"
              className={`space-y-4 rounded-2xl border border-paper-200 bg-white p-5 ${notInDoseRecord}`}
            >
              <h2 id="plan-heading" className="text-xl font-semibold text-paper-950">
                {isDraft
                  ? 'Dose plan (recomputed and frozen at signing)'
                  : detail.signedAt === null
                    ? 'Dose plan of the draft (never signed)'
                    : 'Dose plan as frozen at signing'}
              </h2>
              {detail.planWithheld || !detail.plan ? (
                <div className="flex gap-3 rounded-lg border border-paper-300 bg-paper-100 px-4 py-3">
                  <LockIcon className="mt-0.5 size-5 text-paper-700" />
                  <div className="space-y-1">
                    <p className="font-semibold text-paper-950">
                      The computed figures are hidden from you for now.
                    </p>
                    <p className="text-paper-800">
                      This is the blind double check: work out the BSA, dose and drug volume
                      yourself from the measurements below, and enter them on the dose check. The
                      plan appears here once your figures match.
                    </p>
                    <p>
                      <Link
                        to={paths.doseCheck.getHref(detail.id)}
                        className="font-medium text-iris-700 underline underline-offset-4"
                      >
                        Go to the dose check for order {detail.id}
                      </Link>
                    </p>
                  </div>
                </div>
              ) : (
                <>
                  <PlanFigures plan={detail.plan} />
                  <PlanWorking working={detail.plan.working} />
                </>
              )}
            </section>

            <div className={`space-y-6 ${notInDoseRecord}`}>
              {detail.warnings.length > 0 && <PlanWarnings warnings={detail.warnings} />}

              <OrderInputs order={detail} />
              <ChecklistAnswers order={detail} definition={definition} />
              <OrderReasons order={detail} />
              <AttachmentsPanel order={detail} canUpload={canWrite && isDraft} />
            </div>
            <PharmacyRecord order={detail} />
          </div>
          <div className="space-y-6 print:mt-6">
            <OrderFacts order={detail} />
            <TreatmentCautions
              kind={detail.kind}
              protocolCautions={definition?.cautions}
              className={notInDoseRecord}
            />
          </div>
        </div>
      </PrintFrame>

      {mayCancel && cancelling && (
        <CancelOrderDialog
          order={detail}
          treatment={detail.protocol.title}
          open={cancelling}
          onDismiss={() => setCancelling(false)}
          onCancelled={(cancelled) => {
            setCancelling(false);
            setOutcome(`Order ${cancelled.id} is cancelled. It is on no worklist any more.`);
          }}
        />
      )}
      {canWrite && isDraft && (
        <SignOrderDialog
          order={detail}
          open={signing}
          knownProblems={knownProblems}
          describePath={describePath}
          onDismiss={() => setSigning(false)}
          onSigned={(signed: OrderDetail) => {
            setSigning(false);
            setOutcome(
              `Order ${signed.id} is signed. ${awaitsDoseCheck(signed.status) ? 'It now waits for the pharmacist’s dose check.' : 'It is ready for the session.'}`,
            );
          }}
        />
      )}
    </div>
  );
}
