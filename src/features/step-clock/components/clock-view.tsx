import { useEffect, useId, useMemo, useRef, useState } from 'react';
import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import type { DosePlan } from '../../../../shared/schemas/calculation';
import type { SessionEventLike } from '../../../../shared/session/dose-record';
import type { SessionClock } from '../../../../shared/session/session-clock';
import { volumeInfusedRequired } from '../../../../shared/session/session-rules';
import { Button } from '../../../components/ui/button';
import { LeakIcon, ScreenAwakeIcon, StatusStoppedIcon } from '../../../components/ui/icons';
import type { SessionOrder } from '../api/get-session-order';
import type { SessionDeviation } from '../api/session-state-schema';
import type { Urgency } from '../hooks/use-announcer';
import { useCues } from '../hooks/use-cues';
import { useDropReminder } from '../hooks/use-drop-reminder';
import type { EventBody } from '../hooks/use-session-events';
import { useMutedPreference } from '../hooks/use-stored-draft';
import { useWakeLock, type WakeLockStatus } from '../hooks/use-wake-lock';
import { capitalised, stepNames } from './clock-format';
import { ClockFace } from './clock-face';
import { DeviationList } from './deviation-list';
import { ExposureDialog } from './exposure-dialog';
import {
  ExtravasationDialog,
  ExtravasationNotice,
  readVolumeInfused,
  VolumeInfusedField,
} from './extravasation';
import { eyeWords } from './eye-badge';
import { LateEntryDialog } from './late-entry-dialog';
import { LateEntryIcon } from './late-entry-icon';
import { OverrideAuthorisationDialog } from './override-authorisation-dialog';
import { ReasonDialog } from './reason-dialog';
import { RecentTaps } from './recent-taps';
import { SessionCautions } from './session-cautions';
import { SoundControl } from './sound-control';
import { dropDueNow, type SessionFacts } from './session-facts';
import { StepActions } from './step-actions';
import { StepList } from './step-list';

const wakeLockWords: Record<Exclude<WakeLockStatus, 'off'>, string> = {
  on: 'Screen kept on during the session',
  unsupported: 'This browser cannot keep the screen on: set the tablet not to sleep',
  refused: 'The screen may dim: the browser declined to keep it on',
};

/**
 * The running session: clock, the buttons of the moment, steps, deviations and cautions. Someone
 * `watching` gets the same clock and lists from the stored events, without anything that records
 * a tap or calls for action at the bedside (buttons, sound, screen lock, the list of taps to withdraw).
 */
