import { DateTime } from 'luxon';
import {
  currentUnitLocale,
  formatDuration,
  formatQuantity,
  formatUnitTime,
} from '../../shared/format/figures';
import { unitTimeZone } from '../config/unit-time-zone';

/**
 * A calendar date that is not an instant (a date of birth, a vial's expiry) in the unit's locale:
 * "14/03/1956" for the demo unit. The one formatter is shared/format/figures.ts's.
 */
export { formatCalendarDate } from '../../shared/format/figures';

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

/** The pattern a person types a date in for the unit's locale: "DD/MM/YYYY" for en-GB. */
export function unitDatePattern(): string {
  const parts = new Intl.DateTimeFormat(currentUnitLocale(), {
    day: '2-digit',
    month: '2-digit',
    year: 'numeric',
  }).formatToParts(new Date(Date.UTC(2001, 10, 22)));
  return parts
    .map((part) =>
      part.type === 'day'
        ? 'DD'
        : part.type === 'month'
          ? 'MM'
          : part.type === 'year'
            ? 'YYYY'
            : part.value,
    )
    .join('');
}

/**
 * A date typed in the unit's pattern as YYYY-MM-DD, or null when it is not a real date.
 * Accepts one- or two-digit days and months and any of / . - as the separator.
 */
export function parseUnitDate(text: string): string | null {
  const trimmed = text.trim();
  if (/^\d{4}-\d{2}-\d{2}$/.test(trimmed)) {
    return DateTime.fromISO(trimmed).isValid ? trimmed : null;
  }
  const numbers = trimmed.split(/[/.\-\s]+/);
  if (numbers.length !== 3 || numbers.some((n) => !/^\d+$/.test(n))) return null;
  const order = unitDatePattern()
    .split(/[^DMY]+/)
    .filter(Boolean);
  const byPart: Record<string, number> = {};
  order.forEach((part, index) => (byPart[part] = Number(numbers[index])));
  const year = byPart.YYYY ?? NaN;
  if (String(numbers[order.indexOf('YYYY')]).length !== 4) return null;
  const date = DateTime.fromObject({ year, month: byPart.MM, day: byPart.DD }, { zone: 'utc' });
  return date.isValid ? date.toISODate() : null;
}
