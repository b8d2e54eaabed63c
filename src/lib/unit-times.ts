import { DateTime } from 'luxon';
import { unitTimeZone } from '../config/unit-time-zone';

/** A stored instant as the unit's wall clock, e.g. "7 Nov 2026, 10:05". */
export function formatUnitDateTime(iso: string | null | undefined): string {
  if (!iso) return '—';
  const at = DateTime.fromISO(iso, { setZone: true });
  return at.isValid ? at.setZone(unitTimeZone).setLocale('en-GB').toFormat('d LLL yyyy, HH:mm') : iso;
}

/** The unit's calendar date of an instant, e.g. "7 Nov 2026". */
export function formatUnitDate(iso: string | null | undefined): string {
  if (!iso) return '—';
  const at = DateTime.fromISO(iso, { setZone: true });
  return at.isValid ? at.setZone(unitTimeZone).setLocale('en-GB').toFormat('d LLL yyyy') : iso;
}

/** The unit's wall-clock time to the second, e.g. "10:24:00". */
export function formatUnitClock(iso: string | null | undefined): string {
  if (!iso) return '—';
  const at = DateTime.fromISO(iso, { setZone: true });
  return at.isValid ? at.setZone(unitTimeZone).toFormat('HH:mm:ss') : iso;
}

/** Seconds after a start as "+15:00", or "+1:02:05" past an hour. */
export function formatOffset(seconds: number): string {
  const sign = seconds < 0 ? '−' : '+';
  const whole = Math.round(Math.abs(seconds));
  const h = Math.floor(whole / 3600);
  const m = Math.floor((whole % 3600) / 60);
  const s = whole % 60;
  const mmss = `${String(m).padStart(2, '0')}:${String(s).padStart(2, '0')}`;
  return h > 0 ? `${sign}${h}:${mmss}` : `${sign}${mmss}`;
}

/** A duration in seconds as "10 min", "1 min 23 s" or "45 s". */
export function formatDurationS(seconds: number | null | undefined): string {
  if (seconds === null || seconds === undefined) return '—';
  const whole = Math.round(seconds);
  const m = Math.floor(whole / 60);
  const s = whole % 60;
  if (m === 0) return `${s} s`;
  return s === 0 ? `${m} min` : `${m} min ${s} s`;
}

/** A figure with its unit, rounded for reading (the stored figure keeps its precision). */
export function formatFigure(value: number | null | undefined, unit: string | null | undefined, digits = 2): string {
  if (value === null || value === undefined) return '—';
  const text = Number.isInteger(value) ? String(value) : String(Number(value.toFixed(digits)));
  return unit ? `${text} ${unit}` : text;
}
