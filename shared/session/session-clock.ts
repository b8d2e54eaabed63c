import { belowMinimumThickness } from '../engine/corneal-uv';
import type { ProtocolStep, ProtocolVersion, StepKind } from '../protocol/protocol-schema';
import type { DosePlan } from '../schemas/calculation';
import {
  firstStepOfKind,
  infusedVolumeMl,
  replaySession,
  runsRunningMs,
  spanOf,
  type SessionEventLike,
  type SessionReplay,
} from './dose-record';

export type ClockPhase = 'not-started' | 'running' | 'finished' | 'stopped';

export interface ClockStep {
  index: number;
  id: string;
  kind: StepKind;
  title: string;
  startedAt: string;
  /** Null for a step that ends when the nurse says so. */
  durationS: number | null;
  /** Running time less pauses, over every run of the step. */
  elapsedS: number;
  /** Null for an untimed step; 0 once the time is up. */
  remainingS: number | null;
  /** Time past the step's duration; null for an untimed step. */
  overrunS: number | null;
  paused: boolean;
}

export interface NextStep {
  index: number;
  id: string;
  kind: StepKind;
  title: string;
  durationS: number | null;
}

export interface PulseState {
  lightOn: boolean;
  /** Seconds left in the current on or off phase; null while paused or once the time is up. */
  phaseLeftS: number | null;
}

export interface SessionClock {
  phase: ClockPhase;
  current: ClockStep | null;
  next: NextStep | null;
  /** PDT: seconds until the light is due, timed from the infusion START; negative when late. */
  lightStartInS: number | null;
  /** PDT: volume infused so far at the planned rate (derived, not measured). */
  infusedVolumeMl: number | null;
  /** Seconds to the current step's next cue (a drop, a minute mark). */
  nextCueInS: number | null;
  /** Pulsed UV: which half of the cycle the light is in. */
  pulse: PulseState | null;
  /** Seconds to the next step change, cue or light start, so a warning can sound before it. */
  upcomingChangeInS: number | null;
}

export interface SessionClockInput {
  protocol: ProtocolVersion;
  plan: DosePlan;
  events: readonly SessionEventLike[];
  nowMs: number;
}

/** Steps in which riboflavin drops are given: their cue counts from the last drop. */
const dropStepKinds: ReadonlySet<StepKind> = new Set(['soak', 'uv', 'swelling']);

const phaseByOutcome: Record<SessionReplay['outcome'], ClockPhase> = {
  'not-started': 'not-started',
  'in-progress': 'running',
  completed: 'finished',
  stopped: 'stopped',
};

/**
 * What the bedside clock shows at `nowMs`, worked out from the events alone (never by counting
 * ticks), so a reload, a sleeping tablet or a late queue changes nothing. Called every frame,
 * so it costs one sort and one pass over the session's few hundred events at most.
 */
