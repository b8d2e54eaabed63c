import { DateTime } from 'luxon';
import { formatUnitMonth } from '../../../../shared/format/figures';

/** "2026-11" as "Nov 2026", in the unit's locale. */
export function monthWords(month: string, style: 'short' | 'long' = 'short'): string {
  return formatUnitMonth(month, style);
}

/** Every month from `first` to `last` inclusive, as YYYY-MM (at most 120, so a typo cannot hang the page). */
export function monthsBetween(first: string, last: string): string[] {
  const out: string[] = [];
  let at = DateTime.fromFormat(first, 'yyyy-MM');
  const end = DateTime.fromFormat(last, 'yyyy-MM');
  if (!at.isValid || !end.isValid) return out;
  while (at <= end && out.length < 120) {
    out.push(at.toFormat('yyyy-MM'));
    at = at.plus({ months: 1 });
  }
  return out;
}

export function formatRate(ratePct: number): string {
  return `${Number.isInteger(ratePct) ? ratePct : ratePct.toFixed(1)} %`;
}
