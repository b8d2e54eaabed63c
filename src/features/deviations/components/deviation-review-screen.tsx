import { useQuery } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';
import { Link, useLocation } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { Button, LinkButton } from '../../../components/ui/button';
import {
  AlertIcon,
  ArrowLeftIcon,
  LockIcon,
  OrderClipboardIcon,
  ReloadIcon,
} from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { paths } from '../../../config/paths';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import type { DeviationDetail } from '../api/deviation-schemas';
import { deviationQueries } from '../api/deviation-queries';
import { ClassificationLabel, ReviewStatusBadge, SeverityBadge } from './deviation-badges';
import type { QueueState } from './deviations-table';
import { classificationWords, eyeWords, participantPart, typeWords } from './deviation-words';
import { PlanAndGiven, SessionTimes } from '../../../components/plan-and-given';
import { CloseDeviationForm, ReopenDeviationForm } from './review-forms';
import { SessionTimeline } from './session-timeline';
import { formatUnitDateTime } from '../../../lib/unit-times';
import { formatFigureDifference, formatFigurePair } from '../../../../shared/format/precision';

function Section({
  id,
  title,
  children,
  className = '',
}: {
  id: string;
  title: string;
  children: ReactNode;
  className?: string;
}) {
  return (
    <section
      aria-labelledby={id}
      className={`rounded-2xl border border-paper-200 bg-white p-5 ${className}`}
    >
      <h2 id={id} className="mb-3 text-xl font-semibold text-paper-950">
        {title}
      </h2>
      {children}
    </section>
  );
}

type DeviationReviewScreenProps = {
  deviationId: number;
  /** The signed-in person, to say why they may not review a session they took part in. */
  userId: number;
  mayReview: boolean;
};