export function sessionClock({ protocol, plan, events, nowMs }: SessionClockInput): SessionClock {
  const replay = replaySession(protocol, events);
  const over = replay.endedMs !== null;
  const current = over ? null : currentStep(protocol, replay, nowMs);
  const currentRun = current ? lastRunOf(replay, current.id) : undefined;

  let nextCueInS: number | null = null;
  const cueEveryS = current ? protocol.steps[current.index]?.cueEveryS : undefined;
  if (current && currentRun && cueEveryS !== undefined) {
    let baseMs = currentRun.startMs;
    if (dropStepKinds.has(current.kind)) {
      for (const drop of replay.drops) {
        if (drop.stepId === current.id && drop.ms > baseMs && drop.ms <= nowMs) baseMs = drop.ms;
      }
    }
    const cueMs = cueEveryS * 1000;
    nextCueInS = (cueMs - (Math.max(0, nowMs - baseMs) % cueMs)) / 1000;
  }

  let lightStartInS: number | null = null;
  let infusedMl: number | null = null;
  if (protocol.kind === 'pdt') {
    const infusionStep = firstStepOfKind(protocol, 'infusion');
    const lightStep = firstStepOfKind(protocol, 'light');
    const infusion = spanOf(infusionStep ? replay.runs.get(infusionStep.id) : undefined);
    const lightStarted = lightStep ? replay.runs.has(lightStep.id) : false;
    if (infusion) {
      // Timed from the START of the infusion (TAP Study Group, Arch Ophthalmol 1999).
      const dueAfterS =
        plan.lightStartAfterInfusionStartS ??
        (protocol.timing?.lightStartAfterInfusionStartMin ?? 0) * 60;
      if (!over && !lightStarted)
        lightStartInS = (infusion.startMs + dueAfterS * 1000 - nowMs) / 1000;
      const endMs = Math.min(infusion.endMs ?? nowMs, nowMs);
      infusedMl = infusedVolumeMl(
        plan.infusionRateMlPerMin,
        protocol.drug?.finalVolumeMl ?? null,
        Math.max(0, endMs - infusion.startMs) / 1000,
      );
    }
  }

  let pulse: PulseState | null = null;
  const cycle = protocol.light.pulse;
  if (current && current.kind === 'uv' && cycle) {
    if (current.paused || current.remainingS === 0) {
      pulse = { lightOn: false, phaseLeftS: null };
    } else {
      const onMs = cycle.onS * 1000;
      const cycleMs = onMs + cycle.offS * 1000;
      const positionMs = (current.elapsedS * 1000) % cycleMs;
      const lightOn = positionMs < onMs;
      const phaseLeftS = ((lightOn ? onMs : cycleMs) - positionMs) / 1000;
      pulse = {
        lightOn,
        phaseLeftS:
          current.remainingS === null ? phaseLeftS : Math.min(phaseLeftS, current.remainingS),
      };
    }
  }

  let upcomingChangeInS: number | null = null;
  const consider = (seconds: number | null) => {
    if (
      seconds !== null &&
      seconds > 0 &&
      (upcomingChangeInS === null || seconds < upcomingChangeInS)
    )
      upcomingChangeInS = seconds;
  };
  if (current && !current.paused) consider(current.remainingS);
  consider(nextCueInS);
  consider(lightStartInS);

  return {
    phase: phaseByOutcome[replay.outcome],
    current,
    next: over ? null : nextStep(protocol, replay, current),
    lightStartInS,
    infusedVolumeMl: infusedMl,
    nextCueInS,
    pulse,
    upcomingChangeInS,
  };
}

function lastRunOf(replay: SessionReplay, stepId: string) {
  const runs = replay.runs.get(stepId);
  return runs?.[runs.length - 1];
}

function currentStep(
  protocol: ProtocolVersion,
  replay: SessionReplay,
  nowMs: number,
): ClockStep | null {
  if (replay.openStepId === null) return null;
  const index = protocol.steps.findIndex((step) => step.id === replay.openStepId);
  const step = protocol.steps[index];
  const runs = replay.runs.get(replay.openStepId);
  const run = runs?.[runs.length - 1];
  const first = runs?.[0];
  if (!step || !runs || !run || !first) return null;
  const elapsedS = runsRunningMs(runs, nowMs) / 1000;
  const lastPause = run.pauses[run.pauses.length - 1];
  return {
    index,
    id: step.id,
    kind: step.kind,
    title: step.title,
    startedAt: new Date(first.startMs).toISOString(),
    durationS: step.durationS,
    elapsedS,
    remainingS: step.durationS === null ? null : Math.max(0, step.durationS - elapsedS),
    overrunS: step.durationS === null ? null : Math.max(0, elapsedS - step.durationS),
    paused: lastPause !== undefined && lastPause.endMs === null,
  };
}

/** A step that runs only when the stroma is thin is skipped unless the last reading is below the minimum. */
function applies(step: ProtocolStep, protocol: ProtocolVersion, replay: SessionReplay): boolean {
  if (step.onlyIf !== 'thickness-below-minimum') return true;
  const last = replay.thicknessReadings[replay.thicknessReadings.length - 1];
  return (
    protocol.cxl !== null &&
    last !== undefined &&
    belowMinimumThickness(last.thicknessUm, protocol.cxl.minStromalThicknessUm)
  );
}

function nextStep(
  protocol: ProtocolVersion,
  replay: SessionReplay,
  current: ClockStep | null,
): NextStep | null {
  const anchorId = current?.id ?? replay.lastStartedStepId;
  const anchor = anchorId === null ? -1 : protocol.steps.findIndex((step) => step.id === anchorId);
  for (let index = anchor + 1; index < protocol.steps.length; index += 1) {
    const step = protocol.steps[index];
    if (step && applies(step, protocol, replay))
      return { index, id: step.id, kind: step.kind, title: step.title, durationS: step.durationS };
  }
  return null;
}
