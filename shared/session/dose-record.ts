import { doseInInfusedVolumeMg } from '../engine/dose-given';
import { fluenceJPerCm2, pulsedOnS } from '../engine/light-arithmetic';
import type { ProtocolStep, ProtocolVersion, StepKind } from '../protocol/protocol-schema';
import type { DosePlan } from '../schemas/calculation';
import { deviceUsedOf, type DeviceUsed } from './device-used';
import { isWithdrawableType, type DeviceRecord, type SessionEventInput } from './session-events';

/**
 * An event as the session functions read it: stored events carry the server's `id`; events
 * still queued on a tablet have none yet and sort after stored ones at the same instant.
 */
export type SessionEventLike = SessionEventInput & {
  id?: number;
  serverTime?: string;
  deviceRecord?: DeviceRecord;
};

/**
 * A tap that reached the server more than this long after it was made is listed with its delay
 * in the dose record (a tablet that was offline; common practice: a minute is worth a look).
 */
export const receiptDelayShownS = 60;

/** A tap entered after the session ended, with the reason it is late. */
export interface LateEntry {
  idempotencyKey: string;
  type: SessionEventInput['type'];
  stepId: string | null;
  at: string;
  receivedAt: string | null;
  reason: string;
}

/** A tap that reached the server more than receiptDelayShownS after it was made. */
export interface ReceiptDelay {
  idempotencyKey: string;
  type: SessionEventInput['type'];
  stepId: string | null;
  at: string;
  receivedAt: string;
  delayS: number;
}

export type SessionOutcome = 'not-started' | 'in-progress' | 'completed' | 'stopped';

export interface Interval {
  startMs: number;
  /** Null while it is still open. */
  endMs: number | null;
}

/** One stretch of a step from its step-started to its step-ended, with the pauses inside it. */
export interface StepRun extends Interval {
  pauses: Interval[];
}

/** A tap the nurse withdrew as a mistake: kept in the record, left out of every figure. */
export interface WithdrawnTap {
  idempotencyKey: string;
  type: SessionEventInput['type'];
  stepId: string | null;
  /** When the mistaken tap was made. */
  at: string;
  /** When it was withdrawn. */
  withdrawnAt: string;
  reason: string;
}

/** The events replayed once, in time order, into runs per step and the session's other facts. */
export interface SessionReplay {
  sessionStartedMs: number | null;
  endedMs: number | null;
  outcome: SessionOutcome;
  stopReason: string | null;
  /** The step that was running when the session was stopped. */
  stoppedInStepId: string | null;
  /** Runs per step id, oldest first. A step normally runs once; a restart adds a run. */
  runs: Map<string, StepRun[]>;
  /** The step running now, if any (at most one runs at a time). */
  openStepId: string | null;
  /** The step most recently started, running or not. */
  lastStartedStepId: string | null;
  extravasationMs: number | null;
  drops: { stepId: string; ms: number }[];
  thicknessReadings: { stepId: string; ms: number; thicknessUm: number }[];
  thicknessOverrideReason: string | null;
  lastEventMs: number | null;
  withdrawnTaps: WithdrawnTap[];
  /** The volume the nurse read off the pump at an extravasation or a stop (the latest counts). */
  volumeInfusedMl: number | null;
  /** What the laser displayed at the end of the light step (the latest reading counts). */
  deviceExposure: { stepId: string; exposureS: number; energyJ: number | null } | null;
  lateEntries: LateEntry[];
  /** The session's start as stored: the device chosen and set, and what the server found about it. */
  start: Extract<SessionEventLike, { type: 'session-started' }> | null;
}

function compareIds(a: number | undefined, b: number | undefined): number {
  if (a === b) return 0;
  if (a === undefined) return 1;
  if (b === undefined) return -1;
  return a - b;
}

