import { DateTime } from 'luxon';
import { formatUnitTime } from '../format/figures';

export interface LightPrecautionEndInput {
  /** ISO 8601 date-time with offset (the infusion's start as recorded). */
  infusionStartAt: string;
  /** The protocol's precaution period (drug.lightPrecautionH). */
  hours: number;
  /** The unit's IANA time zone, e.g. Europe/Lisbon. */
  zone: string;
}

export interface LightPrecautionEnd {
  endUtc: string;
  /** ISO 8601 with the zone's offset at that instant. */
  endLocal: string;
  /** e.g. "Monday 26 October 2026, 09:00 WET". */
  endLocalText: string;
}

const msPerHour = 3_600_000;

/**
 * When the photosensitivity precaution ends. The period is elapsed time counted from the
 * infusion start, not calendar time, so 48 h stays 48 real hours across a daylight-saving
 * change and the local clock time of the end may shift by an hour. Throws RangeError on an
 * unusable input.
 */
export function lightPrecautionEnd({
  infusionStartAt,
  hours,
  zone,
}: LightPrecautionEndInput): LightPrecautionEnd {
  const start = DateTime.fromISO(infusionStartAt, { setZone: true });
  if (!start.isValid)
    throw new RangeError(`infusionStartAt must be an ISO 8601 date-time (got ${infusionStartAt})`);
  if (!Number.isFinite(hours) || hours < 0)
    throw new RangeError(`hours must be a number of at least 0 (got ${hours})`);
  const endUtc = start.toUTC().plus({ milliseconds: Math.round(hours * msPerHour) });
  const endLocal = endUtc.setZone(zone);
  if (!endLocal.isValid)
    throw new RangeError(`zone must be an IANA time zone such as Europe/Lisbon (got ${zone})`);
  return {
    endUtc: endUtc.toISO() ?? '',
    endLocal: endLocal.toISO() ?? '',
    endLocalText: formatUnitTime(endUtc.toISO(), zone, 'sheet'),
  };
}

/** Where the precaution period is counted from, and why. */
export interface PrecautionStart {
  at: string;
  basis: 'infusion-start' | 'latest-plausible';
  /** Said on the sheet and in the e-mail when the infusion start is not on record. */
  note: string | null;
}

/**
 * The precaution counts from the infusion's start. With no infusion start on record (never
 * tapped, or withdrawn) it counts from the latest time the drug can have been started, the end of
 * the session (or now, while it runs), so the period never ends earlier than it should.
 */
export function precautionStartFor(
  record: { infusionStartAt: string | null; endedAt: string | null },
  nowIso: string,
): PrecautionStart {
  if (record.infusionStartAt)
    return { at: record.infusionStartAt, basis: 'infusion-start', note: null };
  const at = record.endedAt ?? nowIso;
  return {
    at,
    basis: 'latest-plausible',
    note: `No infusion start is on record, so the period is counted from the latest time the infusion can have started (${record.endedAt ? 'the end of the session' : 'now, the session still running'}); it may end later than it would from the true start.`,
  };
}
