/**
 * The unit's locale (UNIT_LOCALE; en-GB, day/month/year, for the demo unit): the one setting
 * every date on a screen, sheet, e-mail or refusal is written in, never the browser's default.
 * The server sets it from its config at start; the client from `GET /api/unit` before it renders.
 * Formatting is in ./figures.ts (which re-exports these); this module imports nothing, so the
 * client can set the locale at start-up without loading the date library.
 */
let unitLocale = 'en-GB';

/** Sets the unit's locale; an unknown tag leaves the one in use. */
export function setUnitLocale(locale: string): void {
  try {
    if (Intl.DateTimeFormat.supportedLocalesOf([locale]).length === 1) unitLocale = locale;
  } catch {
    // An invalid tag leaves the locale as it was.
  }
}

/** The unit's locale, e.g. "en-GB". */
export function currentUnitLocale(): string {
  return unitLocale;
}
