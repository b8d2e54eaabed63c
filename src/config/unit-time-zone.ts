import { setUnitLocale } from '../../shared/format/unit-locale';

/**
 * The unit's IANA time zone. The server stores times in UTC; screens show them in this zone, so
 * a time on the screen is the time on the ward clock whatever the device's own setting.
 * The value comes from the server (`GET /api/unit`, its UNIT_TIME_ZONE) before the app renders;
 * the demo unit's zone stands in until then, or if the server cannot be asked.
 */
export let unitTimeZone = 'Europe/Lisbon';

/** How the zone is named beside a time on screen, e.g. "09:05 (Lisbon time)". */
export let unitTimeZoneLabel = 'Lisbon time';

/** Called once at start-up with the server's setting. */
export function applyServerTimeZone(zone: string, locale?: string): void {
  // The unit's locale (UNIT_LOCALE): dates are entered and shown in its order (day/month/year
  // for the demo unit's en-GB), never in the browser's default. One home: shared/format/unit-locale.ts.
  if (locale) setUnitLocale(locale);
  try {
    new Intl.DateTimeFormat('en', { timeZone: zone });
  } catch {
    return;
  }
  unitTimeZone = zone;
  const city = zone.split('/').pop()?.replace(/_/g, ' ');
  unitTimeZoneLabel = city ? `${city} time` : zone;
}
