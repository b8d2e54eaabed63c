import { formatDuration, formatQuantity, formatUnitTime } from '../../shared/format/figures';
import { unitTimeZone } from '../config/unit-time-zone';

/** A stored instant as the unit's wall clock with the zone's short name, e.g. "7 Nov 2026, 10:05 WET". */
export function formatUnitDateTime(iso: string | null | undefined): string {
  return formatUnitTime(iso, unitTimeZone, 'record');
}

/** The unit's calendar date of an instant, e.g. "7 Nov 2026". */
export function formatUnitDate(iso: string | null | undefined): string {
  return formatUnitTime(iso, unitTimeZone, 'date');
}

/** The unit's wall-clock time to the second with the zone's short name, e.g. "10:24:00 WET". */
export function formatUnitClock(iso: string | null | undefined): string {
  return formatUnitTime(iso, unitTimeZone, 'clock');
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
