import type { DeviationSeverity, DeviationType } from '../../shared/session/session-events';

/** What each deviation type and severity is called on every screen that lists deviations. */
export const deviationTypeWords: Record<DeviationType, string> = {
  'infusion-duration': 'Infusion time off plan',
  'light-start-window': 'Light started outside its window',
  'exposure-time': 'Light exposure time off plan',
  'delivered-fluence': 'Delivered fluence off plan',
  'device-setting': 'Device set off plan',
  'beyond-use': 'Drug used after its beyond-use time',
  'reconstitution-to-infusion': 'Too long from reconstitution to infusion',
  'light-without-infusion': 'Light with no infusion start on record',
  'soak-short': 'Riboflavin soak too short',
  'drop-gap': 'Too long between drops',
  'uv-below-thickness': 'UV given below the minimum thickness',
  'thickness-override': 'Thickness minimum overridden',
  extravasation: 'Extravasation',
  'stopped-early': 'Session stopped early',
  'contraindication-override': 'Contraindication overridden',
};

/** A type the server added after this screen was built still reads, by its key. */
export function typeWords(type: string): string {
  return (deviationTypeWords as Record<string, string>)[type] ?? type;
}

export const severityWords: Record<DeviationSeverity, string> = {
  minor: 'Minor',
  major: 'Major',
  critical: 'Critical',
};
