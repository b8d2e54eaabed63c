import { DateTime } from 'luxon';
import { unitTimeZone } from '../../../config/unit-time-zone';

/** A calendar date (YYYY-MM-DD, no time zone) written out, e.g. "21 Jul 1961". */
export function formatCalendarDate(date: string): string {
  const day = DateTime.fromISO(date, { zone: unitTimeZone });
  return day.isValid ? day.setLocale('en-GB').toFormat('d LLL yyyy') : date;
}

/** Whole years of age today in the unit's time zone. */
export function ageInYears(dateOfBirth: string): number | null {
  const born = DateTime.fromISO(dateOfBirth, { zone: unitTimeZone });
  if (!born.isValid) return null;
  return Math.floor(DateTime.now().setZone(unitTimeZone).diff(born, 'years').years);
}
