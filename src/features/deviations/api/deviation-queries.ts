import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { AuditFilter } from '../../../../shared/schemas/reviews';
import { getProtocolChoices } from '../../../lib/get-protocol-choices';
import { getDeviation } from './get-deviation';
import { getDeviations } from './get-deviations';
import { getProtocolSteps } from './get-protocol-steps';
import { getTreatmentOrder } from './get-treatment-order';

/** The deviations feature's query keys and options, general → specific. */
export const deviationQueries = {
  all: () => ['deviations'] as const,
  lists: () => [...deviationQueries.all(), 'list'] as const,
  list: (filter: AuditFilter) =>
    queryOptions({
      queryKey: [...deviationQueries.lists(), filter] as const,
      queryFn: ({ signal }) => getDeviations(filter, { signal }),
      // The current page stays on screen while the next one loads.
      placeholderData: keepPreviousData,
    }),
  details: () => [...deviationQueries.all(), 'detail'] as const,
  detail: (id: number) =>
    queryOptions({
      queryKey: [...deviationQueries.details(), id] as const,
      queryFn: ({ signal }) => getDeviation(id, { signal }),
    }),

  /** What the review screens read from other parts of the API, kept under this feature's keys. */
  order: (orderId: number) =>
    queryOptions({
      queryKey: [...deviationQueries.all(), 'order', orderId] as const,
      queryFn: ({ signal }) => getTreatmentOrder(orderId, { signal }),
    }),
  protocolChoices: () =>
    queryOptions({
      queryKey: [...deviationQueries.all(), 'protocol-choices'] as const,
      queryFn: ({ signal }) => getProtocolChoices({ signal }),
      staleTime: 5 * 60_000,
    }),
  protocolSteps: (key: string, version: number) =>
    queryOptions({
      queryKey: [...deviationQueries.all(), 'protocol-steps', key, version] as const,
      queryFn: ({ signal }) => getProtocolSteps(key, version, { signal }),
      // An approved version never changes.
      staleTime: Infinity,
    }),
};
