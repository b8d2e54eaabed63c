import { useId, useRef, useState } from 'react';
import { belowMinimumThickness } from '../../../../shared/engine/corneal-uv';
import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import { runsRunningMs } from '../../../../shared/session/dose-record';
import type { NextStep, SessionClock } from '../../../../shared/session/session-clock';
import { drugTimeVerdict, shortEndVerdict } from '../../../../shared/session/session-rules';
import type { SessionOrder } from '../api/get-session-order';
import { Button } from '../../../components/ui/button';
import {
  AlertIcon,
  CheckCircleIcon,
  DropletIcon,
  EndStepIcon,
  PauseCircleIcon,
  StartCircleIcon,
  StatusCompletedIcon,
  ThicknessGaugeIcon,
} from '../../../components/ui/icons';
import type { EventBody } from '../hooks/use-session-events';
import { useStoredDraft } from '../hooks/use-stored-draft';
import { AftercareChecklist } from './aftercare-checklist';
import { formatElapsed, formatRemaining, stepNames, stepsEndedByTheirOwnTap } from './clock-format';
import { IdentityConfirmationDialog } from './identity-confirmation-dialog';
import { ReasonDialog } from './reason-dialog';
import type { SessionFacts } from './session-facts';

/** What the big button does now. */
type Primary =
  | { kind: 'end'; stepId: string; label: string }
  | { kind: 'start'; stepId: string; endStepId: string | null; label: string }
  | { kind: 'complete'; endStepId: string | null; label: string }
  | { kind: 'blocked'; why: string };

function primaryAction(
  clock: SessionClock,
  facts: SessionFacts,
  beyondUse: { passed: boolean; why: string },
): Primary {
  const current = clock.current;
  const start = (next: NextStep, endStepId: string | null): Primary => {
    if (next.kind === 'uv' && !facts.uvGate.allowed)
      return { kind: 'blocked', why: facts.uvGate.why ?? 'UV cannot start yet.' };
    // Mirrors the server: no infusion from a drug past its beyond-use time.
    if (next.kind === 'infusion' && beyondUse.passed)
      return { kind: 'blocked', why: beyondUse.why };
    return { kind: 'start', stepId: next.id, endStepId, label: `Start ${stepNames[next.kind]}` };
  };
  if (current) {
    if (stepsEndedByTheirOwnTap.has(current.kind))
      return { kind: 'end', stepId: current.id, label: `End ${stepNames[current.kind]}` };
    if (current.kind !== 'aftercare' && clock.next) return start(clock.next, current.id);
    return complete(current.id);
  }
  if (clock.next) return start(clock.next, null);
  return complete(null);

  function complete(endStepId: string | null): Primary {
    // Mirrors the server: a PDT session with light completes once the laser's exposure is entered.
    if (facts.exposureMissing)
      return {
        kind: 'blocked',
        why: 'Enter the exposure the laser displays before completing the session.',
      };
    return { kind: 'complete', endStepId, label: 'Complete session' };
  }
}

/** A second press of the big button this soon after the first is taken as a double tap and ignored. */
const doubleTapGuardMs = 600;

/**
 * The buttons of the moment: end or start a step, pause, drops, thickness readings, completion.
 * Each press becomes an event at once (queued, then sent); nothing waits for the network.
 */
