/**
 * The unit's IANA time zone. The server stores times in UTC; screens show them in this zone, so
 * a time on the screen is the time on the ward clock whatever the device's own setting.
 * It matches the server's UNIT_TIME_ZONE for the demo unit.
 */
export const unitTimeZone = 'Europe/Lisbon';

/** How the zone is named beside a time on screen, e.g. "09:05 (Lisbon time)". */
export const unitTimeZoneLabel = 'Lisbon time';
