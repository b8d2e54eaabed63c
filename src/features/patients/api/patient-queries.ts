import { patientKeys, patientQuery, patientSearchQuery } from '../../../lib/queries/patients';

/** The patients feature's queries: the one patient cache (src/lib/queries/patients.ts). */
export const patientQueries = {
  all: patientKeys.all,
  searches: patientKeys.searches,
  search: patientSearchQuery,
  histories: patientKeys.details,
  history: patientQuery,
};
