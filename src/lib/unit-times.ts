import { DateTime } from 'luxon';
import { formatDuration, formatQuantity } from '../../shared/format/figures';
import { unitTimeZone } from '../config/unit-time-zone';

/** A stored instant as the unit's wall clock, e.g. "7 Nov 2026, 10:05". */
export function formatUnitDateTime(iso: string | null | undefined): string {
  if (!iso) return '—';
  const at = DateTime.fromISO(iso, { setZone: true });
  return at.isValid
    ? at.setZone(unitTimeZone).setLocale('en-GB').toFormat('d LLL yyyy, HH:mm')
    : iso;
}

/** The unit's calendar date of an instant, e.g. "7 Nov 2026". */
export function formatUnitDate(iso: string | null | undefined): string {
  if (!iso) return '—';
  const at = DateTime.fromISO(iso, { setZone: true });
  return at.isValid ? at.setZone(unitTimeZone).setLocale('en-GB').toFormat('d LLL yyyy') : iso;
}

/**
 * The unit's way of writing a calendar date in figures (the demo unit writes day/month/year), for
 * a date that is not an instant: a date of birth is read against a wristband exactly as written.
 */
export const unitDateFigures = 'dd/MM/yyyy';

/** A calendar date (YYYY-MM-DD) in the unit's figures, e.g. "14/03/1956". */
export function formatCalendarFigures(date: string | null | undefined): string {
  if (!date) return '—';
  const day = DateTime.fromISO(date, { zone: 'utc' });
  return day.isValid ? day.toFormat(unitDateFigures) : date;
}

/** The unit's wall-clock time to the second, e.g. "10:24:00". */
export function formatUnitClock(iso: string | null | undefined): string {
  if (!iso) return '—';
  const at = DateTime.fromISO(iso, { setZone: true });
  return at.isValid ? at.setZone(unitTimeZone).toFormat('HH:mm:ss') : iso;
}

/** Seconds after a start as "+15:00", or "+1:02:05" past an hour. */
export function formatOffset(seconds: number): string {
  return `${seconds < 0 ? '−' : '+'}${formatDuration(Math.abs(seconds), 'clock')}`;
}

/** A duration in seconds as "10 min", "1 min 23 s", "45 s" or "1 h 5 min". */
export function formatDurationS(seconds: number | null | undefined): string {
  return formatDuration(seconds, 'words');
}

/** A figure with its unit, rounded for reading (the stored figure keeps its precision). */
export function formatFigure(
  value: number | null | undefined,
  unit: string | null | undefined,
  digits = 2,
): string {
  return formatQuantity(value, unit ?? '', digits);
}
