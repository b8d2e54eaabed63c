import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { PossibleDuplicatesQuery } from '../../../../shared/schemas/patients';
import { findPossibleDuplicates } from './find-possible-duplicates';
import { getPatientHistory } from './get-patient-history';
import { searchPatients } from './search-patients';

/** The patients feature's query keys and options, general → specific. */
export const patientQueries = {
  all: () => ['patients'] as const,
  searches: () => [...patientQueries.all(), 'search'] as const,
  search: (text: string) =>
    queryOptions({
      queryKey: [...patientQueries.searches(), text.trim()] as const,
      queryFn: ({ signal }) => searchPatients(text, { signal }),
      // The previous results stay on screen while the next letters are looked up.
      placeholderData: keepPreviousData,
    }),
  /** Who already has the name and date of birth typed into the new-patient form. */
  possibleDuplicates: (query: PossibleDuplicatesQuery) =>
    queryOptions({
      queryKey: [...patientQueries.all(), 'possible-duplicates', query] as const,
      queryFn: ({ signal }) => findPossibleDuplicates(query, { signal }),
    }),
  histories: () => [...patientQueries.all(), 'history'] as const,
  history: (id: number) =>
    queryOptions({
      queryKey: [...patientQueries.histories(), id] as const,
      queryFn: ({ signal }) => getPatientHistory(id, { signal }),
    }),
};
