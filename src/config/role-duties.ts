import type { Role } from '../../shared/roles';

/**
 * One line per role on what that person gets done in Luxtempo. Shown on Today and beside the
 * role choices when an administrator sets up an account, so both always say the same thing.
 */
export const roleDuties: Record<Role, string> = {
  clinician:
    'Prepare and sign treatment orders from a chosen protocol version, and approve new protocol versions.',
  pharmacist:
    'Work out each drug dose on your own before seeing the plan, then record how the dose was prepared.',
  nurse:
    'Run each treatment at the bedside on the step clock, recording every step as it happens, and give discharge advice.',
  auditor:
    'Review every deviation from protocol, comment on it and close it, and follow how often deviations happen.',
  admin:
    'Look after staff accounts and their roles, and bring protocol versions in or retire them.',
};
