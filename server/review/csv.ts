import { formatUnitTime } from '../../shared/format/figures';
import { exportNumber, roundForReading, type ReadingKind } from '../../shared/format/precision';

/**
 * One CSV field (RFC 4180): quoted when it holds a comma, quote or line break, quotes doubled.
 * Text that a spreadsheet would run as a formula (=, +, -, @ at the start) gets a leading
 * apostrophe; numbers are written as numbers, without binary noise (0.02, never
 * 0.020000000000000004: shared/format/precision).
 */
export function csvField(value: unknown): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return exportNumber(value);
  let text = String(value);
  if (/^[=+\-@\t\r]/.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** A stored figure (a DECIMAL column comes back as a string) at the precision it is read at. */
export function csvReading(kind: ReadingKind, value: unknown): number | null {
  if (value === null || value === undefined || value === '') return null;
  return roundForReading(kind, Number(value));
}

export function csvLine(values: unknown[]): string {
  return `${values.map(csvField).join(',')}\r\n`;
}

/** ISO 8601 with the unit's offset, e.g. 2026-11-20T10:05:00.000+00:00. */
export function isoInZone(value: Date | string | null, zone: string): string | null {
  if (value === null) return null;
  const date =
    value instanceof Date
      ? value
      : new Date(
          value.includes('T') || value.endsWith('Z') ? value : `${value.replace(' ', 'T')}Z`,
        );
  return Number.isNaN(date.getTime()) ? null : formatUnitTime(date.toISOString(), zone, 'iso');
}
