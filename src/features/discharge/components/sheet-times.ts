import { DateTime } from 'luxon';
import {
  formatCalendarDate,
  formatDuration,
  formatQuantity,
  formatUnitTime,
  zoneAbbreviation,
} from '../../../../shared/format/figures';

/**
 * Times on the sheet are the unit's wall clock in the zone the server named, with the zone's
 * short name (WET, WEST…) because a patient may read it after the clocks have changed; dates are
 * in the unit's locale (shared/format/figures.ts).
 */
function inZone(iso: string, zone: string): DateTime | null {
  const at = DateTime.fromISO(iso, { zone: 'utc' }).setZone(zone);
  return at.isValid ? at : null;
}

/** "10:06 WET" */
export function clockText(iso: string, zone: string): string {
  return formatUnitTime(iso, zone, 'short');
}

/** "Thursday 26 November 2026" */
export function dayText(iso: string, zone: string): string {
  return formatUnitTime(iso, zone, 'day');
}

/** "Thursday 26 November 2026, 10:06 WET" */
export function dayAndClockText(iso: string, zone: string): string {
  return formatUnitTime(iso, zone, 'sheet');
}

/** "10:06 to 10:16 WET", or with both days when the span crosses midnight. */
export function spanText(fromIso: string, toIso: string | null, zone: string): string {
  const from = inZone(fromIso, zone);
  const to = toIso ? inZone(toIso, zone) : null;
  if (!from) return fromIso;
  const zoned = (at: DateTime, format: string) => `${at.toFormat(format)} ${zoneAbbreviation(at)}`;
  if (!to) return `from ${zoned(from, 'HH:mm')}`;
  if (!from.hasSame(to, 'day'))
    return `${formatUnitTime(fromIso, zone, 'record')} to ${formatUnitTime(toIso, zone, 'record')}`;
  return zoneAbbreviation(from) === zoneAbbreviation(to)
    ? `${from.toFormat('HH:mm')} to ${zoned(to, 'HH:mm')}`
    : `${zoned(from, 'HH:mm')} to ${zoned(to, 'HH:mm')}`;
}

/** A calendar date (YYYY-MM-DD) in the unit's figures, e.g. "21/07/1961", as on the wristband. */
export function birthDateText(date: string): string {
  return formatCalendarDate(date);
}

/** "10 min", "59 s", "1 min 23 s": a duration as a patient reads it. */
export function durationText(seconds: number): string {
  return formatDuration(seconds, 'words');
}

/** "83 s", "12.5 J/cm²": no thousands separator. */
export function figureText(value: number, unit: string): string {
  return formatQuantity(value, unit);
}