export function StepActions({
  clock,
  protocol,
  facts,
  serverNowMs,
  onRecord,
  onOverride,
  onEnterExposure,
  beyondUseAtMs,
  order,
}: {
  clock: SessionClock;
  protocol: ProtocolVersion;
  facts: SessionFacts;
  serverNowMs: number;
  /** `atMs`: the moment of the press on the server's clock, when a confirmation came between. */
  onRecord: (bodies: readonly EventBody[], atMs?: number) => void;
  onOverride: () => void;
  /** Opens the dialog for the laser's displayed exposure (after the light step ends). */
  onEnterExposure: () => void;
  beyondUseAtMs: number | null;
  order: SessionOrder;
}) {
  const orderId = order.id;
  const current = clock.current;
  // A light or UV start waits for identity and eye confirmed again; an early end for its reason.
  const [identityFor, setIdentityFor] = useState<{
    stepId: string;
    what: string;
    bodies: readonly EventBody[];
  } | null>(null);
  const [shortEnd, setShortEnd] = useState<{
    stepId: string;
    name: string;
    ranS: number;
    durationS: number;
    atMs: number;
    isLight: boolean;
  } | null>(null);
  const startStep = (stepId: string, bodies: readonly EventBody[]) => {
    const step = protocol.steps.find((s) => s.id === stepId);
    if (step && facts.needsIdentity(step, serverNowMs)) {
      setIdentityFor({ stepId, what: stepNames[step.kind], bodies });
      return;
    }
    onRecord(bodies);
  };
  const beyondUse = {
    passed:
      beyondUseAtMs !== null &&
      !drugTimeVerdict('infusion', serverNowMs, {
        reconstitutedAt: null,
        beyondUseAt: new Date(beyondUseAtMs).toISOString(),
      }).allowed,
    why: 'The drug is past its beyond-use time: discard it. A pharmacist makes it up again (Preparation, on the order); the infusion starts after that.',
  };
  const primary = primaryAction(clock, facts, beyondUse);
  const lastPressMs = useRef(Number.NEGATIVE_INFINITY);

  const pressPrimary = () => {
    // The button now means something else ("End laser" became "Start after-care"): a second
    // press straight after the first is a double tap, not a decision.
    const nowMs = Date.now();
    const doubleTap = nowMs - lastPressMs.current < doubleTapGuardMs;
    lastPressMs.current = nowMs;
    if (doubleTap) return;
    if (primary.kind === 'end') {
      const step = current ? protocol.steps[current.index] : undefined;
      const verdict =
        current && step ? shortEndVerdict(step, protocol.tolerances, current.elapsedS) : null;
      if (current && verdict?.short) {
        setShortEnd({
          stepId: primary.stepId,
          name: stepNames[current.kind],
          ranS: current.elapsedS,
          durationS: verdict.durationS,
          atMs: serverNowMs,
          isLight: current.kind === 'light',
        });
        return;
      }
      onRecord([{ type: 'step-ended', stepId: primary.stepId }]);
      if (current?.kind === 'light') onEnterExposure();
    } else if (primary.kind === 'start')
      startStep(
        primary.stepId,
        primary.endStepId
          ? [
              { type: 'step-ended', stepId: primary.endStepId },
              { type: 'step-started', stepId: primary.stepId },
            ]
          : [{ type: 'step-started', stepId: primary.stepId }],
      );
    else if (primary.kind === 'complete')
      onRecord(
        primary.endStepId
          ? [{ type: 'step-ended', stepId: primary.endStepId }, { type: 'session-completed' }]
          : [{ type: 'session-completed' }],
      );
  };

  const canPause = current !== null && (current.kind === 'light' || current.kind === 'uv');
  const cueEveryS = current ? protocol.steps[current.index]?.cueEveryS : undefined;
  const isDropStep =
    current !== null &&
    (current.kind === 'soak' || current.kind === 'uv' || current.kind === 'swelling') &&
    cueEveryS !== undefined;
  const measures =
    current !== null && (current.kind === 'thickness' || current.kind === 'swelling');
  const minimumUm = protocol.cxl?.minStromalThicknessUm ?? null;
  const thin =
    minimumUm !== null &&
    facts.lastThickness !== null &&
    belowMinimumThickness(facts.lastThickness.thicknessUm, minimumUm);
  const uvInstead =
    clock.next?.kind === 'swelling' &&
    facts.overrideReason !== null &&
    facts.uvStep &&
    facts.uvGate.allowed
      ? facts.uvStep
      : undefined;

  // A timed step ended too early can carry on: its time counts over all of its runs.
  const lastStepId = facts.replay.lastStartedStepId;
  const lastStep = lastStepId ? protocol.steps.find((step) => step.id === lastStepId) : undefined;
  const lastRuns = lastStepId ? facts.replay.runs.get(lastStepId) : undefined;
  const stoppedByExtravasation = lastStep?.kind === 'infusion' && facts.extravasationMs !== null;
  const leftOfLastS =
    !current &&
    !stoppedByExtravasation &&
    lastStep &&
    lastStep.durationS !== null &&
    stepsEndedByTheirOwnTap.has(lastStep.kind) &&
    lastRuns
      ? lastStep.durationS - runsRunningMs(lastRuns, serverNowMs) / 1000
      : 0;

  // The override is offered inside the box that says why UV waits, when that box shows.
  const overrideHere = thin && facts.overrideReason === null && primary.kind === 'blocked';

  const primaryIcon =
    primary.kind === 'end' ? (
      <EndStepIcon className="size-8" />
    ) : primary.kind === 'complete' ? (
      <StatusCompletedIcon className="size-8" />
    ) : (
      <StartCircleIcon className="size-8" />
    );

  return (
    <div className="flex flex-col gap-3">
      {measures && current && minimumUm !== null && (
        <ThicknessEntry
          orderId={orderId}
          stepId={current.id}
          minimumUm={minimumUm}
          facts={facts}
          onRecord={onRecord}
        />
      )}

      {current?.kind === 'aftercare' && (
        <AftercareChecklist
          orderId={orderId}
          stepId={current.id}
          done={facts.aftercareDone}
          onRecord={onRecord}
        />
      )}

      <div className="flex flex-wrap items-stretch gap-3">
        {/* In a drop step the drop is what the nurse taps every few minutes: it is the large
            button, and the step's own end or next start stands beside it, smaller. */}
        {isDropStep && current && (
          <Button
            className="min-h-16 min-w-56 flex-[2] px-5"
            icon={<DropletIcon className="size-10" />}
            onClick={() => onRecord([{ type: 'drop-given', stepId: current.id }])}
          >
            {/* The label carries its own size: the button's base size would win over a class on it. */}
            <span className="text-3xl font-semibold">Drop given</span>
          </Button>
        )}
        {primary.kind === 'blocked' ? (
          // Beside a drop it takes a row of its own, so it reads in one or two lines, with the
          // way past it (a clinician's override) in the same box.
          <div
            className={`flex min-h-16 flex-1 flex-wrap items-center gap-x-3 gap-y-2 rounded-xl border-2 border-alarm-700 bg-alarm-50 px-4 py-2 ${isDropStep ? 'basis-full' : ''}`}
          >
            <p className="flex min-w-48 flex-1 items-center gap-2 font-medium text-paper-950">
              <AlertIcon className="size-6 shrink-0 text-alarm-700" />
              {primary.why}
            </p>
            {overrideHere && (
              <Button variant="secondary" icon={<AlertIcon />} onClick={onOverride}>
                Authorise UV override…
              </Button>
            )}
          </div>
        ) : (
          <Button
            variant={isDropStep ? 'secondary' : 'primary'}
            className={
              isDropStep
                ? 'min-h-16 min-w-36 flex-1 px-4'
                : 'min-h-16 min-w-64 flex-1 px-6 text-2xl'
            }
            icon={primaryIcon}
            onClick={pressPrimary}
          >
            <span className={isDropStep ? 'text-xl' : 'text-2xl'}>{primary.label}</span>
          </Button>
        )}
        {canPause && current && (
          <Button
            variant="secondary"
            className="min-h-16 px-4 text-xl"
            icon={
              current.paused ? (
                <StartCircleIcon className="size-7" />
              ) : (
                <PauseCircleIcon className="size-7" />
              )
            }
            onClick={() =>
              onRecord([{ type: current.paused ? 'resumed' : 'paused', stepId: current.id }])
            }
          >
            {current.paused
              ? `Resume ${stepNames[current.kind]}`
              : `Pause ${stepNames[current.kind]}`}
          </Button>
        )}
      </div>

      {((thin && !overrideHere) || uvInstead || leftOfLastS > 0.5 || facts.exposureMissing) && (
        <div className="flex flex-wrap gap-3">
          {facts.exposureMissing && (
            <Button icon={<AlertIcon />} onClick={onEnterExposure}>
              Enter the laser’s exposure…
            </Button>
          )}
          {thin && facts.overrideReason === null && !overrideHere && (
            <Button variant="secondary" icon={<AlertIcon />} onClick={onOverride}>
              Authorise UV below the minimum…
            </Button>
          )}
          {uvInstead && (
            <Button
              variant="secondary"
              icon={<StartCircleIcon />}
              onClick={() =>
                startStep(uvInstead.id, [
                  ...(current ? [{ type: 'step-ended' as const, stepId: current.id }] : []),
                  { type: 'step-started', stepId: uvInstead.id },
                ])
              }
            >
              Start UV without swelling (override recorded)
            </Button>
          )}
          {leftOfLastS > 0.5 && lastStep && (
            <Button
              variant="secondary"
              icon={<StartCircleIcon />}
              onClick={() => onRecord([{ type: 'step-started', stepId: lastStep.id }])}
            >
              Continue {stepNames[lastStep.kind]} ({formatRemaining(leftOfLastS)} left)
            </Button>
          )}
        </div>
      )}

      {identityFor && (
        <IdentityConfirmationDialog
          open
          order={order}
          what={identityFor.what}
          onDismiss={() => setIdentityFor(null)}
          onConfirm={() => {
            const { stepId, bodies } = identityFor;
            setIdentityFor(null);
            onRecord([
              {
                type: 'identity-confirmed',
                stepId,
                checks: { patientName: true, dateOfBirth: true, treatmentEye: true },
              },
              ...bodies,
            ]);
          }}
        />
      )}
      <ReasonDialog
        open={shortEnd !== null}
        onDismiss={() => setShortEnd(null)}
        title={`End the ${shortEnd?.name ?? 'step'} early?`}
        description={
          shortEnd
            ? `The ${shortEnd.name} has run ${formatElapsed(shortEnd.ranS)} of ${formatElapsed(shortEnd.durationS)}. Ending it now is recorded as short, with your reason, for the auditor. To carry on instead, go back.`
            : ''
        }
        fieldLabel={`Why does the ${shortEnd?.name ?? 'step'} end early?`}
        confirmLabel={`End ${shortEnd?.name ?? 'step'} early`}
        confirmIcon={<EndStepIcon />}
        draftKey={`short-end.${orderId}`}
        danger
        onConfirm={(reason) => {
          if (!shortEnd) return;
          setShortEnd(null);
          onRecord([{ type: 'step-ended', stepId: shortEnd.stepId, reason }], shortEnd.atMs);
          if (shortEnd.isLight) onEnterExposure();
        }}
      />
    </div>
  );
}

