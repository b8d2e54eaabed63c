import { formatUnitTime } from '../../shared/format/figures';

/**
 * One CSV field (RFC 4180): quoted when it holds a comma, quote or line break, quotes doubled.
 * Text that a spreadsheet would run as a formula (=, +, -, @ at the start) gets a leading
 * apostrophe; numbers are written as numbers.
 */
export function csvField(value: unknown): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  let text = String(value);
  if (/^[=+\-@\t\r]/.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
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
