import type { ProtocolVersion } from '../../shared/protocol/protocol-schema';
import { replaySession, runsRunningMs } from '../../shared/session/dose-record';
import type { SessionEvent, SessionEventInput } from '../../shared/session/session-events';
import {
  identityConfirmationMissing,
  lateEntryPlaceVerdict,
  shortEndVerdict,
} from '../../shared/session/session-rules';

/** A tap refused by one of the bedside rules; the service turns it into its refusal (and audit row). */
export interface BedsideRefusal {
  rule: string;
  message: string;
  field: { path: string; message: string };
  /** 400 for a time out of place (bad input), 422 for a safety rule. */
  status: 400 | 422;
}

const minutes = (s: number) => `${Math.round((s / 60) * 10) / 10} min`;
const secondsOrMinutes = (s: number) => (s >= 120 ? minutes(s) : `${Math.round(s)} s`);

/**
 * The rules of the tablet's moments that read the session's other taps (`kept`: stored, withdrawals
 * applied, the new tap left out): identity and eye again before the light or UV, a reason for
 * ending a timed dose step far short, and where a missed tap entered late may fall.
 */
export function bedsideRefusal(
  definition: ProtocolVersion,
  input: SessionEventInput,
  kept: readonly SessionEvent[],
): BedsideRefusal | null {
  const at = Date.parse(input.clientTime);
  const stepOf = (id: string) => definition.steps.find((step) => step.id === id);
  const replay = replaySession(definition, kept);

  if (input.lateEntryReason !== undefined && 'stepId' in input && replay.endedMs === null) {
    const boundaries = kept
      .filter((e) => e.type === 'step-started' || e.type === 'step-ended')
      .map((e) => Date.parse(e.clientTime));
    const verdict = lateEntryPlaceVerdict(
      { type: input.type, atMs: at },
      {
        runs: replay.runs.get(input.stepId) ?? [],
        lastBoundaryMs: boundaries.length > 0 ? Math.max(...boundaries) : null,
      },
    );
    if (!verdict.allowed)
      return {
        rule: 'late_entry_out_of_place',
        message: `A late ${input.type} of step ${input.stepId} cannot be timed there.`,
        field: { path: 'clientTime', message: `clientTime of a late ${input.type} ${verdict.why}` },
        status: 400,
      };
  }

  if (input.type === 'step-started') {
    const step = stepOf(input.stepId);
    if (step && identityConfirmationMissing(step, at, kept))
      return {
        rule: 'identity_not_confirmed',
        message: `Confirm the patient’s name, date of birth and the treatment eye before the ${step.kind === 'uv' ? 'UV' : 'light'} starts.`,
        field: {
          path: 'type',
          message: `an identity-confirmed event for step ${step.id} (patientName, dateOfBirth, treatmentEye) must precede its start`,
        },
        status: 422,
      };
  }

  // Ending a timed dose step far short of its time is a decision, said with a reason. Starting
  // another step ends the running one as well, so that path needs the step's own end first.
  const openId = replay.openStepId;
  const open = openId !== null ? stepOf(openId) : undefined;
  const ends =
    (input.type === 'step-ended' && input.stepId === openId) ||
    (input.type === 'step-started' && openId !== null && input.stepId !== openId);
  if (ends && open && openId !== null) {
    const ranS = runsRunningMs(replay.runs.get(openId) ?? [], at) / 1000;
    const verdict = shortEndVerdict(open, definition.tolerances, ranS);
    const reasonGiven = input.type === 'step-ended' && input.reason !== undefined;
    if (verdict.short && !reasonGiven)
      return {
        rule: 'short_end_reason_required',
        message: `The ${open.title} ran ${secondsOrMinutes(ranS)} of ${secondsOrMinutes(verdict.durationS)}; ending it this early needs a reason.`,
        field:
          input.type === 'step-ended'
            ? {
                path: 'reason',
                message: `reason (5 to 500 characters) is required to end step ${openId} before ${secondsOrMinutes(verdict.shortestS)} of running time`,
              }
            : {
                path: 'stepId',
                message: `step ${openId} is running and short of ${secondsOrMinutes(verdict.shortestS)}: end it with its own step-ended event and a reason before starting ${input.stepId}`,
              },
        status: 422,
      };
  }
  return null;
}