function ThicknessEntry({
  orderId,
  stepId,
  minimumUm,
  facts,
  onRecord,
}: {
  orderId: number;
  stepId: string;
  minimumUm: number;
  facts: SessionFacts;
  onRecord: (bodies: readonly EventBody[]) => void;
}) {
  const [text, setText, clearText] = useStoredDraft(`thickness.${orderId}`, '');
  const [error, setError] = useState<string | undefined>();
  const id = useId();
  const last = facts.lastThickness;

  const submit = () => {
    const value = Number(text.trim().replace(',', '.'));
    if (text.trim() === '' || !Number.isFinite(value) || value < 100 || value > 900) {
      setError('Enter the thinnest stromal thickness as a number from 100 to 900 µm.');
      document.getElementById(id)?.focus();
      return;
    }
    setError(undefined);
    clearText();
    onRecord([{ type: 'thickness-measured', stepId, thicknessUm: value }]);
  };

  return (
    <div className="flex flex-col gap-1 rounded-xl border border-paper-300 bg-paper-100 px-4 py-2">
      <form
        className="flex flex-wrap items-center gap-x-3 gap-y-1"
        onSubmit={(event) => {
          event.preventDefault();
          submit();
        }}
      >
        {/* Label beside the field and the last reading on one line below: one short block on a tablet. */}
        <div className="flex items-center gap-2">
          <label htmlFor={id} className="max-w-36 text-sm leading-tight font-medium text-paper-900">
            Thinnest stromal thickness (µm)
          </label>
          <input
            id={id}
            inputMode="decimal"
            autoComplete="off"
            value={text}
            aria-invalid={error ? true : undefined}
            aria-describedby={error ? `${id}-error` : undefined}
            onChange={(event) => setText(event.target.value)}
            className={`numerals-steady min-h-tap w-28 rounded-lg border bg-white px-3 py-1.5 text-2xl text-paper-950 ${error ? 'border-2 border-alarm-700' : 'border-paper-500'}`}
          />
        </div>
        <Button
          type="submit"
          variant="secondary"
          className="min-h-12 text-lg"
          icon={<ThicknessGaugeIcon className="size-6" />}
        >
          Record reading
        </Button>
        <div className="min-w-0 basis-full text-paper-950">
          {last ? (
            <p className="flex items-start gap-1.5 text-base leading-snug">
              {last.thicknessUm >= minimumUm ? (
                <CheckCircleIcon className="mt-0.5 size-6" />
              ) : (
                <AlertIcon className="mt-0.5 size-6 text-alarm-700" />
              )}
              <span>
                Last reading <strong className="numerals-steady">{last.thicknessUm} µm</strong>:{' '}
                {last.thicknessUm >= minimumUm ? (
                  `at or above the ${minimumUm} µm minimum`
                ) : (
                  <strong>below the {minimumUm} µm minimum</strong>
                )}
              </span>
            </p>
          ) : (
            <p className="text-paper-700">No reading yet. Minimum before UV: {minimumUm} µm.</p>
          )}
        </div>
      </form>
      <div className="text-paper-950">
        {error && (
          <p id={`${id}-error`} className="flex items-center gap-1.5 font-medium text-alarm-700">
            <AlertIcon className="size-5" />
            {error}
          </p>
        )}
        {facts.overrideReason !== null && (
          <p className="text-sm text-paper-800">Override recorded: “{facts.overrideReason}”</p>
        )}
      </div>
    </div>
  );
}
