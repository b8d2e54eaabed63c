import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { DoseRecordFilter } from '../../../../shared/schemas/reviews';
import { getProtocolChoices } from '../../../lib/get-protocol-choices';
import { getDoseRecords } from './get-dose-records';
import { getProtocolSteps } from './get-protocol-steps';
import { getSession } from './get-session';
import { getTreatmentOrder } from './get-treatment-order';

/** The dose-records feature's query keys and options, general → specific. */
export const doseRecordQueries = {
  all: () => ['dose-records'] as const,
  lists: () => [...doseRecordQueries.all(), 'list'] as const,
  list: (filter: DoseRecordFilter) =>
    queryOptions({
      queryKey: [...doseRecordQueries.lists(), filter] as const,
      queryFn: ({ signal }) => getDoseRecords(filter, { signal }),
      placeholderData: keepPreviousData,
    }),

  /** What the printed record reads from other parts of the API, kept under this feature's keys. */
  order: (orderId: number) =>
    queryOptions({
      queryKey: [...doseRecordQueries.all(), 'order', orderId] as const,
      queryFn: ({ signal }) => getTreatmentOrder(orderId, { signal }),
    }),
  session: (orderId: number) =>
    queryOptions({
      queryKey: [...doseRecordQueries.all(), 'session', orderId] as const,
      queryFn: ({ signal }) => getSession(orderId, { signal }),
    }),
  protocolChoices: () =>
    queryOptions({
      queryKey: [...doseRecordQueries.all(), 'protocol-choices'] as const,
      queryFn: ({ signal }) => getProtocolChoices({ signal }),
      staleTime: 5 * 60_000,
    }),
  protocolSteps: (key: string, version: number) =>
    queryOptions({
      queryKey: [...doseRecordQueries.all(), 'protocol-steps', key, version] as const,
      queryFn: ({ signal }) => getProtocolSteps(key, version, { signal }),
      staleTime: Infinity,
    }),
};
