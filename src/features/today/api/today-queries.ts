import { queryOptions } from '@tanstack/react-query';
import { todayKeys, todayQuery } from '../../../lib/queries/today';

/** The today feature's queries: the one Today cache (src/lib/queries/today.ts). */
export const todayQueries = {
  all: todayKeys.all,
  worklists: () =>
    queryOptions({
      ...todayQuery(),
      // Never open on an old copy.
      refetchOnMount: 'always',
    }),
};
