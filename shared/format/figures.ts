import { DateTime, Duration } from 'luxon';
import { currentUnitLocale } from './unit-locale';

// The unit's locale lives in a module of its own, so that setting it at start-up does not load luxon.
export { currentUnitLocale, setUnitLocale } from './unit-locale';

/**
 * One formatter per kind of figure, so that the step clock, the records, the sheets, the e-mails
 * and the exports print the same figure the same way. No I/O; both sides import it.
 *
 * A figure that is missing, not a number, or (for a duration) negative prints as "—": a record
 * shows that something is absent rather than a made-up 0 or a thrown error on a printed sheet.
 */
export const noFigure = '—';

// No thousands separator: "3,800" reads as 3.8 in much of Europe, and "1,800 s" must not appear.
const plainNumbers = new Map<number, Intl.NumberFormat>();
function plain(maxDecimals: number): Intl.NumberFormat {
  let format = plainNumbers.get(maxDecimals);
  if (!format) {
    format = new Intl.NumberFormat('en-GB', {
      maximumFractionDigits: maxDecimals,
      useGrouping: false,
    });
    plainNumbers.set(maxDecimals, format);
  }
  return format;
}

/** A number as people write it: at most `maxDecimals` decimals, no trailing zeros, no grouping ("1800", "49.8"). */
export function formatPlainNumber(value: number | null | undefined, maxDecimals = 2): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return noFigure;
  return plain(maxDecimals).format(value);
}

/** A number with its unit: "1800 s", "12.5 J/cm²", "0.25 mL". An empty unit prints the number alone. */
export function formatQuantity(
  value: number | null | undefined,
  unit: string,
  maxDecimals = 2,
): string {
  const text = formatPlainNumber(value, maxDecimals);
  return text === noFigure || unit === '' ? text : `${text} ${unit}`;
}

/**
 * How a duration reads:
 * - 'clock': the step clock's digits, "00:59", "01:23", "30:00", "1:02:03";
 * - 'hours-clock': a beyond-use countdown, hours always shown, "04:00:00", "00:01:23";
 * - 'words': records, sheets and e-mails, "59 s", "1 min 23 s", "30 min", "1 h 2 min 3 s";
 * - 'seconds-and-words': a planned time that must be read both ways, "59 s", "83 s (1 min 23 s)",
 *   "1800 s (30 min)" (the seconds keep up to 2 decimals; the words are whole seconds);
 * - 'spoken': the step clock's words for a screen reader, "1 minute 23 seconds", "1 hour".
 */
export type DurationStyle = 'clock' | 'hours-clock' | 'words' | 'seconds-and-words' | 'spoken';

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

/** Whole seconds: 'nearest' for records; a count-down rounds 'up' and a count-up 'down' so neither runs ahead. */
export type SecondsRounding = 'nearest' | 'up' | 'down';

function wholeSeconds(seconds: number, rounding: SecondsRounding): number {
  // The small allowance keeps 59.9999999 (a difference of two clock readings) from losing a second.
  if (rounding === 'up') return Math.ceil(seconds - 1e-6);
  if (rounding === 'down') return Math.floor(seconds + 1e-6);
  return Math.round(seconds);
}

export interface DurationOptions {
  /** Whole seconds for the clock and the words; 'nearest' unless said. */
  rounding?: SecondsRounding;
  /** Decimals the seconds keep in 'seconds-and-words' (2 unless said; a plan keeps the protocol's digits). */
  maxDecimals?: number;
}

export function formatDuration(
  seconds: number | null | undefined,
  style: DurationStyle,
  { rounding = 'nearest', maxDecimals = 2 }: DurationOptions = {},
): string {
  if (seconds === null || seconds === undefined || !Number.isFinite(seconds) || seconds < 0)
    return noFigure;
  const whole = Math.max(0, wholeSeconds(seconds, rounding));
  const parts = Duration.fromObject({ seconds: whole }).shiftTo('hours', 'minutes', 'seconds');
  if (style === 'clock') return parts.toFormat(parts.hours > 0 ? 'h:mm:ss' : 'mm:ss');
  if (style === 'hours-clock') return parts.toFormat('hh:mm:ss');
  if (style === 'spoken') {
    const spoken = [
      parts.hours ? plural(parts.hours, 'hour') : '',
      parts.minutes ? plural(parts.minutes, 'minute') : '',
      parts.seconds || whole === 0 ? plural(parts.seconds, 'second') : '',
    ];
    return spoken.filter(Boolean).join(' ');
  }
  const words = [
    parts.hours ? `${parts.hours} h` : '',
    parts.minutes ? `${parts.minutes} min` : '',
    parts.seconds || whole === 0 ? `${parts.seconds} s` : '',
  ]
    .filter(Boolean)
    .join(' ');
  if (style === 'words') return words;
  const exact = formatQuantity(seconds, 's', maxDecimals);
  return whole < 60 ? exact : `${exact} (${words})`;
}

