import { queryOptions } from '@tanstack/react-query';
import type { PossibleDuplicatesQuery } from '../../../../shared/schemas/patients';
import { patientKeys, patientQuery, patientSearchQuery } from '../../../lib/queries/patients';
import { findPossibleDuplicates } from './find-possible-duplicates';

/** The patients feature's queries: the one patient cache (src/lib/queries/patients.ts). */
export const patientQueries = {
  all: patientKeys.all,
  searches: patientKeys.searches,
  search: patientSearchQuery,
  /** Who already has the name and date of birth typed into the new-patient form. */
  possibleDuplicates: (query: PossibleDuplicatesQuery) =>
    queryOptions({
      queryKey: [...patientKeys.all(), 'possible-duplicates', query] as const,
      queryFn: ({ signal }) => findPossibleDuplicates(query, { signal }),
    }),
  histories: patientKeys.details,
  history: patientQuery,
};
