import { useServerNowMs } from '../../../lib/server-now';
import { useQuery } from '@tanstack/react-query';
import { useEffect, useRef, useState, type RefObject } from 'react';
import {
  awaitsDoseCheck,
  awaitsPreparation,
  canReprepare,
} from '../../../../shared/orders/lifecycle';
import type { OrderDetail, OrderStatus } from '../../../../shared/schemas/orders';
import { Button, LinkButton } from '../../../components/ui/button';
import {
  AlertIcon,
  ArrowLeftIcon,
  CheckCircleIcon,
  InfoIcon,
  LockIcon,
  ReloadIcon,
  TurnBackIcon,
} from '../../../components/ui/icons';
import { orderStatusWords } from '../../../components/ui/order-status-words';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { paths } from '../../../config/paths';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { doseCheckQueries } from '../api/dose-check-queries';
import type { ProtocolDrugParameters } from '../api/get-protocol-drug';
import { useClockOffsetMs } from '../hooks/use-server-now';
import { BlindCheckForm } from './blind-check-form';
import { CheckOutcome } from './check-outcome';
import { patientName, quantity, unitDateTime } from './display-format';
import { figureWords, isCheckedFigure } from './dose-figures';
import { DrugParameters } from './drug-parameters';
import { FiguresHiddenNote } from './figures-hidden-note';
import { OrderIdentity } from './order-identity';
import { OrderInputs } from './order-inputs';
import { PreparationForm } from './preparation-form';
import { PreparationRecord } from './preparation-record';
import { TreatmentCautions } from './treatment-cautions';
import { AcceptedCautionsBanner } from '../../../components/ui/accepted-cautions-banner';

type DoseCheckScreenProps = {
  orderId: number;
  userId: number;
  canPrepare: boolean;
};

const announcements: Partial<Record<`${OrderStatus}>${OrderStatus}`, string>> = {
  'signed>checked':
    'Your figures agree with the plan. The plan and its working are now shown beside your figures.',
  'signed>returned':
    'Your figures differed again. The order has gone back to the clinician with your comment.',
  'checked>prepared': 'Preparation recorded. The beyond-use countdown has started.',
};

export function DoseCheckScreen({ orderId, userId, canPrepare }: DoseCheckScreenProps) {
  const orderQuery = useQuery(doseCheckQueries.order(orderId));
  const order = orderQuery.data;
  const protocolQuery = useQuery({
    ...doseCheckQueries.protocolDrug(order?.protocol.key ?? '', order?.protocol.version ?? 0),
    enabled: order !== undefined,
  });
  const clockOffsetMs = useClockOffsetMs();

  // When the order moves on (a match, a return, a preparation), say so and put focus on what changed.
  const [announcement, setAnnouncement] = useState('');
  const movedToRef = useRef<HTMLHeadingElement>(null);
  const previousStatus = useRef<OrderStatus | null>(null);
  const status = order?.status ?? null;
  useEffect(() => {
    const before = previousStatus.current;
    previousStatus.current = status;
    if (!before || !status || before === status) return;
    const words = announcements[`${before}>${status}`];
    if (words) setAnnouncement(words);
    movedToRef.current?.focus();
  }, [status]);

  const header = (
    <PageHeader
      title={order ? `Dose check: ${patientName(order.patient)}` : 'Dose check'}
      lead={
        order
          ? `Order ${order.id}, record ${order.patient.recordNumber}. ${orderStatusWords(order.status, 'long')}.`
          : `Order ${orderId}`
      }
      actions={
        <LinkButton to={paths.doseChecks.getHref()} icon={<ArrowLeftIcon />}>
          All dose checks
        </LinkButton>
      }
    />
  );

  if (orderQuery.isPending) {
    return (
      <>
        {header}
        <LoadingPanel label="Loading the order…" />
      </>
    );
  }
  if (orderQuery.isError && !order) {
    const missing = isApiRequestError(orderQuery.error) && orderQuery.error.status === 404;
    return (
      <>
        {header}
        <StatusPanel
          role="alert"
          icon={<AlertIcon className="size-6" />}
          title={missing ? `There is no order ${orderId}` : 'The order could not be loaded'}
          actions={
            missing ? (
              <LinkButton to={paths.doseChecks.getHref()}>Back to dose checks</LinkButton>
            ) : (
              <Button
                variant="secondary"
                icon={<ReloadIcon />}
                busy={orderQuery.isFetching}
                onClick={() => void orderQuery.refetch()}
              >
                Try again
              </Button>
            )
          }
        >
          <p>{describeError(orderQuery.error)}</p>
        </StatusPanel>
      </>
    );
  }
  if (!order) return header;

  const protocol = protocolQuery.data;
  const cautions = <TreatmentCautions protocolCautions={protocol?.definition.cautions} />;

  return (
    <>
      {header}
      {/* Kept in the page at all times so a screen reader hears each change of the order. */}
      <p role="status" className="sr-only">
        {announcement}
      </p>
      <div className="space-y-6">
        <OrderIdentity order={order} />
        <AcceptedCautionsBanner cautions={order.answeredCautions} />
        <ScreenBody
          order={order}
          protocol={protocol}
          protocolProblem={protocolQuery.isError ? describeError(protocolQuery.error) : null}
          onRetryProtocol={() => void protocolQuery.refetch()}
          userId={userId}
          canPrepare={canPrepare}
          clockOffsetMs={clockOffsetMs}
          movedToRef={movedToRef}
        />
        {order.kind === 'pdt' && cautions}
      </div>
    </>
  );
}