export function DeviationReviewScreen({
  deviationId,
  userId,
  mayReview,
}: DeviationReviewScreenProps) {
  const location = useLocation();
  const queueSearch = (location.state as QueueState | null)?.queueSearch;
  const detail = useQuery(deviationQueries.detail(deviationId));
  const orderId = detail.data?.deviation.orderId;
  const order = useQuery({
    ...deviationQueries.order(orderId ?? 0),
    enabled: orderId !== undefined,
  });
  const protocol = order.data?.protocol;
  const steps = useQuery({
    ...deviationQueries.protocolSteps(protocol?.key ?? '', protocol?.version ?? 0),
    enabled: protocol !== undefined,
  });
  const [outcome, setOutcome] = useState('');

  const backLink = (
    <LinkButton to={paths.deviations.getHref(queueSearch)} icon={<ArrowLeftIcon />}>
      Back to the queue
    </LinkButton>
  );

  if (detail.isPending) return <LoadingPanel label="Loading the deviation…" />;
  if (detail.isError) {
    const missing = isApiRequestError(detail.error) && detail.error.status === 404;
    return (
      <StatusPanel
        role="alert"
        headingLevel="h1"
        icon={<AlertIcon className="size-6" />}
        title={missing ? 'There is no such deviation' : 'The deviation could not be loaded'}
        actions={
          <>
            {backLink}
            {!missing && (
              <Button
                icon={<ReloadIcon />}
                busy={detail.isFetching}
                onClick={() => void detail.refetch()}
              >
                Try again
              </Button>
            )}
          </>
        }
      >
        <p>{describeError(detail.error)}</p>
      </StatusPanel>
    );
  }

  const { deviation, session, participants, history, canReview } = detail.data;
  const myParts = participants
    .filter((p) => p.userId === userId)
    .map((p) => participantPart(p.part).toLowerCase());
  const figures = formatFigurePair(deviation.expected, deviation.actual, deviation.unit);
  const difference =
    deviation.expected !== null && deviation.actual !== null
      ? formatFigureDifference(deviation.expected, deviation.actual, deviation.unit)
      : null;
  const o = order.data;
  // One line per person, with every part they had (a pharmacist checks and prepares).
  const people = [...new Set(participants.map((p) => p.userId))].map((id) => {
    const parts = participants.filter((p) => p.userId === id);
    return {
      userId: id,
      displayName: parts[0]!.displayName,
      parts: parts.map((p) => participantPart(p.part)),
    };
  });

  return (
    <>
      <PageHeader
        title={`Deviation ${deviation.id}: ${typeWords(deviation.type)}`}
        lead={
          o ? (
            <>
              {o.protocol.title}, version {o.protocol.version} · {o.patient.familyName},{' '}
              {o.patient.givenName} ({o.patient.recordNumber}) · {eyeWords[o.eye]}
            </>
          ) : (
            `Order ${deviation.orderId}`
          )
        }
        actions={
          <>
            {backLink}
            <LinkButton to={paths.order.getHref(deviation.orderId)} icon={<OrderClipboardIcon />}>
              Order {deviation.orderId}
            </LinkButton>
          </>
        }
      />

      {outcome && (
        <Alert tone="info" title={outcome} className="mb-5">
          {deviation.reviewStatus === 'closed'
            ? 'It has left the open queue; reopen it below if the judgement needs another look.'
            : 'It is in the open queue.'}
        </Alert>
      )}

      <div className="grid items-start gap-5 lg:grid-cols-[minmax(0,1fr)_minmax(18rem,24rem)]">
        <div className="flex min-w-0 flex-col gap-5">
          <Section id="what-departed" title="What departed from protocol">
            <div className="mb-3 flex flex-wrap items-center gap-2">
              <SeverityBadge severity={deviation.severity} />
              <ReviewStatusBadge status={deviation.reviewStatus} />
              {deviation.classification && (
                <ClassificationLabel classification={deviation.classification} />
              )}
            </div>
            <p className="mb-4 max-w-prose text-paper-900">{deviation.message}</p>
            <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-1.5">
              <dt className="text-paper-700">Expected</dt>
              <dd className="numerals-steady font-medium">{figures.expected}</dd>
              <dt className="text-paper-700">Actual</dt>
              <dd className="numerals-steady font-semibold">{figures.actual}</dd>
              {difference !== null && (
                <>
                  <dt className="text-paper-700">Difference</dt>
                  <dd className="numerals-steady">{difference}</dd>
                </>
              )}
              <dt className="text-paper-700">When it happened</dt>
              <dd>{formatUnitDateTime(deviation.detectedAt)}</dd>
            </dl>
          </Section>

          <Section id="plan-and-given" title="Plan and what was given">
            {order.isError ? (
              <Alert tone="error" title="The order’s plan could not be loaded">
                {describeError(order.error)}
              </Alert>
            ) : order.isPending ? (
              <LoadingPanel label="Loading the plan…" />
            ) : (
              <PlanAndGiven
                plan={order.data.plan}
                record={session.record}
                steps={steps.data}
                headingId="plan-and-given"
              />
            )}
            <h3 className="mt-5 mb-2 font-semibold text-paper-950">The session</h3>
            <SessionTimes record={session.record} />
          </Section>

          <Section id="timeline" title="Session timeline">
            {steps.isError && (
              <Alert
                tone="error"
                title="The protocol’s step names could not be loaded"
                className="mb-3"
              >
                Steps are shown by their ids. {describeError(steps.error)}
              </Alert>
            )}
            <SessionTimeline
              events={session.events}
              steps={steps.data}
              withdrawnTaps={session.record?.withdrawnTaps ?? []}
            />
          </Section>
        </div>

        <div className="flex min-w-0 flex-col gap-5">
          <Section id="review" title="Your review">
            <ReviewPanel
              detail={detail.data}
              mayReview={mayReview}
              myParts={myParts}
              canReview={canReview}
              onOutcome={setOutcome}
            />
          </Section>

          <Section id="history" title="Review history">
            {history.length === 0 ? (
              <p className="text-paper-700">Not reviewed yet.</p>
            ) : (
              <ol className="flex flex-col gap-3">
                {history.map((h, index) => (
                  <li key={`${h.createdAt}-${index}`} className="border-l-4 border-paper-300 pl-3">
                    <p className="font-medium text-paper-950">
                      {h.action === 'closed' ? 'Closed' : 'Reopened'}
                      {h.classification && (
                        <> as {classificationWords[h.classification].label.toLowerCase()}</>
                      )}
                    </p>
                    <p className="text-sm text-paper-700">
                      {h.reviewer ?? 'Unknown reviewer'} · {formatUnitDateTime(h.createdAt)}
                    </p>
                    <p className="mt-1 whitespace-pre-line text-paper-900">{h.comment}</p>
                  </li>
                ))}
              </ol>
            )}
          </Section>

          <Section id="session-deviations" title="All deviations of this session">
            <ul className="flex flex-col gap-3">
              {session.deviations.map((d) => (
                <li key={d.id} className="flex flex-col gap-1">
                  <span className="flex flex-wrap items-center gap-2">
                    <SeverityBadge severity={d.severity} />
                    {d.id === deviation.id ? (
                      <span className="font-semibold">
                        {typeWords(d.type)}{' '}
                        <span className="font-normal text-paper-700">(this one)</span>
                      </span>
                    ) : (
                      <Link
                        to={paths.deviation.getHref(d.id)}
                        state={location.state}
                        className="font-semibold text-iris-700 underline underline-offset-4 hover:text-iris-900"
                      >
                        {typeWords(d.type)}
                      </Link>
                    )}
                  </span>
                  <span className="numerals-steady text-sm text-paper-700">
                    Expected {formatFigurePair(d.expected, d.actual, d.unit).expected}, actual{' '}
                    {formatFigurePair(d.expected, d.actual, d.unit).actual}
                  </span>
                </li>
              ))}
            </ul>
          </Section>

          <Section id="participants" title="Who took part">
            {participants.length === 0 ? (
              <p className="text-paper-700">No participants were recorded.</p>
            ) : (
              <ul className="flex flex-col gap-1.5">
                {people.map((p) => (
                  <li key={p.userId}>
                    <span className="font-medium text-paper-950">{p.displayName}</span>
                    <span className="block text-sm text-paper-700">
                      {p.parts.join('; ')} · person id {p.userId}
                    </span>
                  </li>
                ))}
              </ul>
            )}
          </Section>
        </div>
      </div>
    </>
  );
}

