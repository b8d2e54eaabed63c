import { DateTime } from 'luxon';
import type { Eye } from '../../../../shared/schemas/patients';
import { unitTimeZone } from '../../../config/unit-time-zone';

export const eyeWords: Record<Eye, string> = { right: 'Right eye', left: 'Left eye' };

export function patientName(patient: { givenName: string; familyName: string }): string {
  return `${patient.familyName}, ${patient.givenName}`;
}

/** A number as the plan would print it: no trailing zeros, a point for decimals. */
export function numberText(value: number, maxDecimals = 6): string {
  return new Intl.NumberFormat('en-GB', {
    maximumFractionDigits: maxDecimals,
    useGrouping: false,
  }).format(value);
}

export function quantity(value: number | null | undefined, unit: string, maxDecimals = 6): string {
  if (value === null || value === undefined) return '—';
  return unit === '' ? numberText(value, maxDecimals) : `${numberText(value, maxDecimals)} ${unit}`;
}

/** A date and time on the unit's clock, e.g. "1 Dec 2026, 14:05". */
export function unitDateTime(iso: string): string {
  return DateTime.fromISO(iso, { zone: 'utc' }).setZone(unitTimeZone).toFormat('d LLL yyyy, HH:mm');
}

export function unitTime(iso: string): string {
  return DateTime.fromISO(iso, { zone: 'utc' }).setZone(unitTimeZone).toFormat('HH:mm');
}

/** "HH:mm" when the time falls on the same day on the unit's clock as `nowMs`, else with its date. */
export function unitTimeNear(iso: string, nowMs: number): string {
  const at = DateTime.fromISO(iso, { zone: 'utc' }).setZone(unitTimeZone);
  const now = DateTime.fromMillis(nowMs, { zone: unitTimeZone });
  return at.hasSame(now, 'day') ? at.toFormat('HH:mm') : at.toFormat('HH:mm, d LLL');
}
