import type { ReviewClassification, ReviewStatus } from '../../../../shared/schemas/reviews';
import type { DeviationSeverity, DeviationType } from '../../../../shared/session/session-events';

export const deviationTypeWords: Record<DeviationType, string> = {
  'infusion-duration': 'Infusion time off plan',
  'light-start-window': 'Light started outside its window',
  'exposure-time': 'Light exposure time off plan',
  'delivered-fluence': 'Delivered fluence off plan',
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
export const statusWords: Record<ReviewStatus, string> = { open: 'Open', closed: 'Closed' };

export const classificationWords: Record<ReviewClassification, { label: string; meaning: string }> =
  {
    acceptable: {
      label: 'Acceptable',
      meaning: 'Within what the unit accepts; nothing further to do.',
    },
    'needs-follow-up': {
      label: 'Needs follow-up',
      meaning:
        'Something to act on: a process change, a word with the team, or a check on the patient.',
    },
    incident: {
      label: 'Incident',
      meaning: 'Harm or a near miss: also report it through the hospital’s incident system.',
    },
  };

export const eyeWords = { right: 'Right eye', left: 'Left eye' } as const;

const partWords: Record<string, string> = {
  ordered: 'Ordered and signed (clinician)',
  checked: 'Checked the dose (pharmacist)',
  prepared: 'Prepared the drug (pharmacist)',
  nursed: 'Ran the session (nurse)',
};
export function participantPart(part: string): string {
  return partWords[part] ?? part;
}

/** Field names of the review API as a person reads them. */
export const reviewFieldWords = { classification: 'Classification', comment: 'Comment' };
