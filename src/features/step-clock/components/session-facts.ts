import type { ProtocolStep, ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import { replaySession, type SessionEventLike, type SessionReplay } from '../../../../shared/session/dose-record';
import type { SessionClock } from '../../../../shared/session/session-clock';

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
}

/** The facts the buttons depend on, read from the same events the clock uses. */
export function sessionFacts(protocol: ProtocolVersion, events: readonly SessionEventLike[], clock: SessionClock): SessionFacts {
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

  const lightStepId = protocol.kind === 'pdt' ? protocol.steps.find((step) => step.kind === 'light')?.id : undefined;
  const minimumUm = protocol.cxl?.minStromalThicknessUm ?? null;
  let uvGate: SessionFacts['uvGate'] = { allowed: true, why: null };
  if (minimumUm !== null && replay.thicknessOverrideReason === null) {
    if (!lastReading) uvGate = { allowed: false, why: `Record the thinnest stromal thickness first: UV needs at least ${minimumUm} µm.` };
    else if (lastReading.thicknessUm < minimumUm)
      uvGate = { allowed: false, why: `The last reading, ${lastReading.thicknessUm} µm, is below the ${minimumUm} µm minimum. UV starts only after a reading of at least ${minimumUm} µm or an override a clinician authorises with their password.` };
  }

  return {
    replay,
    doneStepIds,
    lastThickness: lastReading ? { thicknessUm: lastReading.thicknessUm, ms: lastReading.ms } : null,
    overrideReason: replay.thicknessOverrideReason,
    extravasationMs: replay.extravasationMs,
    dropsInCurrentStep,
    lastDropOrStartMs,
    uvStep: protocol.steps.find((step) => step.kind === 'uv'),
    uvGate,
    exposureMissing: lightStepId !== undefined && replay.runs.has(lightStepId) && replay.openStepId !== lightStepId && replay.deviceExposure === null,
  };
}
