import type { ProtocolStep, ProtocolVersion, StepKind } from '../protocol/protocol-schema';
import type { SessionEventLike, StepRun } from './dose-record';

/**
 * The session's safety rules that both sides read: the server refuses a tap by them, the clock
 * shows the same rule before the tap is made. One function per rule; no I/O.
 */

/** UV starts on a stroma read at or above the protocol's minimum, or with a clinician's authorised override. */
export function uvStartVerdict(
  minimumUm: number | null,
  lastReadingUm: number | null,
  authorisedOverride: boolean,
): { allowed: true } | { allowed: false; lastReadingUm: number | null; minimumUm: number } {
  if (minimumUm === null || authorisedOverride) return { allowed: true };
  if (lastReadingUm !== null && lastReadingUm >= minimumUm) return { allowed: true };
  return { allowed: false, lastReadingUm, minimumUm };
}

/** Neither a session nor an infusion starts from a drug past its beyond-use time; an infusion never before the drug was made up. */
export function drugTimeVerdict(
  what: 'session' | 'infusion',
  atMs: number,
  preparation: { reconstitutedAt: string | null; beyondUseAt: string } | null,
): { allowed: true } | { allowed: false; rule: 'beyond_use' | 'before_reconstitution' } {
  if (preparation === null) return { allowed: true };
  if (atMs > Date.parse(preparation.beyondUseAt)) return { allowed: false, rule: 'beyond_use' };
  if (
    what === 'infusion' &&
    preparation.reconstitutedAt !== null &&
    atMs < Date.parse(preparation.reconstitutedAt)
  )
    return { allowed: false, rule: 'before_reconstitution' };
  return { allowed: true };
}

/**
 * The volume the pump shows is recorded at an extravasation, and at a PDT stop once the infusion
 * has started (unless an extravasation recorded it already).
 */
export function volumeInfusedRequired(
  type: 'extravasation' | 'session-stopped',
  facts: { infusionStarted: boolean; volumeKnown: boolean },
): boolean {
  return type === 'extravasation' || (facts.infusionStarted && !facts.volumeKnown);
}

/** A PDT session whose light step ran completes only once the laser's displayed exposure is entered. */
export function exposureMissing(facts: {
  lightStarted: boolean;
  lightRunning: boolean;
  exposureEntered: boolean;
}): boolean {
  return facts.lightStarted && !facts.lightRunning && !facts.exposureEntered;
}

/** Steps that start only once patient identity (name, date of birth) and eye were confirmed again. */
export const identityConfirmedBefore: ReadonlySet<StepKind> = new Set(['light', 'uv']);

/** True when `step` is a light or UV step and no identity confirmation for it is timed at or before `atMs`. */
export function identityConfirmationMissing(
  step: Pick<ProtocolStep, 'id' | 'kind'>,
  atMs: number,
  kept: readonly SessionEventLike[],
): boolean {
  if (!identityConfirmedBefore.has(step.kind)) return false;
  return !kept.some(
    (e) =>
      e.type === 'identity-confirmed' && e.stepId === step.id && Date.parse(e.clientTime) <= atMs,
  );
}

/**
 * How far short of its time a timed dose step may end without a reason: the protocol's own
 * tolerance for what that step gives (soak and infusion in minutes, light and UV in seconds). Steps
 * that give no dose (a wait, a check) have none.
 */
function shortfallAllowedS(
  kind: StepKind,
  tolerances: ProtocolVersion['tolerances'],
): number | null {
  switch (kind) {
    case 'soak':
      return (tolerances.soakShortfallMin ?? 0) * 60;
    case 'infusion':
      return (tolerances.infusionDurationMin ?? 0) * 60;
    case 'light':
    case 'uv':
      return tolerances.exposureS;
    default:
      return null;
  }
}

/** A timed dose step ended after `ranS` of running time: short when below its time less the tolerance (to the whole second, as the clock shows it). */
export function shortEndVerdict(
  step: Pick<ProtocolStep, 'kind' | 'durationS'>,
  tolerances: ProtocolVersion['tolerances'],
  ranS: number,
): { short: false } | { short: true; shortestS: number; durationS: number } {
  const allowedS = shortfallAllowedS(step.kind, tolerances);
  if (step.durationS === null || allowedS === null) return { short: false };
  const shortestS = step.durationS - allowedS;
  return Math.round(ranS) < shortestS
    ? { short: true, shortestS, durationS: step.durationS }
    : { short: false };
}

/**
 * Where a late entry (a missed tap entered afterwards at its real time) may fall in its step:
 * a drop or reading inside a run of the step; an end after the start of a step still running; a
 * start after every start or end of any step already on record, while the step is not running.
 */
export function lateEntryPlaceVerdict(
  entry: { type: string; atMs: number },
  facts: {
    runs: readonly StepRun[];
    /** The latest start or end of any step on record, in ms. */
    lastBoundaryMs: number | null;
  },
): { allowed: true } | { allowed: false; why: string } {
  const last = facts.runs[facts.runs.length - 1];
  const open = last !== undefined && last.endMs === null;
  switch (entry.type) {
    case 'drop-given':
    case 'thickness-measured':
      return facts.runs.some(
        (run) => run.startMs <= entry.atMs && (run.endMs === null || entry.atMs <= run.endMs),
      )
        ? { allowed: true }
        : { allowed: false, why: 'must lie while its step ran (after its start, before its end)' };
    case 'step-ended':
      return open && last.startMs < entry.atMs
        ? { allowed: true }
        : { allowed: false, why: 'must be after the start of a step that is still running' };
    case 'step-started':
      if (open) return { allowed: false, why: 'must name a step that is not running' };
      return facts.lastBoundaryMs === null || entry.atMs > facts.lastBoundaryMs
        ? { allowed: true }
        : {
            allowed: false,
            why: `must be after the last step start or end on record (${new Date(facts.lastBoundaryMs).toISOString()})`,
          };
    default:
      return {
        allowed: false,
        why: 'is entered late only as a step start or end, a drop or a thickness reading',
      };
  }
}
