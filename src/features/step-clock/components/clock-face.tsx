import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import type { DosePlan } from '../../../../shared/schemas/calculation';
import type { SessionClock } from '../../../../shared/session/session-clock';
import {
  AlertIcon,
  CheckCircleIcon,
  ClockIcon,
  DropletIcon,
  HourglassIcon,
  LightBeamIcon,
  PauseCircleIcon,
  StatusInSessionIcon,
} from '../../../components/ui/icons';
import type { Flash } from '../hooks/use-cues';
import {
  formatElapsed,
  formatFigure,
  formatRemaining,
  formatWardTime,
  stepNames,
} from './clock-format';
import { dropDueNow, type SessionFacts } from './session-facts';

interface FaceReading {
  /** The timer's accessible name, e.g. "Time left for the laser". */
  timerName: string;
  value: string;
  caption: string;
  /** Share of the step done, 0 to 1; null when it has no length. */
  progress: number | null;
  /** The unrounded time the numeral stands for, in ms (left, or until the light); null when it counts up. */
  exactMs: number | null;
  status: { word: string; Icon: typeof ClockIcon; alarm: boolean };
}

function reading(clock: SessionClock, protocol: ProtocolVersion, plan: DosePlan): FaceReading {
  const current = clock.current;
  const lightDueAfterS =
    plan.lightStartAfterInfusionStartS ??
    (protocol.timing?.lightStartAfterInfusionStartMin ?? 0) * 60;
  const lightCountdown = (): FaceReading => {
    const inS = clock.lightStartInS ?? 0;
    return {
      timerName: 'Time until the light starts',
      value: formatRemaining(Math.max(0, inS)),
      exactMs: inS * 1000,
      caption:
        inS > 0
          ? 'until the light starts, timed from the infusion start'
          : inS > -1
            ? 'the light is due now'
            : `the light is late by ${formatElapsed(-inS)}`,
      progress: lightDueAfterS > 0 ? Math.min(1, Math.max(0, 1 - inS / lightDueAfterS)) : null,
      status:
        inS > 0
          ? { word: 'Waiting for the light', Icon: HourglassIcon, alarm: false }
          : { word: inS > -1 ? 'Light due now' : 'Light late', Icon: AlertIcon, alarm: true },
    };
  };

  if (current) {
    const name = stepNames[current.kind];
    if (current.kind === 'wait' && clock.lightStartInS !== null) return lightCountdown();
    if (current.durationS !== null && current.remainingS !== null) {
      const over = current.overrunS ?? 0;
      return {
        timerName: `Time left for the ${name}`,
        value: formatRemaining(current.remainingS),
        exactMs: current.remainingS * 1000,
        caption:
          current.remainingS > 0
            ? `left of ${formatElapsed(current.durationS)}`
            : `time is up · over by ${formatElapsed(over)}`,
        progress: Math.min(1, current.elapsedS / current.durationS),
        status: current.paused
          ? { word: 'Paused', Icon: PauseCircleIcon, alarm: false }
          : current.remainingS > 0
            ? { word: 'Running', Icon: StatusInSessionIcon, alarm: false }
            : { word: 'Time is up', Icon: AlertIcon, alarm: true },
      };
    }
    return {
      timerName: `Time since the ${name} started`,
      value: formatElapsed(current.elapsedS),
      exactMs: null,
      caption: 'elapsed; this step ends when you say so',
      progress: null,
      status: { word: 'In progress', Icon: StatusInSessionIcon, alarm: false },
    };
  }
  if (clock.lightStartInS !== null) return lightCountdown();
  const next = clock.next;
  return {
    timerName: next ? `Length of the ${stepNames[next.kind]}` : 'Session time',
    value: next?.durationS ? formatElapsed(next.durationS) : '--:--',
    caption: next
      ? next.durationS
        ? `the ${stepNames[next.kind]} lasts this long`
        : `the ${stepNames[next.kind]} has no set length`
      : 'all steps done',
    progress: null,
    exactMs: null,
    status: next
      ? { word: 'Between steps', Icon: ClockIcon, alarm: false }
      : { word: 'All steps done', Icon: CheckCircleIcon, alarm: false },
  };
}

