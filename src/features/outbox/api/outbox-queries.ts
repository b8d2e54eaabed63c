import { queryOptions } from '@tanstack/react-query';
import { getOutboxMessages } from './get-outbox-messages';

/** The outbox feature's query keys and options, general → specific. */
export const outboxQueries = {
  all: () => ['outbox'] as const,
  lists: () => [...outboxQueries.all(), 'list'] as const,
  list: () =>
    queryOptions({
      queryKey: [...outboxQueries.lists()] as const,
      queryFn: ({ signal }) => getOutboxMessages({ signal }),
    }),
};
