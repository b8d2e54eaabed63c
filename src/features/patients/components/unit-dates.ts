import { DateTime } from 'luxon';
import { unitTimeZone } from '../../../config/unit-time-zone';

/** Whole years of age today in the unit's time zone. */
export function ageInYears(dateOfBirth: string): number | null {
  const born = DateTime.fromISO(dateOfBirth, { zone: unitTimeZone });
  if (!born.isValid) return null;
  return Math.floor(DateTime.now().setZone(unitTimeZone).diff(born, 'years').years);
}