/**
 * A short English name for the zone at that instant. British English names the European
 * zones (WET, WEST, CET); US English names the American ones (EST, PDT); otherwise an offset
 * such as "GMT+9".
 */
export function zoneAbbreviation(at: DateTime): string {
  // Asking Intl for a zone's name is slow (milliseconds), and lists and records print many
  // times: the name is kept per zone, year and offset, which fix it.
  const key = `${at.zoneName}|${at.year}|${at.offset}`;
  let name = zoneNames.get(key);
  if (name === undefined) {
    const british = at.setLocale('en-GB').toFormat('ZZZZ');
    const american = /^(GMT|UTC)[+−-]/.test(british) ? at.setLocale('en-US').toFormat('ZZZZ') : '';
    name = american === '' || /^(GMT|UTC)[+−-]/.test(american) ? british : american;
    if (zoneNames.size > 1000) zoneNames.clear();
    zoneNames.set(key, name);
  }
  return name;
}
const zoneNames = new Map<string, string>();

/**
 * How a moment on the unit's clock reads, in the unit's locale; every style but 'day' and
 * 'date' carries the zone's short name, because a patient may read the sheet, and a colleague
 * the record, after the clocks have changed. In the demo unit's en-GB:
 * - 'sheet': "Thursday 3 December 2026, 14:05 WET" (discharge sheet, e-mails, refusals);
 * - 'record': "03/12/2026, 14:05 WET" (screens, lists and the printed dose record);
 * - 'short': "14:05 WET";
 * - 'clock': "14:05:09 WET", to the second (taps and events in a record);
 * - 'day': "Thursday 3 December 2026";
 * - 'date': "03/12/2026";
 * - 'iso': "2026-12-03T14:05:09.000+00:00", ISO 8601 with the zone's offset (CSV exports).
 */
export type UnitTimeStyle = 'sheet' | 'record' | 'short' | 'clock' | 'day' | 'date' | 'iso';

/**
 * How a calendar day is written: in the locale's figures ('date', "03/12/2026" in en-GB), or in
 * words ('day', "Thursday 3 December 2026": day before month whatever the locale, so no reader
 * mistakes it, with the locale's names; a fixed pattern, so every ICU writes it alike).
 */
function dayText(at: DateTime, style: 'date' | 'day'): string {
  const local = at.setLocale(currentUnitLocale());
  return style === 'date'
    ? local.toLocaleString(DateTime.DATE_SHORT)
    : local.toFormat('cccc d LLLL yyyy');
}

/** A stored instant (ISO 8601) on the clock of the unit's IANA zone; an unreadable instant prints as given. */
export function formatUnitTime(
  iso: string | null | undefined,
  zone: string,
  style: UnitTimeStyle,
): string {
  if (!iso) return noFigure;
  const at = DateTime.fromISO(iso, { zone: 'utc' }).setZone(zone);
  if (!at.isValid) return iso;
  if (style === 'iso') return at.toISO({ suppressMilliseconds: false, includeOffset: true });
  if (style === 'day' || style === 'date') return dayText(at, style);
  const time = `${at.toFormat(style === 'clock' ? 'HH:mm:ss' : 'HH:mm')} ${zoneAbbreviation(at)}`;
  if (style === 'short' || style === 'clock') return time;
  return `${dayText(at, style === 'sheet' ? 'day' : 'date')}, ${time}`;
}

/**
 * A calendar date that is not an instant (YYYY-MM-DD, such as a date of birth) in the unit's
 * locale, read against a wristband exactly as written: "14/03/1956" ('date') or
 * "Wednesday 14 March 1956" ('day'). An unreadable date prints as given.
 */
export function formatCalendarDate(
  isoDate: string | null | undefined,
  style: 'date' | 'day' = 'date',
): string {
  if (!isoDate) return noFigure;
  const at = DateTime.fromISO(isoDate.slice(0, 10), { zone: 'utc' });
  return at.isValid ? dayText(at, style) : isoDate;
}

/** A calendar month (YYYY-MM) in the unit's locale: "Nov 2026" ('short') or "November 2026". */
export function formatUnitMonth(month: string, style: 'short' | 'long' = 'short'): string {
  const at = DateTime.fromFormat(month, 'yyyy-MM', { zone: 'utc' });
  return at.isValid
    ? at
        .setLocale(currentUnitLocale())
        .toLocaleString({ month: style === 'short' ? 'short' : 'long', year: 'numeric' })
    : month;
}
