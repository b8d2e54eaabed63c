import type { ProtocolKind } from '../../../../shared/protocol/protocol-schema';
import { unitTimeZone } from '../../../config/unit-time-zone';
import type { VersionOrigin } from '../api/protocol-response-schemas';

/** Kinds in words, never by colour or abbreviation alone. */
export const kindLabels: Record<ProtocolKind, { short: string; long: string }> = {
  pdt: { short: 'PDT', long: 'Photodynamic therapy with verteporfin' },
  cxl: { short: 'CXL', long: 'Corneal cross-linking with riboflavin and UVA' },
};

export const originLabels: Record<VersionOrigin, string> = {
  shipped: 'Shipped with Luxtempo (demo unit)',
  imported: 'Imported from a file',
  cloned: 'Drafted from an earlier version',
};

const dateTime = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
  timeZone: unitTimeZone,
  timeZoneName: 'short',
});
const dateOnly = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });

/** A stored UTC instant shown on the unit's clock, with the zone named. */
export function formatDateTime(iso: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : dateTime.format(date);
}

/** A calendar date (YYYY-MM-DD) with no time of day. */
export function formatDate(isoDate: string): string {
  const date = new Date(`${isoDate}T00:00:00Z`);
  return Number.isNaN(date.getTime()) ? isoDate : dateOnly.format(date);
}

const plainNumber = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 10, useGrouping: false });

/** Protocol figures are shown exactly as stored: no rounding, no grouping. */
export function formatFigure(value: number): string {
  return plainNumber.format(value);
}

/** Seconds with minutes beside them when that reads more easily ("600 s (10 min)"). */
export function formatDurationS(seconds: number): string {
  if (seconds < 120) return `${formatFigure(seconds)} s`;
  const minutes = seconds / 60;
  const minutesText = Number.isInteger(minutes) ? `${minutes} min` : `${Math.floor(minutes)} min ${formatFigure(seconds - Math.floor(minutes) * 60)} s`;
  return `${formatFigure(seconds)} s (${minutesText})`;
}

/** The first 12 hexadecimal digits identify a version to a person; the full value is one click away. */
export function shortSha256(sha256: string): string {
  return `${sha256.slice(0, 12)}…`;
}
