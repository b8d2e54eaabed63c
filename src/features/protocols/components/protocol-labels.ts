import type { ProtocolKind } from '../../../../shared/protocol/protocol-schema';
import {
  formatDuration,
  formatPlainNumber,
  formatUnitTime,
} from '../../../../shared/format/figures';
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

/** A stored UTC instant shown on the unit's clock, with the zone's short name. */
export function formatDateTime(iso: string): string {
  return formatUnitTime(iso, unitTimeZone, 'record');
}

/** A calendar date (YYYY-MM-DD) with no time of day. */
export function formatDate(isoDate: string): string {
  const text = formatUnitTime(`${isoDate}T00:00:00Z`, 'UTC', 'date');
  return text.includes('T00:00:00Z') ? isoDate : text;
}

/** Protocol figures are shown exactly as stored: no rounding, no grouping. */
export function formatFigure(value: number): string {
  return formatPlainNumber(value, 10);
}

/**
 * Seconds with minutes beside them from a minute up ("83 s (1 min 23 s)", "600 s (10 min)"), as the
 * plan prints the same figures; protocol figures keep every stored digit.
 */
export function formatDurationS(seconds: number): string {
  return formatDuration(seconds, 'seconds-and-words', { maxDecimals: 10 });
}

/** The first 12 hexadecimal digits identify a version to a person; the full value is one click away. */
export function shortSha256(sha256: string): string {
  return `${sha256.slice(0, 12)}…`;
}
