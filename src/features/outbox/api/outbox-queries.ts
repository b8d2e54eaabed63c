import { outboxKeys, outboxListQuery } from '../../../lib/queries/outbox';

/** The outbox feature's queries: the one outbox cache (src/lib/queries/outbox.ts). */
export const outboxQueries = {
  all: outboxKeys.all,
  lists: outboxKeys.lists,
  list: outboxListQuery,
};
