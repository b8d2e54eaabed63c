import {
  formatPlainNumber,
  formatQuantity,
  formatUnitTime,
} from '../../../../shared/format/figures';
import type { Eye } from '../../../../shared/schemas/patients';
import { unitTimeZone } from '../../../config/unit-time-zone';

export const eyeWords: Record<Eye, string> = { right: 'Right eye', left: 'Left eye' };

export function patientName(patient: { givenName: string; familyName: string }): string {
  return `${patient.familyName}, ${patient.givenName}`;
}

/** A number as the plan would print it: no trailing zeros, a point for decimals. */
export function numberText(value: number, maxDecimals = 6): string {
  return formatPlainNumber(value, maxDecimals);
}

export function quantity(value: number | null | undefined, unit: string, maxDecimals = 6): string {
  return formatQuantity(value, unit, maxDecimals);
}

/** A date and time on the unit's clock, e.g. "1 Dec 2026, 14:05 WET". */
export function unitDateTime(iso: string): string {
  return formatUnitTime(iso, unitTimeZone, 'record');
}

export function unitTime(iso: string): string {
  return formatUnitTime(iso, unitTimeZone, 'short');
}

/** "14:05 WET" when the time falls on the same day on the unit's clock as `nowMs`, else with its date. */
export function unitTimeNear(iso: string, nowMs: number): string {
  const sameDay =
    formatUnitTime(iso, unitTimeZone, 'date') ===
    formatUnitTime(new Date(nowMs).toISOString(), unitTimeZone, 'date');
  return formatUnitTime(iso, unitTimeZone, sameDay ? 'short' : 'record');
}
