import type { FollowUpPlan } from '../protocol/protocol-schema';
import { letterChangeFromLogMarChange } from './visual-acuity';
import { wilsonInterval, type ShareWithInterval } from './proportions';

/** What one treated eye's follow-up says about the protocol's outcome. */
export type EyeOutcome =
  /** The outcome visit was recorded and the outcome reached. */
  | 'reached'
  | 'not-reached'
  /** The outcome visit was missed: past its due date and window without a record. */
  | 'lost-to-follow-up'
  /** The outcome visit is not yet past its window. */
  | 'pending'
  /** Recorded, but a figure the outcome needs (e.g. the baseline Kmax) is missing. */
  | 'not-assessable';

export interface VisitFacts {
  visitKey: string;
  recorded: boolean;
  dueOn: string;
  windowDays: number;
  acuityLogMar: number | null;
  subretinalFluid: 'present' | 'resolved' | null;
  kmaxD: number | null;
}

function lastDayOf(visit: VisitFacts): string {
  const date = new Date(`${visit.dueOn}T00:00:00Z`);
  date.setUTCDate(date.getUTCDate() + visit.windowDays);
  return date.toISOString().slice(0, 10);
}

/**
 * One eye's outcome under the protocol's definition: subretinal fluid resolved at the outcome
 * visit (PDT), or a Kmax increase from baseline below the protocol's limit (CXL; 1 D at 12
 * months, common practice). An eye whose outcome visit has passed its window unrecorded is
 * lost to follow-up — counted and shown, never dropped.
 */
export function eyeOutcome(
  outcome: FollowUpPlan['outcome'],
  visits: VisitFacts[],
  today: string,
): { outcome: EyeOutcome; acuityChangeLogMar: number | null; kmaxChangeD: number | null } {
  const at = visits.find((v) => v.visitKey === outcome.visitId);
  const baseline = visits.find((v) => v.visitKey === (outcome.baselineVisitId ?? 'baseline'));
  const none = { acuityChangeLogMar: null, kmaxChangeD: null };
  if (!at) return { outcome: 'not-assessable', ...none };
  if (!at.recorded)
    return { outcome: today > lastDayOf(at) ? 'lost-to-follow-up' : 'pending', ...none };
  const acuityChangeLogMar =
    baseline?.recorded && baseline.acuityLogMar !== null && at.acuityLogMar !== null
      ? Math.round((at.acuityLogMar - baseline.acuityLogMar) * 100) / 100
      : null;
  if (outcome.measure === 'subretinal-fluid-resolved') {
    if (at.subretinalFluid === null)
      return { outcome: 'not-assessable', acuityChangeLogMar, kmaxChangeD: null };
    return {
      outcome: at.subretinalFluid === 'resolved' ? 'reached' : 'not-reached',
      acuityChangeLogMar,
      kmaxChangeD: null,
    };
  }
  if (
    !baseline?.recorded ||
    baseline.kmaxD === null ||
    at.kmaxD === null ||
    outcome.maxIncreaseD === null
  )
    return { outcome: 'not-assessable', acuityChangeLogMar, kmaxChangeD: null };
  const kmaxChangeD = Math.round((at.kmaxD - baseline.kmaxD) * 100) / 100;
  return {
    outcome: kmaxChangeD < outcome.maxIncreaseD ? 'reached' : 'not-reached',
    acuityChangeLogMar,
    kmaxChangeD,
  };
}

export interface OutcomeSummary {
  treatedEyes: number;
  reached: number;
  notReached: number;
  lostToFollowUp: number;
  pending: number;
  notAssessable: number;
  /** Reached among eyes assessed at the outcome visit, with its Wilson 95 % interval. */
  share: ShareWithInterval;
  /** The worst case: every eye lost to follow-up counted as not reaching the outcome. */
  shareIfLostFailed: ShareWithInterval;
  /** Mean change from baseline at the outcome visit (negative logMAR = better), and its eyes. */
  meanAcuityChangeLogMar: number | null;
  meanAcuityChangeLetters: number | null;
  acuityPairs: number;
  eyesWithComplication: number;
  complicationRate: ShareWithInterval;
}

/** Sums eyes' outcomes into the figures the auditor reads. */
export function summariseOutcomes(
  eyes: { outcome: EyeOutcome; acuityChangeLogMar: number | null; complications: number }[],
): OutcomeSummary {
  const count = (o: EyeOutcome) => eyes.filter((e) => e.outcome === o).length;
  const reached = count('reached');
  const notReached = count('not-reached');
  const lost = count('lost-to-follow-up');
  const changes = eyes.map((e) => e.acuityChangeLogMar).filter((c): c is number => c !== null);
  const mean = changes.length ? changes.reduce((a, b) => a + b, 0) / changes.length : null;
  const withComplication = eyes.filter((e) => e.complications > 0).length;
  return {
    treatedEyes: eyes.length,
    reached,
    notReached,
    lostToFollowUp: lost,
    pending: count('pending'),
    notAssessable: count('not-assessable'),
    share: wilsonInterval(reached, reached + notReached),
    shareIfLostFailed: wilsonInterval(reached, reached + notReached + lost),
    meanAcuityChangeLogMar: mean === null ? null : Math.round(mean * 1000) / 1000,
    meanAcuityChangeLetters:
      mean === null ? null : Math.round(letterChangeFromLogMarChange(mean) * 10) / 10,
    acuityPairs: changes.length,
    eyesWithComplication: withComplication,
    complicationRate: wilsonInterval(withComplication, eyes.length),
  };
}
