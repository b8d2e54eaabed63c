import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { AuditTrailQuery } from '../../../../shared/schemas/reviews';
import { getAuditEvents } from './get-audit-events';

/** The audit trail feature's query keys and options, general → specific. */
export const auditTrailQueries = {
  all: () => ['audit-trail'] as const,
  lists: () => [...auditTrailQueries.all(), 'list'] as const,
  list: (query: AuditTrailQuery) =>
    queryOptions({
      queryKey: [...auditTrailQueries.lists(), query] as const,
      queryFn: ({ signal }) => getAuditEvents(query, { signal }),
      placeholderData: keepPreviousData,
    }),
};
