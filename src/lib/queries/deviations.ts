import { keepPreviousData, queryOptions, type QueryClient } from '@tanstack/react-query';
import type { AuditFilter } from '../../../shared/schemas/reviews';
import { api } from '../api-client';
import {
  deviationDetailSchema,
  deviationPageSchema,
  type DeviationDetail,
  type DeviationPage,
} from './deviation-schemas';
import { refreshAfterOrderChange } from './orders';
import type { Fetching } from './request';
import { searchOf, segment } from './request';

/*
 * One cache for deviations under review: the queue (filtered pages) and each deviation with its
 * session and review history.
 */

export const deviationKeys = {
  all: () => ['deviations'] as const,
  lists: () => [...deviationKeys.all(), 'list'] as const,
  list: (filter: AuditFilter) => [...deviationKeys.lists(), filter] as const,
  details: () => [...deviationKeys.all(), 'detail'] as const,
  detail: (id: number) => [...deviationKeys.details(), id] as const,
};

/** The filter as URL search parameters; empty values are left out. */
export const deviationSearch = (filter: Partial<AuditFilter>): string => searchOf(filter);

/** One page of the queue, filtered, sorted and paged by the server. */
export async function getDeviations(
  filter: AuditFilter,
  { signal }: { signal?: AbortSignal } = {},
): Promise<DeviationPage> {
  return api.get(`/deviations?${deviationSearch(filter)}`, { schema: deviationPageSchema, signal });
}

/**
 * The address of the CSV of every deviation the filter matches, in the table's order. The
 * server streams it as an attachment, so a plain link downloads it.
 */
export function deviationsCsvHref(filter: AuditFilter): string {
  const { page: _page, pageSize: _pageSize, ...rest } = filter;
  const search = deviationSearch(rest);
  return `/api/exports/deviations.csv${search ? `?${search}` : ''}`;
}

/** One deviation with its session, participants, review history and whether I may review it. */
export function getDeviation(id: number, { signal }: Fetching = {}): Promise<DeviationDetail> {
  return api.get(`/deviations/${segment(id)}`, { schema: deviationDetailSchema, signal });
}

export const deviationListQuery = (filter: AuditFilter) =>
  queryOptions({
    queryKey: deviationKeys.list(filter),
    queryFn: ({ signal }) => getDeviations(filter, { signal }),
    // The current page stays on screen while the next one loads.
    placeholderData: keepPreviousData,
  });

export const deviationQuery = (id: number) =>
  queryOptions({
    queryKey: deviationKeys.detail(id),
    queryFn: ({ signal }) => getDeviation(id, { signal }),
  });

/**
 * After a review closed or reopened a deviation: its new state is known; the queue and the
 * session's other deviations moved, and so may the order's status (reviewed once none is open).
 */
export function refreshAfterReview(queryClient: QueryClient, detail: DeviationDetail) {
  queryClient.setQueryData(deviationKeys.detail(detail.deviation.id), detail);
  refreshAfterOrderChange(queryClient, { id: detail.deviation.orderId });
  return queryClient.invalidateQueries({ queryKey: deviationKeys.all() });
}