type ScreenBodyProps = {
  order: OrderDetail;
  protocol: ProtocolDrugParameters | undefined;
  protocolProblem: string | null;
  onRetryProtocol: () => void;
  userId: number;
  canPrepare: boolean;
  clockOffsetMs: number;
  movedToRef: RefObject<HTMLHeadingElement | null>;
};

function ScreenBody({
  order,
  protocol,
  protocolProblem,
  onRetryProtocol,
  userId,
  canPrepare,
  clockOffsetMs,
  movedToRef,
}: ScreenBodyProps) {
  const serverNowMs = useServerNowMs(clockOffsetMs);
  if (order.kind !== 'pdt') {
    return (
      <StatusPanel icon={<InfoIcon className="size-6" />} title="No drug to check">
        <p>
          {order.protocol.title} gives no drug, so this order needs neither a dose check nor a
          preparation.
        </p>
      </StatusPanel>
    );
  }

  if (awaitsDoseCheck(order.status) && order.signedBy?.id === userId) {
    return (
      <StatusPanel
        icon={<LockIcon className="size-6" />}
        title="You signed this order, so someone else must check it"
      >
        <p>
          The dose check is independent only when it is done by a pharmacist who did not sign the
          order.
        </p>
      </StatusPanel>
    );
  }

  if (awaitsDoseCheck(order.status) && order.planWithheld) {
    return (
      <>
        <FiguresHiddenNote />
        <div className="grid items-start gap-6 lg:grid-cols-2">
          <div className="space-y-6">
            <OrderInputs
              inputs={order.inputs}
              defaultFormula={protocol?.definition.bsaFormulaDefault ?? null}
            />
            <ProtocolPanel
              protocol={protocol}
              problem={protocolProblem}
              onRetry={onRetryProtocol}
            />
          </div>
          {/* Stays in view while the person reads down the measurements and the protocol. */}
          <div className="lg:sticky lg:top-4">
            <BlindCheckForm order={order} protocol={protocol} />
          </div>
        </div>
      </>
    );
  }

  if (order.status === 'returned') {
    const refusals = order.doseChecks.filter((check) => check.outcome === 'mismatch');
    return (
      <section
        aria-labelledby="returned-heading"
        className="rounded-2xl border-2 border-paper-400 bg-white p-6"
      >
        <h2
          ref={movedToRef}
          tabIndex={-1}
          id="returned-heading"
          className="flex items-center gap-2 text-xl font-semibold text-paper-950"
        >
          <TurnBackIcon className="size-6" />
          Sent back to the clinician
        </h2>
        <p className="mt-2 text-paper-800">
          The figures differed from the plan {refusals.length}{' '}
          {refusals.length === 1 ? 'time' : 'times'}, so the order went back to the clinician who
          signed it. It returns to the dose-check list once they amend and sign it again.
        </p>
        {order.returnComment && (
          <p className="mt-3 rounded-lg bg-paper-100 px-4 py-3 text-paper-900">
            <span className="font-semibold">Comment sent: </span>
            {order.returnComment}
          </p>
        )}
        <ul className="numerals-steady mt-3 space-y-1 text-sm text-paper-800">
          {refusals.map((check) => (
            <li key={check.id}>
              {unitDateTime(check.createdAt)}: {quantity(check.entered.bsaM2, 'm²')},{' '}
              {quantity(check.entered.doseMg, 'mg')}, {quantity(check.entered.drugVolumeMl, 'mL')} —
              differed in{' '}
              {check.differing
                .map((path) => (isCheckedFigure(path) ? figureWords[path] : path))
                .join(', ')}
            </li>
          ))}
        </ul>
      </section>
    );
  }

  const plan = order.plan;
  if (!plan) {
    return (
      <StatusPanel
        icon={<InfoIcon className="size-6" />}
        title={`This order is ${orderStatusWords(order.status, 'long').toLowerCase()}`}
      >
        <p>It is not waiting for a dose check, and its plan is not shown to you here.</p>
      </StatusPanel>
    );
  }

  if (awaitsPreparation(order.status)) {
    return (
      <>
        <CheckOutcome order={order} plan={plan} protocol={protocol} headingRef={movedToRef} />
        {canPrepare ? (
          <PreparationForm
            order={order}
            plan={plan}
            protocol={protocol}
            clockOffsetMs={clockOffsetMs}
          />
        ) : (
          <StatusPanel
            icon={<LockIcon className="size-6" />}
            title="Recording the preparation is not part of your roles"
          >
            <p>A pharmacist records the vial, its expiry and the reconstitution time.</p>
          </StatusPanel>
        )}
      </>
    );
  }

  if (order.preparation) {
    // A drug past its beyond-use time is discarded and made up again (shared/orders/lifecycle.ts);
    // the server also refuses once the infusion has started.
    const remake =
      canPrepare &&
      canReprepare(order.status, {
        beyondUsePassed: Date.parse(order.preparation.beyondUseAt) <= serverNowMs,
        infusionStarted: false,
      }).allowed;
    return (
      <>
        <PreparationRecord order={order} preparation={order.preparation} headingRef={movedToRef} />
        {remake && (
          <>
            <StatusPanel
              role="alert"
              icon={<AlertIcon className="size-6" />}
              title="Past its beyond-use time: discard the drug and make it up again"
            >
              <p>
                The session cannot start, and the infusion cannot start, with this preparation.
                Record the fresh one below; the old one stays on record.
              </p>
            </StatusPanel>
            <PreparationForm
              order={order}
              plan={plan}
              protocol={protocol}
              clockOffsetMs={clockOffsetMs}
            />
          </>
        )}
        <CheckOutcome order={order} plan={plan} protocol={protocol} />
      </>
    );
  }

  if (order.doseChecks.some((check) => check.outcome === 'match')) {
    return <CheckOutcome order={order} plan={plan} protocol={protocol} headingRef={movedToRef} />;
  }

  return (
    <StatusPanel
      icon={<CheckCircleIcon className="size-6" />}
      title={`This order is ${orderStatusWords(order.status, 'long').toLowerCase()}`}
    >
      <p>It is not waiting for a dose check.</p>
    </StatusPanel>
  );
}

function ProtocolPanel({
  protocol,
  problem,
  onRetry,
}: {
  protocol: ProtocolDrugParameters | undefined;
  problem: string | null;
  onRetry: () => void;
}) {
  if (protocol) return <DrugParameters protocol={protocol} />;
  if (problem) {
    return (
      <StatusPanel
        role="alert"
        icon={<AlertIcon className="size-6" />}
        title="The protocol’s figures could not be loaded"
        actions={
          <Button variant="secondary" icon={<ReloadIcon />} onClick={onRetry}>
            Try again
          </Button>
        }
      >
        <p>{problem}</p>
      </StatusPanel>
    );
  }
  return <LoadingPanel label="Loading the protocol’s figures…" />;
}
