import { DateTime } from 'luxon';

/**
 * Times on the sheet are the unit's wall clock in the zone the server named, with the zone's
 * short name (WET, WEST…) because a patient may read it after the clocks have changed.
 */
function inZone(iso: string, zone: string): DateTime | null {
  const at = DateTime.fromISO(iso, { zone: 'utc' }).setZone(zone).setLocale('en-GB');
  return at.isValid ? at : null;
}

/** "10:06 WET" */
export function clockText(iso: string, zone: string): string {
  return inZone(iso, zone)?.toFormat('HH:mm ZZZZ') ?? iso;
}

/** "Thursday 26 November 2026" */
export function dayText(iso: string, zone: string): string {
  return inZone(iso, zone)?.toFormat('cccc d LLLL yyyy') ?? iso;
}

/** "Thursday 26 November 2026, 10:06 WET" */
export function dayAndClockText(iso: string, zone: string): string {
  return inZone(iso, zone)?.toFormat('cccc d LLLL yyyy, HH:mm ZZZZ') ?? iso;
}

/** "10:06 to 10:16 WET", or with both days when the span crosses midnight. */
export function spanText(fromIso: string, toIso: string | null, zone: string): string {
  const from = inZone(fromIso, zone);
  const to = toIso ? inZone(toIso, zone) : null;
  if (!from) return fromIso;
  if (!to) return `from ${from.toFormat('HH:mm ZZZZ')}`;
  if (!from.hasSame(to, 'day')) return `${from.toFormat('d LLL HH:mm ZZZZ')} to ${to.toFormat('d LLL HH:mm ZZZZ')}`;
  return from.toFormat('ZZZZ') === to.toFormat('ZZZZ') ? `${from.toFormat('HH:mm')} to ${to.toFormat('HH:mm ZZZZ')}` : `${from.toFormat('HH:mm ZZZZ')} to ${to.toFormat('HH:mm ZZZZ')}`;
}

/** A calendar date (YYYY-MM-DD), e.g. "21 July 1961". */
export function birthDateText(date: string): string {
  const day = DateTime.fromISO(date, { zone: 'utc' }).setLocale('en-GB');
  return day.isValid ? day.toFormat('d LLLL yyyy') : date;
}

/** "10 min", "83 s", "1 min 23 s": a duration as a patient reads it. */
export function durationText(seconds: number): string {
  const whole = Math.round(seconds);
  if (whole < 60) return `${whole} s`;
  const h = Math.floor(whole / 3600);
  const min = Math.floor((whole % 3600) / 60);
  const s = whole % 60;
  return [h ? `${h} h` : '', min ? `${min} min` : '', s ? `${s} s` : ''].filter(Boolean).join(' ');
}

// No thousands separator: "3,800" reads as 3.8 in much of Europe.
const plain = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 2, useGrouping: false });

export function figureText(value: number, unit: string): string {
  return `${plain.format(value)} ${unit}`;
}
