import { peopleKeys, peopleListQuery, roleRequestsQuery } from '../../../lib/queries/people';

/** The people feature's queries: the one people cache (src/lib/queries/people.ts). */
export const peopleQueries = {
  all: peopleKeys.all,
  lists: peopleKeys.lists,
  list: peopleListQuery,
  roleRequests: roleRequestsQuery,
};