/**
 * The bedside clock: the step, its state in words, and the time as a numeral large enough to
 * read from two metres. What it shows is worked out from the events at this instant.
 */
export function ClockFace({
  clock,
  protocol,
  plan,
  facts,
  serverNowMs,
  deviceNowMs,
  flash,
}: {
  clock: SessionClock;
  protocol: ProtocolVersion;
  plan: DosePlan;
  facts: SessionFacts;
  serverNowMs: number;
  deviceNowMs?: number;
  flash: Flash | null;
}) {
  const face = reading(clock, protocol, plan);
  const current = clock.current;
  const step = current
    ? protocol.steps[current.index]
    : clock.next
      ? protocol.steps[clock.next.index]
      : undefined;
  const cueEveryS = current ? protocol.steps[current.index]?.cueEveryS : undefined;
  const isDropStep =
    current !== null &&
    (current.kind === 'soak' || current.kind === 'uv' || current.kind === 'swelling') &&
    cueEveryS !== undefined;
  const dropDue = dropDueNow(clock, protocol, facts, serverNowMs);
  const infusionStartMs =
    facts.replay.runs.get(protocol.steps.find((s) => s.kind === 'infusion')?.id ?? '')?.[0]
      ?.startMs ?? null;

  const showVolume =
    protocol.kind === 'pdt' &&
    clock.infusedVolumeMl !== null &&
    (current === null || current.kind === 'infusion' || current.kind === 'wait');
  const untimed =
    current !== null &&
    current.durationS === null &&
    !(current.kind === 'wait' && clock.lightStartInS !== null);

  return (
    <div
      className={`flex flex-col gap-1 rounded-2xl border-2 bg-white px-5 py-3 ${
        flash
          ? 'border-iris-700 ring-8 ring-iris-300'
          : face.status.alarm || dropDue
            ? 'border-alarm-700'
            : 'border-paper-300'
      }`}
    >
      {/* The state floats beside the step's number, so a long title takes the whole width below it. */}
      <div className="flow-root">
        <p
          className={`float-right ml-4 flex items-center gap-1.5 text-lg leading-6 font-semibold ${face.status.alarm ? 'text-alarm-700' : 'text-paper-900'}`}
        >
          <face.status.Icon className="size-6" />
          {face.status.word}
        </p>
        <h2 className="min-w-0 text-xl leading-snug font-semibold text-paper-950">
          <span className="block text-sm font-medium text-paper-700">
            {current
              ? `Step ${current.index + 1} of ${protocol.steps.length}`
              : clock.next
                ? `Next: step ${clock.next.index + 1} of ${protocol.steps.length}`
                : 'Steps done'}
          </span>
          {step?.title ?? 'All steps done'}
        </h2>
      </div>

      {/* The data- figures let the benchmark compare what the clock worked out with the true schedule. */}
      <p
        role="timer"
        aria-label={face.timerName}
        data-exact-ms={face.exactMs ?? undefined}
        data-server-now-ms={serverNowMs}
        data-device-now-ms={deviceNowMs}
        className={`numerals-steady font-semibold ${untimed ? 'text-clock-sm [@media(max-height:820px)]:text-6xl' : 'text-clock'} ${face.status.alarm ? 'text-alarm-700' : 'text-paper-950'}`}
      >
        {face.value}
      </p>
      {dropDue ? (
        // Read from across the room: a block of colour, a drop, the words, and the count since.
        <p
          data-drop-due
          className="relative flex h-16 items-center gap-4 rounded-xl bg-alarm-700 px-5 text-white"
        >
          {/* Only the frame around it beats (and not at all with reduced motion): the words keep full contrast. */}
          <span
            aria-hidden="true"
            className="pointer-events-none absolute -inset-1.5 rounded-2xl border-4 border-alarm-700 motion-safe:animate-pulse"
          />
          <DropletIcon className="size-10 shrink-0" />
          <span className="text-4xl leading-none font-bold tracking-wide whitespace-nowrap uppercase">
            Drop due
          </span>
          <span className="text-base leading-snug font-semibold">
            {lastDropText(facts, serverNowMs, cueEveryS ?? 0)} · {facts.dropsInCurrentStep} given in
            this step
          </span>
        </p>
      ) : (
        // In a drop step the row keeps the banner's height, so nothing moves under a finger reaching for Drop given when a drop falls due.
        <div className={`flex items-center gap-4 ${isDropStep ? 'h-16' : 'min-h-9'}`}>
          {flash ? (
            // The cue's words for a moment, where the eye already is; the screen reader hears them from the live region.
            <p
              aria-hidden="true"
              className="flex shrink-0 items-center gap-2 rounded-lg bg-iris-700 px-3 py-1 text-lg font-bold text-white"
            >
              {flash.kind === 'drop' ? (
                <DropletIcon className="size-6 shrink-0" />
              ) : (
                <AlertIcon className="size-6 shrink-0" />
              )}
              {flash.text}
            </p>
          ) : isDropStep && clock.nextCueInS !== null ? (
            <p className="flex shrink-0 items-center gap-2 text-lg text-paper-900">
              <DropletIcon className="size-5" />
              <span>
                Next drop in{' '}
                <strong className="numerals-steady">{formatRemaining(clock.nextCueInS)}</strong>
              </span>
              <span className="text-base text-paper-700">
                · {facts.dropsInCurrentStep} given in this step
              </span>
            </p>
          ) : (
            <p className="shrink-0 text-lg text-paper-800">{face.caption}</p>
          )}
          {face.progress !== null && (
            <div
              aria-hidden="true"
              className="h-3 flex-1 overflow-hidden rounded-full bg-paper-200"
            >
              <div
                className="h-full rounded-full bg-iris-700"
                style={{ width: `${Math.round(face.progress * 1000) / 10}%` }}
              />
            </div>
          )}
        </div>
      )}

      <ul className="flex flex-wrap gap-x-6 gap-y-0.5 text-lg text-paper-900 empty:hidden">
        {showVolume && clock.infusedVolumeMl !== null && (
          <li className="flex items-center gap-2">
            <DropletIcon className="size-5" />
            <span>
              Given so far{' '}
              <strong className="numerals-steady">
                {formatFigure(clock.infusedVolumeMl, 1)} mL
              </strong>
              {protocol.drug && ` of ${formatFigure(protocol.drug.finalVolumeMl)} mL`}
              <span className="text-base text-paper-700"> (planned rate × time)</span>
            </span>
          </li>
        )}
        {clock.lightStartInS !== null && current !== null && current.kind !== 'wait' && (
          <li className="flex items-center gap-2">
            <LightBeamIcon className="size-5" />
            <span>
              Light starts in{' '}
              <strong className="numerals-steady">
                {formatRemaining(Math.max(0, clock.lightStartInS))}
              </strong>
              {infusionStartMs !== null && (
                <span className="text-base text-paper-700">
                  {' '}
                  (from the infusion start, {formatWardTime(infusionStartMs)})
                </span>
              )}
            </span>
          </li>
        )}
        {clock.pulse && (
          <li className="flex items-center gap-2">
            <LightBeamIcon className="size-5" />
            <span>
              Pulsed UV: <strong>{clock.pulse.lightOn ? 'light on' : 'light off'}</strong>
              {clock.pulse.phaseLeftS !== null && (
                <span className="numerals-steady">
                  {' '}
                  for {formatRemaining(clock.pulse.phaseLeftS)}
                </span>
              )}
            </span>
          </li>
        )}
      </ul>
    </div>
  );
}

/** "2 min since the last drop" (or since the step started), to the whole minute past the first. */
function lastDropText(facts: SessionFacts, serverNowMs: number, cueEveryS: number): string {
  const sinceS =
    facts.lastDropOrStartMs === null ? cueEveryS : (serverNowMs - facts.lastDropOrStartMs) / 1000;
  const since = sinceS < 60 ? `${Math.floor(sinceS)} s` : `${Math.floor(sinceS / 60)} min`;
  return `${since} since the ${facts.dropsInCurrentStep > 0 ? 'last drop' : 'step started'}`;
}