type ReviewPanelProps = {
  detail: DeviationDetail;
  mayReview: boolean;
  myParts: string[];
  canReview: boolean;
  onOutcome: (text: string) => void;
};

function ReviewPanel({ detail, mayReview, myParts, canReview, onOutcome }: ReviewPanelProps) {
  const { deviation } = detail;
  if (!mayReview) {
    return (
      <p className="flex gap-2 text-paper-800">
        <LockIcon className="mt-0.5 size-5" />
        <span>
          Closing and reopening deviations is not part of your roles; you can read the review here.
        </span>
      </p>
    );
  }
  if (!canReview) {
    return (
      <div className="flex gap-2 text-paper-800">
        <LockIcon className="mt-0.5 size-5" />
        <p>
          You took part in this session{myParts.length > 0 ? ` (${myParts.join('; ')})` : ''}, so
          another auditor must review it. A review is independent or it is not a review.
        </p>
      </div>
    );
  }
  if (deviation.reviewStatus === 'open') {
    return <CloseDeviationForm deviationId={deviation.id} onOutcome={onOutcome} />;
  }
  return (
    <>
      <p className="mb-4 text-paper-800">
        Closed
        {deviation.classification
          ? ` as ${classificationWords[deviation.classification].label.toLowerCase()}`
          : ''}
        {deviation.reviewedAt ? ` on ${formatUnitDateTime(deviation.reviewedAt)}` : ''}. Reopen it
        if the judgement needs another look.
      </p>
      <ReopenDeviationForm deviationId={deviation.id} onOutcome={onOutcome} />
    </>
  );
}
