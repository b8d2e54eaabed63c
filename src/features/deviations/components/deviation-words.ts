import type { ReviewClassification, ReviewStatus } from '../../../../shared/schemas/reviews';

export { deviationTypeWords, severityWords, typeWords } from '../../../lib/deviation-words';
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
