import { queryOptions } from '@tanstack/react-query';
import { getPeople } from './get-people';

/** The people feature's query keys and options, general → specific. */
export const peopleQueries = {
  all: () => ['people'] as const,
  lists: () => [...peopleQueries.all(), 'list'] as const,
  list: () =>
    queryOptions({
      queryKey: [...peopleQueries.lists()] as const,
      queryFn: ({ signal }) => getPeople({ signal }),
    }),
};
