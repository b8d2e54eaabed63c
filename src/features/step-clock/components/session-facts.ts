import type { ProtocolStep, ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import {
  replaySession,
  withdrawalsApplied,
  type SessionEventLike,
  type SessionReplay,
} from '../../../../shared/session/dose-record';
import type { SessionClock } from '../../../../shared/session/session-clock';
import type { AftercareItem } from '../../../../shared/session/session-events';
import {
  exposureMissing,
  identityConfirmationMissing,
  uvStartVerdict,
} from '../../../../shared/session/session-rules';

export interface SessionFacts {
  replay: SessionReplay;
  /** Steps that have run and are not running now. */
  doneStepIds: ReadonlySet<string>;
  lastThickness: { thicknessUm: number; ms: number } | null;
  overrideReason: string | null;
  extravasationMs: number | null;
  /** Drops given in the step running now. */
  dropsInCurrentStep: number;
  /** The last drop of the running step, or its start when none has been given yet. */
  lastDropOrStartMs: number | null;
  uvStep: ProtocolStep | undefined;
  /** Whether UV may start: a reading at or above the minimum, or an override a clinician authorised. */
  uvGate: { allowed: boolean; why: string | null };
  /** PDT: the light step has run and ended, and the laser's displayed exposure is not entered yet. */
  exposureMissing: boolean;
  /** Mirrors the server: whether a start of this step at `atMs` still needs identity and eye confirmed. */
  needsIdentity: (step: Pick<ProtocolStep, 'id' | 'kind'>, atMs: number) => boolean;
  /** After-care items recorded (withdrawn ones left out). */
  aftercareDone: ReadonlySet<AftercareItem>;
}

/** The facts the buttons depend on, read from the same events the clock uses. */
export function sessionFacts(
  protocol: ProtocolVersion,
  events: readonly SessionEventLike[],
  clock: SessionClock,
): SessionFacts {
  const replay = replaySession(protocol, events);
  const doneStepIds = new Set([...replay.runs.keys()].filter((id) => id !== replay.openStepId));
  const lastReading = replay.thicknessReadings[replay.thicknessReadings.length - 1];
  const current = clock.current;

  let dropsInCurrentStep = 0;
  let lastDropOrStartMs: number | null = null;
  if (current) {
    const runs = replay.runs.get(current.id) ?? [];
    const runStartMs = runs[runs.length - 1]?.startMs ?? Date.parse(current.startedAt);
    lastDropOrStartMs = runStartMs;
    for (const drop of replay.drops) {
      if (drop.stepId !== current.id || drop.ms < runStartMs) continue;
      dropsInCurrentStep += 1;
      lastDropOrStartMs = Math.max(lastDropOrStartMs, drop.ms);
    }
  }

  const lightStepId =
    protocol.kind === 'pdt' ? protocol.steps.find((step) => step.kind === 'light')?.id : undefined;
  const minimumUm = protocol.cxl?.minStromalThicknessUm ?? null;
  let uvGate: SessionFacts['uvGate'] = { allowed: true, why: null };
  // An override reaches the tablet only once the server has checked its clinician's password.
  const uv = uvStartVerdict(
    minimumUm,
    lastReading?.thicknessUm ?? null,
    replay.thicknessOverrideReason !== null,
  );
  if (!uv.allowed) {
    uvGate =
      uv.lastReadingUm === null
        ? {
            allowed: false,
            why: `Record the thinnest stromal thickness first: UV needs at least ${uv.minimumUm} µm.`,
          }
        : {
            allowed: false,
            why: `UV starts only after a reading of at least ${uv.minimumUm} µm (last: ${uv.lastReadingUm} µm), or a clinician’s authorised override.`,
          };
  }

  const { kept } = withdrawalsApplied(events);
  const aftercareDone = new Set<AftercareItem>();
  for (const event of kept) if (event.type === 'aftercare-checked') aftercareDone.add(event.item);

  return {
    replay,
    needsIdentity: (step, atMs) => identityConfirmationMissing(step, atMs, kept),
    aftercareDone,
    doneStepIds,
    lastThickness: lastReading
      ? { thicknessUm: lastReading.thicknessUm, ms: lastReading.ms }
      : null,
    overrideReason: replay.thicknessOverrideReason,
    extravasationMs: replay.extravasationMs,
    dropsInCurrentStep,
    lastDropOrStartMs,
    uvStep: protocol.steps.find((step) => step.kind === 'uv'),
    uvGate,
    exposureMissing:
      lightStepId !== undefined &&
      exposureMissing({
        lightStarted: replay.runs.has(lightStepId),
        lightRunning: replay.openStepId === lightStepId,
        exposureEntered: replay.deviceExposure !== null,
      }),
  };
}

/** A drop step whose interval has passed since its last drop (or its start): the drop is due. */
export function dropDueNow(
  clock: SessionClock,
  protocol: ProtocolVersion,
  facts: SessionFacts,
  serverNowMs: number,
): boolean {
  const current = clock.current;
  const cueEveryS = current ? protocol.steps[current.index]?.cueEveryS : undefined;
  return (
    current !== null &&
    (current.kind === 'soak' || current.kind === 'uv' || current.kind === 'swelling') &&
    cueEveryS !== undefined &&
    facts.lastDropOrStartMs !== null &&
    serverNowMs - facts.lastDropOrStartMs >= cueEveryS * 1000
  );
}
