import { formatNumber, roundToStep } from '../engine/rounding';
import { formatMeasureWithConversion, massToKg } from '../engine/units';
import type { WeightUnit } from '../schemas/calculation';
import type { RecordedMeasurement } from '../schemas/patients';

/** How far a weight may move from the last one recorded, and within how long, before a reason is asked. */
export interface WeightChangeRule {
  maxPct: number;
  withinDays: number;
}

/** A weight kept from a signed order: as typed, and in kg. */
export interface RecordedWeight {
  weight: { value: number; unit: WeightUnit };
  weightKg: number;
  /** ISO date-time the order carrying it was signed. */
  measuredAt: string;
}

/** The newest recorded weight among measurements listed newest first. */
export function lastRecordedWeight(
  measurements: readonly RecordedMeasurement[],
): RecordedWeight | null {
  const last = measurements.find((m) => m.weight !== null && m.weightKg !== null);
  return last?.weight && last.weightKg !== null
    ? { weight: last.weight, weightKg: last.weightKg, measuredAt: last.measuredAt }
    : null;
}

export interface WeightChange {
  last: RecordedWeight;
  current: { value: number; unit: WeightUnit };
  currentKg: number;
  /** Whole days between the last weight and now. */
  daysAgo: number;
  /** Signed change from the last weight, in percent of it. */
  changePct: number;
  rule: WeightChangeRule;
}

/**
 * The change from the patient's last recorded weight when it needs a reason: more than the rule's
 * percentage, the last weight less than the rule's days old. Null when no reason is needed.
 */
export function weightChangeNeedingReason(
  last: RecordedWeight | null,
  current: { value: number; unit: WeightUnit } | undefined,
  nowMs: number,
  rule: WeightChangeRule,
): WeightChange | null {
  if (last === null || current === undefined) return null;
  const currentKg = massToKg(current.value, current.unit);
  const ageMs = nowMs - Date.parse(last.measuredAt);
  if (!(ageMs < rule.withinDays * 86_400_000)) return null;
  const changePct = ((currentKg - last.weightKg) / last.weightKg) * 100;
  if (Math.abs(changePct) <= rule.maxPct + 1e-9) return null;
  return {
    last,
    current,
    currentKg,
    daysAgo: Math.max(0, Math.floor(ageMs / 86_400_000)),
    changePct,
    rule,
  };
}

/** What the clinician reads: both weights in both units, the change, and the rule it breaks. */
export function weightChangeMessage(change: WeightChange): string {
  const pct = formatNumber(roundToStep(Math.abs(change.changePct), 0.1));
  const when =
    change.daysAgo === 0
      ? 'today'
      : change.daysAgo === 1
        ? '1 day ago'
        : `${change.daysAgo} days ago`;
  return `the weight ${formatMeasureWithConversion(change.current)} is ${pct} % ${change.changePct < 0 ? 'less' : 'more'} than the ${formatMeasureWithConversion(change.last.weight)} recorded ${when} (more than ${formatNumber(change.rule.maxPct)} % within ${formatNumber(change.rule.withinDays)} days): check the weight and its unit, and give a reason (5 to 500 characters)`;
}
