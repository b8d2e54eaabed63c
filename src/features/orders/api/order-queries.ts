import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { isSessionRunning } from '../../../../shared/orders/lifecycle';
import type { OrderListQuery, SigningFactsQuery } from '../../../../shared/schemas/orders';
import { findPatients, getPatient } from './find-patients';
import { getOrder } from './get-order';
import { getOrderSession } from './get-order-session';
import { getOrders } from './get-orders';
import { getPatientMeasurements } from './get-patient-measurements';
import { getProtocolChoices } from './get-protocol-choices';
import { getProtocolDefinition } from './get-protocol-definition';
import { getSigningFacts } from './get-signing-facts';

/** The orders feature's query keys and options, general → specific. */
export const orderQueries = {
  all: () => ['orders'] as const,
  lists: () => [...orderQueries.all(), 'list'] as const,
  list: (query: OrderListQuery) =>
    queryOptions({
      queryKey: [...orderQueries.lists(), query] as const,
      queryFn: ({ signal }) => getOrders(query, { signal }),
      // The current page stays visible while the next one loads, so the table does not jump.
      placeholderData: keepPreviousData,
    }),
  details: () => [...orderQueries.all(), 'detail'] as const,
  detail: (id: number) =>
    queryOptions({
      queryKey: [...orderQueries.details(), id] as const,
      queryFn: ({ signal }) => getOrder(id, { signal }),
    }),
  /** The session's dose record and live deviations; polled while the session runs. */
  session: (id: number) =>
    queryOptions({
      queryKey: [...orderQueries.details(), id, 'session'] as const,
      queryFn: ({ signal }) => getOrderSession(id, { signal }),
      refetchInterval: (query) =>
        query.state.data && isSessionRunning(query.state.data.status) ? 10_000 : false,
    }),

  /** What the order form reads from other parts of the API, kept under this feature's keys. */
  protocolChoices: () =>
    queryOptions({
      queryKey: [...orderQueries.all(), 'protocol-choices'] as const,
      queryFn: ({ signal }) => getProtocolChoices({ signal }),
    }),
  protocolDefinition: (key: string, version: number) =>
    queryOptions({
      queryKey: [...orderQueries.all(), 'protocol-definition', key, version] as const,
      queryFn: ({ signal }) => getProtocolDefinition(key, version, { signal }),
      // An approved version never changes.
      staleTime: Infinity,
    }),
  patientChoices: (text: string) =>
    queryOptions({
      queryKey: [...orderQueries.all(), 'patient-choices', text.trim()] as const,
      queryFn: ({ signal }) => findPatients(text, { signal }),
      placeholderData: keepPreviousData,
    }),
  patient: (id: number) =>
    queryOptions({
      queryKey: [...orderQueries.all(), 'patient', id] as const,
      queryFn: ({ signal }) => getPatient(id, { signal }),
    }),
  /** The patient's other open orders and recent treatments a signature would be held to. */
  signingFacts: (query: SigningFactsQuery) =>
    queryOptions({
      queryKey: [
        ...orderQueries.all(),
        'patient',
        query.patientId,
        'signing-facts',
        query,
      ] as const,
      queryFn: ({ signal }) => getSigningFacts(query, { signal }),
    }),
  patientMeasurements: (patientId: number) =>
    queryOptions({
      queryKey: [...orderQueries.all(), 'patient', patientId, 'measurements'] as const,
      queryFn: ({ signal }) => getPatientMeasurements(patientId, { signal }),
    }),
};