export function ClockView({
  order,
  protocol,
  plan,
  clock,
  facts,
  serverNowMs,
  deviceNowMs,
  deviations,
  events,
  onRecord,
  announce,
  watching,
}: {
  order: SessionOrder;
  protocol: ProtocolVersion;
  plan: DosePlan;
  clock: SessionClock;
  facts: SessionFacts;
  serverNowMs: number;
  /** This device's own clock at the same instant (serverNowMs less the measured offset). */
  deviceNowMs?: number;
  deviations: readonly SessionDeviation[];
  /** Stored and queued, for the list of recent taps that can be withdrawn. */
  events: readonly SessionEventLike[];
  onRecord: (bodies: readonly EventBody[], atMs?: number) => void;
  announce: (text: string, urgency?: Urgency) => void;
  watching: boolean;
}) {
  const [muted, setMuted] = useMutedPreference();
  const [dialog, setDialog] = useState<
    null | 'stop' | 'override' | 'extravasation' | 'exposure' | 'late'
  >(null);
  const [stopVolumeText, setStopVolumeText] = useState('');
  const [stopVolumeError, setStopVolumeError] = useState<string | undefined>();
  const finalVolumeMl = protocol.drug?.finalVolumeMl ?? null;
  const infusionStepId = protocol.steps.find((step) => step.kind === 'infusion')?.id;
  // Mirrors the server: a PDT stop after the infusion started records the volume the pump shows
  // (unless an extravasation recorded it already).
  const stopNeedsVolume =
    finalVolumeMl !== null &&
    infusionStepId !== undefined &&
    volumeInfusedRequired('session-stopped', {
      infusionStarted: facts.replay.runs.has(infusionStepId),
      volumeKnown: facts.replay.volumeInfusedMl !== null,
    });
  const lightStep = protocol.steps.find((step) => step.kind === 'light');
  // Stop and extravasation are timed at the press that opened the dialog, not at the confirmation.
  const pressedAtMs = useRef(0);
  const wakeLock = useWakeLock(!watching);
  const stepsHeading = useId();
  const deviationsHeading = useId();
  const cautionsHeading = useId();
  const recentHeading = useId();

  const current = clock.current;
  const cueEveryS = current ? (protocol.steps[current.index]?.cueEveryS ?? null) : null;
  const isDropStep =
    current !== null &&
    (current.kind === 'soak' || current.kind === 'uv' || current.kind === 'swelling') &&
    cueEveryS !== null;
  const currentKind = current?.kind ?? null;
  const cueWords = useMemo(
    () => ({ stepName: currentKind ? stepNames[currentKind] : 'step' }),
    [currentKind],
  );
  const flash = useCues({
    clock,
    cueEveryS,
    dropCount: facts.dropsInCurrentStep,
    isDropStep,
    muted,
    enabled: !watching,
    words: cueWords,
    announce,
  });

  useDropReminder({
    due: dropDueNow(clock, protocol, facts, serverNowMs),
    sound: !watching && !muted,
  });

  // Step changes are said once, politely; the clock itself is never read out on its own.
  const currentId = current?.id ?? null;
  const announced = useRef<string | null | undefined>(undefined);
  useEffect(() => {
    if (announced.current === undefined) {
      announced.current = currentId;
      return;
    }
    if (announced.current === currentId) return;
    const endedId = announced.current;
    announced.current = currentId;
    if (current) announce(`${capitalised(stepNames[current.kind])} started: ${current.title}.`);
    else if (endedId) {
      const ended = protocol.steps.find((step) => step.id === endedId);
      announce(
        `${capitalised(ended ? stepNames[ended.kind] : 'step')} ended.${clock.next ? ` Next: ${clock.next.title}.` : ''}`,
      );
    }
  }, [announce, clock.next, current, currentId, protocol.steps]);

  const seenDeviations = useRef<Set<number> | null>(null);
  useEffect(() => {
    const ids = new Set(deviations.map((deviation) => deviation.id));
    if (seenDeviations.current === null) {
      seenDeviations.current = ids;
      return;
    }
    for (const deviation of deviations) {
      if (seenDeviations.current.has(deviation.id)) continue;
      announce(
        `New deviation, ${deviation.severity}: ${deviation.message}`,
        deviation.severity === 'minor' ? 'polite' : 'assertive',
      );
    }
    seenDeviations.current = ids;
  }, [announce, deviations]);

  const openTimed = (which: 'stop' | 'extravasation') => {
    pressedAtMs.current = serverNowMs;
    setDialog(which);
  };

  return (
    <div className="grid gap-4 lg:grid-cols-[minmax(0,1.75fr)_minmax(0,1fr)]">
      <div className="flex min-w-0 flex-col gap-3">
        {facts.extravasationMs !== null && <ExtravasationNotice atMs={facts.extravasationMs} />}
        <ClockFace
          clock={clock}
          protocol={protocol}
          plan={plan}
          facts={facts}
          serverNowMs={serverNowMs}
          deviceNowMs={deviceNowMs}
          flash={flash}
        />
        {!watching && (
          <StepActions
            clock={clock}
            protocol={protocol}
            facts={facts}
            serverNowMs={serverNowMs}
            order={order}
            onRecord={onRecord}
            onOverride={() => setDialog('override')}
            onEnterExposure={() => setDialog('exposure')}
            beyondUseAtMs={order.beyondUseAt ? Date.parse(order.beyondUseAt) : null}
          />
        )}
      </div>

      {/* Sized to the screen so the page itself never scrolls on a landscape tablet; the lists scroll inside. */}
      <div className="flex min-w-0 flex-col gap-3 lg:max-h-[calc(100dvh-16.5rem)]">
        {!watching && (
          <>
            <div className="flex flex-wrap gap-2">
              <Button
                variant="secondary"
                icon={<StatusStoppedIcon />}
                onClick={() => openTimed('stop')}
              >
                Stop session…
              </Button>
              {protocol.kind === 'pdt' && (
                <Button
                  variant="secondary"
                  icon={<LeakIcon />}
                  onClick={() => openTimed('extravasation')}
                >
                  Extravasation…
                </Button>
              )}
              <Button
                variant="secondary"
                icon={<LateEntryIcon />}
                onClick={() => setDialog('late')}
              >
                Missed tap…
              </Button>
            </div>
            <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
              <SoundControl muted={muted} setMuted={setMuted} />
              {wakeLock !== 'off' && (
                <p className="flex items-center gap-1.5 text-sm text-paper-700">
                  <ScreenAwakeIcon className="size-4 shrink-0" />
                  {wakeLockWords[wakeLock]}
                </p>
              )}
            </div>
          </>
        )}
        <div className="flex min-h-0 flex-1 flex-col gap-4 border-t border-paper-200 pt-2 lg:overflow-y-auto lg:pr-1">
          {!watching && (
            <RecentTaps
              orderId={order.id}
              protocol={protocol}
              events={events}
              headingId={recentHeading}
              onRecord={onRecord}
              announce={announce}
            />
          )}
          <StepList protocol={protocol} clock={clock} facts={facts} headingId={stepsHeading} />
          <DeviationList deviations={deviations} headingId={deviationsHeading} />
          <SessionCautions
            protocol={protocol}
            eyeWord={eyeWords[order.eye]}
            compact
            headingId={cautionsHeading}
          />
        </div>
      </div>

      <ReasonDialog
        open={dialog === 'stop'}
        onDismiss={() => setDialog(null)}
        title="Stop the session"
        description="The session ends here and the order is marked stopped. The dose record keeps what was given up to the moment you pressed Stop."
        fieldLabel="Why is the session stopped?"
        confirmLabel="Stop session"
        confirmIcon={<StatusStoppedIcon />}
        draftKey={`stop.${order.id}`}
        danger
        checkOthers={() => {
          if (!stopNeedsVolume || finalVolumeMl === null) return true;
          const volume = readVolumeInfused(stopVolumeText, finalVolumeMl);
          setStopVolumeError('error' in volume ? volume.error : undefined);
          return !('error' in volume);
        }}
        onConfirm={(reason) => {
          setDialog(null);
          const volume =
            stopNeedsVolume && finalVolumeMl !== null
              ? readVolumeInfused(stopVolumeText, finalVolumeMl)
              : null;
          setStopVolumeText('');
          onRecord(
            [
              {
                type: 'session-stopped',
                reason,
                ...(volume && 'value' in volume ? { volumeInfusedMl: volume.value } : {}),
              },
            ],
            pressedAtMs.current,
          );
        }}
      >
        {stopNeedsVolume && finalVolumeMl !== null && (
          <VolumeInfusedField
            text={stopVolumeText}
            onChange={setStopVolumeText}
            error={stopVolumeError}
            finalVolumeMl={finalVolumeMl}
          />
        )}
      </ReasonDialog>
      {!watching && (
        <LateEntryDialog
          open={dialog === 'late'}
          orderId={order.id}
          protocol={protocol}
          clock={clock}
          facts={facts}
          serverNowMs={serverNowMs}
          onDismiss={() => setDialog(null)}
          onRecorded={(text) => {
            setDialog(null);
            announce(text);
          }}
        />
      )}
      <OverrideAuthorisationDialog
        open={dialog === 'override'}
        orderId={order.id}
        minimumUm={protocol.cxl?.minStromalThicknessUm ?? null}
        onDismiss={() => setDialog(null)}
        onRecorded={() => {
          setDialog(null);
          announce('Override authorised and recorded.');
        }}
      />
      {lightStep && (
        <ExposureDialog
          open={dialog === 'exposure'}
          plannedS={plan.exposureS ?? protocol.light.exposureS}
          onDismiss={() => setDialog(null)}
          onRecord={(figures) => {
            setDialog(null);
            onRecord([{ type: 'exposure-recorded', stepId: lightStep.id, ...figures }]);
          }}
        />
      )}
      {protocol.kind === 'pdt' && finalVolumeMl !== null && (
        <ExtravasationDialog
          open={dialog === 'extravasation'}
          draftKey={`extravasation.${order.id}`}
          finalVolumeMl={finalVolumeMl}
          onDismiss={() => setDialog(null)}
          onRecord={(note, volumeInfusedMl) => {
            setDialog(null);
            onRecord(
              [{ type: 'extravasation', volumeInfusedMl, ...(note ? { note } : {}) }],
              pressedAtMs.current,
            );
          }}
        />
      )}
    </div>
  );
}