function compareText(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

interface TimedEvent {
  event: SessionEventLike;
  ms: number;
}

/** Sorted by clientTime, then id (unsent last), then key, so any arrival order gives one list. */
function sortedUnique(events: readonly SessionEventLike[]): TimedEvent[] {
  const timed: TimedEvent[] = [];
  for (const event of events) {
    const ms = Date.parse(event.clientTime);
    if (Number.isFinite(ms)) timed.push({ event, ms });
  }
  timed.sort(
    (a, b) =>
      a.ms - b.ms ||
      compareIds(a.event.id, b.event.id) ||
      compareText(a.event.idempotencyKey, b.event.idempotencyKey),
  );
  // A re-sent event keeps its idempotency key; the earliest copy stands.
  const seen = new Set<string>();
  return timed.filter(({ event }) =>
    seen.has(event.idempotencyKey) ? false : (seen.add(event.idempotencyKey), true),
  );
}

/**
 * The one place where a withdrawal takes effect: the withdrawn taps and the withdrawals themselves
 * are taken out of the list before anything is replayed, so a withdrawn tap counts as never
 * tapped and the withdrawal changes nothing else. Only the first withdrawal of a tap counts, and
 * one that names a tap that cannot be withdrawn (or no tap at all) takes nothing out; the server
 * refuses those, so this only guards against a list that never passed through it.
 */
export function withdrawalsApplied<E extends SessionEventLike>(
  events: readonly E[],
): { kept: E[]; withdrawn: WithdrawnTap[] } {
  const withdrawals = new Map<string, Extract<SessionEventLike, { type: 'tap-withdrawn' }>>();
  for (const event of events)
    if (event.type === 'tap-withdrawn' && !withdrawals.has(event.withdrawnKey))
      withdrawals.set(event.withdrawnKey, event);
  if (withdrawals.size === 0) return { kept: [...events], withdrawn: [] };
  const kept: E[] = [];
  const withdrawn = new Map<string, WithdrawnTap>();
  for (const event of events) {
    if (event.type === 'tap-withdrawn') continue;
    const withdrawal = isWithdrawableType(event.type)
      ? withdrawals.get(event.idempotencyKey)
      : undefined;
    if (!withdrawal) {
      kept.push(event);
      continue;
    }
    // A re-sent copy has the same key and is withdrawn with it, but is listed once.
    if (!withdrawn.has(event.idempotencyKey)) {
      withdrawn.set(event.idempotencyKey, {
        idempotencyKey: event.idempotencyKey,
        type: event.type,
        stepId: 'stepId' in event ? event.stepId : null,
        at: event.clientTime,
        withdrawnAt: withdrawal.clientTime,
        reason: withdrawal.reason,
      });
    }
  }
  return {
    kept,
    withdrawn: [...withdrawn.values()].sort((a, b) => Date.parse(a.at) - Date.parse(b.at)),
  };
}

function closeRun(run: StepRun, ms: number): void {
  run.endMs = ms;
  const last = run.pauses[run.pauses.length - 1];
  if (last && last.endMs === null) last.endMs = ms;
}

/**
 * Replays the events into a session state. Total: a sequence that makes no sense (a second
 * start of a running step, a resume with no pause, an event after the session ended) is
 * ignored rather than refused, because the events are facts already recorded at the bedside.
 */
export function replaySession(
  protocol: Pick<ProtocolVersion, 'steps'>,
  events: readonly SessionEventLike[],
): SessionReplay {
  const { kept, withdrawn } = withdrawalsApplied(events);
  const stepIds = new Set(protocol.steps.map((step) => step.id));
  const infusionStepId = protocol.steps.find((step) => step.kind === 'infusion')?.id ?? null;
  const replay: SessionReplay = {
    sessionStartedMs: null,
    endedMs: null,
    outcome: 'not-started',
    stopReason: null,
    stoppedInStepId: null,
    runs: new Map(),
    openStepId: null,
    lastStartedStepId: null,
    extravasationMs: null,
    drops: [],
    thicknessReadings: [],
    thicknessOverrideReason: null,
    lastEventMs: null,
    withdrawnTaps: withdrawn,
    volumeInfusedMl: null,
    deviceExposure: null,
    lateEntries: [],
    start: null,
  };
  const openRun = (): StepRun | undefined => {
    if (replay.openStepId === null) return undefined;
    const runs = replay.runs.get(replay.openStepId);
    return runs?.[runs.length - 1];
  };
  const closeOpen = (ms: number): void => {
    const run = openRun();
    if (run) closeRun(run, ms);
    replay.openStepId = null;
  };

  for (const { event, ms } of sortedUnique(kept)) {
    // Once the session has ended, later taps describe nothing that was given, except a late
    // entry (refused without its reason): it is listed, and an extravasation found after the end
    // or the laser's figures entered late still count.
    if (replay.endedMs !== null) {
      if (event.lateEntryReason === undefined) continue;
      replay.lateEntries.push(lateEntryOf(event, event.lateEntryReason));
      if (event.type === 'extravasation') {
        replay.extravasationMs ??= ms;
        if (event.volumeInfusedMl !== undefined) replay.volumeInfusedMl = event.volumeInfusedMl;
      }
      if (event.type === 'exposure-recorded' && stepIds.has(event.stepId))
        replay.deviceExposure = {
          stepId: event.stepId,
          exposureS: event.exposureS,
          energyJ: event.energyJ ?? null,
        };
      continue;
    }
    replay.lastEventMs = ms;
    if (event.lateEntryReason !== undefined) {
      // A late entry timed inside the session (the server refuses none) still says so.
      replay.lateEntries.push(lateEntryOf(event, event.lateEntryReason));
    }
    switch (event.type) {
      case 'session-started':
        replay.sessionStartedMs ??= ms;
        replay.start ??= event;
        break;
      case 'step-started': {
        if (!stepIds.has(event.stepId) || replay.openStepId === event.stepId) break;
        // The step clock runs one step at a time: starting the next step ends the one before.
        closeOpen(ms);
        const runs = replay.runs.get(event.stepId) ?? [];
        runs.push({ startMs: ms, endMs: null, pauses: [] });
        replay.runs.set(event.stepId, runs);
        replay.openStepId = event.stepId;
        replay.lastStartedStepId = event.stepId;
        break;
      }
      case 'step-ended':
        if (replay.openStepId === event.stepId) closeOpen(ms);
        break;
      case 'paused': {
        const run = replay.openStepId === event.stepId ? openRun() : undefined;
        const last = run?.pauses[run.pauses.length - 1];
        if (run && (!last || last.endMs !== null)) run.pauses.push({ startMs: ms, endMs: null });
        break;
      }
      case 'resumed': {
        const run = replay.openStepId === event.stepId ? openRun() : undefined;
        const last = run?.pauses[run.pauses.length - 1];
        if (last && last.endMs === null) last.endMs = ms;
        break;
      }
      case 'drop-given':
        if (stepIds.has(event.stepId)) replay.drops.push({ stepId: event.stepId, ms });
        break;
      case 'thickness-measured':
        if (stepIds.has(event.stepId))
          replay.thicknessReadings.push({
            stepId: event.stepId,
            ms,
            thicknessUm: event.thicknessUm,
          });
        break;
      case 'thickness-override':
        replay.thicknessOverrideReason = event.reason;
        break;
      case 'exposure-recorded':
        if (stepIds.has(event.stepId))
          replay.deviceExposure = {
            stepId: event.stepId,
            exposureS: event.exposureS,
            energyJ: event.energyJ ?? null,
          };
        break;
      case 'extravasation':
        replay.extravasationMs ??= ms;
        if (event.volumeInfusedMl !== undefined) replay.volumeInfusedMl = event.volumeInfusedMl;
        // Extravasation stops the infusion at once (the protocol's caution), whatever is tapped next.
        if (infusionStepId !== null && replay.openStepId === infusionStepId) closeOpen(ms);
        break;
      case 'session-stopped':
      case 'session-completed':
        if (event.type === 'session-stopped') replay.stoppedInStepId = replay.openStepId;
        closeOpen(ms);
        replay.endedMs = ms;
        replay.outcome = event.type === 'session-stopped' ? 'stopped' : 'completed';
        if (event.type === 'session-stopped') {
          replay.stopReason = event.reason;
          if (event.volumeInfusedMl !== undefined) replay.volumeInfusedMl = event.volumeInfusedMl;
        }
        break;
      case 'tap-withdrawn':
        // Taken out before the replay (withdrawalsApplied); never reaches here.
        break;
    }
  }
  if (
    replay.outcome === 'not-started' &&
    (replay.sessionStartedMs !== null || replay.runs.size > 0)
  )
    replay.outcome = 'in-progress';
  return replay;
}

/** Milliseconds a run has been running up to `untilMs`, less its pauses (a pause stops the light). */
export function runningMs(run: StepRun, untilMs: number): number {
  const endMs = Math.min(run.endMs ?? untilMs, untilMs);
  if (endMs <= run.startMs) return 0;
  let pausedMs = 0;
  for (const pause of run.pauses) {
    const from = Math.max(pause.startMs, run.startMs);
    const to = Math.min(pause.endMs ?? endMs, endMs);
    if (to > from) pausedMs += to - from;
  }
  return endMs - run.startMs - pausedMs;
}

export function runsRunningMs(runs: readonly StepRun[], untilMs: number): number {
  return runs.reduce((sum, run) => sum + runningMs(run, untilMs), 0);
}

/** From the first start to the last end; `endMs` null while the last run is open. */
export function spanOf(runs: readonly StepRun[] | undefined): Interval | null {
  const first = runs?.[0];
  const last = runs?.[runs.length - 1];
  return first && last ? { startMs: first.startMs, endMs: last.endMs } : null;
}

export function firstStepOfKind(
  protocol: Pick<ProtocolVersion, 'steps'>,
  kind: StepKind,
): ProtocolStep | undefined {
  return protocol.steps.find((step) => step.kind === kind);
}

function fluenceFrom(irradianceMwPerCm2: number | null, onS: number | null): number | null {
  return irradianceMwPerCm2 === null || onS === null
    ? null
    : fluenceJPerCm2(irradianceMwPerCm2, onS);
}

/**
 * Volume infused so far at the plan's rate. Derived, not measured: the pump's own counter is
 * the measured figure. Capped at the final volume because the bag holds no more.
 */
export function infusedVolumeMl(
  rateMlPerMin: number | null,
  finalVolumeMl: number | null,
  infusionS: number | null,
): number | null {
  if (rateMlPerMin === null || infusionS === null) return null;
  const volumeMl = (rateMlPerMin * infusionS) / 60;
  return finalVolumeMl === null ? volumeMl : Math.min(volumeMl, finalVolumeMl);
}

/** The longest time without a drop in a step, counting from its start and up to its end. */
function longestDropGapS(
  stepId: string | undefined,
  span: Interval | null,
  drops: SessionReplay['drops'],
  untilMs: number,
): number | null {
  if (stepId === undefined || span === null) return null;
  const endMs = Math.max(span.startMs, span.endMs ?? untilMs);
  let previousMs = span.startMs;
  let longestMs = 0;
  for (const drop of drops) {
    if (drop.stepId !== stepId || drop.ms < span.startMs || drop.ms > endMs) continue;
    longestMs = Math.max(longestMs, drop.ms - previousMs);
    previousMs = drop.ms;
  }
  return Math.max(longestMs, endMs - previousMs) / 1000;
}

const iso = (ms: number | null | undefined): string | null =>
  ms === null || ms === undefined ? null : new Date(ms).toISOString();

/**
 * What was actually given, as figures derived from the session's events. Fields another kind
 * of protocol does not use are null (or empty). While a step still runs its figures run up to
 * `nowMs` (or, without it, to the latest event) and the outcome says in-progress.
 */
export interface DoseRecord {
  kind: ProtocolVersion['kind'];
  outcome: SessionOutcome;
  sessionStartedAt: string | null;
  /** When the session was completed or stopped. */
  endedAt: string | null;
  stopReason: string | null;
  /** The step that was running when the session was stopped. */
  stoppedInStepId: string | null;
  /** The plan's irradiance, from which the delivered fluence is worked out. */
  irradianceMwPerCm2: number | null;

  infusionStartAt: string | null;
  /** The infusion step's end, or the extravasation that stopped it. */
  infusionEndAt: string | null;
  infusionDurationS: number | null;
  /**
   * The volume infused: what the nurse read off the pump at an extravasation or a stop
   * (`volumeGivenSource` 'entered'), otherwise planned rate × infusion duration capped at the
   * final volume ('derived').
   */
  volumeGivenMl: number | null;
  volumeGivenSource: 'entered' | 'derived' | null;
  /** Milligrams in the volume infused (shared/engine/dose-given), and the dose ordered, for "about N mg of M mg". */
  doseGivenMg: number | null;
  plannedDoseMg: number | null;
  extravasationAt: string | null;
  lightStartAt: string | null;
  lightEndAt: string | null;
  /** Timed from the START of the infusion (TAP Study Group, Arch Ophthalmol 1999). */
  lightStartAfterInfusionStartS: number | null;
  /** Light on-time by the taps: running time of the light step less its pauses (information; the device's figure is judged). */
  lightOnS: number | null;
  /** The exposure time and energy the laser displayed at the end of the light step, as the nurse entered them. */
  deviceExposureS: number | null;
  deviceEnergyJ: number | null;
  /** PDT: a light step ran with no infusion start on record (never tapped, or withdrawn). */
  lightWithoutInfusion: boolean;

  soakStartAt: string | null;
  soakEndAt: string | null;
  soakDurationS: number | null;
  drops: { stepId: string; at: string }[];
  longestDropGapSoakS: number | null;
  longestDropGapUvS: number | null;
  thicknessReadings: { stepId: string; at: string; thicknessUm: number }[];
  /** The last reading before UV started (before UV starts: the last reading so far). */
  thicknessBeforeUvUm: number | null;
  thicknessOverrideReason: string | null;
  uvStartAt: string | null;
  uvEndAt: string | null;
  /** Running time of the UV step less its pauses. */
  uvElapsedS: number | null;
  /** UV on-time: the elapsed time, or its on-share when the light is pulsed. */
  uvOnS: number | null;

  /**
   * Irradiance × on-time ÷ 1000 (mW/cm² × s = mJ/cm²); the on-time is the device's figure when
   * entered, the irradiance is `deviceUsed.fluenceIrradianceMwPerCm2` (its basis says measured,
   * nominal or planned).
   */
  deliveredFluenceJPerCm2: number | null;
  /** The device and lens used, what was set and measured (absent in records stored before devices). */
  deviceUsed?: DeviceUsed;

  /** Taps withdrawn as mistakes, with the reason: none of the figures above counts them. */
  withdrawnTaps: WithdrawnTap[];
  /** Taps entered after the session ended, each with its reason. */
  lateEntries: LateEntry[];
  /** Taps that reached the server more than receiptDelayShownS after they were made. */
  receiptDelays: ReceiptDelay[];
}

/** Taps whose receipt lagged their making by more than receiptDelayShownS, oldest first. */
export function receiptDelaysOf(events: readonly SessionEventLike[]): ReceiptDelay[] {
  const delays: ReceiptDelay[] = [];
  const seen = new Set<string>();
  for (const event of events) {
    if (event.serverTime === undefined || seen.has(event.idempotencyKey)) continue;
    seen.add(event.idempotencyKey);
    const delayS = (Date.parse(event.serverTime) - Date.parse(event.clientTime)) / 1000;
    if (delayS > receiptDelayShownS) {
      delays.push({
        idempotencyKey: event.idempotencyKey,
        type: event.type,
        stepId: 'stepId' in event ? event.stepId : null,
        at: event.clientTime,
        receivedAt: event.serverTime,
        delayS,
      });
    }
  }
  return delays.sort((a, b) => Date.parse(a.at) - Date.parse(b.at));
}

export interface DoseRecordInput {
  protocol: ProtocolVersion;
  plan: DosePlan;
  events: readonly SessionEventLike[];
  nowMs?: number;
}

export function deriveDoseRecord({ protocol, plan, events, nowMs }: DoseRecordInput): DoseRecord {
  const replay = replaySession(protocol, events);
  const untilMs = replay.endedMs ?? nowMs ?? replay.lastEventMs ?? 0;
  const stepSpan = (kind: StepKind) => {
    const step = firstStepOfKind(protocol, kind);
    const runs = step ? replay.runs.get(step.id) : undefined;
    return { step, runs, span: spanOf(runs) };
  };
  const seconds = (span: Interval | null) =>
    span === null ? null : Math.max(0, (span.endMs ?? untilMs) - span.startMs) / 1000;
  const onS = (runs: StepRun[] | undefined) =>
    runs && runs.length > 0 ? runsRunningMs(runs, untilMs) / 1000 : null;

  const isPdt = protocol.kind === 'pdt';
  const infusion = stepSpan('infusion');
  const light = stepSpan('light');
  const soak = stepSpan('soak');
  const uv = stepSpan('uv');

  const infusionDurationS = isPdt ? seconds(infusion.span) : null;
  const lightOnS = isPdt ? onS(light.runs) : null;
  const deviceExposure =
    isPdt && light.step && replay.deviceExposure?.stepId === light.step.id
      ? replay.deviceExposure
      : null;
  const finalVolumeMl = protocol.drug?.finalVolumeMl ?? null;
  const enteredMl = isPdt ? replay.volumeInfusedMl : null;
  const volumeGivenMl = !isPdt
    ? null
    : (enteredMl ?? infusedVolumeMl(plan.infusionRateMlPerMin, finalVolumeMl, infusionDurationS));
  const plannedDoseMg = isPdt ? (plan.doseMg ?? null) : null;
  const doseGivenMg =
    volumeGivenMl !== null && plannedDoseMg !== null && finalVolumeMl !== null
      ? doseInInfusedVolumeMg(Math.min(volumeGivenMl, finalVolumeMl), plannedDoseMg, finalVolumeMl)
      : null;
  const uvElapsedS = isPdt ? null : onS(uv.runs);
  const uvOnS = uvElapsedS === null ? null : pulsedOnS(uvElapsedS, protocol.light.pulse);

  const uvStartMs = uv.span?.startMs ?? null;
  const deviceUsed = deviceUsedOf(protocol, plan, replay.start);
  const readingsBeforeUv = replay.thicknessReadings.filter(
    (reading) => uvStartMs === null || reading.ms <= uvStartMs,
  );

  return {
    kind: protocol.kind,
    outcome: replay.outcome,
    sessionStartedAt: iso(replay.sessionStartedMs),
    endedAt: iso(replay.endedMs),
    stopReason: replay.stopReason,
    stoppedInStepId: replay.stoppedInStepId,
    irradianceMwPerCm2: plan.irradianceMwPerCm2,

    infusionStartAt: isPdt ? iso(infusion.span?.startMs) : null,
    infusionEndAt: isPdt ? iso(infusion.span?.endMs) : null,
    infusionDurationS,
    volumeGivenMl,
    volumeGivenSource: volumeGivenMl === null ? null : enteredMl !== null ? 'entered' : 'derived',
    doseGivenMg,
    plannedDoseMg,
    extravasationAt: isPdt ? iso(replay.extravasationMs) : null,
    lightStartAt: isPdt ? iso(light.span?.startMs) : null,
    lightEndAt: isPdt ? iso(light.span?.endMs) : null,
    lightStartAfterInfusionStartS:
      isPdt && infusion.span && light.span
        ? (light.span.startMs - infusion.span.startMs) / 1000
        : null,
    lightOnS,
    deviceExposureS: deviceExposure?.exposureS ?? null,
    deviceEnergyJ: deviceExposure?.energyJ ?? null,
    lightWithoutInfusion: isPdt && light.span !== null && infusion.span === null,

    soakStartAt: isPdt ? null : iso(soak.span?.startMs),
    soakEndAt: isPdt ? null : iso(soak.span?.endMs),
    soakDurationS: isPdt ? null : seconds(soak.span),
    drops: isPdt
      ? []
      : replay.drops.map((drop) => ({ stepId: drop.stepId, at: new Date(drop.ms).toISOString() })),
    longestDropGapSoakS: isPdt
      ? null
      : longestDropGapS(soak.step?.id, soak.span, replay.drops, untilMs),
    longestDropGapUvS: isPdt ? null : longestDropGapS(uv.step?.id, uv.span, replay.drops, untilMs),
    thicknessReadings: isPdt
      ? []
      : replay.thicknessReadings.map((reading) => ({
          stepId: reading.stepId,
          at: new Date(reading.ms).toISOString(),
          thicknessUm: reading.thicknessUm,
        })),
    thicknessBeforeUvUm: isPdt
      ? null
      : (readingsBeforeUv[readingsBeforeUv.length - 1]?.thicknessUm ?? null),
    thicknessOverrideReason: isPdt ? null : replay.thicknessOverrideReason,
    uvStartAt: isPdt ? null : iso(uvStartMs),
    uvEndAt: isPdt ? null : iso(uv.span?.endMs),
    uvElapsedS,
    uvOnS,

    deliveredFluenceJPerCm2: fluenceFrom(
      deviceUsed.fluenceIrradianceMwPerCm2,
      isPdt ? (deviceExposure?.exposureS ?? lightOnS) : uvOnS,
    ),
    deviceUsed,

    withdrawnTaps: replay.withdrawnTaps,
    lateEntries: replay.lateEntries,
    receiptDelays: receiptDelaysOf(events),
  };
}

/** A late entry as the record lists it: what, when it happened, when it was entered, and why. */
function lateEntryOf(
  event: SessionEventInput & { idempotencyKey: string; clientTime: string; serverTime?: string },
  reason: string,
): LateEntry {
  return {
    idempotencyKey: event.idempotencyKey,
    type: event.type,
    stepId: 'stepId' in event ? event.stepId : null,
    at: event.clientTime,
    receivedAt: event.serverTime ?? null,
    reason,
  };
}
