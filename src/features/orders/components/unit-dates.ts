import { DateTime } from 'luxon';
import { unitTimeZone } from '../../../config/unit-time-zone';

/** A calendar date (YYYY-MM-DD) written out, e.g. "21 Jul 1961". */
export function formatCalendarDate(date: string): string {
  const day = DateTime.fromISO(date, { zone: unitTimeZone });
  return day.isValid ? day.setLocale('en-GB').toFormat('d LLL yyyy') : date;
}
