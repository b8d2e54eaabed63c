import { queryOptions } from '@tanstack/react-query';
import { getRoleRequests } from './account-actions';
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
  roleRequests: () =>
    queryOptions({
      queryKey: [...peopleQueries.all(), 'role-requests'] as const,
      queryFn: ({ signal }) => getRoleRequests({ signal }),
    }),
};
