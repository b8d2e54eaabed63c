import { DateTime } from 'luxon';
import { unitTimeZone } from '../../../config/unit-time-zone';

/** A stored UTC instant as the unit's wall-clock date and time, e.g. "14 Mar 2026, 09:05". */
export function formatUnitDateTime(iso: string): string {
  const at = DateTime.fromISO(iso, { zone: 'utc' });
  return at.isValid ? at.setZone(unitTimeZone).setLocale('en-GB').toFormat('d LLL yyyy, HH:mm') : iso;
}

/** A calendar date (YYYY-MM-DD) written out, e.g. "21 Jul 1961". */
export function formatCalendarDate(date: string): string {
  const day = DateTime.fromISO(date, { zone: unitTimeZone });
  return day.isValid ? day.setLocale('en-GB').toFormat('d LLL yyyy') : date;
}

/** A stored UTC instant as the unit's wall-clock time to the second, e.g. "10:21:00". */
export function formatUnitClock(iso: string): string {
  const at = DateTime.fromISO(iso, { zone: 'utc' });
  return at.isValid ? at.setZone(unitTimeZone).toFormat('HH:mm:ss') : iso;
}
